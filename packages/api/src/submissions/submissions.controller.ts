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
import { ApiConsumes, ApiOkResponse, ApiOperation, ApiTags } from '@nestjs/swagger';
import type { Request, Response } from 'express';
import { AnySignedIn, type AuthUser, CurrentUser, PracticeScoped, Roles } from '../auth/index.js';
import { IssueQueryDto, SubmissionDto, UploadQueryDto } from './dto/submission.dto.js';
import { IntakeService } from './intake.service.js';
import { ValidationReportService } from './validation-report/validation-report.service.js';
import { findSubmission } from './submission-store.js';
import { toView } from './submission-view.js';
import { SubmissionsService } from './submissions.service.js';
import { Sequelize } from 'sequelize-typescript';

const actorOf = (user: AuthUser) => ({
  id: user.id,
  label: user.email,
  role: user.role,
  regionId: user.regionId,
  practiceIds: user.practiceIds,
});

@ApiTags('submissions')
@Controller('practices/:practiceId')
export class SubmissionsController {
  constructor(
    @Inject(IntakeService) private readonly intake: IntakeService,
    @Inject(SubmissionsService) private readonly submissions: SubmissionsService,
    @Inject(ValidationReportService) private readonly reports: ValidationReportService,
    @Inject(Sequelize) private readonly sequelize: Sequelize,
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
  @ApiOkResponse({ type: SubmissionDto })
  async upload(
    @CurrentUser() user: AuthUser,
    @Param('practiceId', ParseIntPipe) practiceId: number,
    @Param('quarterId', ParseIntPipe) quarterId: number,
    @Query() query: UploadQueryDto,
    @Req() req: Request,
  ) {
    const id = await this.intake.receiveRequest(
      req,
      actorOf(user),
      practiceId,
      quarterId,
      query.dateConvention ?? null,
    );
    return toView((await findSubmission(this.sequelize, id))!, user);
  }

  @Get('submissions')
  @AnySignedIn()
  @PracticeScoped('practiceId')
  @ApiOperation({
    summary: "A practice's submissions by audit quarter, with status, counts, who and when",
  })
  history(@CurrentUser() user: AuthUser, @Param('practiceId', ParseIntPipe) practiceId: number) {
    return this.submissions.history(user, practiceId);
  }

  @Get('submissions/:submissionId')
  @AnySignedIn()
  @PracticeScoped('practiceId')
  @ApiOperation({ summary: 'One submission: status, progress, summary of its validation report' })
  @ApiOkResponse({ type: SubmissionDto })
  get(
    @CurrentUser() user: AuthUser,
    @Param('practiceId', ParseIntPipe) practiceId: number,
    @Param('submissionId', ParseIntPipe) submissionId: number,
  ) {
    return this.submissions.get(user, practiceId, submissionId);
  }

  @Get('submissions/:submissionId/issues')
  @AnySignedIn()
  @PracticeScoped('practiceId')
  @ApiOperation({ summary: 'The issues of a validation report, filtered, sorted and paged' })
  issues(
    @CurrentUser() user: AuthUser,
    @Param('practiceId', ParseIntPipe) practiceId: number,
    @Param('submissionId', ParseIntPipe) submissionId: number,
    @Query() query: IssueQueryDto,
  ) {
    return this.submissions.issues(user, practiceId, submissionId, query);
  }

  @Get('submissions/:submissionId/report.json')
  @AnySignedIn()
  @PracticeScoped('practiceId')
  @ApiOperation({ summary: 'The whole validation report as JSON (summary and every issue)' })
  async reportJson(
    @CurrentUser() user: AuthUser,
    @Param('practiceId', ParseIntPipe) practiceId: number,
    @Param('submissionId', ParseIntPipe) submissionId: number,
    @Res() res: Response,
  ) {
    const row = await this.submissions.row(practiceId, submissionId);
    res.status(200);
    res.setHeader('Content-Type', 'application/json; charset=utf-8');
    res.setHeader(
      'Content-Disposition',
      `attachment; filename="cairn-report-${row.practice_code}-${row.year}Q${row.quarter}-${row.id}.json"`,
    );
    await this.reports.writeJson(row, user, res);
  }

  @Get('submissions/:submissionId/rejected-rows.xlsx')
  @AnySignedIn()
  @PracticeScoped('practiceId')
  @ApiOperation({ summary: 'The refused rows as given, with a column of Cairn’s issues, as XLSX' })
  async rejectedRows(
    @CurrentUser() user: AuthUser,
    @Param('practiceId', ParseIntPipe) practiceId: number,
    @Param('submissionId', ParseIntPipe) submissionId: number,
    @Res() res: Response,
  ) {
    const row = await this.submissions.row(practiceId, submissionId);
    res.status(200);
    res.setHeader(
      'Content-Type',
      'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet',
    );
    res.setHeader(
      'Content-Disposition',
      `attachment; filename="cairn-refused-rows-${row.practice_code}-${row.year}Q${row.quarter}-${row.id}.xlsx"`,
    );
    await this.reports.writeRejectedRowsXlsx(row, user, res);
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
  async confirm(
    @CurrentUser() user: AuthUser,
    @Param('practiceId', ParseIntPipe) practiceId: number,
    @Param('submissionId', ParseIntPipe) submissionId: number,
  ) {
    return toView(await this.submissions.confirm(actorOf(user), practiceId, submissionId), user);
  }

  @Post('submissions/:submissionId/cancel')
  @HttpCode(200)
  @Roles('practice_lead', 'regional_lead')
  @PracticeScoped('practiceId')
  @ApiOperation({
    summary: 'Cancel a submission that is processing, awaiting confirmation or failed',
  })
  @ApiOkResponse({ type: SubmissionDto })
  async cancel(
    @CurrentUser() user: AuthUser,
    @Param('practiceId', ParseIntPipe) practiceId: number,
    @Param('submissionId', ParseIntPipe) submissionId: number,
  ) {
    return toView(await this.submissions.cancel(actorOf(user), practiceId, submissionId), user);
  }

  @Post('submissions/:submissionId/retry')
  @HttpCode(200)
  @Roles('practice_lead', 'regional_lead')
  @PracticeScoped('practiceId')
  @ApiOperation({ summary: 'Check a failed submission again (its file is kept for this)' })
  @ApiOkResponse({ type: SubmissionDto })
  async retry(
    @CurrentUser() user: AuthUser,
    @Param('practiceId', ParseIntPipe) practiceId: number,
    @Param('submissionId', ParseIntPipe) submissionId: number,
  ) {
    return toView(await this.submissions.retry(actorOf(user), practiceId, submissionId), user);
  }
}
