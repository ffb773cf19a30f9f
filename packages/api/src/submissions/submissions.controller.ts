import {
  Controller,
  Get,
  HttpCode,
  HttpStatus,
  Inject,
  Param,
  ParseIntPipe,
  Post,
  Query,
  Req,
  Res,
} from '@nestjs/common';
import {
  ApiAcceptedResponse,
  ApiConflictResponse,
  ApiConsumes,
  ApiOkResponse,
  ApiPayloadTooLargeResponse,
  ApiOperation,
  ApiTags,
} from '@nestjs/swagger';
import type { Request, Response } from 'express';
import { type Actor, CurrentActor } from '../auth/actor.js';
import { AnySignedIn, PracticeScoped, Roles } from '../auth/index.js';
import {
  IssuePageDto,
  IssueQueryDto,
  SubmissionDto,
  SubmissionHistoryDto,
  UploadProblemDto,
  UploadQueryDto,
  ValidationReportFileDto,
} from './dto/submission.dto.js';
import { fileResponse, XLSX } from '../common/file-response.js';
import { IntakeService } from './intake.service.js';
import { type ReportDownload, SubmissionsService } from './submissions.service.js';
import { ApiProblems } from '../common/problem.dto.js';

function send(res: Response, download: ReportDownload): Promise<void> {
  res.status(200);
  res.setHeader('Content-Type', download.contentType);
  res.setHeader('Content-Disposition', `attachment; filename="${download.fileName}"`);
  return download.write(res);
}

@ApiProblems()
@ApiTags('submissions')
@Controller('practices/:practiceId')
export class SubmissionsController {
  constructor(
    @Inject(IntakeService) private readonly intake: IntakeService,
    @Inject(SubmissionsService) private readonly submissions: SubmissionsService,
  ) {}

  @Post('quarters/:quarterId/extracts')
  @HttpCode(HttpStatus.ACCEPTED)
  @Roles('practice_lead', 'regional_lead')
  @PracticeScoped('practiceId')
  @ApiConsumes('multipart/form-data')
  @ApiOperation({
    summary:
      'Upload an extract (.xlsx or .csv, in a part named "file") for a practice and audit quarter',
    description:
      'Answers 202 with the new submission, in status processing; poll it for progress and the report.',
  })
  @ApiAcceptedResponse({ type: SubmissionDto })
  @ApiConflictResponse({ type: UploadProblemDto, description: 'Identical to an earlier file' })
  @ApiPayloadTooLargeResponse({ type: UploadProblemDto, description: 'Over the size limit' })
  async upload(
    @CurrentActor() actor: Actor,
    @Param('practiceId', ParseIntPipe) practiceId: number,
    @Param('quarterId', ParseIntPipe) quarterId: number,
    @Query() query: UploadQueryDto,
    @Req() req: Request,
  ): Promise<SubmissionDto> {
    const id = await this.intake.receiveRequest(
      req,
      actor,
      practiceId,
      quarterId,
      query.dateConvention ?? null,
    );
    return this.submissions.get(actor, practiceId, id);
  }

  @Get('submissions')
  @AnySignedIn()
  @PracticeScoped('practiceId')
  @ApiOperation({
    summary: "A practice's submissions by audit quarter, with status, counts, who and when",
  })
  @ApiOkResponse({ type: SubmissionHistoryDto })
  history(
    @CurrentActor() actor: Actor,
    @Param('practiceId', ParseIntPipe) practiceId: number,
  ): Promise<SubmissionHistoryDto> {
    return this.submissions.history(actor, practiceId);
  }

  @Get('submissions/:submissionId')
  @AnySignedIn()
  @PracticeScoped('practiceId')
  @ApiOperation({ summary: 'One submission: status, progress, summary of its validation report' })
  @ApiOkResponse({ type: SubmissionDto })
  get(
    @CurrentActor() actor: Actor,
    @Param('practiceId', ParseIntPipe) practiceId: number,
    @Param('submissionId', ParseIntPipe) submissionId: number,
  ): Promise<SubmissionDto> {
    return this.submissions.get(actor, practiceId, submissionId);
  }

  @Get('submissions/:submissionId/issues')
  @AnySignedIn()
  @PracticeScoped('practiceId')
  @ApiOperation({ summary: 'The issues of a validation report, filtered, sorted and paged' })
  @ApiOkResponse({ type: IssuePageDto })
  issues(
    @CurrentActor() actor: Actor,
    @Param('practiceId', ParseIntPipe) practiceId: number,
    @Param('submissionId', ParseIntPipe) submissionId: number,
    @Query() query: IssueQueryDto,
  ): Promise<IssuePageDto> {
    return this.submissions.issues(actor, practiceId, submissionId, query);
  }

  @Get('submissions/:submissionId/report.json')
  @AnySignedIn()
  @PracticeScoped('practiceId')
  @ApiOperation({ summary: 'The whole validation report as JSON (summary and every issue)' })
  @ApiOkResponse({ type: ValidationReportFileDto, description: 'Sent as an attachment' })
  async reportJson(
    @CurrentActor() actor: Actor,
    @Param('practiceId', ParseIntPipe) practiceId: number,
    @Param('submissionId', ParseIntPipe) submissionId: number,
    @Res() res: Response,
  ): Promise<void> {
    await send(
      res,
      await this.submissions.download(actor, practiceId, submissionId, 'report.json'),
    );
  }

  @Get('submissions/:submissionId/rejected-rows.xlsx')
  @AnySignedIn()
  @PracticeScoped('practiceId')
  @ApiOperation({ summary: 'The refused rows as given, with a column of Cairn’s issues, as XLSX' })
  @ApiOkResponse(fileResponse(XLSX, 'The refused rows, and an about sheet'))
  async rejectedRows(
    @CurrentActor() actor: Actor,
    @Param('practiceId', ParseIntPipe) practiceId: number,
    @Param('submissionId', ParseIntPipe) submissionId: number,
    @Res() res: Response,
  ): Promise<void> {
    await send(
      res,
      await this.submissions.download(actor, practiceId, submissionId, 'rejected-rows.xlsx'),
    );
  }

  @Post('submissions/:submissionId/confirm')
  @HttpCode(200)
  @Roles('practice_lead', 'regional_lead')
  @PracticeScoped('practiceId')
  @ApiOperation({
    summary:
      'Confirm: make this submission current for its practice and quarter (the previous one is superseded)',
  })
  @ApiOkResponse({ type: SubmissionDto })
  confirm(
    @CurrentActor() actor: Actor,
    @Param('practiceId', ParseIntPipe) practiceId: number,
    @Param('submissionId', ParseIntPipe) submissionId: number,
  ): Promise<SubmissionDto> {
    return this.submissions.confirm(actor, practiceId, submissionId);
  }

  @Post('submissions/:submissionId/cancel')
  @HttpCode(200)
  @Roles('practice_lead', 'regional_lead')
  @PracticeScoped('practiceId')
  @ApiOperation({
    summary: 'Cancel a submission that is processing, awaiting confirmation or failed',
  })
  @ApiOkResponse({ type: SubmissionDto })
  cancel(
    @CurrentActor() actor: Actor,
    @Param('practiceId', ParseIntPipe) practiceId: number,
    @Param('submissionId', ParseIntPipe) submissionId: number,
  ): Promise<SubmissionDto> {
    return this.submissions.cancel(actor, practiceId, submissionId);
  }

  @Post('submissions/:submissionId/retry')
  @HttpCode(200)
  @Roles('practice_lead', 'regional_lead')
  @PracticeScoped('practiceId')
  @ApiOperation({ summary: 'Check a failed submission again (its file is kept for this)' })
  @ApiOkResponse({ type: SubmissionDto })
  retry(
    @CurrentActor() actor: Actor,
    @Param('practiceId', ParseIntPipe) practiceId: number,
    @Param('submissionId', ParseIntPipe) submissionId: number,
  ): Promise<SubmissionDto> {
    return this.submissions.retry(actor, practiceId, submissionId);
  }
}
