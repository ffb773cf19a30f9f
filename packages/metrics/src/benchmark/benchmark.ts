import type { MeasureGroup, TypeSplit } from '../measures/compile.js';
import type { AuditQuarter } from '../measures/quarter.js';
import type { Month } from '../records/record.js';
import type { Direction } from '../stats/funnel-flag.js';
import type { OverdispersionMethod } from '../stats/overdispersed-limits.js';
import type { PackedColumn } from './packed-column.js';

/**
 * A quarter's benchmark of a region (build-benchmark.ts), plain and JSON-serialisable so that
 * the API can store it whole and read it back with `JSON.parse`. Region statistics are plain
 * objects; the numbers of every practice and locality are packed columns, read through the
 * accessors of benchmark-views.ts, which also recompute what is cheap to recompute (rates,
 * intervals, limits per distinct n) rather than store it.
 *
 * Practices are in input order (p = 0 … P − 1), localities in order of first appearance. Type
 * groups g: 0 type 1, 1 type 2 and other. Splits k: 0 all, 1 type 1, 2 type 2 and other.
 * Columns (M measures), for practices only (a locality's counts and expected events are the
 * sums of its practices', which the accessors add up in practice order, as the build does):
 * - records: p·4 + k, all, eligible, unknown type, under age;
 * - events, denominator, measured: (p·M + m)·2 + g;
 * - expected (case mix, float64): (p·M + m)·2 + g;
 * - flags: (p·M + m)·3 + k, the exact-limit `FlagCode` × 8 + the adjusted-limit one;
 * - localityFlags: (l·M + m)·3 + k, the same for localities.
 * The split "all" is the sum of the two type groups (expected too, group 0 first).
 */
export const BENCHMARK_FORMAT = 1;

export const BENCHMARK_LEVELS = ['practice', 'locality'] as const;
export type BenchmarkLevel = (typeof BENCHMARK_LEVELS)[number];

/**
 * A unit's funnel flag as one small number: 0 no n, else funnel-flag.ts's band code (1 within,
 * 2 notable above, 3 notable below, 4 outlier above, 5 outlier below).
 */
export type FlagCode = 0 | 1 | 2 | 3 | 4 | 5;

export interface BenchmarkOptions {
  /** Level of each unit's own interval (Wilson) and of the O/E interval (default 0.95). */
  confidence?: number;
  /** Widening of the over-dispersion-adjusted limits (default 'additive'). */
  overdispersion?: OverdispersionMethod;
  /** Points of each funnel curve (default 30). */
  curvePoints?: number;
}

export interface BenchmarkMeasure {
  key: string;
  label: string;
  source: string;
  note: string | null;
  group: MeasureGroup;
  composite: boolean;
  denominator: 'eligible' | 'measured';
  direction: Direction;
}

/** Funnel limits over a grid of n spanning the units' sizes, for plotting. */
export interface FunnelCurves {
  n: number[];
  /** Exact binomial limits with interpolation at 95 % and 99.8 %. */
  exact: { innerLower: number[]; innerUpper: number[]; outerLower: number[]; outerUpper: number[] };
  /** Over-dispersion-adjusted limits; null where no over-dispersion is present (the exact
   * limits apply). */
  adjusted: {
    innerLower: number[];
    innerUpper: number[];
    outerLower: number[];
    outerUpper: number[];
  } | null;
}

export interface OverdispersionSummary {
  phi: number | null;
  tau2: number | null;
  present: boolean;
  statistic: number | null;
  critical: number | null;
  bounds: { lower: number; upper: number } | null;
}

/** The comparison of one level's units on one measure and split. */
export interface LevelComparison {
  /** Units with n > 0. */
  units: number;
  /** Median of the units' rates (n > 0), the reference for improvement potential. */
  median: number | null;
  /** Over-dispersion around θ₀ (null when θ₀ is 0, 1 or unknown). */
  overdispersion: OverdispersionSummary | null;
  curves: FunnelCurves | null;
}

export interface MeasureComparison {
  measure: string;
  split: TypeSplit;
  /** Region totals over every practice. */
  events: number;
  denominator: number;
  measured: number;
  n: number;
  /** The pooled regional proportion Σy/Σn (null when n = 0). */
  theta0: number | null;
  /** Σ E over the practices (equals Σ O up to rounding, by construction). */
  expected: number;
  practice: LevelComparison;
  locality: LevelComparison;
}

export interface Benchmark {
  format: typeof BENCHMARK_FORMAT;
  measureSetId: string;
  fingerprint: string;
  quarter: AuditQuarter;
  window: { start: Month; end: Month };
  options: Required<BenchmarkOptions>;
  measures: BenchmarkMeasure[];
  splits: TypeSplit[];
  practices: string[];
  localities: string[];
  /** Locality index of each practice, −1 for none. */
  practiceLocality: number[];
  /** Region record counts. */
  records: { total: number; eligible: number; unknownType: number; underAge: number };
  /** Per measure m and split k at m·3 + k. */
  comparisons: MeasureComparison[];
  /** Garwood count intervals of every observed count that has a ratio: O → [lower, upper]. */
  poisson: { observed: number[]; lower: number[]; upper: number[] };
  /** Type 2 time from diagnosis to insulin over the region (Kaplan–Meier). */
  progression: { n: number; events: number; excluded: number; median: number | null };
  columns: {
    records: PackedColumn;
    events: PackedColumn;
    denominator: PackedColumn;
    measured: PackedColumn;
    expected: PackedColumn;
    flags: PackedColumn;
    localityFlags: PackedColumn;
  };
}
