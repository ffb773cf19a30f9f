/**
 * What the web client asks on every load: who, if anyone, is signed in.
 * GET /api/session is always 200 (a signed-out visitor is a normal state);
 * GET /api/me is the same person for signed-in callers (401 otherwise).
 */
import { Controller, Get, Inject, Req } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import {
  ApiOkResponse,
  ApiOperation,
  ApiProperty,
  ApiPropertyOptional,
  ApiTags,
} from '@nestjs/swagger';
import type { Request } from 'express';
import { ROLES, type Role } from '../users/roles.js';
import type { AuthUser } from './auth-user.js';
import { AnySignedIn, CurrentUser, Public } from './decorators.js';
import { MeService } from './me.service.js';
import { SessionService } from './session.service.js';
import { section } from './config-section.js';

export class MePracticeDto {
  @ApiProperty({ example: 12 })
  id!: number;

  @ApiProperty({ example: 'OV102' })
  code!: string;

  @ApiProperty({ example: 'Quarrybank Surgery' })
  name!: string;
}

export class MeDto {
  @ApiProperty()
  id!: number;

  @ApiProperty({ example: 'priya.calloway@quarrybank.example' })
  email!: string;

  @ApiProperty({ example: 'Priya Calloway' })
  displayName!: string;

  @ApiProperty({ enum: ROLES })
  role!: Role;

  @ApiProperty({ example: 'Ostrevale' })
  regionName!: string;

  @ApiProperty({
    type: [MePracticeDto],
    description: 'The practices this person leads (practice leads only)',
  })
  practices!: MePracticeDto[];

  @ApiProperty({ description: 'When the session ends at the latest (absolute timeout), ISO 8601' })
  sessionExpiresAt!: string;
}

export class SessionDto {
  @ApiProperty({ nullable: true, type: MeDto, description: 'The signed-in person, or null' })
  user!: MeDto | null;

  @ApiProperty({
    nullable: true,
    type: String,
    description:
      'Send this as the X-CSRF-Token header on every state-changing request; null when signed out',
  })
  csrfToken!: string | null;

  @ApiPropertyOptional({
    nullable: true,
    enum: ['idle', 'absolute', 'deactivated', 'removed'],
    description: 'Set when a session ended on this request (why the person is signed out)',
  })
  sessionEnded!: string | null;

  @ApiProperty({
    description: 'True when sign-in goes through the local fake identity provider (development)',
  })
  localSignIn!: boolean;
}

@ApiTags('session')
@Controller()
export class SessionController {
  constructor(
    @Inject(SessionService) private readonly sessions: SessionService,
    @Inject(MeService) private readonly me: MeService,
    @Inject(ConfigService) private readonly config: ConfigService,
  ) {}

  @Get('session')
  @Public()
  @ApiOperation({
    summary: 'The current session: the signed-in person (or null) and the CSRF token',
  })
  @ApiOkResponse({ type: SessionDto })
  async session(
    @Req() req: Request,
    @CurrentUser() user: AuthUser | undefined,
  ): Promise<SessionDto> {
    const { ended } = await this.sessions.resolve(req);
    const auth = section(this.config, 'auth');
    return {
      user: user ? await this.me.describe(user, req) : null,
      csrfToken: user ? (this.sessions.csrfToken(req) ?? null) : null,
      sessionEnded: ended ?? null,
      localSignIn: auth.idp.source === 'dev-fake',
    };
  }

  @Get('me')
  @AnySignedIn()
  @ApiOperation({ summary: 'The signed-in person: role, region and practices' })
  @ApiOkResponse({ type: MeDto })
  async getMe(@Req() req: Request, @CurrentUser() user: AuthUser): Promise<MeDto> {
    return this.me.describe(user, req);
  }
}
