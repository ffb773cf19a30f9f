import {
  Body,
  Controller,
  Delete,
  Get,
  Header,
  HttpCode,
  Inject,
  Param,
  ParseIntPipe,
  Post,
  Put,
} from '@nestjs/common';
import { ApiOkResponse, ApiOperation, ApiProduces, ApiTags } from '@nestjs/swagger';
import { type Actor, CurrentActor } from '../auth/actor.js';
import { Roles } from '../auth/index.js';
import { ApiProblems } from '../common/problem.dto.js';
import {
  DigestPreviewDto,
  DigestReportRefDto,
  DigestScheduleDto,
  DigestSendResultDto,
  DigestTestSendDto,
  ScheduleDigestsDto,
} from './dto/digest.dto.js';
import { DigestsService } from './digests.service.js';

/** A report's digests: preview, test, send, schedule (the regional lead). */
@ApiProblems()
@ApiTags('digests')
@Controller('digests')
@Roles('regional_lead')
export class DigestsController {
  constructor(@Inject(DigestsService) private readonly digests: DigestsService) {}

  @Get()
  @ApiOperation({ summary: 'The reports digests can be made from, latest first' })
  @ApiOkResponse({ type: [DigestReportRefDto] })
  list(@CurrentActor() actor: Actor): Promise<DigestReportRefDto[]> {
    return this.digests.list(actor);
  }

  @Get(':reportId/practices/:practiceId/preview')
  @ApiOperation({
    summary: "A practice's digest as it will be sent: subject, recipients, text part, attachment",
    description: 'The HTML part is served alone at htmlPath, for a sandboxed frame.',
  })
  @ApiOkResponse({ type: DigestPreviewDto })
  preview(
    @CurrentActor() actor: Actor,
    @Param('reportId', ParseIntPipe) reportId: number,
    @Param('practiceId', ParseIntPipe) practiceId: number,
  ): Promise<DigestPreviewDto> {
    return this.digests.preview(actor, reportId, practiceId);
  }

  @Get(':reportId/practices/:practiceId/preview.html')
  // The message's own inline styles and nothing else: no script, no image, no fetch.
  @Header(
    'Content-Security-Policy',
    "default-src 'none'; style-src 'unsafe-inline'; frame-ancestors 'self'; form-action 'none'; base-uri 'none'",
  )
  @Header('Content-Type', 'text/html; charset=utf-8')
  @Header('Cache-Control', 'no-store')
  @ApiProduces('text/html')
  @ApiOperation({ summary: "A practice's digest: the HTML part alone, exactly as sent" })
  @ApiOkResponse({ description: 'The HTML part', schema: { type: 'string' } })
  previewHtml(
    @CurrentActor() actor: Actor,
    @Param('reportId', ParseIntPipe) reportId: number,
    @Param('practiceId', ParseIntPipe) practiceId: number,
  ): Promise<string> {
    return this.digests.previewHtml(actor, reportId, practiceId);
  }

  @Post(':reportId/practices/:practiceId/test')
  @HttpCode(200)
  @ApiOperation({
    summary: "Sends a practice's digest to the signed-in regional lead alone, now",
  })
  @ApiOkResponse({ type: DigestTestSendDto })
  sendTest(
    @CurrentActor() actor: Actor,
    @Param('reportId', ParseIntPipe) reportId: number,
    @Param('practiceId', ParseIntPipe) practiceId: number,
  ): Promise<DigestTestSendDto> {
    return this.digests.sendTest(actor, reportId, practiceId);
  }

  @Post(':reportId/send')
  @HttpCode(200)
  @ApiOperation({
    summary: "Queues every practice's digests (practices queued before are left alone)",
  })
  @ApiOkResponse({ type: DigestSendResultDto })
  sendAll(
    @CurrentActor() actor: Actor,
    @Param('reportId', ParseIntPipe) reportId: number,
  ): Promise<DigestSendResultDto> {
    return this.digests.sendAll(actor, reportId);
  }

  @Get(':reportId/schedule')
  @ApiOperation({ summary: 'When the digests are to be sent, or were' })
  @ApiOkResponse({ type: DigestScheduleDto })
  scheduleOf(
    @CurrentActor() actor: Actor,
    @Param('reportId', ParseIntPipe) reportId: number,
  ): Promise<DigestScheduleDto> {
    return this.digests.scheduleOf(actor, reportId);
  }

  @Put(':reportId/schedule')
  @ApiOperation({ summary: 'Sends the digests at a time (sets or moves it)' })
  @ApiOkResponse({ type: DigestScheduleDto })
  schedule(
    @CurrentActor() actor: Actor,
    @Param('reportId', ParseIntPipe) reportId: number,
    @Body() body: ScheduleDigestsDto,
  ): Promise<DigestScheduleDto> {
    return this.digests.schedule(actor, reportId, body.sendAt);
  }

  @Delete(':reportId/schedule')
  @ApiOperation({ summary: 'Cancels the scheduled sending' })
  @ApiOkResponse({ type: DigestScheduleDto })
  cancel(
    @CurrentActor() actor: Actor,
    @Param('reportId', ParseIntPipe) reportId: number,
  ): Promise<DigestScheduleDto> {
    return this.digests.cancelSchedule(actor, reportId);
  }
}
