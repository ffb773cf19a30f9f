import { type CareColumns, FLAG_NO, FLAG_YES, MISSING_YEAR, TYPE_2 } from '../records/columns.js';
import type { CareRecord } from '../records/record.js';
import { type AuditQuarter, reviewWindow } from '../measures/quarter.js';
import {
  kaplanMeierFromCounts,
  type SurvivalCount,
  type SurvivalEstimate,
} from '../stats/kaplan-meier.js';

/**
 * Progression to insulin in type 2 diabetes (methods §5): whole years from diagnosis to the
 * insulin start year (event), or to the end of the review window for those not on insulin
 * (censored), by the Kaplan–Meier estimate (kaplan-meier.ts); median per practice and for the
 * region. Included: type 2, age at least `minAge` at the end of the window, diagnosis year
 * known and not after the window. Left out: insulin status not recorded, on insulin without a
 * start year, or a start year before diagnosis or after the window (data to check, not time
 * to guess).
 */
export interface ProgressionTime {
  practiceCode: string;
  years: number;
  event: boolean;
}

export interface PracticeProgression {
  code: string;
  n: number;
  events: number;
  median: number | null;
}

export interface InsulinProgression {
  region: SurvivalEstimate;
  practices: PracticeProgression[];
  /** Records left out for incomplete or inconsistent insulin data. */
  excluded: number;
}

/** Times are counted in whole years up to this cap (longer times count as the cap). */
export const INSULIN_MAX_YEARS = 150;
const MAX_YEARS = INSULIN_MAX_YEARS;

/** The time of one record, or null when it is not included (see above). */
export function progressionTime(
  record: CareRecord,
  endYear: number,
  minAge = 12,
): { years: number; event: boolean } | 'excluded' | null {
  if (record.diabetesType !== 'type2') return null;
  if (endYear - record.birthYear < minAge) return null;
  if (record.diagnosisYear === null || record.diagnosisYear > endYear) return null;
  if (record.onInsulin === null) return 'excluded';
  if (record.onInsulin === false) return { years: endYear - record.diagnosisYear, event: false };
  const start = record.insulinStartYear;
  if (start === null || start < record.diagnosisYear || start > endYear) return 'excluded';
  return { years: start - record.diagnosisYear, event: true };
}

function summarise(
  practiceCodes: readonly string[],
  histogram: Int32Array,
  excluded: number,
): InsulinProgression {
  const W = MAX_YEARS + 1;
  const region: SurvivalCount[] = [];
  for (let t = 0; t < W; t++) region.push({ time: t, events: 0, censored: 0 });
  const practices: PracticeProgression[] = practiceCodes.map((code, p) => {
    const counts: SurvivalCount[] = [];
    for (let t = 0; t < W; t++) {
      const events = histogram[(p * W + t) * 2] as number;
      const censored = histogram[(p * W + t) * 2 + 1] as number;
      if (events > 0 || censored > 0) {
        counts.push({ time: t, events, censored });
        const r = region[t] as SurvivalCount;
        r.events += events;
        r.censored += censored;
      }
    }
    const estimate = kaplanMeierFromCounts(counts);
    return { code, n: estimate.n, events: estimate.events, median: estimate.median };
  });
  return { region: kaplanMeierFromCounts(region), practices, excluded };
}

/** Progression to insulin from records. */
export function insulinProgression(
  records: readonly CareRecord[],
  quarter: AuditQuarter,
  options: { minAge?: number } = {},
): InsulinProgression {
  const { endYear } = reviewWindow(quarter);
  const codes: string[] = [];
  const index = new Map<string, number>();
  for (const r of records) {
    if (!index.has(r.practiceCode)) {
      index.set(r.practiceCode, codes.length);
      codes.push(r.practiceCode);
    }
  }
  const W = MAX_YEARS + 1;
  const histogram = new Int32Array(codes.length * W * 2);
  let excluded = 0;
  for (const r of records) {
    const time = progressionTime(r, endYear, options.minAge ?? 12);
    if (time === null) continue;
    if (time === 'excluded') {
      excluded++;
      continue;
    }
    const p = index.get(r.practiceCode) as number;
    const k = (p * W + Math.min(time.years, MAX_YEARS)) * 2 + (time.event ? 0 : 1);
    histogram[k] = (histogram[k] as number) + 1;
  }
  return summarise(codes, histogram, excluded);
}

/** `insulinTimeAt`: the record is not in the progression population. */
export const INSULIN_NOT_INCLUDED = -1;
/** `insulinTimeAt`: the record is left out for incomplete or inconsistent insulin data. */
export const INSULIN_EXCLUDED = -2;

/**
 * The time of record i of the columns (the rule of `progressionTime`, on the columnar form):
 * `INSULIN_NOT_INCLUDED`, `INSULIN_EXCLUDED`, or years × 2 + (0 for an event, 1 when censored), years capped at
 * `INSULIN_MAX_YEARS`.
 */
export function insulinTimeAt(
  columns: CareColumns,
  i: number,
  endYear: number,
  minAge: number,
): number {
  if (columns.diabetesType[i] !== TYPE_2) return INSULIN_NOT_INCLUDED;
  if (endYear - (columns.birthYear[i] as number) < minAge) return INSULIN_NOT_INCLUDED;
  const dy = columns.diagnosisYear[i] as number;
  if (dy === MISSING_YEAR || dy > endYear) return INSULIN_NOT_INCLUDED;
  const insulin = columns.onInsulin[i] as number;
  if (insulin === FLAG_NO) return Math.min(endYear - dy, MAX_YEARS) * 2 + 1;
  if (insulin !== FLAG_YES) return INSULIN_EXCLUDED;
  const start = columns.insulinStartYear[i] as number;
  if (start === MISSING_YEAR || start < dy || start > endYear) return INSULIN_EXCLUDED;
  return Math.min(start - dy, MAX_YEARS) * 2;
}

/** Progression to insulin from the columnar form (one pass, no objects per record). */
export function insulinProgressionColumns(
  columns: CareColumns,
  quarter: AuditQuarter,
  options: { minAge?: number } = {},
): InsulinProgression {
  const { endYear } = reviewWindow(quarter);
  const minAge = options.minAge ?? 12;
  const W = MAX_YEARS + 1;
  const histogram = new Int32Array(columns.practiceCodes.length * W * 2);
  let excluded = 0;
  for (let i = 0; i < columns.length; i++) {
    const time = insulinTimeAt(columns, i, endYear, minAge);
    if (time === INSULIN_NOT_INCLUDED) continue;
    if (time === INSULIN_EXCLUDED) {
      excluded++;
      continue;
    }
    const k = (columns.practice[i] as number) * W * 2 + time;
    histogram[k] = (histogram[k] as number) + 1;
  }
  return summarise(columns.practiceCodes, histogram, excluded);
}
