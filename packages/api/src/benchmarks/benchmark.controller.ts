import { Controller, Get, Inject, Param, ParseIntPipe, Query, Req, Res } from '@nestjs/common';
import { ApiOkResponse, ApiOperation, ApiTags } from '@nestjs/swagger';
import type { Request, Response } from 'express';
import { type Actor, CurrentActor } from '../auth/actor.js';
import { Roles } from '../auth/index.js';
import { ApiProblems } from '../common/problem.dto.js';
import {
  BenchmarkQueryDto,
  BenchmarkTrendDto,
  MeasureFunnelDto,
  RegionBenchmarkDto,
  TrendQueryDto,
} from './dto/benchmark.dto.js';
import { SplitQueryDto } from './dto/results-common.dto.js';
import { BenchmarksService } from './benchmarks.service.js';
import { sendAnswer } from './answers/send-answer.js';

/** The region's benchmark of an audit quarter: regional leads and auditors. */
@ApiProblems()
@ApiTags('benchmarks')
@Controller('quarters/:quarterId/benchmark')
export class BenchmarkController {
  constructor(@Inject(BenchmarksService) private readonly benchmarks: BenchmarksService) {}

  @Get()
  @Roles('regional_lead', 'auditor')
  @ApiOperation({
    summary: 'Every practice on every measure of an audit quarter, with the region’s statistics',
    description:
      'Read from the practices’ current submissions for the quarter; `builtFrom` says which set. Practices come in pages (`page`, `pageSize`; `page` in the answer says how many there are), each page with the region’s statistics, the measures and the coverage; pages with the same `builtFrom.resultId` belong together. Practices without a current submission are listed in `coverage.missing`, never counted as zero. 404 quarter-not-found, 404 locality-not-found; 400 for a bad split, page or page size, or a page past the last. Sent with an ETag; If-None-Match with it gives 304 while nothing it was built from has changed.',
  })
  @ApiOkResponse({ type: RegionBenchmarkDto })
  async region(
    @CurrentActor() actor: Actor,
    @Param('quarterId', ParseIntPipe) quarterId: number,
    @Query() query: BenchmarkQueryDto,
    @Req() req: Request,
    @Res() res: Response,
  ): Promise<void> {
    // The stored answer's bytes, with its ETag (304 when the reader has them).
    sendAnswer(req, res, await this.benchmarks.regionAnswer(actor, quarterId, query));
  }

  @Get('measures/:measureKey')
  @Roles('regional_lead', 'auditor')
  @ApiOperation({
    summary:
      'One measure’s funnel plot: every practice’s point, the limits as curves, over-dispersion',
    description: '404 measure-not-found naming the measure set’s measures.',
  })
  @ApiOkResponse({ type: MeasureFunnelDto })
  funnel(
    @CurrentActor() actor: Actor,
    @Param('quarterId', ParseIntPipe) quarterId: number,
    @Param('measureKey') measureKey: string,
    @Query() query: SplitQueryDto,
  ): Promise<MeasureFunnelDto> {
    return this.benchmarks.funnel(actor, quarterId, measureKey, query.split ?? 'all');
  }

  @Get('trend')
  @Roles('regional_lead', 'auditor')
  @ApiOperation({
    summary:
      'One measure over every quarter of the region up to this one: the region and every practice',
    description:
      'Each quarter with its own measure set; a quarter whose measure set lacks the measure, or without a current submission, is a gap (no rate), never a zero. Run-chart signals per series.',
  })
  @ApiOkResponse({ type: BenchmarkTrendDto })
  trend(
    @CurrentActor() actor: Actor,
    @Param('quarterId', ParseIntPipe) quarterId: number,
    @Query() query: TrendQueryDto,
  ): Promise<BenchmarkTrendDto> {
    return this.benchmarks.trend(actor, quarterId, query);
  }
}
