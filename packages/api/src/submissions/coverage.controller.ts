import { Controller, Get, Inject, Param, ParseIntPipe } from '@nestjs/common';
import { ApiOperation, ApiTags } from '@nestjs/swagger';
import { type AuthUser, CurrentUser, Roles } from '../auth/index.js';
import { SubmissionsService } from './submissions.service.js';

@ApiTags('submissions')
@Controller('quarters/:quarterId/coverage')
export class CoverageController {
  constructor(@Inject(SubmissionsService) private readonly submissions: SubmissionsService) {}

  @Get()
  @Roles('regional_lead', 'auditor')
  @ApiOperation({
    summary:
      'Submission coverage of a quarter: which practices have a current submission, which are awaiting confirmation, which have none',
  })
  coverage(@CurrentUser() user: AuthUser, @Param('quarterId', ParseIntPipe) quarterId: number) {
    return this.submissions.coverage(user, quarterId);
  }
}
