/**
 * Seeded synthetic records for the benchmark and the larger tests, written straight into the
 * columnar form (no record objects). Invented data with plausible shapes; nothing is real.
 */
import {
  CARE_PROCESS_FIELDS,
  type CareColumns,
  type CareProcessField,
  FLAG_NO,
  FLAG_UNKNOWN,
  FLAG_YES,
  MEASUREMENT_FIELDS,
  type MeasurementField,
  MISSING_MONTH,
  MISSING_YEAR,
  TYPE_1,
  TYPE_2,
  TYPE_OTHER,
  TYPE_UNKNOWN,
} from '../src/index.js';

/** mulberry32, a small seeded 32-bit generator (public domain). */
export function rng(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

function normal(random: () => number): number {
  // Box–Muller.
  const u = Math.max(random(), 1e-12);
  return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * random());
}

export interface SyntheticOptions {
  records: number;
  practices: number;
  seed: number;
  /** Last month index of the review window the data is generated around. */
  endMonthIndex: number;
}

/** Practice codes 'P00001' … */
export function practiceCode(i: number): string {
  return `P${String(i + 1).padStart(5, '0')}`;
}

export function syntheticColumns(options: SyntheticOptions): CareColumns {
  const { records: N, practices: P, seed, endMonthIndex } = options;
  const random = rng(seed);
  const endYear = Math.floor(endMonthIndex / 12);
  // Practice sizes: log-normal weights; records sorted by practice (as a database load gives).
  const weights = new Float64Array(P);
  let total = 0;
  for (let p = 0; p < P; p++) {
    weights[p] = Math.exp(0.6 * normal(random));
    total += weights[p] as number;
  }
  const practice = new Int32Array(N);
  let filled = 0;
  for (let p = 0; p < P; p++) {
    const share = p === P - 1 ? N - filled : Math.round(((weights[p] as number) / total) * N);
    const end = Math.min(N, filled + share);
    practice.fill(p, filled, end);
    filled = end;
  }
  if (filled < N) practice.fill(P - 1, filled, N);
  const quality = new Float64Array(P);
  for (let p = 0; p < P; p++) quality[p] = 0.6 + 0.38 * random();

  const months = {} as Record<CareProcessField, Int16Array>;
  for (const f of CARE_PROCESS_FIELDS) months[f] = new Int16Array(N);
  const values = {} as Record<MeasurementField, Float64Array>;
  for (const f of MEASUREMENT_FIELDS) values[f] = new Float64Array(N);
  const birthYear = new Int16Array(N);
  const sex = new Uint8Array(N);
  const diabetesType = new Uint8Array(N);
  const diagnosisYear = new Int16Array(N);
  const deprivation = new Uint8Array(N);
  const smokingStatus = new Uint8Array(N);
  const onStatin = new Uint8Array(N);
  const onInsulin = new Uint8Array(N);
  const insulinStartYear = new Int16Array(N);
  const cvdHistory = new Uint8Array(N);

  const month = (q: number): number => {
    // Done with probability q; mostly in the window, sometimes older (outside it).
    if (random() >= q) return MISSING_MONTH;
    return random() < 0.93
      ? endMonthIndex - Math.floor(random() * 12)
      : endMonthIndex - 12 - Math.floor(random() * 12);
  };

  for (let i = 0; i < N; i++) {
    const q = quality[practice[i] as number] as number;
    const r = random();
    const type = r < 0.08 ? TYPE_1 : r < 0.975 ? TYPE_2 : r < 0.995 ? TYPE_OTHER : TYPE_UNKNOWN;
    diabetesType[i] = type;
    const age =
      type === TYPE_1
        ? 12 + Math.floor(random() * 70)
        : Math.max(10, Math.min(99, Math.round(66 + 13 * normal(random))));
    birthYear[i] = endYear - age;
    const s = random();
    sex[i] = s < 0.46 ? 0 : s < 0.97 ? 1 : s < 0.985 ? 2 : 3;
    deprivation[i] = random() < 0.1 ? 0 : 1 + Math.floor(random() * 5);
    const duration = Math.min(age - 1, Math.floor(-Math.log(Math.max(random(), 1e-9)) * 9));
    diagnosisYear[i] = random() < 0.03 ? MISSING_YEAR : endYear - Math.max(0, duration);

    let m = month(q);
    months.hba1c[i] = m;
    values.hba1c[i] =
      m === MISSING_MONTH ? NaN : Math.round(Math.max(25, 58 + 14 * normal(random)));
    m = month(q);
    months.bloodPressure[i] = m;
    values.systolic[i] = m === MISSING_MONTH ? NaN : Math.round(134 + 15 * normal(random));
    values.diastolic[i] = m === MISSING_MONTH ? NaN : Math.round(77 + 10 * normal(random));
    m = month(q * 0.97);
    months.cholesterol[i] = m;
    values.cholesterol[i] =
      m === MISSING_MONTH ? NaN : Math.round(Math.max(1.5, 4.4 + 1.0 * normal(random)) * 10) / 10;
    m = month(q * 0.98);
    months.serumCreatinine[i] = m;
    values.serumCreatinine[i] =
      m === MISSING_MONTH ? NaN : Math.round(80 * Math.exp(0.3 * normal(random)));
    m = month(q * 0.8);
    months.urineAlbumin[i] = m;
    values.urineAlbumin[i] =
      m === MISSING_MONTH ? NaN : Math.round(1.5 * Math.exp(1.1 * normal(random)) * 10) / 10;
    months.footSurveillance[i] = month(q * 0.92);
    m = month(q * 0.95);
    months.bmi[i] = m;
    values.bmi[i] =
      m === MISSING_MONTH ? NaN : Math.round(Math.max(15, 31 + 6 * normal(random)) * 10) / 10;
    m = month(q);
    months.smoking[i] = m;
    smokingStatus[i] = m === MISSING_MONTH ? 0 : 1 + Math.floor(random() * 3);
    months.retinalScreening[i] = month(q * 0.9);

    const st = random();
    onStatin[i] = st < 0.05 ? FLAG_UNKNOWN : st < 0.72 ? FLAG_YES : FLAG_NO;
    cvdHistory[i] = random() < 0.05 ? FLAG_UNKNOWN : random() < 0.22 ? FLAG_YES : FLAG_NO;
    const dy = diagnosisYear[i] as number;
    if (type === TYPE_1) {
      onInsulin[i] = FLAG_YES;
      insulinStartYear[i] = dy === MISSING_YEAR ? MISSING_YEAR : dy;
    } else {
      // Time to insulin roughly exponential with a median near seven years.
      const t = Math.floor((-Math.log(Math.max(random(), 1e-9)) * 7) / Math.LN2);
      const started = dy !== MISSING_YEAR && dy + t <= endYear;
      onInsulin[i] = started ? FLAG_YES : FLAG_NO;
      insulinStartYear[i] = started ? dy + t : MISSING_YEAR;
    }
  }
  return {
    length: N,
    practiceCodes: Array.from({ length: P }, (_, p) => practiceCode(p)),
    practice,
    recordKeys: null,
    birthYear,
    sex,
    diabetesType,
    diagnosisYear,
    deprivation,
    months,
    values,
    smokingStatus,
    onStatin,
    onInsulin,
    insulinStartYear,
    cvdHistory,
  };
}

/** Practice → locality for the synthetic region: 50 localities of consecutive practices. */
export function syntheticLocalities(practices: number, localities = 50): Map<string, string> {
  const map = new Map<string, string>();
  for (let p = 0; p < practices; p++) {
    map.set(
      practiceCode(p),
      `L${String(Math.floor((p * localities) / practices) + 1).padStart(3, '0')}`,
    );
  }
  return map;
}
