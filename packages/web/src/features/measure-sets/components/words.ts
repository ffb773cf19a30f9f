/** The measure-set vocabulary in words (display only). */
import type {
  Comparator,
  DenominatorKind,
  DiabetesType,
  MeasureDirection,
  MeasureSetStatus,
  Measurement,
} from '../../../lib/api/types';

export const denominatorWords: Record<DenominatorKind, string> = {
  eligible: 'Everyone in the population (no result counts against)',
  measured: 'Only people with a result in the review window',
};

export const directionWords: Record<MeasureDirection, string> = {
  higher: 'Higher is better',
  lower: 'Lower is better',
};

export const comparatorWords: Record<Comparator, string> = {
  lt: 'below',
  le: 'at or below',
  gt: 'above',
  ge: 'at or above',
};

export const typeWords: Record<DiabetesType, string> = {
  type1: 'Type 1',
  type2: 'Type 2',
  other: 'Other types',
};

export const measurementWords: Record<Measurement, { label: string; unit: string }> = {
  hba1c: { label: 'HbA1c', unit: 'mmol/mol' },
  systolic: { label: 'Systolic blood pressure', unit: 'mmHg' },
  diastolic: { label: 'Diastolic blood pressure', unit: 'mmHg' },
  cholesterol: { label: 'Total cholesterol', unit: 'mmol/L' },
  serumCreatinine: { label: 'Serum creatinine', unit: 'µmol/L' },
  urineAlbumin: { label: 'Urine albumin:creatinine ratio', unit: 'mg/mmol' },
  bmi: { label: 'BMI', unit: 'kg/m²' },
};

export const flagWords: Record<string, string> = {
  onStatin: 'On a statin',
  onInsulin: 'On insulin',
  cvdHistory: 'History of cardiovascular disease',
};

export const statusWords: Record<MeasureSetStatus, string> = {
  draft: 'Draft',
  published: 'Published',
};
