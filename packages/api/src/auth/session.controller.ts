import { Controller, Get } from '@nestjs/common';
import { ApiOkResponse, ApiOperation, ApiProperty, ApiTags } from '@nestjs/swagger';

export class SessionDto {
  @ApiProperty({ nullable: true, type: Object, description: 'The signed-in person, or null' })
  user!: null;
}

/**
 * What the web client asks on every load: who, if anyone, is signed in.
 * Always 200 (a signed-out visitor is a normal state, not an error).
 */
@ApiTags('session')
@Controller('session')
export class SessionController {
  @Get()
  @ApiOperation({ summary: 'The current session: the signed-in person or null' })
  @ApiOkResponse({ type: SessionDto })
  session(): SessionDto {
    // Sign-in does not exist yet: nobody can be signed in.
    return { user: null };
  }
}
