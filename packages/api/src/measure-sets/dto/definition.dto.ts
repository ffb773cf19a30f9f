/**
 * A measure set's definition, field by field, as stored and as a draft is
 * edited: the shape @cairn/metrics' parseMeasureSet validates (docs/methods.md
 * §2–3). These classes describe it for the OpenAPI document and the web;
 * the validation itself is the schema's (zod), whose errors name the path in
 * this shape (e.g. `targets[3].threshold`).
 */
import { ApiExtraModels, ApiProperty, ApiPropertyOptional, getSchemaPath } from '@nestjs/swagger';
import { CARE_PROCESS_FIELDS } from '@cairn/metrics';

export const DIABETES_TYPES = ['type1', 'type2', 'other'] as const;
export const DENOMINATOR_KINDS = ['eligible', 'measured'] as const;
export const MEASURE_DIRECTIONS = ['higher', 'lower'] as const;
export const COMPARATORS = ['lt', 'le', 'gt', 'ge'] as const;
export const MEASUREMENTS = [
  'hba1c',
  'systolic',
  'diastolic',
  'cholesterol',
  'serumCreatinine',
  'urineAlbumin',
  'bmi',
] as const;
export const FLAGS = ['onStatin', 'onInsulin', 'cvdHistory'] as const;
export const WINDOWS = ['review', 'retinal'] as const;

export class PopulationDefinitionDto {
  @ApiProperty({ enum: DIABETES_TYPES, enumName: 'DiabetesType', isArray: true })
  types!: (typeof DIABETES_TYPES)[number][];

  @ApiProperty({ type: Number, nullable: true, description: 'Youngest age included; null: none' })
  minAge!: number | null;

  @ApiProperty({ type: Number, nullable: true, description: 'Oldest age included; null: none' })
  maxAge!: number | null;
}

/** What every care process and treatment target has. */
export class MeasureDefinitionBaseDto {
  @ApiProperty({ type: String, example: 'hba1c_le_53' })
  key!: string;

  @ApiProperty({ type: String })
  label!: string;

  @ApiProperty({ type: String, description: 'The guideline or rule the measure comes from' })
  source!: string;

  @ApiProperty({ enum: DENOMINATOR_KINDS, enumName: 'DenominatorKind' })
  denominator!: (typeof DENOMINATOR_KINDS)[number];

  @ApiProperty({ enum: MEASURE_DIRECTIONS, enumName: 'MeasureDirection' })
  direction!: (typeof MEASURE_DIRECTIONS)[number];

  @ApiProperty({ type: PopulationDefinitionDto })
  population!: PopulationDefinitionDto;

  @ApiPropertyOptional({ type: String })
  note?: string;
}

export class RecordedProcessDefinitionDto extends MeasureDefinitionBaseDto {
  @ApiProperty({ enum: ['recorded'] })
  rule!: 'recorded';

  @ApiProperty({
    enum: CARE_PROCESS_FIELDS as unknown as string[],
    enumName: 'CareProcessField',
    description: 'The record field whose month must lie in the window',
  })
  field!: (typeof CARE_PROCESS_FIELDS)[number];

  @ApiProperty({ enum: WINDOWS, enumName: 'MeasureWindow' })
  window!: (typeof WINDOWS)[number];
}

export class CompositeProcessDefinitionDto extends MeasureDefinitionBaseDto {
  @ApiProperty({ enum: ['allOf'] })
  rule!: 'allOf';

  @ApiProperty({
    type: String,
    isArray: true,
    description: 'Keys of the recorded care processes that must all be complete',
  })
  of!: string[];
}

export class BloodPressureBandDto {
  @ApiProperty({ type: Number, description: 'The band applies from this age' })
  minAge!: number;

  @ApiProperty({ type: Number, example: 140 })
  systolicBelow!: number;

  @ApiProperty({ type: Number, example: 90 })
  diastolicBelow!: number;
}

export class ValueConditionDto {
  @ApiProperty({ enum: ['value'] })
  rule!: 'value';

  @ApiProperty({ enum: MEASUREMENTS, enumName: 'Measurement' })
  measurement!: (typeof MEASUREMENTS)[number];

  @ApiProperty({ enum: COMPARATORS, enumName: 'Comparator' })
  comparator!: (typeof COMPARATORS)[number];

  @ApiProperty({ type: Number, description: 'In the measurement’s canonical unit' })
  threshold!: number;
}

export class BloodPressureConditionDto {
  @ApiProperty({ enum: ['bloodPressure'] })
  rule!: 'bloodPressure';

  @ApiProperty({ type: [BloodPressureBandDto] })
  bands!: BloodPressureBandDto[];
}

export class FlagConditionDto {
  @ApiProperty({ enum: ['flag'] })
  rule!: 'flag';

  @ApiProperty({ enum: FLAGS, enumName: 'FlagField' })
  flag!: (typeof FLAGS)[number];

  @ApiProperty({ type: Boolean, description: 'The recorded value that meets the target' })
  equals!: boolean;
}

export class TargetRefConditionDto {
  @ApiProperty({ enum: ['target'] })
  rule!: 'target';

  @ApiProperty({ type: String, description: 'Key of a target defined before this one' })
  key!: string;
}

const conditionRefs = [
  ValueConditionDto,
  BloodPressureConditionDto,
  FlagConditionDto,
  TargetRefConditionDto,
].map((c) => ({ $ref: getSchemaPath(c) }));

export type ConditionDefinitionDto =
  ValueConditionDto | BloodPressureConditionDto | FlagConditionDto | TargetRefConditionDto;

export class ValueTargetDefinitionDto extends MeasureDefinitionBaseDto {
  @ApiProperty({ enum: ['value'] })
  rule!: 'value';

  @ApiProperty({ enum: MEASUREMENTS, enumName: 'Measurement' })
  measurement!: (typeof MEASUREMENTS)[number];

  @ApiProperty({ enum: COMPARATORS, enumName: 'Comparator' })
  comparator!: (typeof COMPARATORS)[number];

  @ApiProperty({ type: Number })
  threshold!: number;
}

export class BloodPressureTargetDefinitionDto extends MeasureDefinitionBaseDto {
  @ApiProperty({ enum: ['bloodPressure'] })
  rule!: 'bloodPressure';

  @ApiProperty({ type: [BloodPressureBandDto] })
  bands!: BloodPressureBandDto[];
}

export class FlagTargetDefinitionDto extends MeasureDefinitionBaseDto {
  @ApiProperty({ enum: ['flag'] })
  rule!: 'flag';

  @ApiProperty({ enum: FLAGS, enumName: 'FlagField' })
  flag!: (typeof FLAGS)[number];

  @ApiProperty({ type: Boolean })
  equals!: boolean;
}

@ApiExtraModels(
  ValueConditionDto,
  BloodPressureConditionDto,
  FlagConditionDto,
  TargetRefConditionDto,
)
export class CompositeTargetDefinitionDto extends MeasureDefinitionBaseDto {
  @ApiProperty({ enum: ['anyOf', 'allOf'], enumName: 'CompositeRule' })
  rule!: 'anyOf' | 'allOf';

  @ApiProperty({ type: 'array', items: { oneOf: conditionRefs } })
  of!: ConditionDefinitionDto[];
}

export class EligibilityDefinitionDto {
  @ApiProperty({ type: Number, example: 12 })
  minAge!: number;
}

export class BreakdownBandsDto {
  @ApiProperty({ type: [Number], example: [12, 40, 65, 80] })
  ageBands!: number[];

  @ApiProperty({ type: [Number], example: [0, 2, 7, 15] })
  durationBands!: number[];
}

export type CareProcessDefinitionDto = RecordedProcessDefinitionDto | CompositeProcessDefinitionDto;
export type TargetDefinitionDto =
  | ValueTargetDefinitionDto
  | BloodPressureTargetDefinitionDto
  | FlagTargetDefinitionDto
  | CompositeTargetDefinitionDto;

@ApiExtraModels(
  RecordedProcessDefinitionDto,
  CompositeProcessDefinitionDto,
  ValueTargetDefinitionDto,
  BloodPressureTargetDefinitionDto,
  FlagTargetDefinitionDto,
  CompositeTargetDefinitionDto,
)
export class MeasureSetDefinitionDto {
  @ApiProperty({ type: String, example: 'cairn-default-2026.1' })
  id!: string;

  @ApiProperty({ type: String })
  label!: string;

  @ApiPropertyOptional({ type: String })
  description?: string;

  @ApiProperty({ type: EligibilityDefinitionDto })
  eligibility!: EligibilityDefinitionDto;

  @ApiProperty({ type: Number, example: 12 })
  retinalWindowMonths!: number;

  @ApiProperty({ type: BreakdownBandsDto })
  breakdowns!: BreakdownBandsDto;

  @ApiProperty({
    type: 'array',
    items: {
      oneOf: [RecordedProcessDefinitionDto, CompositeProcessDefinitionDto].map((c) => ({
        $ref: getSchemaPath(c),
      })),
    },
  })
  careProcesses!: CareProcessDefinitionDto[];

  @ApiProperty({
    type: 'array',
    items: {
      oneOf: [
        ValueTargetDefinitionDto,
        BloodPressureTargetDefinitionDto,
        FlagTargetDefinitionDto,
        CompositeTargetDefinitionDto,
      ].map((c) => ({ $ref: getSchemaPath(c) })),
    },
  })
  targets!: TargetDefinitionDto[];
}
