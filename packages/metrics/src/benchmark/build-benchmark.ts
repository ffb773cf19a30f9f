import { TYPE_SPLITS, type CompiledMeasureSet } from '../measures/compile.js';
import { type AuditQuarter, reviewWindow } from '../measures/quarter.js';
import type { MeasureSet } from '../measures/schema.js';
import { assertConfidence } from '../stats/assert.js';
import { kaplanMeierFromCounts, type SurvivalCount } from '../stats/kaplan-meier.js';
import { overdispersionOfColumns } from '../stats/overdispersion.js';
import { poissonInterval } from '../stats/poisson-interval.js';
import { medianOfUnsorted } from '../stats/run-chart.js';
import { assertSumsOf, type PracticeSums } from '../sums/practice-sums.js';
import { sumsLayout, type SumsLayout } from '../sums/sums-layout.js';
import {
  type Benchmark,
  BENCHMARK_FORMAT,
  type BenchmarkOptions,
  type LevelComparison,
  type MeasureComparison,
  type OverdispersionSummary,
} from './benchmark.js';
import { expectedFromSums } from './case-mix-sums.js';
import { curveGrid, flagCode, funnelCurves, limitsTable } from './funnel-table.js';
import { packColumn } from './packed-column.js';
import { unitTallies } from './unit-tallies.js';

/**
 * A quarter's benchmark of a region built from its practices' sums (practice-sums.ts); every
 * statistic is a function of sums over practices, so one practice's confirmation needs only its
 * own sums and a rebuild. Steps:
 * 1. each unit's events, measured and denominator per measure and type group (unit-tallies.ts);
 * 2. case mix: the region's stratum rates and each unit's expected events (case-mix-sums.ts);
 * 3. per measure and split (all; type 1; type 2 and other): the region's pooled rate θ₀ (the
 *    target, docs/methods.md §8), and per level (practices; localities) the median of unit
 *    rates, over-dispersion (Spiegelhalter, Stat Med 2005;24:1185–202 §4; Spiegelhalter et al.,
 *    JRSS A 2012;175:1–47), exact and adjusted funnel limits once per distinct n, each unit's
 *    flags, and funnel curves for plotting (funnel-table.ts);
 * 4. the Garwood interval (Biometrika 1936) of every observed count with a case-mix ratio;
 * 5. the region's Kaplan–Meier time from diagnosis to insulin (Kaplan & Meier, JASA 1958).
 * The result is deterministic in its input: the same sums in the same order give the same
 * benchmark, bit for bit.
 */
export interface BenchmarkPracticeInput {
  code: string;
  locality?: string | null;
  sums: PracticeSums;
}

export interface BuildBenchmarkInput {
  practices: readonly BenchmarkPracticeInput[];
  measureSet: MeasureSet | CompiledMeasureSet | SumsLayout;
  quarter: AuditQuarter;
  options?: BenchmarkOptions;
}

function resolveOptions(options: BenchmarkOptions = {}): Required<BenchmarkOptions> {
  const confidence = options.confidence ?? 0.95;
  assertConfidence(confidence, 'options.confidence');
  const overdispersion = options.overdispersion ?? 'additive';
  if (overdispersion !== 'additive' && overdispersion !== 'multiplicative') {
    throw new RangeError(
      `options.overdispersion must be 'additive' or 'multiplicative' (got ${String(overdispersion)})`,
    );
  }
  const curvePoints = options.curvePoints ?? 30;
  if (!Number.isInteger(curvePoints) || curvePoints < 2 || curvePoints > 1000) {
    throw new RangeError(`options.curvePoints must be an integer 2…1000 (got ${curvePoints})`);
  }
  return { confidence, overdispersion, curvePoints };
}

/**
 * What the benchmark reads of one practice's sums: its tallies and record counts (the units'
 * columns) and its case-mix strata (expected events). A rebuild after a confirm keeps these of
 * the practices that did not change (`buildBenchmarkOfParts`).
 */
export type BenchmarkParts = Pick<PracticeSums, 'tallies' | 'records' | 'strata'>;

export interface BenchmarkPartsInput {
  practices: readonly { code: string; locality?: string | null; parts: BenchmarkParts }[];
  /**
   * Life tables of time to insulin whose sum is the region's: every practice's, or the region's
   * sums' own (the same integer totals).
   */
  insulin: readonly PracticeSums['insulin'][];
  measureSet: MeasureSet | CompiledMeasureSet | SumsLayout;
  quarter: AuditQuarter;
  options?: BenchmarkOptions;
}

/** Codes and localities of the units, checked. */
function resolveCodes(
  practices: readonly { code: string; locality?: string | null }[],
  check: (index: number) => void,
): { codes: string[]; localities: string[]; practiceLocality: Int32Array } {
  if (!Array.isArray(practices)) throw new RangeError('practices must be an array');
  const seen = new Set<string>();
  const localities: string[] = [];
  const localityIndex = new Map<string, number>();
  const practiceLocality = new Int32Array(practices.length);
  practices.forEach((p, i) => {
    if (typeof p?.code !== 'string' || p.code === '') {
      throw new RangeError(`practices[${i}].code must be a non-empty string`);
    }
    if (seen.has(p.code))
      throw new RangeError(`practices[${i}]: practice ${p.code} is listed twice`);
    seen.add(p.code);
    check(i);
    const locality = p.locality ?? null;
    if (locality === null) practiceLocality[i] = -1;
    else {
      if (typeof locality !== 'string' || locality === '') {
        throw new RangeError(`practices[${i}].locality must be a locality code or null`);
      }
      let l = localityIndex.get(locality);
      if (l === undefined) {
        l = localities.length;
        localityIndex.set(locality, l);
        localities.push(locality);
      }
      practiceLocality[i] = l;
    }
  });
  return { codes: practices.map((p) => p.code), localities, practiceLocality };
}

// Garwood intervals depend only on the count and the level: each is computed once and kept.
const intervals = new Map<number, [number, number][]>();

function countInterval(observed: number, confidence: number): [number, number] {
  let byCount = intervals.get(confidence);
  if (byCount === undefined) {
    if (intervals.size >= 4) intervals.clear();
    byCount = [];
    intervals.set(confidence, byCount);
  }
  let interval = byCount[observed];
  if (interval === undefined) {
    const { lower, upper } = poissonInterval(observed, confidence);
    interval = [lower, upper];
    byCount[observed] = interval;
  }
  return interval;
}

function summary(od: ReturnType<typeof overdispersionOfColumns>): OverdispersionSummary {
  return {
    phi: od.phi,
    tau2: od.tau2,
    present: od.present,
    statistic: od.statistic,
    critical: od.critical,
    bounds: od.bounds,
  };
}

/** Split k of measure m of a per-group column, for every unit, into `out`. */
function splitColumn(
  column: Uint32Array,
  M: number,
  m: number,
  k: number,
  out: Float64Array,
): void {
  const units = column.length / (2 * M);
  for (let u = 0; u < units; u++) {
    const x = (u * M + m) * 2;
    out[u] =
      k === 0 ? (column[x] as number) + (column[x + 1] as number) : (column[x + k - 1] as number);
  }
}

/** The region's total of split k of measure m over the practices (0 … P − 1). */
function regionTotal(
  column: Uint32Array | Float64Array,
  M: number,
  m: number,
  k: number,
  P: number,
): number {
  let total = 0;
  for (let p = 0; p < P; p++) {
    const x = (p * M + m) * 2;
    total +=
      k === 0 ? (column[x] as number) + (column[x + 1] as number) : (column[x + k - 1] as number);
  }
  return total;
}

/**
 * One level's comparison (practices or localities) on one measure and split: median of the
 * rates, over-dispersion, limits once per distinct n, each unit's flags (written to `flags` at
 * `first` + i·`stride`) and the funnel curves.
 */
function compareLevel(
  events: Float64Array,
  n: Float64Array,
  theta0: number | null,
  options: Required<BenchmarkOptions>,
  rates: Float64Array,
  flags: Uint8Array,
  first: number,
  stride: number,
): LevelComparison {
  const count = n.length;
  let units = 0;
  for (let i = 0; i < count; i++) {
    const size = n[i] as number;
    if (size > 0) rates[units++] = (events[i] as number) / size;
  }
  const middle = medianOfUnsorted(rates.subarray(0, units));
  if (theta0 === null) return { units, median: middle, overdispersion: null, curves: null };
  const od = summary(overdispersionOfColumns(events, n, theta0));
  const table = limitsTable(theta0, n, od, options.overdispersion);
  // Table index of each n (n are whole numbers up to the largest).
  const largest = table.n.length > 0 ? (table.n[table.n.length - 1] as number) : 0;
  const index = new Int32Array(largest + 1).fill(-1);
  table.n.forEach((size, i) => (index[size] = i));
  for (let i = 0; i < count; i++) {
    const size = n[i] as number;
    const e = events[i] as number;
    const t = index[size] as number;
    flags[first + i * stride] =
      flagCode(e, size, table.exact, t) * 8 + flagCode(e, size, table.adjusted, t);
  }
  const curves =
    units > 0
      ? funnelCurves(theta0, curveGrid(n, options.curvePoints), od, options.overdispersion, table)
      : null;
  return { units, median: middle, overdispersion: od, curves };
}

export function buildBenchmark(input: BuildBenchmarkInput): Benchmark {
  const layout = sumsLayout(input.measureSet);
  const w = reviewWindow(input.quarter, layout.compiled.retinalWindowMonths);
  const options = resolveOptions(input.options);
  const practices = input.practices;
  const units = resolveCodes(practices, (i) => {
    const p = practices[i] as BenchmarkPracticeInput;
    if (p.sums === null || typeof p.sums !== 'object') {
      throw new RangeError(`practices[${i}].sums must be the practice's sums`);
    }
    assertSumsOf(p.sums, layout, w.quarter, `the sums of practice ${p.code}`);
  });
  const sums = practices.map((p) => p.sums);
  return benchmarkOf(
    layout,
    w,
    options,
    units,
    sums,
    sums.map((s) => s.insulin),
  );
}

/**
 * The same benchmark as `buildBenchmark` from what it reads of each practice's sums (its
 * parts) and the region's life table: a rebuild after one practice's confirm keeps the parts of
 * every other practice and needs no practice's full sums. The same parts and life-table totals
 * in the same order give the same benchmark, bit for bit.
 */
export function buildBenchmarkOfParts(input: BenchmarkPartsInput): Benchmark {
  const layout = sumsLayout(input.measureSet);
  const w = reviewWindow(input.quarter, layout.compiled.retinalWindowMonths);
  const options = resolveOptions(input.options);
  const practices = input.practices;
  const M = layout.compiled.measures.length;
  const units = resolveCodes(practices, (i) => {
    const parts = (practices[i] as BenchmarkPartsInput['practices'][number]).parts;
    if (
      parts === null ||
      typeof parts !== 'object' ||
      parts.tallies?.length !== M * 6 ||
      parts.records?.length !== 4 ||
      parts.strata?.values?.length !== (parts.strata?.ids?.length ?? -1) * layout.valuesPerStratum
    ) {
      throw new RangeError(`practices[${i}].parts are not the parts of sums of this measure set`);
    }
  });
  return benchmarkOf(
    layout,
    w,
    options,
    units,
    practices.map((p) => p.parts),
    input.insulin,
  );
}

function benchmarkOf(
  layout: SumsLayout,
  w: ReturnType<typeof reviewWindow>,
  options: Required<BenchmarkOptions>,
  units: { codes: string[]; localities: string[]; practiceLocality: Int32Array },
  sums: readonly BenchmarkParts[],
  insulin: readonly PracticeSums['insulin'][],
): Benchmark {
  const { codes, localities, practiceLocality } = units;
  const compiled = layout.compiled;
  const M = compiled.measures.length;
  const P = codes.length;
  const L = localities.length;
  const U = P + L;

  const tallies = unitTallies(layout, sums, practiceLocality, L);
  const expected = expectedFromSums(layout, sums, practiceLocality, L);
  const flags = new Uint8Array(U * M * 3);
  const comparisons: MeasureComparison[] = [];
  const events = new Float64Array(U);
  const n = new Float64Array(U);
  const rates = new Float64Array(U);
  for (let m = 0; m < M; m++) {
    const measure = compiled.measures[m] as CompiledMeasureSet['measures'][number];
    const nColumn = measure.denominator === 'eligible' ? tallies.denominator : tallies.measured;
    for (let k = 0; k < 3; k++) {
      splitColumn(tallies.events, M, m, k, events);
      splitColumn(nColumn, M, m, k, n);
      let regionEvents = 0;
      let regionN = 0;
      for (let p = 0; p < P; p++) {
        regionEvents += events[p] as number;
        regionN += n[p] as number;
      }
      const theta0 = regionN > 0 ? regionEvents / regionN : null;
      const level = (from: number, count: number): LevelComparison =>
        compareLevel(
          events.subarray(from, from + count),
          n.subarray(from, from + count),
          theta0,
          options,
          rates,
          flags,
          (from * M + m) * 3 + k,
          M * 3,
        );
      comparisons.push({
        measure: measure.key,
        split: TYPE_SPLITS[k] as MeasureComparison['split'],
        events: regionEvents,
        denominator: regionTotal(tallies.denominator, M, m, k, P),
        measured: regionTotal(tallies.measured, M, m, k, P),
        n: regionN,
        theta0,
        expected: regionTotal(expected, M, m, k, P),
        practice: level(0, P),
        locality: level(P, L),
      });
    }
  }

  // Garwood intervals of every observed count with a ratio (E > 0), computed once each.
  let largestObserved = 0;
  for (let x = 0; x < U * M; x++) {
    const o = (tallies.events[2 * x] as number) + (tallies.events[2 * x + 1] as number);
    if (o > largestObserved) largestObserved = o;
  }
  const needed = new Uint8Array(largestObserved + 1);
  for (let u = 0; u < U; u++) {
    for (let m = 0; m < M; m++) {
      const x = (u * M + m) * 2;
      const e0 = expected[x] as number;
      const e1 = expected[x + 1] as number;
      const o0 = tallies.events[x] as number;
      const o1 = tallies.events[x + 1] as number;
      if (e0 + e1 > 0) needed[o0 + o1] = 1;
      if (e0 > 0) needed[o0] = 1;
      if (e1 > 0) needed[o1] = 1;
    }
  }
  const poisson: Benchmark['poisson'] = { observed: [], lower: [], upper: [] };
  for (let o = 0; o <= largestObserved; o++) {
    if (needed[o] === 0) continue;
    const interval = countInterval(o, options.confidence);
    poisson.observed.push(o);
    poisson.lower.push(interval[0]);
    poisson.upper.push(interval[1]);
  }

  // The region's time to insulin.
  let excluded = 0;
  const lifeTable: SurvivalCount[] = [];
  for (const table of insulin) {
    excluded += table.excluded;
    const c = table.counts;
    for (let y = 0; 2 * y < c.length; y++) {
      const row = lifeTable[y] ?? (lifeTable[y] = { time: y, events: 0, censored: 0 });
      row.events += c[2 * y] as number;
      row.censored += c[2 * y + 1] as number;
    }
  }
  const km = kaplanMeierFromCounts(lifeTable.filter((r) => r !== undefined));

  let total = 0;
  let eligible = 0;
  let unknownType = 0;
  let underAge = 0;
  for (let p = 0; p < P; p++) {
    total += tallies.records[p * 4] as number;
    eligible += tallies.records[p * 4 + 1] as number;
    unknownType += tallies.records[p * 4 + 2] as number;
    underAge += tallies.records[p * 4 + 3] as number;
  }

  return {
    format: BENCHMARK_FORMAT,
    measureSetId: compiled.id,
    fingerprint: layout.fingerprint,
    quarter: w.quarter,
    window: { start: w.start, end: w.end },
    options,
    measures: compiled.measures.map((m) => ({
      key: m.key,
      label: m.label,
      source: m.source,
      note: m.note,
      group: m.group,
      composite: m.composite,
      denominator: m.denominator,
      direction: m.direction,
    })),
    splits: [...TYPE_SPLITS],
    practices: codes,
    localities,
    practiceLocality: Array.from(practiceLocality),
    records: { total, eligible, unknownType, underAge },
    comparisons,
    poisson,
    progression: { n: km.n, events: km.events, excluded, median: km.median },
    columns: {
      records: packColumn(tallies.records.subarray(0, P * 4)),
      events: packColumn(tallies.events.subarray(0, P * M * 2)),
      denominator: packColumn(tallies.denominator.subarray(0, P * M * 2)),
      measured: packColumn(tallies.measured.subarray(0, P * M * 2)),
      expected: packColumn(expected.subarray(0, P * M * 2)),
      flags: packColumn(flags.subarray(0, P * M * 3)),
      localityFlags: packColumn(flags.subarray(P * M * 3)),
    },
  };
}
