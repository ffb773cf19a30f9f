/** Helpers for tests: a care record with every field, overridable. */
import type { CareRecord } from '../src/index.js';

export function record(overrides: Partial<CareRecord> = {}): CareRecord {
  return {
    practiceCode: 'P1',
    recordKey: 'R1',
    birthYear: 1960,
    sex: 'F',
    diabetesType: 'type2',
    diagnosisYear: 2015,
    deprivationQuintile: 3,
    hba1c: null,
    bloodPressure: null,
    cholesterol: null,
    serumCreatinine: null,
    urineAlbumin: null,
    footSurveillance: null,
    bmi: null,
    smoking: null,
    retinalScreening: null,
    onStatin: null,
    onInsulin: null,
    insulinStartYear: null,
    cvdHistory: null,
    ...overrides,
  };
}

/** Every care process done in the given month, with values. */
export function complete(month: string, overrides: Partial<CareRecord> = {}): CareRecord {
  return record({
    hba1c: { month, mmolMol: 50 },
    bloodPressure: { month, systolic: 128, diastolic: 76 },
    cholesterol: { month, totalMmolL: 4.2 },
    serumCreatinine: { month, umolL: 80 },
    urineAlbumin: { month, acrMgMmol: 1.1 },
    footSurveillance: { month },
    bmi: { month, kgM2: 29.5 },
    smoking: { month, status: 'never' },
    retinalScreening: { month },
    onStatin: true,
    onInsulin: false,
    cvdHistory: false,
    ...overrides,
  });
}
