/** What the API sends about measure sets: every field, for the OpenAPI document and the web. */
import { ApiProperty } from '@nestjs/swagger';
import { MEASURE_KINDS, READING_FIELDS } from '../describe.js';

export const DIABETES_TYPES = ['type1', 'type2', 'other'] as const;
export const DENOMINATOR_KINDS = ['eligible', 'measured'] as const;
export const MEASURE_DIRECTIONS = ['higher', 'lower'] as const;
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

export class MeasureSetSummaryDto {
  @ApiProperty({ type: String, example: 'cairn-default-2026.1' })
  id!: string;

  @ApiProperty({ type: String, example: 'Cairn default measure set 2026.1' })
  label!: string;

  @ApiProperty({ type: String, nullable: true })
  description!: string | null;

  @ApiProperty({ type: Number, example: 10 })
  careProcesses!: number;

  @ApiProperty({ type: Number, example: 10 })
  treatmentTargets!: number;

  @ApiProperty({ type: Boolean, description: 'The version a new audit quarter gets by default' })
  isDefault!: boolean;
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
}
