/**
 * The demo scenario's extracts: eight audit quarters (2024 Q4 … 2026 Q3) of
 * de-identified annual-review data for every practice of the invented
 * Ostrevale region, written as the files practices would send (XLSX and
 * CSV in a few export styles), plus a manifest. `npm start` uploads them
 * through Cairn's own upload → check → confirm pipeline.
 *
 * Deterministic: one seeded PRNG (sfc32, seeded by FNV-1a of a label), no
 * Math.random. Every person is invented.
 *
 * The distributions are plausible, not sourced (common practice, tuned by
 * eye): HbA1c higher in type 1 and rising with duration in type 2, clinic
 * blood pressure around 134/78 mmHg, total cholesterol around 4.5 mmol/L
 * (lower on a statin), creatinine by sex and age, a skewed urine ACR. Type 2
 * time from diagnosis to insulin is exponential with a median of 7 years, the
 * common rule of thumb (docs/methods.md §5, common practice, no source).
 *
 * Practice behaviours (demo-region.ts `profile`): 'improving' completes more
 * care processes quarter on quarter; 'persistently-low' stays well below its
 * peers; 'implausible' sends values outside plausible ranges (refused rows);
 * 'not-submitted' sends nothing for the latest quarter. The implausible practice also shows
 * clinical data-quality flags: type 1 recorded as not on insulin, and diagnostic results below
 * the WHO thresholds.
 *
 * Run: npx tsx seed-data/extracts.ts [outDir]
 */
import { mkdirSync, writeFileSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { COLUMNS } from '../packages/api/src/submissions/format/columns.ts';
import {
  type ExtractValue,
  writeCsv,
  writeXlsx,
} from '../packages/api/src/submissions/template/extract-writer.ts';
import { type DemoPractice, practices } from './demo-region.ts';

export const DEMO_QUARTERS = [
  [2024, 4],
  [2025, 1],
  [2025, 2],
  [2025, 3],
  [2025, 4],
  [2026, 1],
  [2026, 2],
  [2026, 3],
] as const;

export interface ManifestEntry {
  practice: string;
  quarter: string;
  file: string;
  dateConvention: 'day_first' | 'month_first' | null;
  rows: number;
}

// ───────────────────────────── PRNG ─────────────────────────────

function fnv1a(text: string): number {
  let h = 0x811c9dc5;
  for (let i = 0; i < text.length; i++) {
    h ^= text.charCodeAt(i);
    h = Math.imul(h, 0x01000193);
  }
  return h >>> 0;
}

/** sfc32 (Chris Doty-Humphrey's Small Fast Counting generator), seeded from a label. */
export function rng(label: string): () => number {
  let a = fnv1a(`a:${label}`);
  let b = fnv1a(`b:${label}`);
  let c = fnv1a(`c:${label}`);
  let d = 1;
  const next = () => {
    const t = (((a + b) | 0) + d) | 0;
    d = (d + 1) | 0;
    a = b ^ (b >>> 9);
    b = (c + (c << 3)) | 0;
    c = (c << 21) | (c >>> 11);
    c = (c + t) | 0;
    return (t >>> 0) / 4294967296;
  };
  for (let i = 0; i < 12; i++) next();
  return next;
}

const normal = (r: () => number, mean: number, sd: number) => {
  const u = Math.max(r(), 1e-12);
  const v = r();
  return mean + sd * Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * v);
};
const clamp = (x: number, lo: number, hi: number) => Math.min(hi, Math.max(lo, x));
const round1 = (x: number) => Math.round(x * 10) / 10;

// ───────────────────────────── people ─────────────────────────────

interface Person {
  n: number;
  ref: string;
  birthYear: number;
  sex: 'F' | 'M';
  type: 'type1' | 'type2' | 'other';
  diagnosisYear: number;
  /** Calendar year insulin starts (type 1: at diagnosis), or null if never within the scenario */
  insulinYear: number | null;
  deprivation: number;
  smoking: 'current' | 'ex' | 'never';
  cvd: boolean;
  statin: boolean;
  hba1cLevel: number;
  systolicLevel: number;
  cholesterolLevel: number;
  creatinineLevel: number;
  acrLevel: number;
  bmiLevel: number;
  /** Quarter index from which the person is on the register, and until which (exclusive) */
  from: number;
  until: number;
  /** A data-entry slip: type 1 recorded without insulin */
  slip: boolean;
}

const LOCALITY_DEPRIVATION: Record<string, number[]> = {
  HRN: [0.12, 0.18, 0.22, 0.24, 0.24],
  CND: [0.34, 0.26, 0.18, 0.13, 0.09],
  LWB: [0.2, 0.22, 0.22, 0.2, 0.16],
  TSK: [0.1, 0.16, 0.22, 0.26, 0.26],
};

function pick<T>(r: () => number, items: readonly T[], weights: readonly number[]): T {
  let x = r() * weights.reduce((a, b) => a + b, 0);
  for (let i = 0; i < items.length; i++) {
    x -= weights[i]!;
    if (x <= 0) return items[i]!;
  }
  return items[items.length - 1]!;
}

/** Median 7 years from diagnosis to insulin in type 2: exponential with rate ln 2 / 7. */
const INSULIN_RATE = Math.LN2 / 7;

function makePerson(practice: DemoPractice, n: number, from: number, lastYear: number): Person {
  const r = rng(`${practice.code}:person:${n}`);
  const type = pick(r, ['type1', 'type2', 'other'] as const, [0.09, 0.89, 0.02]);
  const sex = r() < (type === 'type2' ? 0.45 : 0.48) ? 'F' : 'M';
  let birthYear: number;
  let diagnosisAge: number;
  if (type === 'type1') {
    birthYear = Math.round(clamp(normal(r, lastYear - 42, 17), lastYear - 88, lastYear - 12));
    diagnosisAge = clamp(normal(r, 14, 8), 1, lastYear - birthYear);
  } else {
    birthYear = Math.round(clamp(normal(r, lastYear - 66, 12), lastYear - 96, lastYear - 22));
    diagnosisAge = clamp(normal(r, 56, 10), 18, lastYear - birthYear);
  }
  const diagnosisYear = Math.min(lastYear, Math.round(birthYear + diagnosisAge));
  const after = Math.round(-Math.log(Math.max(r(), 1e-9)) / INSULIN_RATE);
  const insulinYear =
    type === 'type1'
      ? diagnosisYear
      : diagnosisYear + after <= lastYear
        ? diagnosisYear + after
        : null;
  const age = lastYear - birthYear;
  const duration = lastYear - diagnosisYear;
  const statin = age >= 40 ? r() < (type === 'type1' ? 0.55 : 0.78) : r() < 0.1;
  const practiceShift = normal(rng(`${practice.code}:shift`), 0, 2.5);
  const hba1cLevel =
    type === 'type1'
      ? normal(r, 67, 13)
      : normal(r, 51 + 0.45 * Math.min(duration, 25) + (insulinYear !== null ? 5 : 0), 11) +
        practiceShift;
  return {
    n,
    ref: `${practice.code.slice(2)}-${String(n).padStart(5, '0')}`,
    birthYear,
    sex,
    type,
    diagnosisYear,
    insulinYear,
    deprivation: pick(
      r,
      [1, 2, 3, 4, 5],
      LOCALITY_DEPRIVATION[practice.locality] ?? [0.2, 0.2, 0.2, 0.2, 0.2],
    ),
    smoking: pick(r, ['current', 'ex', 'never'] as const, [0.15, 0.36, 0.49]),
    cvd: r() < (type === 'type1' ? 0.08 : 0.12 + 0.004 * Math.max(0, age - 50)),
    statin,
    hba1cLevel: clamp(hba1cLevel, 34, 130),
    systolicLevel: clamp(normal(r, 128 + 0.2 * (age - 60), 13), 100, 185),
    cholesterolLevel: clamp(normal(r, statin ? 4.1 : 5.0, 0.85), 2.2, 8.5),
    creatinineLevel: clamp(
      Math.exp(normal(r, Math.log(sex === 'M' ? 86 : 68) + 0.006 * Math.max(0, age - 50), 0.22)),
      40,
      600,
    ),
    acrLevel: clamp(Math.exp(normal(r, Math.log(1.2), 1.05)), 0.2, 280),
    bmiLevel: clamp(normal(r, type === 'type2' ? 31 : 26.5, type === 'type2' ? 5.5 : 4), 17, 58),
    from,
    until: 99,
    // The implausible-data practice records insulin carelessly: many of its type 1 people appear
    // as not on insulin (a clinical data-quality flag). One draw either way, so the rest of every
    // person is the same as before.
    slip: type === 'type1' && r() < (practice.profile === 'implausible' ? 0.35 : 0.01),
  };
}

/** The practice's register over the eight quarters: a cohort, with arrivals and leavers. */
function register(practice: DemoPractice): Person[] {
  const r = rng(`${practice.code}:register`);
  const size = Math.round(practice.listSize * 0.07 * (0.9 + 0.2 * r()));
  const lastYear = DEMO_QUARTERS[DEMO_QUARTERS.length - 1]![0];
  const people: Person[] = [];
  let n = 0;
  for (let i = 0; i < size; i++) people.push(makePerson(practice, ++n, 0, lastYear));
  for (let q = 1; q < DEMO_QUARTERS.length; q++) {
    const arrivals = Math.round(size * 0.012 * (0.5 + r()));
    for (let i = 0; i < arrivals; i++) people.push(makePerson(practice, ++n, q, lastYear));
    for (const person of people) {
      if (person.until === 99 && person.from < q && r() < 0.008) person.until = q;
    }
  }
  return people;
}

// ───────────────────────────── completion ─────────────────────────────

/** Typical chance that a care process was done in the review window (common practice, tuned by eye). */
const BASE_COMPLETION: Record<string, number> = {
  hba1c: 0.93,
  blood_pressure: 0.94,
  cholesterol: 0.84,
  serum_creatinine: 0.9,
  urine_albumin: 0.62,
  foot_surveillance: 0.74,
  bmi: 0.86,
  smoking: 0.88,
  retinal_screening: 0.8,
};

function completionFactor(practice: DemoPractice, q: number): number {
  const r = rng(`${practice.code}:factor:${q}`);
  const own = 0.9 + 0.1 * rng(`${practice.code}:own`)();
  switch (practice.profile) {
    case 'improving':
      return clamp(0.52 + (0.48 * q) / (DEMO_QUARTERS.length - 1), 0, 1.05);
    case 'persistently-low':
      return 0.56 + 0.04 * r();
    default:
      return clamp(own + normal(r, 0, 0.02), 0.7, 1.06);
  }
}

// ───────────────────────────── export styles ─────────────────────────────

type Style = 'csv-iso' | 'xlsx-dates' | 'csv-dmy-semicolon' | 'xlsx-lab-units';

function styleOf(practice: DemoPractice, index: number): Style {
  if (practice.code === 'OV104' || practice.code === 'OV306') return 'xlsx-lab-units';
  if (practice.code === 'OV202' || practice.code === 'OV402') return 'csv-dmy-semicolon';
  return index % 3 === 1 ? 'xlsx-dates' : 'csv-iso';
}

const monthStart = (year: number, month: number, day: number) =>
  new Date(Date.UTC(year, month - 1, day));

function monthsBack(
  endYear: number,
  endMonth: number,
  back: number,
): { year: number; month: number } {
  const index = endYear * 12 + (endMonth - 1) - back;
  return { year: Math.floor(index / 12), month: (index % 12) + 1 };
}

const two = (n: number) => String(n).padStart(2, '0');

function rowsFor(practice: DemoPractice, people: Person[], q: number, style: Style) {
  const [year, quarter] = DEMO_QUARTERS[q]!;
  const endMonth = quarter * 3;
  const factor = completionFactor(practice, q);
  const headings = COLUMNS.map((c) => c.key);
  const rows: ExtractValue[][] = [];
  for (const person of people) {
    if (person.from > q || person.until <= q) continue;
    if (person.diagnosisYear > year) continue;
    const r = rng(`${practice.code}:${person.n}:${year}Q${quarter}`);
    const date = (process: string): Date | null => {
      const p = clamp(BASE_COMPLETION[process]! * factor, 0, 0.99);
      if (r() < p) {
        const m = monthsBack(year, endMonth, Math.floor(r() * 12));
        return monthStart(m.year, m.month, 1 + Math.floor(r() * 28));
      }
      if (r() < 0.4) {
        const m = monthsBack(year, endMonth, 12 + Math.floor(r() * 18));
        return monthStart(m.year, m.month, 1 + Math.floor(r() * 28));
      }
      return null;
    };
    const drift = (q - 4) * -0.4 * (practice.profile === 'improving' ? 1 : 0.2);
    const hba1c = Math.round(clamp(normal(r, person.hba1cLevel + drift, 4), 28, 160));
    const systolic = Math.round(clamp(normal(r, person.systolicLevel, 8), 88, 220));
    let diastolic = Math.round(
      clamp(normal(r, 78 - 0.1 * (year - person.birthYear - 60), 8), 50, 115),
    );
    if (systolic - diastolic < 25) diastolic = systolic - 25;
    const cholesterol = round1(clamp(normal(r, person.cholesterolLevel, 0.35), 1.8, 11));
    const creatinine = Math.round(
      clamp(normal(r, person.creatinineLevel, person.creatinineLevel * 0.06), 35, 900),
    );
    const acr = round1(clamp(person.acrLevel * Math.exp(normal(r, 0, 0.3)), 0.1, 400));
    const bmi = round1(clamp(normal(r, person.bmiLevel, 0.8), 16, 60));
    const onInsulin = person.insulinYear !== null && person.insulinYear <= year && !person.slip;
    const values: Record<string, ExtractValue> = {
      record_ref: person.ref,
      birth_year: person.birthYear,
      sex: person.sex,
      diabetes_type: person.type,
      diagnosis_year: person.diagnosisYear,
      deprivation_quintile: person.deprivation,
      hba1c_date: date('hba1c'),
      hba1c_value: hba1c,
      bp_date: date('blood_pressure'),
      bp_systolic: systolic,
      bp_diastolic: diastolic,
      cholesterol_date: date('cholesterol'),
      cholesterol_value: cholesterol,
      creatinine_date: date('serum_creatinine'),
      creatinine_value: creatinine,
      acr_date: date('urine_albumin'),
      acr_value: acr,
      foot_check_date: date('foot_surveillance'),
      bmi_date: date('bmi'),
      bmi_value: bmi,
      smoking_date: date('smoking'),
      smoking_status: person.smoking,
      retinal_screening_date: date('retinal_screening'),
      on_statin: person.statin ? 'yes' : 'no',
      on_insulin: onInsulin ? 'yes' : 'no',
      insulin_start_year: onInsulin ? person.insulinYear : null,
      cvd_history: person.cvd ? 'yes' : 'no',
    };
    for (const [dateKey, valueKeys] of [
      ['hba1c_date', ['hba1c_value']],
      ['bp_date', ['bp_systolic', 'bp_diastolic']],
      ['cholesterol_date', ['cholesterol_value']],
      ['creatinine_date', ['creatinine_value']],
      ['acr_date', ['acr_value']],
      ['bmi_date', ['bmi_value']],
      ['smoking_date', ['smoking_status']],
    ] as const) {
      if (values[dateKey] === null) for (const k of valueKeys) values[k] = null;
    }
    if (style === 'xlsx-lab-units') {
      // Laboratory units of another convention: HbA1c in %, cholesterol and creatinine in mg/dL.
      if (values.hba1c_value !== null) {
        values.hba1c_value = Math.round((hba1c / 10.929 + 2.15) * 10) / 10;
        values.hba1c_unit = '%';
      }
      if (values.cholesterol_value !== null) {
        values.cholesterol_value = Math.round(cholesterol * 38.67);
        values.cholesterol_unit = 'mg/dL';
      }
      if (values.creatinine_value !== null) {
        values.creatinine_value = Math.round((creatinine / 88.42) * 100) / 100;
        values.creatinine_unit = 'mg/dL';
      }
      if (r() < 0.3) {
        const glucose = r() < 0.5;
        values.diagnostic_test = glucose ? 'fasting_glucose' : 'hba1c';
        values.diagnostic_value = glucose
          ? round1(normal(r, 8.6, 1.2))
          : Math.round(normal(r, 58, 7));
        values.diagnostic_unit = glucose ? 'mmol/L' : 'mmol/mol';
      }
    }
    if (practice.profile === 'implausible') {
      const x = r();
      if (x < 0.012) values.hba1c_value = 480;
      else if (x < 0.022 && values.bp_date !== null) {
        values.bp_systolic = 72;
        values.bp_diastolic = 118;
      } else if (x < 0.03 && values.bmi_date !== null) values.bmi_value = 312;
      else if (x < 0.036) values.birth_year = 1884;
      else if (x < 0.045 && values.creatinine_date !== null) values.creatinine_value = 0.9;
      else if (x < 0.05 && values.hba1c_date !== null) values.hba1c_value = 6.8;
      // A diagnostic result below the WHO thresholds (a clinical data-quality flag); drawn last,
      // so nothing else of the row changes.
      if (r() < 0.05) {
        values.diagnostic_test = 'fasting_glucose';
        values.diagnostic_value = round1(5.2 + r());
        values.diagnostic_unit = 'mmol/L';
      }
    }
    rows.push(headings.map((h) => values[h] ?? null));
  }
  return { headings, rows };
}

function formatDate(style: Style) {
  return (d: Date) =>
    style === 'csv-dmy-semicolon'
      ? `${two(d.getUTCDate())}/${two(d.getUTCMonth() + 1)}/${d.getUTCFullYear()}`
      : d.toISOString().slice(0, 10);
}

export async function generateExtracts(outDir: string): Promise<ManifestEntry[]> {
  const manifest: ManifestEntry[] = [];
  for (const [index, practice] of practices.entries()) {
    const people = register(practice);
    for (let q = 0; q < DEMO_QUARTERS.length; q++) {
      // Workbook-exporting practices moved to their current export in the last two quarters;
      // before that they sent CSV (it also keeps the first `npm start` quick).
      const own = styleOf(practice, index);
      const style: Style = own.startsWith('xlsx') && q < DEMO_QUARTERS.length - 2 ? 'csv-iso' : own;
      const [year, quarter] = DEMO_QUARTERS[q]!;
      if (practice.profile === 'not-submitted' && q === DEMO_QUARTERS.length - 1) continue;
      const label = `${year} Q${quarter}`;
      const dir = join(outDir, 'extracts', `${year}-Q${quarter}`);
      mkdirSync(dir, { recursive: true });
      const { headings, rows } = rowsFor(practice, people, q, style);
      const xlsx = style === 'xlsx-dates' || style === 'xlsx-lab-units';
      const file = join(dir, `${practice.code}.${xlsx ? 'xlsx' : 'csv'}`);
      if (xlsx) {
        await writeXlsx({ headings, rows }, { filename: file, sharedStrings: true });
      } else {
        const semicolon = style === 'csv-dmy-semicolon';
        writeFileSync(
          file,
          writeCsv(
            { headings, rows },
            {
              delimiter: semicolon ? ';' : ',',
              bom: semicolon,
              decimalComma: semicolon,
              formatDate: formatDate(style),
            },
          ),
        );
      }
      manifest.push({
        practice: practice.code,
        quarter: label,
        file: file.slice(outDir.length + 1),
        dateConvention: style === 'csv-dmy-semicolon' ? 'day_first' : null,
        rows: rows.length,
      });
    }
  }
  writeFileSync(
    join(outDir, 'extracts', 'manifest.json'),
    JSON.stringify(
      { quarters: DEMO_QUARTERS.map(([y, q]) => `${y} Q${q}`), extracts: manifest },
      null,
      2,
    ) + '\n',
  );
  return manifest;
}

const isMain = process.argv[1] && resolve(process.argv[1]) === fileURLToPath(import.meta.url);
if (isMain) {
  const out = resolve(process.argv[2] ?? join(dirname(fileURLToPath(import.meta.url)), 'out'));
  const started = Date.now();
  const manifest = await generateExtracts(out);
  const rows = manifest.reduce((n, m) => n + m.rows, 0);
  console.log(
    `wrote ${manifest.length} demo extracts (${rows} rows) to ${join(out, 'extracts')} in ${((Date.now() - started) / 1000).toFixed(1)} s`,
  );
}
