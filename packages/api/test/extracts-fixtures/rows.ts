/**
 * Extract rows for tests: a clean row for 2026 Q3 (review window 2025-10 …
 * 2026-09) that any test can alter, and helpers to write files.
 */
import { COLUMNS } from '../../src/submissions/format/columns.js';
import {
  type CsvOptions,
  type ExtractValue,
  writeCsv,
  writeXlsx,
  type XlsxOptions,
} from '../../src/submissions/template/extract-writer.js';

export const HEADINGS = COLUMNS.map((c) => c.key);
/** Required columns only (what a minimal export has) */
export const REQUIRED_HEADINGS = COLUMNS.filter((c) => c.required).map((c) => c.key);

export type Row = Record<string, ExtractValue>;

export function goodRow(i: number, overrides: Row = {}): Row {
  const type = i % 10 === 0 ? 'type1' : 'type2';
  const diagnosisYear = 2005 + (i % 15);
  return {
    record_ref: `T-${String(i).padStart(6, '0')}`,
    birth_year: 1940 + (i % 60),
    sex: i % 2 ? 'F' : 'M',
    diabetes_type: type,
    diagnosis_year: diagnosisYear,
    deprivation_quintile: (i % 5) + 1,
    hba1c_date: '2026-05-14',
    hba1c_value: 48 + (i % 30),
    hba1c_unit: null,
    bp_date: '2026-05-14',
    bp_systolic: 120 + (i % 30),
    bp_diastolic: 70 + (i % 15),
    cholesterol_date: '2026-03-02',
    cholesterol_value: 4.2,
    cholesterol_unit: null,
    creatinine_date: '2026-03-02',
    creatinine_value: 80 + (i % 20),
    creatinine_unit: null,
    acr_date: '2026-03-02',
    acr_value: 1.5,
    acr_unit: null,
    foot_check_date: '2025-11-20',
    bmi_date: '2026-05-14',
    bmi_value: 29.5,
    smoking_date: '2026-05-14',
    smoking_status: 'never',
    retinal_screening_date: '2025-12-08',
    on_statin: 'yes',
    on_insulin: type === 'type1' ? 'yes' : 'no',
    insulin_start_year: type === 'type1' ? diagnosisYear : null,
    cvd_history: 'no',
    diagnostic_test: null,
    diagnostic_value: null,
    diagnostic_unit: null,
    ...overrides,
  };
}

export function goodRows(n: number, from = 1): Row[] {
  return Array.from({ length: n }, (_, k) => goodRow(from + k));
}

export function toValues(rows: Row[], headings: string[] = HEADINGS): ExtractValue[][] {
  return rows.map((r) => headings.map((h) => (r[h] === undefined ? null : r[h]!)));
}

export function csvOf(
  rows: Row[],
  headings: string[] = HEADINGS,
  options: CsvOptions = {},
): Buffer {
  return writeCsv({ headings, rows: toValues(rows, headings) }, options);
}

export async function xlsxOf(
  rows: Row[],
  headings: string[] = HEADINGS,
  options: XlsxOptions = {},
): Promise<Buffer> {
  return (await writeXlsx({ headings, rows: toValues(rows, headings) }, options))!;
}
