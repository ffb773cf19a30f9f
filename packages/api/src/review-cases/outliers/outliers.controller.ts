import { Controller, Get, Inject, Param, ParseIntPipe, Query, Res } from '@nestjs/common';
import type { Response } from 'express';
import { fileResponse, XLSX } from '../../common/file-response.js';
import { ApiOkResponse, ApiOperation, ApiTags } from '@nestjs/swagger';
import { type Actor, CurrentActor } from '../../auth/actor.js';
import { Roles } from '../../auth/index.js';
import { SplitQueryDto } from '../../benchmarks/dto/results-common.dto.js';
import { ApiProblems } from '../../common/problem.dto.js';
import {
  DrillDownDto,
  DrillRecordPageDto,
  DrillRecordsQueryDto,
  OutlierListDto,
  OutlierQueryDto,
} from '../dto/outliers.dto.js';
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

  @Get('practices/:practiceId/measures/:measureKey/records')
  @Roles('regional_lead', 'auditor')
  @ApiOperation({
    summary: 'The de-identified records behind the result, paged (pseudonyms only)',
  })
  @ApiOkResponse({ type: DrillRecordPageDto })
  records(
    @CurrentActor() actor: Actor,
    @Param('quarterId', ParseIntPipe) quarterId: number,
    @Param('practiceId', ParseIntPipe) practiceId: number,
    @Param('measureKey') measureKey: string,
    @Query() query: DrillRecordsQueryDto,
  ): Promise<DrillRecordPageDto> {
    return this.outliers.records(actor, quarterId, practiceId, measureKey, query);
  }

  @Get('practices/:practiceId/measures/:measureKey/evidence.xlsx')
  @Roles('regional_lead', 'auditor')
  @ApiOperation({
    summary: 'The evidence as XLSX: about, by type, breakdowns, trend, data quality, records',
  })
  @ApiOkResponse(fileResponse(XLSX, 'The evidence workbook'))
  async evidence(
    @CurrentActor() actor: Actor,
    @Param('quarterId', ParseIntPipe) quarterId: number,
    @Param('practiceId', ParseIntPipe) practiceId: number,
    @Param('measureKey') measureKey: string,
    @Res() res: Response,
  ): Promise<void> {
    // Refusals (404s) are decided before the first byte is written.
    await this.outliers.drillDown(actor, quarterId, practiceId, measureKey, 'all');
    res.setHeader('Content-Type', XLSX);
    res.setHeader(
      'Content-Disposition',
      `attachment; filename="cairn-evidence-${quarterId}-${practiceId}-${measureKey.replace(/[^\w-]/g, '_')}.xlsx"`,
    );
    await this.outliers.evidenceXlsx(actor, quarterId, practiceId, measureKey, res);
  }
}
