import { Controller, Get, Inject, Param, ParseIntPipe } from '@nestjs/common';
import { ApiOkResponse, ApiOperation, ApiTags } from '@nestjs/swagger';
import { type Actor, CurrentActor } from '../auth/actor.js';
import { Roles } from '../auth/index.js';
import { CoverageDto } from './dto/submission.dto.js';
import { SubmissionsService } from './submissions.service.js';
import { ApiProblems } from '../common/problem.dto.js';

@ApiProblems()
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
  @ApiOkResponse({ type: CoverageDto })
  coverage(
    @CurrentActor() actor: Actor,
    @Param('quarterId', ParseIntPipe) quarterId: number,
  ): Promise<CoverageDto> {
    return this.submissions.coverage(actor, quarterId);
  }
}
