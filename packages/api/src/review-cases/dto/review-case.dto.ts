/** Review cases as the API sends and takes them. */
import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { TYPE_SPLITS, type TypeSplit } from '@cairn/metrics';
import { Type } from 'class-transformer';
import {
  IsIn,
  IsInt,
  IsNotEmpty,
  IsOptional,
  IsString,
  MaxLength,
  Min,
  ValidateIf,
} from 'class-validator';
import { PracticeDto } from '../../organisations/dto/practice.dto.js';
import { CASE_STATUSES, type CaseStatus, FINDINGS, type Finding } from '../review-case-policy.js';

export const ENTRY_KINDS = ['opened', 'question', 'answer', 'note', 'state'] as const;
export const VISIBILITIES = ['practice', 'internal'] as const;
export const TRANSITIONS = ['ask', 'close', 'reopen'] as const;
export type Transition = (typeof TRANSITIONS)[number];
export const EVIDENCE_ORIGINS = ['draft', 'report'] as const;

/** Longest text of one timeline entry. */
export const ENTRY_MAX_CHARS = 10_000;

export class CaseActionsDto {
  @ApiProperty({ type: Boolean, description: 'Send a question to the practice (auditor)' })
  ask!: boolean;
  @ApiProperty({ type: Boolean, description: 'Answer, with attachments (the practice’s leads)' })
  answer!: boolean;
  @ApiProperty({ type: Boolean, description: 'Add a comment the practice sees' })
  comment!: boolean;
  @ApiProperty({ type: Boolean, description: 'Add an internal note the practice never sees' })
  note!: boolean;
  @ApiProperty({ type: Boolean, description: 'Close with a finding (auditor)' })
  close!: boolean;
  @ApiProperty({ type: Boolean, description: 'Reopen a closed case (auditor)' })
  reopen!: boolean;
}

export class CaseEvidenceDto {
  @ApiProperty({
    enum: EVIDENCE_ORIGINS,
    enumName: 'EvidenceOrigin',
    description: 'draft: the draft benchmark; report: a published report',
  })
  origin!: 'draft' | 'report';
  @ApiProperty({ type: Number, description: 'The stored result or snapshot it was read from' })
  resultId!: number;
  @ApiProperty({ type: String, description: 'What identifies its inputs' }) key!: string;
  @ApiProperty({ type: String }) measureSetId!: string;
  @ApiProperty({ type: String, description: 'When the benchmark was built (ISO 8601)' })
  builtAt!: string;
  @ApiProperty({ type: Number }) n!: number;
  @ApiProperty({ type: Number }) events!: number;
  @ApiProperty({ type: Number, nullable: true }) rate!: number | null;
  @ApiProperty({ type: Number, nullable: true, description: 'Lower end of the 95 % interval' })
  intervalLower!: number | null;
  @ApiProperty({ type: Number, nullable: true }) intervalUpper!: number | null;
  @ApiProperty({ type: Number, nullable: true, description: 'θ₀: the region’s rate' })
  theta0!: number | null;
  @ApiProperty({ type: Number, nullable: true }) innerLower!: number | null;
  @ApiProperty({ type: Number, nullable: true }) innerUpper!: number | null;
  @ApiProperty({ type: Number, nullable: true }) outerLower!: number | null;
  @ApiProperty({ type: Number, nullable: true }) outerUpper!: number | null;
  @ApiProperty({ type: String, nullable: true, description: 'within, notable or outlier' })
  band!: string | null;
  @ApiProperty({ type: String, nullable: true, description: 'better or worse than expected' })
  assessment!: string | null;
  @ApiProperty({ type: Number, nullable: true }) z!: number | null;
  @ApiProperty({ type: Number, nullable: true }) phi!: number | null;
  @ApiProperty({ type: Number, nullable: true }) tau2!: number | null;
  @ApiProperty({ type: Number, nullable: true, description: 'Case mix O/E' })
  observedExpected!: number | null;
  @ApiProperty({ type: String, description: 'Why it was flagged, in words, when the case opened' })
  reason!: string;
}

export class CaseFileDto {
  @ApiProperty({ type: Number }) id!: number;
  @ApiProperty({ type: String }) fileName!: string;
  @ApiProperty({ type: String, description: 'Judged from the content' }) mediaType!: string;
  @ApiProperty({ type: Number }) sizeBytes!: number;
  @ApiProperty({ type: String, description: 'Where to download it' }) path!: string;
}

export class CaseEntryDto {
  @ApiProperty({ type: Number }) id!: number;
  @ApiProperty({ enum: ENTRY_KINDS, enumName: 'CaseEntryKind' })
  kind!: (typeof ENTRY_KINDS)[number];
  @ApiProperty({
    enum: VISIBILITIES,
    enumName: 'CaseEntryVisibility',
    description: 'practice: the practice sees it; internal: only the region’s side',
  })
  visibility!: (typeof VISIBILITIES)[number];
  @ApiProperty({ type: String }) body!: string;
  @ApiProperty({ enum: CASE_STATUSES, enumName: 'CaseStatus', nullable: true })
  fromStatus!: CaseStatus | null;
  @ApiProperty({ enum: CASE_STATUSES, enumName: 'CaseStatus', nullable: true })
  toStatus!: CaseStatus | null;
  @ApiProperty({ enum: FINDINGS, enumName: 'CaseFinding', nullable: true })
  finding!: Finding | null;
  @ApiProperty({ type: String, description: 'Who wrote it' }) authorName!: string;
  @ApiProperty({ type: String, description: 'Their role then' }) authorRole!: string;
  @ApiProperty({ type: String, description: 'When (ISO 8601)' }) at!: string;
  @ApiProperty({ type: [CaseFileDto] }) files!: CaseFileDto[];
}

export class CaseSubjectQuarterDto {
  @ApiProperty({ type: Number }) id!: number;
  @ApiProperty({ type: String, example: '2026 Q3' }) label!: string;
}

export class CaseSubjectMeasureDto {
  @ApiProperty({ type: String }) key!: string;
  @ApiProperty({ type: String }) label!: string;
  @ApiProperty({ type: String, description: 'The guideline behind it' }) source!: string;
}

export class CaseReopenedDto {
  @ApiProperty({ type: String, description: 'When it was last reopened' }) at!: string;
  @ApiProperty({ type: String, description: 'Who reopened it (a name)' }) by!: string;
  @ApiProperty({
    enum: FINDINGS,
    enumName: 'CaseFinding',
    nullable: true,
    description: 'The finding it was closed with before that reopen',
  })
  previousFinding!: Finding | null;
  @ApiProperty({ type: String, nullable: true }) previousFindingLabel!: string | null;
  @ApiProperty({ type: String, nullable: true, description: 'When it was closed before that' })
  previousClosedAt!: string | null;
}

export class ReviewCaseSummaryDto {
  @ApiProperty({ type: Number }) id!: number;
  @ApiProperty({ type: String }) title!: string;
  @ApiProperty({ type: PracticeDto }) practice!: PracticeDto;
  @ApiProperty({ type: CaseSubjectQuarterDto }) quarter!: CaseSubjectQuarterDto;
  @ApiProperty({ type: CaseSubjectMeasureDto }) measure!: CaseSubjectMeasureDto;
  @ApiProperty({ enum: TYPE_SPLITS, enumName: 'TypeSplit' }) split!: TypeSplit;
  @ApiProperty({ enum: CASE_STATUSES, enumName: 'CaseStatus' }) status!: CaseStatus;
  @ApiProperty({ type: String, description: 'The state in words' }) statusLabel!: string;
  @ApiProperty({
    type: Number,
    description: 'Changes with every state change; send it back as expectedVersion',
  })
  version!: number;
  @ApiProperty({ enum: FINDINGS, enumName: 'CaseFinding', nullable: true })
  finding!: Finding | null;
  @ApiProperty({ type: String, nullable: true }) findingLabel!: string | null;
  @ApiProperty({ type: String }) openedBy!: string;
  @ApiProperty({ type: String }) openedAt!: string;
  @ApiProperty({ type: String }) updatedAt!: string;
  @ApiProperty({ type: String, nullable: true }) closedAt!: string | null;
  @ApiProperty({
    type: CaseReopenedDto,
    nullable: true,
    description: 'Set once the case has been reopened: the close it undid',
  })
  reopened!: CaseReopenedDto | null;
}

export class ReviewCaseDto extends ReviewCaseSummaryDto {
  @ApiProperty({ type: CaseEvidenceDto, description: 'The figures that prompted it, frozen' })
  evidence!: CaseEvidenceDto;
  @ApiProperty({ type: CaseActionsDto }) actions!: CaseActionsDto;
  @ApiProperty({ type: [CaseEntryDto], description: 'Every step, oldest first' })
  timeline!: CaseEntryDto[];
  @ApiProperty({ type: String, description: 'The clinical caution' }) caution!: string;
}

export class FindingOptionDto {
  @ApiProperty({ enum: FINDINGS, enumName: 'CaseFinding' }) key!: Finding;
  @ApiProperty({ type: String }) label!: string;
}

export class ReviewCaseListDto {
  @ApiProperty({ type: [ReviewCaseSummaryDto] }) cases!: ReviewCaseSummaryDto[];
  @ApiProperty({ type: [FindingOptionDto], description: 'The findings a case may be closed with' })
  findings!: FindingOptionDto[];
  @ApiProperty({ type: Boolean, description: 'Whether the reader may open cases' })
  mayOpen!: boolean;
}

export class ListCasesQueryDto {
  @ApiPropertyOptional({ enum: CASE_STATUSES, enumName: 'CaseStatus' })
  @IsOptional()
  @IsIn(CASE_STATUSES)
  status?: CaseStatus;

  @ApiPropertyOptional({ type: Number })
  @IsOptional()
  @Type(() => Number)
  @IsInt()
  @Min(1)
  quarterId?: number;

  @ApiPropertyOptional({ type: Number })
  @IsOptional()
  @Type(() => Number)
  @IsInt()
  @Min(1)
  practiceId?: number;
}

export class OpenCaseDto {
  @ApiProperty({ type: Number }) @IsInt() @Min(1) quarterId!: number;
  @ApiProperty({ type: Number }) @IsInt() @Min(1) practiceId!: number;
  @ApiProperty({ type: String }) @IsString() @IsNotEmpty() @MaxLength(64) measureKey!: string;
  @ApiPropertyOptional({ enum: TYPE_SPLITS, enumName: 'TypeSplit', default: 'all' })
  @IsOptional()
  @IsIn(TYPE_SPLITS)
  split?: TypeSplit;
  @ApiPropertyOptional({ type: Boolean, description: 'Judge the case-mix adjusted rate' })
  @IsOptional()
  caseMix?: boolean;
  @ApiPropertyOptional({ type: String, description: 'Why it is opened: an internal note' })
  @IsOptional()
  @IsString()
  @MaxLength(ENTRY_MAX_CHARS)
  note?: string;
}

export class TransitionDto {
  @ApiProperty({ enum: TRANSITIONS, enumName: 'CaseTransition' })
  @IsIn(TRANSITIONS)
  action!: Transition;

  @ApiProperty({ type: Number, description: 'The version the change was made from' })
  @IsInt()
  @Min(1)
  expectedVersion!: number;

  @ApiProperty({
    type: String,
    description: 'ask: the question (required); close and reopen: a remark the practice sees',
  })
  @IsString()
  @MaxLength(ENTRY_MAX_CHARS)
  message!: string;

  @ApiPropertyOptional({ enum: FINDINGS, enumName: 'CaseFinding', description: 'close: required' })
  @ValidateIf((o: TransitionDto) => o.action === 'close' || o.finding !== undefined)
  @IsIn(FINDINGS)
  finding?: Finding;
}

export class CommentDto {
  @ApiProperty({ type: String })
  @IsString()
  @MaxLength(ENTRY_MAX_CHARS)
  body!: string;

  @ApiProperty({
    enum: VISIBILITIES,
    enumName: 'CaseEntryVisibility',
    description: 'internal notes: auditors only',
  })
  @IsIn(VISIBILITIES)
  visibility!: (typeof VISIBILITIES)[number];
}

export class AnswerFormDto {
  @ApiProperty({ type: String, description: 'The answer' }) text!: string;
  @ApiProperty({ type: Number }) expectedVersion!: number;
  @ApiPropertyOptional({
    type: 'array',
    items: { type: 'string', format: 'binary' },
    description: 'Up to 5 files (PDF, XLSX, CSV, PNG, JPEG), 10 MB each, in parts named "files"',
  })
  files?: unknown[];
}
