/**
 * Deterministic benchmark rows in Cairn's extract format for 2026 Q3: a
 * plausible clean extract (every care process present for most people,
 * canonical units, ISO dates), so that the benchmark measures reading,
 * validating and inserting rather than reporting problems.
 */
import { COLUMNS } from '../src/submissions/format/columns.js';
import type { ExtractValue } from '../src/submissions/template/extract-writer.js';

export const BENCH_HEADINGS = COLUMNS.map((c) => c.key);

function lcg(seed: number) {
  let s = seed >>> 0;
  return () => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return s / 4294967296;
  };
}

const months = [
  '2025-10',
  '2025-11',
  '2025-12',
  '2026-01',
  '2026-02',
  '2026-03',
  '2026-04',
  '2026-05',
  '2026-06',
  '2026-07',
  '2026-08',
  '2026-09',
];

export function* benchRows(
  n: number,
  options: { sparse?: boolean; headings?: string[] } = {},
): Generator<ExtractValue[]> {
  const r = lcg(20260930);
  const headings = options.headings ?? BENCH_HEADINGS;
  const date = () =>
    options.sparse && r() < 0.35
      ? null
      : `${months[Math.floor(r() * 12)]}-${String(1 + Math.floor(r() * 28)).padStart(2, '0')}`;
  for (let i = 1; i <= n; i++) {
    const type1 = r() < 0.09;
    const birth = 1935 + Math.floor(r() * 70);
    const diagnosis = Math.min(2026, birth + 20 + Math.floor(r() * 40));
    const hba1c = date();
    const bp = date();
    const chol = date();
    const creat = date();
    const acr = date();
    const bmi = date();
    const smoking = date();
    const v: Record<string, ExtractValue> = {
      record_ref: `B${String(i).padStart(7, '0')}`,
      birth_year: birth,
      sex: r() < 0.47 ? 'F' : 'M',
      diabetes_type: type1 ? 'type1' : 'type2',
      diagnosis_year: diagnosis,
      deprivation_quintile: 1 + Math.floor(r() * 5),
      hba1c_date: hba1c,
      hba1c_value: hba1c ? 40 + Math.floor(r() * 50) : null,
      bp_date: bp,
      bp_systolic: bp ? 110 + Math.floor(r() * 50) : null,
      bp_diastolic: bp ? 65 + Math.floor(r() * 25) : null,
      cholesterol_date: chol,
      cholesterol_value: chol ? Math.round((3 + r() * 3) * 10) / 10 : null,
      creatinine_date: creat,
      creatinine_value: creat ? 55 + Math.floor(r() * 60) : null,
      acr_date: acr,
      acr_value: acr ? Math.round(r() * 80) / 10 : null,
      foot_check_date: date(),
      bmi_date: bmi,
      bmi_value: bmi ? Math.round((22 + r() * 14) * 10) / 10 : null,
      smoking_date: smoking,
      smoking_status: smoking ? (r() < 0.15 ? 'current' : r() < 0.45 ? 'ex' : 'never') : null,
      retinal_screening_date: date(),
      on_statin: r() < 0.7 ? 'yes' : 'no',
      on_insulin: type1 ? 'yes' : r() < 0.2 ? 'yes' : 'no',
      insulin_start_year: type1 ? diagnosis : null,
      cvd_history: r() < 0.2 ? 'yes' : 'no',
    };
    yield headings.map((h) => v[h] ?? null);
  }
}
