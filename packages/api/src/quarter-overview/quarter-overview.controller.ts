import { Controller, Get, Inject } from '@nestjs/common';
import { ApiOkResponse, ApiOperation, ApiTags } from '@nestjs/swagger';
import { type Actor, AnySignedIn, CurrentActor } from '../auth/index.js';
import { ApiProblems } from '../common/problem.dto.js';
import { AuditQuartersDto } from './dto/quarter-overview.dto.js';
import { QuarterOverviewService } from './quarter-overview.service.js';

@ApiProblems()
@ApiTags('quarters')
@Controller('quarter-overview')
export class QuarterOverviewController {
  constructor(@Inject(QuarterOverviewService) private readonly overview: QuarterOverviewService) {}

  @Get()
  @AnySignedIn()
  @ApiOperation({
    summary:
      'The audit quarters of your region with deadline, measure set, coverage (regional lead, auditor) and published reports, what you may do with each, and the quarter that would open next',
  })
  @ApiOkResponse({ type: AuditQuartersDto })
  get(@CurrentActor() actor: Actor): Promise<AuditQuartersDto> {
    return this.overview.overview(actor);
  }
}
