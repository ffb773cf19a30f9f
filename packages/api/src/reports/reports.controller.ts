import {
  Body,
  Controller,
  Get,
  HttpCode,
  Inject,
  Param,
  ParseIntPipe,
  Post,
  Query,
} from '@nestjs/common';
import { ApiCreatedResponse, ApiOkResponse, ApiOperation, ApiTags } from '@nestjs/swagger';
import { type Actor, CurrentActor } from '../auth/actor.js';
import { PracticeScoped, Roles } from '../auth/index.js';
import { ApiProblems } from '../common/problem.dto.js';
import {
  PublishReportDto,
  ReportDto,
  ReportListDto,
  ReportListQueryDto,
  ReportPracticeDto,
  ReportRegionDto,
  WithdrawReportDto,
} from './dto/report.dto.js';
import { ReportsService } from './reports.service.js';

/** Publishing a quarter's benchmark as a report (regional lead). */
@ApiProblems()
@ApiTags('reports')
@Controller('quarters/:quarterId/reports')
export class PublishReportController {
  constructor(@Inject(ReportsService) private readonly reports: ReportsService) {}

  @Post()
  @Roles('regional_lead')
  @ApiOperation({
    summary: 'Publish the quarter’s benchmark as a report that never changes afterwards',
    description:
      'Freezes the benchmark of the quarter’s current submissions (every practice’s results, the region’s, funnels, trends) with the measure-set version, the submissions, the publisher, the time and the release note; its content hash is the SHA-256 of those canonical bytes. An earlier published report of the quarter stays readable, marked replaced. 409 nothing-to-publish when no extract is confirmed; 409 benchmark-changed when one was confirmed while publishing.',
  })
  @ApiCreatedResponse({ type: ReportDto })
  publish(
    @CurrentActor() actor: Actor,
    @Param('quarterId', ParseIntPipe) quarterId: number,
    @Body() body: PublishReportDto,
  ): Promise<ReportDto> {
    return this.reports.publish(actor, quarterId, body.releaseNote);
  }
}

/** Published reports: everyone of the region reads them, as far as their role allows. */
@ApiProblems()
@ApiTags('reports')
@Controller('reports')
export class ReportsController {
  constructor(@Inject(ReportsService) private readonly reports: ReportsService) {}

  @Get()
  @Roles('practice_lead', 'regional_lead', 'auditor')
  @ApiOperation({
    summary: 'The region’s reports, newest first (withdrawn ones as tombstones)',
  })
  @ApiOkResponse({ type: ReportListDto })
  list(@CurrentActor() actor: Actor, @Query() query: ReportListQueryDto): Promise<ReportListDto> {
    return this.reports.list(actor, query.quarterId);
  }

  @Get(':reportId')
  @Roles('practice_lead', 'regional_lead', 'auditor')
  @ApiOperation({ summary: 'A report’s identity and standing (its permanent address)' })
  @ApiOkResponse({ type: ReportDto })
  get(
    @CurrentActor() actor: Actor,
    @Param('reportId', ParseIntPipe) reportId: number,
  ): Promise<ReportDto> {
    return this.reports.get(actor, reportId);
  }

  @Get(':reportId/region')
  @Roles('regional_lead', 'auditor')
  @ApiOperation({
    summary: 'The region’s figures of a report, exactly as published',
    description: '410 report-withdrawn with the tombstone when it was withdrawn.',
  })
  @ApiOkResponse({ type: ReportRegionDto })
  region(
    @CurrentActor() actor: Actor,
    @Param('reportId', ParseIntPipe) reportId: number,
  ): Promise<ReportRegionDto> {
    return this.reports.region(actor, reportId);
  }

  @Get(':reportId/practices/:practiceId')
  @Roles('practice_lead', 'regional_lead', 'auditor')
  @PracticeScoped('practiceId')
  @ApiOperation({
    summary: 'One practice’s part of a report, exactly as published',
    description:
      'Its own figures in full; for practice leads the region’s figures and other practices under disclosure control. State not-in-report when the practice had no confirmed extract then.',
  })
  @ApiOkResponse({ type: ReportPracticeDto })
  practice(
    @CurrentActor() actor: Actor,
    @Param('reportId', ParseIntPipe) reportId: number,
    @Param('practiceId', ParseIntPipe) practiceId: number,
  ): Promise<ReportPracticeDto> {
    return this.reports.practice(actor, reportId, practiceId);
  }

  @Post(':reportId/withdraw')
  @HttpCode(200)
  @Roles('regional_lead')
  @ApiOperation({
    summary: 'Withdraw a report: its figures are no longer served; a tombstone keeps the reason',
  })
  @ApiOkResponse({ type: ReportDto })
  withdraw(
    @CurrentActor() actor: Actor,
    @Param('reportId', ParseIntPipe) reportId: number,
    @Body() body: WithdrawReportDto,
  ): Promise<ReportDto> {
    return this.reports.withdraw(actor, reportId, body.reason);
  }
}
