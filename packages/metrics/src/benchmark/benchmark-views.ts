import type { TypeSplit } from '../measures/compile.js';
import { assessmentOf, bandOfCode, type BandCode, type FunnelBand } from '../stats/funnel-flag.js';
import { improvementPotential } from '../stats/improvement-potential.js';
import { NO_INTERVAL, type Interval } from '../stats/interval.js';
import { wilsonInterval } from '../stats/wilson-interval.js';
import type {
  Benchmark,
  BenchmarkLevel,
  BenchmarkMeasure,
  FlagCode,
  LevelComparison,
  MeasureComparison,
} from './benchmark.js';
import { BENCHMARK_FORMAT } from './benchmark.js';
import { limitsTable, type LimitsTable } from './funnel-table.js';
import { type ColumnArray, unpackColumn } from './packed-column.js';

/**
 * Reading a stored benchmark (benchmark.ts): one measure and split for every practice or
 * locality (the funnel plot and its table), one practice across every measure, and the table
 * of practices × measures. The packed columns are unpacked once per benchmark object and kept
 * with it. What the benchmark does not store is recomputed with the functions the build used:
 * rates and Wilson intervals (Wilson, JASA 1927), z-scores, limits once per distinct n
 * (funnel-table.ts, so they agree with the stored flags), O/E with the stored Garwood interval
 * of its count (as `standardisedRatio` computes it), and improvement potential towards the
 * level's median (improvement-potential.ts).
 */
export interface UnitFlag {
  band: FunnelBand | null;
  side: 'above' | 'below' | null;
  assessment: 'better' | 'worse' | null;
  inner: Interval;
  outer: Interval;
}

export interface UnitResult {
  code: string;
  events: number;
  denominator: number;
  measured: number;
  n: number;
  rate: number | null;
  /** Wilson interval at the benchmark's confidence level. */
  interval: Interval;
  /** (y/n − θ₀)/√(θ₀(1 − θ₀)/n); null when n = 0 or θ₀ is 0, 1 or unknown. */
  z: number | null;
  /** Against the exact binomial limits. */
  exact: UnitFlag;
  /** Against the over-dispersion-adjusted limits. */
  adjusted: UnitFlag;
  caseMix: {
    observed: number;
    expected: number;
    ratio: number | null;
    interval: Interval;
    adjustedRate: number | null;
  };
  /** Records to change to reach the level's median rate; 0 at or beyond it; null when n = 0. */
  improvementPotential: number | null;
}

export interface MeasureView {
  measure: BenchmarkMeasure;
  split: TypeSplit;
  level: BenchmarkLevel;
  comparison: MeasureComparison;
  units: UnitResult[];
}

interface Unpacked {
  P: number;
  L: number;
  M: number;
  /** Counts per unit (practices, then localities): (u·M + m)·2 + g. */
  events: Float64Array;
  denominator: Float64Array;
  measured: Float64Array;
  expected: Float64Array;
  records: Float64Array;
  /** Flags per unit: (u·M + m)·3 + k. */
  flags: Uint8Array;
  measureIndex: Map<string, number>;
  practiceIndex: Map<string, number>;
  poisson: Map<number, number>;
}

const unpackedCache = new WeakMap<Benchmark, Unpacked>();

function unpack(b: Benchmark): Unpacked {
  const cached = unpackedCache.get(b);
  if (cached !== undefined) return cached;
  if (b?.format !== BENCHMARK_FORMAT) {
    throw new RangeError(
      `the benchmark is in format ${String(b?.format)}; this build reads format ${BENCHMARK_FORMAT}`,
    );
  }
  const P = b.practices.length;
  const L = b.localities.length;
  const M = b.measures.length;
  const column = (name: keyof Benchmark['columns'], length: number): ColumnArray => {
    const c = unpackColumn(b.columns[name], `benchmark column ${name}`);
    if (c.length !== length) {
      throw new RangeError(`benchmark column ${name} holds ${c.length} values, not ${length}`);
    }
    return c;
  };
  const U = P + L;
  const widen = (practices: ColumnArray, perUnit: number): Float64Array => {
    const out = new Float64Array(U * perUnit);
    out.set(practices);
    return out;
  };
  const events = widen(column('events', P * M * 2), M * 2);
  const denominator = widen(column('denominator', P * M * 2), M * 2);
  const measured = widen(column('measured', P * M * 2), M * 2);
  const expected = widen(column('expected', P * M * 2), M * 2);
  const records = widen(column('records', P * 4), 4);
  // Localities: sums of their practices, in practice order (as the build adds them).
  for (let p = 0; p < P; p++) {
    const l = b.practiceLocality[p] as number;
    if (l < 0) continue;
    const from = p * M * 2;
    const to = (P + l) * M * 2;
    for (let k = 0; k < M * 2; k++) {
      events[to + k] = (events[to + k] as number) + (events[from + k] as number);
      denominator[to + k] = (denominator[to + k] as number) + (denominator[from + k] as number);
      measured[to + k] = (measured[to + k] as number) + (measured[from + k] as number);
      expected[to + k] = (expected[to + k] as number) + (expected[from + k] as number);
    }
    for (let k = 0; k < 4; k++) {
      records[(P + l) * 4 + k] =
        (records[(P + l) * 4 + k] as number) + (records[p * 4 + k] as number);
    }
  }
  const flags = new Uint8Array(U * M * 3);
  flags.set(column('flags', P * M * 3));
  flags.set(column('localityFlags', L * M * 3), P * M * 3);
  const unpacked: Unpacked = {
    P,
    L,
    M,
    events,
    denominator,
    measured,
    expected,
    records,
    flags,
    measureIndex: new Map(b.measures.map((m, i) => [m.key, i])),
    practiceIndex: new Map(b.practices.map((code, i) => [code, i])),
    poisson: new Map(b.poisson.observed.map((o, i) => [o, i])),
  };
  unpackedCache.set(b, unpacked);
  return unpacked;
}

function splitIndex(split: TypeSplit): number {
  const k = ['all', 'type1', 'type2_other'].indexOf(split);
  if (k < 0) throw new RangeError(`split must be all, type1 or type2_other (got ${String(split)})`);
  return k;
}

function measureOf(b: Benchmark, d: Unpacked, key: string): number {
  const m = d.measureIndex.get(key);
  if (m === undefined) {
    throw new RangeError(`measure "${key}" is not in measure set ${b.measureSetId}`);
  }
  return m;
}

/** A per-group column's split k for unit u and measure m (group 0 first, as in the build). */
function at(column: Float64Array, M: number, u: number, m: number, k: number): number {
  const x = (u * M + m) * 2;
  return k === 0
    ? (column[x] as number) + (column[x + 1] as number)
    : (column[x + k - 1] as number);
}

function unitFlag(
  code: number,
  direction: BenchmarkMeasure['direction'],
  table: LimitsTable | null,
  limits: 'exact' | 'adjusted',
  t: number,
): UnitFlag {
  if (table === null || t < 0 || code === 0) {
    return { band: null, side: null, assessment: null, inner: NO_INTERVAL, outer: NO_INTERVAL };
  }
  const l = table[limits];
  const { band, side } = bandOfCode(code as BandCode);
  return {
    band,
    side,
    assessment: assessmentOf(side, direction),
    inner: { lower: l[4 * t] as number, upper: l[4 * t + 1] as number },
    outer: { lower: l[4 * t + 2] as number, upper: l[4 * t + 3] as number },
  };
}

/** Everything about units first … first + count − 1 on measure m and split k. */
function unitResults(
  b: Benchmark,
  d: Unpacked,
  m: number,
  k: number,
  comparison: MeasureComparison,
  level: LevelComparison,
  first: number,
  codes: readonly string[],
): UnitResult[] {
  const measure = b.measures[m] as BenchmarkMeasure;
  const M = d.M;
  const nColumn = measure.denominator === 'eligible' ? d.denominator : d.measured;
  const theta0 = comparison.theta0;
  const n = Float64Array.from(codes, (_, i) => at(nColumn, M, first + i, m, k));
  const table =
    theta0 === null ? null : limitsTable(theta0, n, level.overdispersion, b.options.overdispersion);
  const index = new Map<number, number>();
  table?.n.forEach((size, i) => index.set(size, i));
  const confidence = b.options.confidence;
  const variance = theta0 === null ? 0 : theta0 * (1 - theta0);
  return codes.map((code, i) => {
    const u = first + i;
    const size = n[i] as number;
    const events = at(d.events, M, u, m, k);
    const expected = at(d.expected, M, u, m, k);
    const flag = d.flags[(u * M + m) * 3 + k] as number;
    const t = index.get(size) ?? -1;
    let caseMix: UnitResult['caseMix'] = {
      observed: events,
      expected,
      ratio: null,
      interval: NO_INTERVAL,
      adjustedRate: null,
    };
    if (expected > 0) {
      const j = d.poisson.get(events);
      if (j === undefined) throw new RangeError(`the benchmark lacks the interval of ${events}`);
      const ratio = events / expected;
      caseMix = {
        observed: events,
        expected,
        ratio,
        interval: {
          lower: (b.poisson.lower[j] as number) / expected,
          upper: (b.poisson.upper[j] as number) / expected,
        },
        adjustedRate: theta0 === null ? null : ratio * theta0,
      };
    }
    return {
      code,
      events,
      denominator: at(d.denominator, M, u, m, k),
      measured: at(d.measured, M, u, m, k),
      n: size,
      rate: size > 0 ? events / size : null,
      interval: wilsonInterval(events, size, confidence),
      z:
        size > 0 && variance > 0
          ? (events / size - (theta0 as number)) / Math.sqrt(variance / size)
          : null,
      exact: unitFlag(flag >> 3, measure.direction, table, 'exact', t),
      adjusted: unitFlag(flag & 7, measure.direction, table, 'adjusted', t),
      caseMix,
      improvementPotential:
        level.median === null
          ? null
          : improvementPotential(events, size, level.median, measure.direction),
    };
  });
}

/** One measure and split for every practice (or locality): the funnel plot and its table. */
export function benchmarkMeasure(
  b: Benchmark,
  measure: string,
  split: TypeSplit = 'all',
  level: BenchmarkLevel = 'practice',
): MeasureView {
  const d = unpack(b);
  const m = measureOf(b, d, measure);
  const k = splitIndex(split);
  if (level !== 'practice' && level !== 'locality') {
    throw new RangeError(`level must be practice or locality (got ${String(level)})`);
  }
  const comparison = b.comparisons[m * 3 + k] as MeasureComparison;
  const first = level === 'practice' ? 0 : d.P;
  const codes = level === 'practice' ? b.practices : b.localities;
  return {
    measure: b.measures[m] as BenchmarkMeasure,
    split,
    level,
    comparison,
    units: unitResults(b, d, m, k, comparison, comparison[level], first, codes),
  };
}

/**
 * One measure and split for some practices only (indices in benchmark order, e.g. one page of
 * the practices × measures table): the same units as `benchmarkMeasure` gives for them, with
 * limits computed at their own n only.
 */
export function benchmarkMeasureAt(
  b: Benchmark,
  measure: string,
  split: TypeSplit,
  practices: readonly number[],
): UnitResult[] {
  const d = unpack(b);
  const m = measureOf(b, d, measure);
  const k = splitIndex(split);
  const comparison = b.comparisons[m * 3 + k] as MeasureComparison;
  const out: UnitResult[] = [];
  // Runs of consecutive practices, each read as one range.
  for (let i = 0; i < practices.length;) {
    const first = practices[i] as number;
    if (!Number.isInteger(first) || first < 0 || first >= d.P) {
      throw new RangeError(`practice index ${first} is not in this benchmark`);
    }
    let j = i + 1;
    while (j < practices.length && practices[j] === first + (j - i)) j++;
    const codes = b.practices.slice(first, first + (j - i));
    if (codes.length !== j - i) throw new RangeError('practice indices past the benchmark');
    out.push(...unitResults(b, d, m, k, comparison, comparison.practice, first, codes));
    i = j;
  }
  return out;
}

export interface PracticeView {
  code: string;
  locality: string | null;
  records: { total: number; eligible: number; unknownType: number; underAge: number };
  results: {
    measure: BenchmarkMeasure;
    split: TypeSplit;
    theta0: number | null;
    median: number | null;
    unit: UnitResult;
  }[];
}

/** One practice across every measure and split. */
export function benchmarkPractice(b: Benchmark, code: string): PracticeView {
  const d = unpack(b);
  const p = d.practiceIndex.get(code);
  if (p === undefined) throw new RangeError(`practice ${code} is not in this benchmark`);
  const locality = b.practiceLocality[p] as number;
  const results: PracticeView['results'] = [];
  b.measures.forEach((measure, m) => {
    (b.splits as TypeSplit[]).forEach((split, k) => {
      const comparison = b.comparisons[m * 3 + k] as MeasureComparison;
      // The limits at this practice's n only (its flag needs no other unit).
      const [unit] = unitResults(b, d, m, k, comparison, comparison.practice, p, [code]);
      results.push({
        measure,
        split,
        theta0: comparison.theta0,
        median: comparison.practice.median,
        unit: unit as UnitResult,
      });
    });
  });
  return {
    code,
    locality: locality >= 0 ? (b.localities[locality] as string) : null,
    records: {
      total: d.records[p * 4] as number,
      eligible: d.records[p * 4 + 1] as number,
      unknownType: d.records[p * 4 + 2] as number,
      underAge: d.records[p * 4 + 3] as number,
    },
    results,
  };
}

/** Every practice's record counts (all, eligible, unknown type, under age), in benchmark order. */
export function benchmarkRecords(b: Benchmark): {
  code: string;
  total: number;
  eligible: number;
  unknownType: number;
  underAge: number;
}[] {
  const d = unpack(b);
  return b.practices.map((code, p) => ({
    code,
    total: d.records[p * 4] as number,
    eligible: d.records[p * 4 + 1] as number,
    unknownType: d.records[p * 4 + 2] as number,
    underAge: d.records[p * 4 + 3] as number,
  }));
}

export interface BenchmarkTable {
  split: TypeSplit;
  level: BenchmarkLevel;
  measures: string[];
  units: {
    code: string;
    /** Per measure, in `measures` order. */
    n: number[];
    events: number[];
    rate: (number | null)[];
    exact: FlagCode[];
    adjusted: FlagCode[];
  }[];
}

/** The practices (or localities) × measures table: counts, rates and both flags. */
export function benchmarkTable(
  b: Benchmark,
  split: TypeSplit = 'all',
  level: BenchmarkLevel = 'practice',
): BenchmarkTable {
  const d = unpack(b);
  const k = splitIndex(split);
  const M = d.M;
  const first = level === 'practice' ? 0 : d.P;
  const codes = level === 'practice' ? b.practices : b.localities;
  return {
    split,
    level,
    measures: b.measures.map((m) => m.key),
    units: codes.map((code, i) => {
      const u = first + i;
      const n: number[] = [];
      const events: number[] = [];
      const rate: (number | null)[] = [];
      const exact: FlagCode[] = [];
      const adjusted: FlagCode[] = [];
      b.measures.forEach((measure, m) => {
        const size = at(
          measure.denominator === 'eligible' ? d.denominator : d.measured,
          M,
          u,
          m,
          k,
        );
        const e = at(d.events, M, u, m, k);
        const flag = d.flags[(u * M + m) * 3 + k] as number;
        n.push(size);
        events.push(e);
        rate.push(size > 0 ? e / size : null);
        exact.push((flag >> 3) as FlagCode);
        adjusted.push((flag & 7) as FlagCode);
      });
      return { code, n, events, rate, exact, adjusted };
    }),
  };
}
