/** The recall list API: its query (validated) and everything it sends (the OpenAPI document). */
import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { TYPE_SPLITS, type TypeSplit } from '@cairn/metrics';
import { Type } from 'class-transformer';
import { IsIn, IsInt, IsOptional, IsString, Max, MaxLength, Min } from 'class-validator';
import { READING_FIELDS, type ReadingField } from '../../measure-sets/describe.js';
import { MeasureDto } from '../../measure-sets/dto/measure-set.dto.js';
import { PracticeRefDto } from '../../organisations/dto/practice.dto.js';
import { QuarterDto } from '../../quarters/dto/quarter.dto.js';
import { RECALL_REASONS, type RecallReason } from '../recall/recall-rule.js';

export const RECALL_PAGE_MAX = 1000;
export const RECALL_PAGE_DEFAULT = 100;
export const RECORD_REFERENCE_KINDS = ['record_ref', 'pseudonym'] as const;

export class RecallExportQueryDto {
  @ApiProperty({ example: 'hba1c', description: 'Key of a measure of the quarter’s measure set' })
  @IsString()
  @MaxLength(64)
  measure!: string;

  @ApiPropertyOptional({ enum: TYPE_SPLITS, enumName: 'TypeSplit', default: 'all' })
  @IsOptional()
  @IsIn(TYPE_SPLITS)
  split?: TypeSplit;
}

export class RecallListQueryDto extends RecallExportQueryDto {
  @ApiPropertyOptional({ default: 0 })
  @IsOptional()
  @Type(() => Number)
  @IsInt()
  @Min(0)
  offset?: number;

  @ApiPropertyOptional({ default: RECALL_PAGE_DEFAULT, maximum: RECALL_PAGE_MAX })
  @IsOptional()
  @Type(() => Number)
  @IsInt()
  @Min(1)
  @Max(RECALL_PAGE_MAX)
  limit?: number;
}

export class RecallSubmissionDto {
  @ApiProperty({ type: Number, description: 'The current submission the list is read from' })
  id!: number;

  @ApiProperty({ type: Number, description: 'Records it holds' })
  records!: number;

  @ApiProperty({ type: String, description: 'ISO 8601' })
  confirmedAt!: string;
}

export class RecallCountsDto {
  @ApiProperty({ type: Number, description: 'Eligible records of the split' })
  eligible!: number;

  @ApiProperty({ type: Number, description: 'Records in the measure’s denominator (n)' })
  denominator!: number;

  @ApiProperty({
    type: Number,
    description:
      'Records on the list: those that count against the practice on this measure (higher is better: n − met; lower is better: the records counted)',
  })
  listed!: number;
}

export class RecallReadingDto {
  @ApiProperty({ enum: READING_FIELDS, enumName: 'ReadingField' })
  field!: ReadingField;

  @ApiProperty({ type: String, example: 'HbA1c' })
  label!: string;

  @ApiProperty({
    type: String,
    nullable: true,
    example: '2026-03',
    description: 'Month last recorded; null when never recorded, or for a yes/no fact',
  })
  month!: string | null;

  @ApiProperty({
    type: Boolean,
    description: 'Recorded in the measure’s window (a yes/no fact: recorded at all)',
  })
  counts!: boolean;

  @ApiProperty({ type: String, nullable: true, example: '62 mmol/mol' })
  value!: string | null;

  @ApiProperty({
    type: Number,
    isArray: true,
    description: 'The value’s numbers in canonical units (blood pressure: systolic, diastolic)',
  })
  numbers!: number[];

  @ApiProperty({ type: String, example: '62 mmol/mol in 2026-03' })
  text!: string;
}

export class RecallMissingPartDto {
  @ApiProperty({ type: String, example: 'bp_target' })
  key!: string;

  @ApiProperty({ type: String })
  label!: string;
}

export class RecallItemDto {
  @ApiProperty({ type: Number, description: 'Row of the extract the record came from' })
  row!: number;

  @ApiProperty({
    type: String,
    description:
      'The practice’s own record reference (its leads) or the record’s pseudonym (everyone else); see recordReferences',
  })
  reference!: string;

  @ApiProperty({ type: Number, example: 1961 })
  birthYear!: number;

  @ApiProperty({ type: Number, description: 'Age at the end of the review window' })
  age!: number;

  @ApiProperty({ type: String, example: '40–64' })
  ageBand!: string;

  @ApiProperty({ enum: ['F', 'M', 'X', 'U'], enumName: 'Sex' })
  sex!: 'F' | 'M' | 'X' | 'U';

  @ApiProperty({ enum: ['type1', 'type2', 'other'], enumName: 'DiabetesType' })
  diabetesType!: 'type1' | 'type2' | 'other';

  @ApiProperty({ enum: RECALL_REASONS, enumName: 'RecallReason' })
  reason!: RecallReason;

  @ApiProperty({ type: String, example: 'Latest result does not meet the target' })
  reasonText!: string;

  @ApiProperty({
    type: String,
    nullable: true,
    description: 'Month the measure’s field was last recorded (measures of one field)',
  })
  lastRecorded!: string | null;

  @ApiProperty({
    type: String,
    nullable: true,
    description: 'The value that fails the target, “not measured”, or the recorded value',
  })
  value!: string | null;

  @ApiProperty({ type: [RecallMissingPartDto], description: 'Parts of a composite not met' })
  missing!: RecallMissingPartDto[];

  @ApiProperty({ type: [RecallReadingDto] })
  readings!: RecallReadingDto[];

  @ApiProperty({ type: String, description: 'The line explained in one sentence' })
  detail!: string;
}

export class RecallListDto {
  @ApiProperty({ type: PracticeRefDto })
  practice!: PracticeRefDto;

  @ApiProperty({ type: QuarterDto })
  quarter!: QuarterDto;

  @ApiProperty({ type: String, example: 'cairn-default-2026.1' })
  measureSetId!: string;

  @ApiProperty({ type: MeasureDto })
  measure!: MeasureDto;

  @ApiProperty({ enum: TYPE_SPLITS, enumName: 'TypeSplit' })
  split!: TypeSplit;

  @ApiProperty({ type: RecallSubmissionDto })
  submission!: RecallSubmissionDto;

  @ApiProperty({
    enum: RECORD_REFERENCE_KINDS,
    enumName: 'RecordReferenceKind',
    description: 'Which reference `reference` holds: the practice’s own, or the pseudonym',
  })
  recordReferences!: (typeof RECORD_REFERENCE_KINDS)[number];

  @ApiProperty({ type: RecallCountsDto })
  counts!: RecallCountsDto;

  @ApiProperty({ type: Number, description: 'Lines on the whole list (counts.listed)' })
  total!: number;

  @ApiProperty({ type: Number })
  offset!: number;

  @ApiProperty({ type: Number })
  limit!: number;

  @ApiProperty({ type: [RecallItemDto], description: 'This page, in extract row order' })
  items!: RecallItemDto[];
}
