/**
 * DTOs of the submissions API: the inputs (validated) and every response, as
 * classes with every field described, so that the OpenAPI document and the
 * web's generated types say exactly what is sent. Services return these.
 */
import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { Type } from 'class-transformer';
import { IsIn, IsInt, IsOptional, IsString, MaxLength, Min } from 'class-validator';
import { ProblemDto } from '../../common/problem.dto.js';
import { PracticeDto, PracticeRefDto } from '../../organisations/dto/practice.dto.js';
import { QuarterDto } from '../../quarters/dto/quarter.dto.js';
import { ISSUE_SEVERITIES, type IssueSeverity } from '../format/issue-codes.js';

export const SUBMISSION_STATUSES = [
  'processing',
  'rejected',
  'awaiting_confirmation',
  'accepted',
  'superseded',
  'cancelled',
  'failed',
] as const;
export type SubmissionStatus = (typeof SUBMISSION_STATUSES)[number];

export const DATE_CONVENTIONS = ['day_first', 'month_first'] as const;
export type DateConvention = (typeof DATE_CONVENTIONS)[number];

export const SUBMISSION_PHASES = ['queued', 'uploading', 'reading'] as const;
export type SubmissionPhase = (typeof SUBMISSION_PHASES)[number];

/** The severities a row's issue can have (refusals stop the whole file and are not row issues). */
export const ROW_ISSUE_SEVERITIES = ['error', 'warning', 'flag'] as const;

export const ISSUE_SORTS = [
  'row',
  '-row',
  'severity',
  '-severity',
  'code',
  '-code',
  'column',
  '-column',
] as const;
export type IssueSort = (typeof ISSUE_SORTS)[number];

export const COVERAGE_STATES = ['current', 'awaiting_confirmation', 'none'] as const;
export type CoverageState = (typeof COVERAGE_STATES)[number];

// ── inputs ──

export class UploadQueryDto {
  @ApiPropertyOptional({
    enum: DATE_CONVENTIONS,
    enumName: 'DateConvention',
    description:
      'How text dates such as 04/05/2026 are written in the file; without it such dates are refused as ambiguous',
  })
  @IsOptional()
  @IsIn(DATE_CONVENTIONS)
  dateConvention?: DateConvention;
}

export class IssueQueryDto {
  @ApiPropertyOptional({ type: Number, default: 0 })
  @IsOptional()
  @Type(() => Number)
  @IsInt()
  @Min(0)
  offset?: number;

  @ApiPropertyOptional({ type: Number, default: 200, maximum: 2000 })
  @IsOptional()
  @Type(() => Number)
  @IsInt()
  @Min(1)
  limit?: number;

  @ApiPropertyOptional({ enum: ROW_ISSUE_SEVERITIES, enumName: 'RowIssueSeverity' })
  @IsOptional()
  @IsIn(ROW_ISSUE_SEVERITIES)
  severity?: (typeof ROW_ISSUE_SEVERITIES)[number];

  @ApiPropertyOptional({ type: String, example: 'out_of_range' })
  @IsOptional()
  @IsString()
  @MaxLength(48)
  code?: string;

  @ApiPropertyOptional({
    type: String,
    example: 'hba1c_value',
    description: 'The heading as given in the file',
  })
  @IsOptional()
  @IsString()
  @MaxLength(128)
  column?: string;

  @ApiPropertyOptional({ type: Number })
  @IsOptional()
  @Type(() => Number)
  @IsInt()
  @Min(1)
  row?: number;

  @ApiPropertyOptional({ enum: ISSUE_SORTS, enumName: 'IssueSort' })
  @IsOptional()
  @IsIn(ISSUE_SORTS)
  sort?: IssueSort;
}

// ── a submission ──

export class SubmissionFileDto {
  @ApiProperty({ type: String, example: 'q3-extract.xlsx' })
  name!: string;

  @ApiProperty({ type: Number })
  sizeBytes!: number;

  @ApiProperty({ type: String, nullable: true, description: 'SHA-256 of the file, hex' })
  sha256!: string | null;

  @ApiProperty({ type: String, nullable: true, example: 'xlsx', description: 'xlsx or csv' })
  kind!: string | null;

  @ApiProperty({ type: String, nullable: true, description: 'The sheet read (workbooks)' })
  sheetName!: string | null;

  @ApiProperty({ enum: DATE_CONVENTIONS, enumName: 'DateConvention', nullable: true })
  dateConvention!: DateConvention | null;

  @ApiProperty({ type: String, nullable: true, description: 'The delimiter found (CSV)' })
  delimiter!: string | null;

  @ApiProperty({ type: String, nullable: true, description: 'The text encoding found (CSV)' })
  encoding!: string | null;

  @ApiProperty({
    type: Boolean,
    description: 'Whether the file itself is still kept (only while it is checked, or to retry)',
  })
  kept!: boolean;
}

export class SubmissionProgressDto {
  @ApiProperty({ type: Number })
  rowsDone!: number;

  @ApiProperty({ type: Number, nullable: true, description: 'Null until the rows are counted' })
  rowsTotal!: number | null;
}

export class SubmissionCountsDto {
  @ApiProperty({ type: Number }) rowsRead!: number;
  @ApiProperty({ type: Number }) rowsAccepted!: number;
  @ApiProperty({ type: Number }) rowsRejected!: number;
  @ApiProperty({ type: Number }) rowsBlank!: number;
  @ApiProperty({ type: Number }) errors!: number;
  @ApiProperty({ type: Number }) warnings!: number;
  @ApiProperty({ type: Number }) flags!: number;
}

export class IssueCountDto {
  @ApiProperty({ type: String, example: 'out_of_range' })
  code!: string;

  @ApiProperty({ enum: ISSUE_SEVERITIES, enumName: 'IssueSeverity' })
  severity!: IssueSeverity;

  @ApiProperty({ type: String })
  title!: string;

  @ApiProperty({ type: Number })
  count!: number;
}

/** One reason a file was refused, in words, with how to fix it. */
export class SubmissionRefusalProblemDto {
  @ApiProperty({ type: String, example: 'missing_columns', description: 'For support; not shown' })
  code!: string;

  @ApiProperty({ type: String, example: 'Required columns missing' })
  title!: string;

  @ApiProperty({ type: String })
  message!: string;

  @ApiProperty({ type: String })
  fix!: string;

  @ApiProperty({
    type: 'object',
    additionalProperties: true,
    nullable: true,
    description: 'Facts behind the refusal (which columns, which limit); keys depend on the code',
  })
  detail!: Record<string, unknown> | null;
}

export class SubmissionRefusalDto extends SubmissionRefusalProblemDto {
  @ApiProperty({
    type: [SubmissionRefusalProblemDto],
    description:
      'Every reason found, the primary one (code, title…) first: all the problems of the heading row (columns that identify people, units not recognised, repeated and missing columns) are reported together',
  })
  problems!: SubmissionRefusalProblemDto[];
}

export class SubmissionFailureDto {
  @ApiProperty({ type: String })
  message!: string;

  @ApiProperty({ type: Number })
  attempts!: number;

  @ApiProperty({ type: Boolean, description: 'The file is still kept, so it can be checked again' })
  canRetry!: boolean;
}

/** What the signed-in person may do with a submission now (the server decides; see submission-policy.ts). */
export class SubmissionActionsDto {
  @ApiProperty({ type: Boolean, description: 'Make it current (it awaits confirmation)' })
  confirm!: boolean;

  @ApiProperty({
    type: Boolean,
    description: 'Cancel it (processing, awaiting confirmation, failed)',
  })
  cancel!: boolean;

  @ApiProperty({ type: Boolean, description: 'Check it again (failed, file kept)' })
  retry!: boolean;

  @ApiProperty({
    type: Boolean,
    description: 'Send a new extract for the same practice and audit quarter',
  })
  upload!: boolean;
}

export class SubmissionDto {
  @ApiProperty({ type: Number })
  id!: number;

  @ApiProperty({ enum: SUBMISSION_STATUSES, enumName: 'SubmissionStatus' })
  status!: SubmissionStatus;

  @ApiProperty({ type: String, example: 'Awaiting confirmation' })
  statusLabel!: string;

  @ApiProperty({
    enum: SUBMISSION_PHASES,
    enumName: 'SubmissionPhase',
    nullable: true,
    description: 'While processing: waiting for a reader, still arriving, or being read',
  })
  phase!: SubmissionPhase | null;

  @ApiProperty({ type: Boolean, description: 'The current submission of its practice and quarter' })
  isCurrent!: boolean;

  @ApiProperty({ type: PracticeRefDto })
  practice!: PracticeRefDto;

  @ApiProperty({ type: QuarterDto })
  quarter!: QuarterDto;

  @ApiProperty({ type: SubmissionFileDto, description: 'The file itself is not kept once checked' })
  file!: SubmissionFileDto;

  @ApiProperty({
    type: String,
    description: "Who uploaded it: the person's name (or what Cairn did, e.g. demo seeding)",
  })
  uploadedBy!: string;

  @ApiProperty({ type: String, description: 'ISO 8601' })
  uploadedAt!: string;

  @ApiProperty({ type: String, nullable: true }) processingStartedAt!: string | null;
  @ApiProperty({ type: String, nullable: true }) processedAt!: string | null;
  @ApiProperty({ type: String, nullable: true }) confirmedAt!: string | null;
  @ApiProperty({ type: String, nullable: true }) confirmedBy!: string | null;
  @ApiProperty({ type: String, nullable: true }) cancelledAt!: string | null;
  @ApiProperty({ type: String, nullable: true }) cancelledBy!: string | null;
  @ApiProperty({ type: String, nullable: true }) supersededAt!: string | null;
  @ApiProperty({ type: Number, nullable: true }) supersededBySubmissionId!: number | null;
  @ApiProperty({ type: String, nullable: true }) failedAt!: string | null;

  @ApiProperty({ type: SubmissionProgressDto, description: 'A real progress bar while processing' })
  progress!: SubmissionProgressDto;

  @ApiProperty({
    type: SubmissionCountsDto,
    nullable: true,
    description: 'Rows read, accepted, refused, blank; errors, warnings, flags (once checked)',
  })
  counts!: SubmissionCountsDto | null;

  @ApiProperty({ type: [IssueCountDto], description: 'Issues by code, errors first' })
  issuesByCode!: IssueCountDto[];

  @ApiProperty({
    type: SubmissionRefusalDto,
    nullable: true,
    description: 'Why the file was refused',
  })
  refusal!: SubmissionRefusalDto | null;

  @ApiProperty({
    type: SubmissionFailureDto,
    nullable: true,
    description: 'Why processing failed, and whether it can be retried',
  })
  failure!: SubmissionFailureDto | null;

  @ApiProperty({ type: Number, nullable: true, description: 'Where the headings were found' })
  headerRow!: number | null;

  @ApiProperty({ type: [String] })
  columnsFound!: string[];

  @ApiProperty({ type: [String], description: "Columns not in Cairn's format, ignored" })
  columnsIgnored!: string[];

  @ApiProperty({ type: SubmissionActionsDto })
  actions!: SubmissionActionsDto;
}

// ── a practice's history ──

/** What the signed-in person may do for a practice in an audit quarter. */
export class PracticeQuarterActionsDto {
  @ApiProperty({ type: Boolean, description: 'Send an extract for this practice and quarter' })
  upload!: boolean;
}

export class QuarterSubmissionsDto {
  @ApiProperty({ type: QuarterDto })
  quarter!: QuarterDto;

  @ApiProperty({ type: Number, nullable: true })
  currentSubmissionId!: number | null;

  @ApiProperty({ type: [SubmissionDto], description: 'Latest first' })
  submissions!: SubmissionDto[];

  @ApiProperty({ type: PracticeQuarterActionsDto })
  actions!: PracticeQuarterActionsDto;
}

export class SubmissionHistoryDto {
  @ApiProperty({ type: PracticeRefDto })
  practice!: PracticeRefDto;

  @ApiProperty({ type: [QuarterSubmissionsDto], description: 'Every audit quarter, latest first' })
  quarters!: QuarterSubmissionsDto[];
}

// ── where the signed-in person may send extracts ──

export class UploadPracticeDto {
  @ApiProperty({ type: PracticeDto })
  practice!: PracticeDto;

  @ApiProperty({
    type: [Number],
    description:
      'The audit quarters an extract may be sent to for this practice (the upload action)',
  })
  quarterIds!: number[];
}

export class UploadOptionsDto {
  @ApiProperty({
    type: [UploadPracticeDto],
    description: 'The practices the signed-in person may send extracts for, by code',
  })
  practices!: UploadPracticeDto[];

  @ApiProperty({ type: [QuarterDto], description: "The region's audit quarters, latest first" })
  quarters!: QuarterDto[];
}

// ── a validation report's issues ──

export class IssueDto {
  @ApiProperty({ type: Number }) seq!: number;

  @ApiProperty({ enum: ISSUE_SEVERITIES, enumName: 'IssueSeverity' })
  severity!: IssueSeverity;

  @ApiProperty({ type: String }) code!: string;
  @ApiProperty({ type: String }) title!: string;
  @ApiProperty({ type: Number, nullable: true, description: 'Row of the file' }) row!:
    number | null;
  @ApiProperty({ type: String, nullable: true, description: 'Heading as given' }) column!:
    string | null;
  @ApiProperty({ type: String, nullable: true, description: "Cairn's column key" }) columnKey!:
    string | null;
  @ApiProperty({
    type: String,
    nullable: true,
    description: 'The value given (record references pseudonymised outside the practice)',
  })
  value!: string | null;
  @ApiProperty({ type: String }) message!: string;
  @ApiProperty({ type: String }) fix!: string;
}

export class IssueColumnCountDto {
  @ApiProperty({ type: String }) column!: string;
  @ApiProperty({ type: Number }) count!: number;
}

export class IssuePageDto {
  @ApiProperty({ type: Number, description: 'Issues matching the filter' }) total!: number;
  @ApiProperty({ type: Number }) offset!: number;
  @ApiProperty({ type: Number }) limit!: number;

  @ApiProperty({
    type: Boolean,
    description:
      'False when record references are shown as pseudonyms (anyone outside the practice)',
  })
  recordRefsShown!: boolean;

  @ApiProperty({ type: [IssueColumnCountDto], description: 'Issues per column (all of them)' })
  columns!: IssueColumnCountDto[];

  @ApiProperty({ type: [IssueDto] })
  items!: IssueDto[];
}

// ── coverage of a quarter ──

export class CoverageCurrentDto {
  @ApiProperty({ type: Number }) submissionId!: number;
  @ApiProperty({ type: Number, nullable: true }) records!: number | null;
  @ApiProperty({ type: String, nullable: true }) confirmedAt!: string | null;
  @ApiProperty({ type: String, nullable: true }) confirmedBy!: string | null;
}

export class CoverageWaitingDto {
  @ApiProperty({ type: Number }) submissionId!: number;
  @ApiProperty({ enum: SUBMISSION_STATUSES, enumName: 'SubmissionStatus' })
  status!: SubmissionStatus;
  @ApiProperty({ type: String }) uploadedAt!: string;
}

export class CoverageProblemDto {
  @ApiProperty({ type: Number }) submissionId!: number;
  @ApiProperty({ enum: SUBMISSION_STATUSES, enumName: 'SubmissionStatus' })
  status!: SubmissionStatus;
  @ApiProperty({
    type: String,
    nullable: true,
    description: 'The refusal code, if refused (for support)',
  })
  code!: string | null;
  @ApiProperty({
    type: String,
    example: 'Required columns missing',
    description: 'Why, in words',
  })
  reason!: string;
  @ApiProperty({ type: String }) uploadedAt!: string;
}

export class CoveragePracticeDto {
  @ApiProperty({ type: PracticeDto })
  practice!: PracticeDto;

  @ApiProperty({ enum: COVERAGE_STATES, enumName: 'CoverageState' })
  state!: CoverageState;

  @ApiProperty({ type: CoverageCurrentDto, nullable: true })
  current!: CoverageCurrentDto | null;

  @ApiProperty({
    type: [CoverageWaitingDto],
    description: 'Extracts being checked or awaiting confirmation',
  })
  waiting!: CoverageWaitingDto[];

  @ApiProperty({
    type: CoverageProblemDto,
    nullable: true,
    description: 'The latest refused or failed extract still outstanding',
  })
  lastProblem!: CoverageProblemDto | null;
}

/** Practices by state: current + awaitingConfirmation + none = practices (each counted once). */
export class CoverageTotalsDto {
  @ApiProperty({ type: Number }) practices!: number;
  @ApiProperty({ type: Number, description: 'Practices with a current submission' })
  current!: number;
  @ApiProperty({
    type: Number,
    description: 'Of the practices with a current submission, those with another extract waiting',
  })
  currentWithWaiting!: number;
  @ApiProperty({
    type: Number,
    description: 'Practices with no current submission yet but an extract waiting',
  })
  awaitingConfirmation!: number;
  @ApiProperty({ type: Number, description: 'Practices with neither' }) none!: number;
  @ApiProperty({ type: Number, description: 'Records in current submissions' }) records!: number;
}

export class CoverageDto {
  @ApiProperty({ type: QuarterDto }) quarter!: QuarterDto;
  @ApiProperty({ type: CoverageTotalsDto }) totals!: CoverageTotalsDto;
  @ApiProperty({ type: [CoveragePracticeDto] }) practices!: CoveragePracticeDto[];
}

// ── the extract format ──

export class ExtractLimitsDto {
  @ApiProperty({ type: Number }) maxBytes!: number;
  @ApiProperty({ type: Number }) maxRows!: number;
}

export class FormatColumnDto {
  @ApiProperty({ type: String, example: 'hba1c_value' }) key!: string;
  @ApiProperty({ type: String, example: 'care process' }) group!: string;
  @ApiProperty({ type: String }) meaning!: string;
  @ApiProperty({ type: String, description: 'The values allowed, in words' }) allowed!: string;
  @ApiProperty({ type: String, description: 'Whether column and value are needed, in words' })
  required!: string;
  @ApiProperty({ type: Boolean }) columnRequired!: boolean;
  @ApiProperty({ type: Boolean }) valueRequired!: boolean;
  @ApiProperty({ type: [String] }) units!: string[];
  @ApiProperty({ type: [String], nullable: true }) codes!: string[] | null;
  @ApiProperty({ type: String }) example!: string;
}

export class IssueCodeDto {
  @ApiProperty({ type: String }) code!: string;
  @ApiProperty({ enum: ISSUE_SEVERITIES, enumName: 'IssueSeverity' }) severity!: IssueSeverity;
  @ApiProperty({ type: String }) title!: string;
}

export class ExtractFormatDto {
  @ApiProperty({ type: ExtractLimitsDto }) limits!: ExtractLimitsDto;
  @ApiProperty({ type: [FormatColumnDto] }) columns!: FormatColumnDto[];
  @ApiProperty({ type: [IssueCodeDto] }) issueCodes!: IssueCodeDto[];
}

// ── downloads ──

/** An issue in the downloaded validation report. */
export class ReportIssueDto {
  @ApiProperty({ type: Number, nullable: true }) row!: number | null;
  @ApiProperty({ type: String, nullable: true }) column!: string | null;
  @ApiProperty({ type: String, nullable: true }) columnKey!: string | null;
  @ApiProperty({ type: String, nullable: true }) value!: string | null;
  @ApiProperty({ enum: ISSUE_SEVERITIES, enumName: 'IssueSeverity' }) severity!: IssueSeverity;
  @ApiProperty({ type: String }) code!: string;
  @ApiProperty({ type: String }) title!: string;
  @ApiProperty({ type: String }) message!: string;
  @ApiProperty({ type: String }) fix!: string;
}

/** The whole validation report, as downloaded (report.json). */
export class ValidationReportFileDto {
  @ApiProperty({ type: SubmissionDto }) submission!: SubmissionDto;
  @ApiProperty({ type: Boolean }) recordRefsShown!: boolean;
  @ApiProperty({ type: [ReportIssueDto], description: 'Every issue, in the order found' })
  issues!: ReportIssueDto[];
}

/** An upload refused before checking: an identical file (409) or one over the size limit (413). */
export class UploadProblemDto extends ProblemDto {
  @ApiPropertyOptional({ type: String, enum: ['identical_extract', 'file_too_large'] })
  code?: 'identical_extract' | 'file_too_large';

  @ApiPropertyOptional({ type: String, description: 'How to fix it' })
  fix?: string;

  @ApiPropertyOptional({
    type: Number,
    description: 'The earlier identical submission, or the rejected one kept in the history',
  })
  submissionId?: number;

  @ApiPropertyOptional({ enum: SUBMISSION_STATUSES, enumName: 'SubmissionStatus' })
  submissionStatus?: SubmissionStatus;

  @ApiPropertyOptional({ type: Number }) maxBytes?: number;
  @ApiPropertyOptional({ type: String }) sha256?: string;
}
