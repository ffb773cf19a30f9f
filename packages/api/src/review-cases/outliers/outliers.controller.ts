import { Controller, Get, Inject, Param, ParseIntPipe, Query } from '@nestjs/common';
import { ApiOkResponse, ApiOperation, ApiTags } from '@nestjs/swagger';
import { type Actor, CurrentActor } from '../../auth/actor.js';
import { Roles } from '../../auth/index.js';
import { SplitQueryDto } from '../../benchmarks/dto/results-common.dto.js';
import { ApiProblems } from '../../common/problem.dto.js';
import { DrillDownDto, OutlierListDto, OutlierQueryDto } from '../dto/outliers.dto.js';
import { OutliersService } from './outliers.service.js';

/** The outlier list of an audit quarter and the drill-down: auditors and regional leads. */
@ApiProblems()
@ApiTags('outliers')
@Controller('quarters/:quarterId/outliers')
export class OutliersController {
  constructor(@Inject(OutliersService) private readonly outliers: OutliersService) {}

  @Get()
  @Roles('regional_lead', 'auditor')
  @ApiOperation({
    summary:
      'Every practice × measure beyond the chosen limits, strongest evidence first, with why',
    description:
      'Read from the quarter’s stored benchmark (basis). 404 quarter-not-found, measure-not-found, locality-not-found; 400 for a bad level, split or assessment.',
  })
  @ApiOkResponse({ type: OutlierListDto })
  list(
    @CurrentActor() actor: Actor,
    @Param('quarterId', ParseIntPipe) quarterId: number,
    @Query() query: OutlierQueryDto,
  ): Promise<OutlierListDto> {
    return this.outliers.list(actor, quarterId, query);
  }

  @Get('practices/:practiceId/measures/:measureKey')
  @Roles('regional_lead', 'auditor')
  @ApiOperation({
    summary:
      'One practice × measure: by diabetes type with trends, breakdowns against the region, histogram, data-quality flags',
  })
  @ApiOkResponse({ type: DrillDownDto })
  drillDown(
    @CurrentActor() actor: Actor,
    @Param('quarterId', ParseIntPipe) quarterId: number,
    @Param('practiceId', ParseIntPipe) practiceId: number,
    @Param('measureKey') measureKey: string,
    @Query() query: SplitQueryDto,
  ): Promise<DrillDownDto> {
    return this.outliers.drillDown(actor, quarterId, practiceId, measureKey, query.split ?? 'all');
  }
}
