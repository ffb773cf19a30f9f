/** What the API sends about measure sets: every field, for the OpenAPI document and the web. */
import { ApiProperty } from '@nestjs/swagger';
import { IsInt, IsNotEmpty, IsObject, IsString, Matches, MaxLength, Min } from 'class-validator';
import { MEASURE_KINDS, READING_FIELDS } from '../describe.js';
import {
  DENOMINATOR_KINDS,
  DIABETES_TYPES,
  MEASURE_DIRECTIONS,
  MeasureSetDefinitionDto,
} from './definition.dto.js';

export { DENOMINATOR_KINDS, DIABETES_TYPES, MEASURE_DIRECTIONS };
export const MEASURE_SET_STATUSES = ['draft', 'published'] as const;
export type MeasureSetStatus = (typeof MEASURE_SET_STATUSES)[number];
export const MEASURE_SET_USE_KINDS = ['quarter', 'report'] as const;
export const MEASURE_CHANGE_KINDS = ['added', 'removed', 'changed'] as const;
export const BREAKDOWN_KEYS = ['age_band', 'sex', 'deprivation', 'duration'] as const;

export class MeasurePopulationDto {
  @ApiProperty({ enum: DIABETES_TYPES, enumName: 'DiabetesType', isArray: true })
  types!: (typeof DIABETES_TYPES)[number][];

  @ApiProperty({
    type: Number,
    nullable: true,
    description: 'Youngest age included, at the end of the review window; null for no bound',
  })
  minAge!: number | null;

  @ApiProperty({
    type: Number,
    nullable: true,
    description: 'Oldest age included; null for no bound',
  })
  maxAge!: number | null;

  @ApiProperty({ type: String, example: 'Eligible people with any type of diabetes, aged 40–75' })
  text!: string;
}

export class MeasureDto {
  @ApiProperty({ type: String, example: 'hba1c_le_53' })
  key!: string;

  @ApiProperty({ type: String, example: 'HbA1c 53 mmol/mol (7.0 %) or below' })
  label!: string;

  @ApiProperty({ enum: MEASURE_KINDS, enumName: 'MeasureKind' })
  kind!: (typeof MEASURE_KINDS)[number];

  @ApiProperty({ type: Boolean, description: 'True when the measure combines others' })
  composite!: boolean;

  @ApiProperty({
    type: String,
    description: 'What meets the measure, in words',
    example: 'Latest HbA1c in the review window 53 mmol/mol or below',
  })
  definition!: string;

  @ApiProperty({
    enum: DENOMINATOR_KINDS,
    enumName: 'DenominatorKind',
    description:
      'eligible: everyone in the population counts (no result counts against); measured: only those with a result',
  })
  denominator!: (typeof DENOMINATOR_KINDS)[number];

  @ApiProperty({ type: String, description: 'The denominator in words' })
  denominatorText!: string;

  @ApiProperty({
    enum: MEASURE_DIRECTIONS,
    enumName: 'MeasureDirection',
    description: 'Whether a higher or a lower rate is better',
  })
  direction!: (typeof MEASURE_DIRECTIONS)[number];

  @ApiProperty({ type: MeasurePopulationDto })
  population!: MeasurePopulationDto;

  @ApiProperty({ type: String, description: 'The guideline or rule the measure comes from' })
  source!: string;

  @ApiProperty({ type: String, nullable: true })
  note!: string | null;

  @ApiProperty({
    enum: READING_FIELDS,
    enumName: 'ReadingField',
    isArray: true,
    description: 'The record fields the measure reads',
  })
  reads!: (typeof READING_FIELDS)[number][];

  @ApiProperty({
    type: String,
    isArray: true,
    description: 'Keys of the measures a composite combines (empty otherwise)',
  })
  components!: string[];
}

/** Where a version is used: an audit quarter (later, a published report). */
export class MeasureSetUseDto {
  @ApiProperty({ enum: MEASURE_SET_USE_KINDS, enumName: 'MeasureSetUseKind' })
  kind!: (typeof MEASURE_SET_USE_KINDS)[number];

  @ApiProperty({ type: Number })
  id!: number;

  @ApiProperty({ type: String, example: '2026 Q3' })
  label!: string;

  @ApiProperty({ type: String, example: 'open', description: 'The quarter’s or report’s status' })
  status!: string;
}

/** What the caller may do with a version (decided by measure-set-policy.ts). */
export class MeasureSetActionsDto {
  @ApiProperty({ type: Boolean, description: 'Start a draft from this published version' })
  clone!: boolean;

  @ApiProperty({ type: Boolean, description: 'Change this draft' })
  edit!: boolean;

  @ApiProperty({ type: Boolean, description: 'Publish this draft as a new version' })
  publish!: boolean;

  @ApiProperty({ type: Boolean, description: 'Discard this draft' })
  discard!: boolean;
}

export class MeasureSetSummaryDto {
  @ApiProperty({ type: String, example: 'cairn-default-2026.1' })
  id!: string;

  @ApiProperty({ type: String, example: 'Cairn default measure set 2026.1' })
  label!: string;

  @ApiProperty({ type: String, nullable: true })
  description!: string | null;

  @ApiProperty({
    enum: MEASURE_SET_STATUSES,
    enumName: 'MeasureSetStatus',
    description: 'draft: being edited, used by nothing; published: fixed for good',
  })
  status!: MeasureSetStatus;

  @ApiProperty({
    type: String,
    nullable: true,
    description: 'The version this one was started from',
  })
  basedOn!: string | null;

  @ApiProperty({
    type: Boolean,
    description: 'Shipped with Cairn (config/measure-sets/) and read by every region',
  })
  shippedWithCairn!: boolean;

  @ApiProperty({ type: String, description: 'SHA-256 (hex) of the definition as stored' })
  contentHash!: string;

  @ApiProperty({ type: Number, example: 10 })
  careProcesses!: number;

  @ApiProperty({ type: Number, example: 10 })
  treatmentTargets!: number;

  @ApiProperty({ type: Boolean, description: 'The version a new audit quarter gets by default' })
  isDefault!: boolean;

  @ApiProperty({ type: String, description: 'ISO 8601' })
  createdAt!: string;

  @ApiProperty({ type: String, description: 'Who started it (Cairn itself for a shipped version)' })
  createdBy!: string;

  @ApiProperty({ type: String, nullable: true, description: 'ISO 8601' })
  publishedAt!: string | null;

  @ApiProperty({ type: String, nullable: true })
  publishedBy!: string | null;

  @ApiProperty({ type: [MeasureSetUseDto], description: 'The quarters (and reports) that use it' })
  usedBy!: MeasureSetUseDto[];

  @ApiProperty({ type: MeasureSetActionsDto })
  actions!: MeasureSetActionsDto;
}

export class BreakdownCategoryDto {
  @ApiProperty({ type: String, example: '40-64' })
  key!: string;

  @ApiProperty({ type: String, example: '40–64' })
  label!: string;
}

export class BreakdownDto {
  @ApiProperty({ enum: BREAKDOWN_KEYS, enumName: 'BreakdownKey' })
  key!: (typeof BREAKDOWN_KEYS)[number];

  @ApiProperty({ type: String, example: 'Age band' })
  label!: string;

  @ApiProperty({ type: [BreakdownCategoryDto] })
  categories!: BreakdownCategoryDto[];
}

export class MeasureSetDto extends MeasureSetSummaryDto {
  @ApiProperty({
    type: Number,
    example: 12,
    description: 'Youngest age counted at all, at the end of the review window',
  })
  eligibilityMinAge!: number;

  @ApiProperty({
    type: Number,
    example: 12,
    description: 'Months a retinal screening counts for',
  })
  retinalWindowMonths!: number;

  @ApiProperty({ type: [BreakdownDto] })
  breakdowns!: BreakdownDto[];

  @ApiProperty({ type: [MeasureDto], description: 'Care processes first, then treatment targets' })
  measures!: MeasureDto[];

  @ApiProperty({ type: Number, description: 'Saves of a draft so far; send it back when saving' })
  revision!: number;

  @ApiProperty({ type: MeasureSetDefinitionDto, description: 'The definition, as stored' })
  definition!: MeasureSetDefinitionDto;

  @ApiProperty({
    type: String,
    nullable: true,
    description:
      'An unused id for a draft started from this version (when the caller may start one)',
  })
  suggestedDraftId!: string | null;

  @ApiProperty({ type: String, nullable: true, description: 'A label for that draft' })
  suggestedDraftLabel!: string | null;
}

/** Starts a draft from a published version. */
export class CloneMeasureSetDto {
  @ApiProperty({ type: String, example: 'cairn-default-2026.2' })
  @IsString()
  @MaxLength(64)
  @Matches(/^[a-z][a-z0-9-]*-\d{4}\.\d+$/, {
    message: "$property must be a versioned id such as 'cairn-default-2026.2'",
  })
  id!: string;

  @ApiProperty({ type: String, example: 'Cairn default measure set 2026.2' })
  @IsString()
  @IsNotEmpty({ message: '$property must not be empty' })
  @MaxLength(200)
  label!: string;
}

/** Saves a draft: the whole definition, and the revision it was read at. */
export class SaveMeasureSetDraftDto {
  @ApiProperty({ type: Number, description: 'The revision the change was made to' })
  @IsInt()
  @Min(1)
  revision!: number;

  @ApiProperty({ type: MeasureSetDefinitionDto })
  @IsObject()
  definition!: MeasureSetDefinitionDto;
}

export class PublishMeasureSetDto {
  @ApiProperty({ type: Number, description: 'The revision being published, as last read' })
  @IsInt()
  @Min(1)
  revision!: number;
}

/** One difference between a version and the one it was started from. */
export class MeasureSetChangeDto {
  @ApiProperty({ enum: MEASURE_CHANGE_KINDS, enumName: 'MeasureChangeKind' })
  kind!: (typeof MEASURE_CHANGE_KINDS)[number];

  @ApiProperty({
    type: String,
    nullable: true,
    description: 'The measure; null for the set itself',
  })
  measureKey!: string | null;

  @ApiProperty({ type: String, nullable: true })
  measureLabel!: string | null;

  @ApiProperty({
    type: String,
    nullable: true,
    example: 'threshold',
    description: 'Path within the measure (or the set); null when the measure was added or removed',
  })
  field!: string | null;

  @ApiProperty({ type: String, example: 'Threshold' })
  fieldLabel!: string;

  @ApiProperty({ type: String, nullable: true, example: '53' })
  before!: string | null;

  @ApiProperty({ type: String, nullable: true, example: '50' })
  after!: string | null;
}

export class MeasureSetChangesDto {
  @ApiProperty({ type: String })
  id!: string;

  @ApiProperty({ type: String, nullable: true, description: 'The version compared with' })
  basedOn!: string | null;

  @ApiProperty({ type: String, nullable: true })
  basedOnLabel!: string | null;

  @ApiProperty({ type: [MeasureSetChangeDto], description: 'Empty when nothing differs' })
  changes!: MeasureSetChangeDto[];
}

export class DiscardedMeasureSetDto {
  @ApiProperty({ type: String, description: 'The draft discarded' })
  id!: string;

  @ApiProperty({ type: String, nullable: true, description: 'The version it was started from' })
  basedOn!: string | null;
}
