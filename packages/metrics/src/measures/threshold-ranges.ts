/**
 * The values a treatment target's threshold may take: the plausible range of its measurement, in
 * the canonical unit (docs/methods.md §7, common practice; the same ranges the extract checks
 * apply to every result). A threshold outside it could never separate two plausible results, so a
 * measure set that holds one is refused (schema.ts), naming the field and the range.
 */
export type ThresholdMeasurement =
  'hba1c' | 'systolic' | 'diastolic' | 'cholesterol' | 'serumCreatinine' | 'urineAlbumin' | 'bmi';

export interface ThresholdRange {
  /** The measurement in words, as a person reads it. */
  label: string;
  unit: string;
  min: number;
  max: number;
}

export const THRESHOLD_RANGES: Readonly<Record<ThresholdMeasurement, ThresholdRange>> = {
  hba1c: { label: 'HbA1c', unit: 'mmol/mol', min: 20, max: 200 },
  systolic: { label: 'systolic blood pressure', unit: 'mmHg', min: 60, max: 260 },
  diastolic: { label: 'diastolic blood pressure', unit: 'mmHg', min: 30, max: 160 },
  cholesterol: { label: 'total cholesterol', unit: 'mmol/L', min: 1, max: 20 },
  serumCreatinine: { label: 'serum creatinine', unit: 'µmol/L', min: 20, max: 2000 },
  urineAlbumin: { label: 'urine albumin:creatinine ratio', unit: 'mg/mmol', min: 0, max: 3000 },
  bmi: { label: 'BMI', unit: 'kg/m²', min: 10, max: 90 },
};

/** The message for a threshold outside its range, or null when it lies within. */
export function thresholdProblem(measurement: ThresholdMeasurement, value: number): string | null {
  const range = THRESHOLD_RANGES[measurement];
  if (value >= range.min && value <= range.max) return null;
  return `must be between ${range.min} and ${range.max} ${range.unit} (the plausible range of ${range.label})`;
}
