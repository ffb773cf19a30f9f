/**
 * The normalised care record: one person with diabetes in one practice's accepted submission
 * for one audit quarter, as the extracts pipeline stores it and the metrics engine reads it.
 *
 * Conventions (shared with the extracts pipeline; change only together with it):
 * - Dates are held at month precision, as a `Month` string 'YYYY-MM' (data minimisation).
 * - Each care process holds the latest result of the review window (or of the retinal window
 *   for retinal screening), or `null` when none was recorded. A process with a month outside
 *   the window is kept as recorded; the engine decides what counts.
 * - Values are in canonical units: HbA1c mmol/mol (IFCC), total cholesterol mmol/L, serum
 *   creatinine µmol/L, urine albumin:creatinine ratio mg/mmol, BMI kg/m², blood pressure mmHg.
 *   Conversion from other units happens on ingest (see src/units).
 * - `null` in a flag (`onStatin`, `onInsulin`, `cvdHistory`) means "not recorded", which is
 *   different from `false`.
 * - `recordKey` is the practice's own record reference as accepted on upload; it is shown only
 *   to that practice (other users see its keyed pseudonym, see src/disclosure/pseudonym.ts).
 */

/** Diabetes type. `null` on a record means not recorded: such records are not eligible. */
export type DiabetesType = 'type1' | 'type2' | 'other';

/** Sex as recorded: female, male, another or indeterminate, not recorded. */
export type Sex = 'F' | 'M' | 'X' | 'U';

/** A calendar month, 'YYYY-MM' (e.g. '2026-09'). */
export type Month = string;

/** Deprivation quintile of the area of residence: 1 most deprived … 5 least deprived. */
export type DeprivationQuintile = 1 | 2 | 3 | 4 | 5;

/** Smoking status as recorded. */
export type SmokingStatus = 'current' | 'ex' | 'never';

export interface CareRecord {
  /** The practice's code in Cairn. */
  practiceCode: string;
  /** The practice's own record reference (unique within the practice and quarter). */
  recordKey: string;
  birthYear: number;
  sex: Sex;
  diabetesType: DiabetesType | null;
  diagnosisYear: number | null;
  deprivationQuintile: DeprivationQuintile | null;
  hba1c: { month: Month; mmolMol: number } | null;
  bloodPressure: { month: Month; systolic: number; diastolic: number } | null;
  cholesterol: { month: Month; totalMmolL: number } | null;
  serumCreatinine: { month: Month; umolL: number } | null;
  urineAlbumin: { month: Month; acrMgMmol: number } | null;
  footSurveillance: { month: Month } | null;
  bmi: { month: Month; kgM2: number } | null;
  smoking: { month: Month; status: SmokingStatus } | null;
  retinalScreening: { month: Month } | null;
  onStatin: boolean | null;
  onInsulin: boolean | null;
  insulinStartYear: number | null;
  cvdHistory: boolean | null;
}

/** The record fields that hold a care process (each with at least a `month`). */
export type CareProcessField =
  | 'hba1c'
  | 'bloodPressure'
  | 'cholesterol'
  | 'serumCreatinine'
  | 'urineAlbumin'
  | 'footSurveillance'
  | 'bmi'
  | 'smoking'
  | 'retinalScreening';

/** Every care-process field, in the order used by the columnar form. */
export const CARE_PROCESS_FIELDS: readonly CareProcessField[] = [
  'hba1c',
  'bloodPressure',
  'cholesterol',
  'serumCreatinine',
  'urineAlbumin',
  'footSurveillance',
  'bmi',
  'smoking',
  'retinalScreening',
];

/** The numeric results a treatment target can compare with a threshold. */
export type MeasurementField =
  'hba1c' | 'systolic' | 'diastolic' | 'cholesterol' | 'serumCreatinine' | 'urineAlbumin' | 'bmi';

/** The yes/no fields a treatment target can test. */
export type FlagField = 'onStatin' | 'onInsulin' | 'cvdHistory';
