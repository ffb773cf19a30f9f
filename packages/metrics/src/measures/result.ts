import {
  type BreakdownDimension,
  type DimensionKey,
  type MeasureInfo,
  TYPE_SPLITS,
  type TypeSplit,
} from './compile.js';
import type { HistogramLayout } from './layout.js';
import type { AuditQuarter, ReviewWindow } from './quarter.js';
import { standardisedRatio } from '../stats/indirect-standardise.js';
import type { Interval } from '../stats/interval.js';

/**
 * The result of evaluating a measure set over a quarter's records, identical from the plain
 * and the columnar path. Counts are held in typed arrays (a national run has millions of
 * cells); read them through the functions below rather than by index.
 *
 * Units: practices (index 0 … P − 1, in `practices` order), then localities (P … P + L − 1),
 * then the region (P + L). Type groups: 0 type 1, 1 type 2 and other; the split 'all' is their
 * sum. Categories: 0 is everyone, then each breakdown dimension's categories (`dimensions`).
 *
 * The outcome histograms are in the packed layout of layout.ts, in blocks of K cells
 * (`layout.cellsPerBlock`) per unit, type group g and category c:
 * - localities and the region (`rollupCounts`, unit v = u − P): categories c ≥ 1 at
 *   ((v·2 + g)·(C − 1) + c − 1)·K; category 0 (everyone) is the sum of the four sex categories;
 * - practices (`counts`): by default only everyone, at (u·2 + g)·K; with `practiceBreakdowns`
 *   like localities, categories c ≥ 1 at ((u·2 + g)·(C − 1) + c − 1)·K. Practice counts are 16-bit when every practice has fewer than
 * 65,536 records (halving the memory of the largest array), else 32-bit;
 * each measure's counts by outcome are sums over the cells of its pack. `aggregate` and
 * `unitAggregates` do this; events = met, measured = not met + met, denominator = unknown +
 * not met + met (records excluded from the measure's population are in none of them).
 */
export interface EvaluationResult {
  measureSetId: string;
  quarter: AuditQuarter;
  window: ReviewWindow;
  measures: readonly MeasureInfo[];
  dimensions: readonly BreakdownDimension[];
  categoryCount: number;
  practices: readonly string[];
  localities: readonly string[];
  /** Locality index of each practice, −1 for none. */
  practiceLocality: Int32Array;
  layout: HistogramLayout;
  /** Whether practices have breakdown categories (see above). */
  practiceBreakdowns: boolean;
  /** Histogram cells of the practices (see above). */
  counts: Uint16Array | Uint32Array;
  /** Histogram cells of the localities, then the region. */
  rollupCounts: Uint32Array;
  /**
   * Eligible records per unit, type group and category: ((u·2 + g)·C + c); for practices only
   * category 0 unless `practiceBreakdowns`.
   */
  eligible: Uint32Array;
  /**
   * Records per unit (u·4 + k): k = 0 all records, 1 eligible, 2 not eligible for an unknown
   * diabetes type, 3 not eligible for age below the eligibility minimum.
   */
  records: Uint32Array;
  /**
   * Case-mix expected events (indirect standardisation over the region's strata) per unit,
   * type group and measure: (u·2 + g)·M + m; null when not computed.
   */
  expected: Float64Array | null;
}

export type Level = 'practice' | 'locality' | 'region';

export interface Aggregate {
  /** Records meeting the measure (care process complete, target met). */
  events: number;
  /** Records in the measure's population. */
  denominator: number;
  /** Records in the population with a known outcome (for care processes: the denominator). */
  measured: number;
  /** The denominator the measure declares: `denominator` or `measured`. */
  n: number;
  /** events / n, or null when n = 0. */
  rate: number | null;
}

export interface AggregateQuery {
  measure: string;
  level?: Level;
  /** Practice or locality code (not for the region). */
  unit?: string;
  split?: TypeSplit;
  dimension?: DimensionKey;
  category?: string;
}

export function measureIndex(result: EvaluationResult, key: string): number {
  const index = result.measures.findIndex((m) => m.key === key);
  if (index < 0)
    throw new RangeError(`measure "${key}" is not in measure set ${result.measureSetId}`);
  return index;
}

/** Unit index of a level and code. */
export function unitIndex(result: EvaluationResult, level: Level, code?: string): number {
  const P = result.practices.length;
  const L = result.localities.length;
  if (level === 'region') return P + L;
  if (level === 'practice') {
    const i = result.practices.indexOf(code ?? '');
    if (i < 0) throw new RangeError(`unit: practice "${code}" has no records in this result`);
    return i;
  }
  if (level === 'locality') {
    const i = result.localities.indexOf(code ?? '');
    if (i < 0) throw new RangeError(`unit: locality "${code}" is not in this result`);
    return P + i;
  }
  throw new RangeError(`level must be practice, locality or region (got ${String(level)})`);
}

/** Category index of a dimension and category key (0 for everyone). */
export function categoryIndex(
  result: EvaluationResult,
  dimension?: DimensionKey,
  category?: string,
): number {
  if (dimension === undefined) return 0;
  const d = result.dimensions.find((x) => x.key === dimension);
  if (d === undefined) throw new RangeError(`dimension "${dimension}" is not known`);
  const c = d.categories.findIndex((x) => x.key === category);
  if (c < 0) {
    throw new RangeError(
      `category "${String(category)}" is not a category of ${dimension} (${d.categories
        .map((x) => x.key)
        .join(', ')})`,
    );
  }
  return d.offset + c;
}

function typeGroups(split: TypeSplit): readonly number[] {
  if (split === 'all') return [0, 1];
  if (split === 'type1') return [0];
  if (split === 'type2_other') return [1];
  throw new RangeError(`split must be one of ${TYPE_SPLITS.join(', ')} (got ${String(split)})`);
}

/** The aggregate at raw indices (no lookups). */
export function aggregateAt(
  result: EvaluationResult,
  unit: number,
  split: TypeSplit,
  category: number,
  measure: number,
): Aggregate {
  const C = result.categoryCount;
  const K = result.layout.cellsPerBlock;
  const pack = result.layout.packs[result.layout.measurePack[measure] as number];
  const cellCodes = result.layout.cellCodes[measure];
  if (pack === undefined || cellCodes === undefined) {
    throw new RangeError(`measure index ${measure} is out of range`);
  }
  const byCode = [0, 0, 0, 0];
  const sexOffset = result.dimensions.find((d) => d.key === 'sex')?.offset ?? 1;
  for (const g of typeGroups(split)) {
    const P = result.practices.length;
    let stored: number[];
    let array: Uint16Array | Uint32Array;
    if (unit < P && !result.practiceBreakdowns) {
      if (category !== 0) {
        throw new RangeError(
          'category: practice breakdowns were not computed (evaluate with practiceBreakdowns: true)',
        );
      }
      array = result.counts;
      stored = [(unit * 2 + g) * K];
    } else {
      array = unit < P ? result.counts : result.rollupCounts;
      const v = unit < P ? unit : unit - P;
      // Category 0 (everyone) is stored as its four sex categories.
      const cats =
        category === 0 ? [sexOffset, sexOffset + 1, sexOffset + 2, sexOffset + 3] : [category];
      stored = cats.map((c) => ((v * 2 + g) * (C - 1) + c - 1) * K);
    }
    for (const start of stored) {
      const base = start + pack.offset;
      for (let cell = 0; cell < cellCodes.length; cell++) {
        const code = cellCodes[cell] as number;
        byCode[code] = (byCode[code] as number) + (array[base + cell] as number);
      }
    }
  }
  const unknown = byCode[1] as number;
  const notMet = byCode[2] as number;
  const met = byCode[3] as number;
  const denominator = unknown + notMet + met;
  const measured = notMet + met;
  const kind = (result.measures[measure] as MeasureInfo).denominator;
  const n = kind === 'eligible' ? denominator : measured;
  return { events: met, denominator, measured, n, rate: n > 0 ? met / n : null };
}

/** One aggregate: a measure for a unit, type split and optional breakdown category. */
export function aggregate(result: EvaluationResult, query: AggregateQuery): Aggregate {
  const level = query.level ?? 'region';
  return aggregateAt(
    result,
    unitIndex(result, level, query.unit),
    query.split ?? 'all',
    categoryIndex(result, query.dimension, query.category),
    measureIndex(result, query.measure),
  );
}

export interface UnitAggregate extends Aggregate {
  code: string;
}

/** One measure for every unit of a level (practices in `practices` order, or localities). */
export function unitAggregates(
  result: EvaluationResult,
  measure: string,
  options: {
    level?: Exclude<Level, 'region'>;
    split?: TypeSplit;
    dimension?: DimensionKey;
    category?: string;
  } = {},
): UnitAggregate[] {
  const m = measureIndex(result, measure);
  const c = categoryIndex(result, options.dimension, options.category);
  const split = options.split ?? 'all';
  const level = options.level ?? 'practice';
  const codes = level === 'practice' ? result.practices : result.localities;
  const offset = level === 'practice' ? 0 : result.practices.length;
  return codes.map((code, i) => ({ code, ...aggregateAt(result, offset + i, split, c, m) }));
}

/** Eligible records of a unit (optionally one type split and category). */
export function eligibleCount(
  result: EvaluationResult,
  query: Omit<AggregateQuery, 'measure'> = {},
): number {
  const u = unitIndex(result, query.level ?? 'region', query.unit);
  const c = categoryIndex(result, query.dimension, query.category);
  if (u < result.practices.length && c !== 0 && !result.practiceBreakdowns) {
    throw new RangeError(
      'category: practice breakdowns were not computed (evaluate with practiceBreakdowns: true)',
    );
  }
  let n = 0;
  for (const g of typeGroups(query.split ?? 'all')) {
    n += result.eligible[(u * 2 + g) * result.categoryCount + c] as number;
  }
  return n;
}

/** Record counts of a unit: all, eligible, excluded for unknown type, excluded by age. */
export function recordCounts(
  result: EvaluationResult,
  level: Level = 'region',
  unit?: string,
): { total: number; eligible: number; unknownType: number; underAge: number } {
  const u = unitIndex(result, level, unit);
  return {
    total: result.records[u * 4] as number,
    eligible: result.records[u * 4 + 1] as number,
    unknownType: result.records[u * 4 + 2] as number,
    underAge: result.records[u * 4 + 3] as number,
  };
}

export interface CaseMixRow {
  code: string;
  observed: number;
  expected: number;
  n: number;
  ratio: number | null;
  interval: Interval;
  adjustedRate: number | null;
}

/**
 * Case-mix-adjusted comparison of one measure (indirect standardisation, methods §8): per unit
 * O (events), E (expected from the region's stratum rates), O/E with its exact Poisson
 * interval, and the adjusted rate (O/E)·θ₀ with θ₀ the region's rate for the split.
 */
export function caseMixRatios(
  result: EvaluationResult,
  measure: string,
  options: { level?: Exclude<Level, 'region'>; split?: TypeSplit; confidence?: number } = {},
): CaseMixRow[] {
  if (result.expected === null) {
    throw new RangeError('the result was evaluated without case mix (caseMix: false)');
  }
  const m = measureIndex(result, measure);
  const split = options.split ?? 'all';
  const M = result.measures.length;
  const level = options.level ?? 'practice';
  const codes = level === 'practice' ? result.practices : result.localities;
  const offset = level === 'practice' ? 0 : result.practices.length;
  const region = aggregateAt(
    result,
    result.practices.length + result.localities.length,
    split,
    0,
    m,
  );
  const expected = result.expected;
  return codes.map((code, i) => {
    const u = offset + i;
    const a = aggregateAt(result, u, split, 0, m);
    let e = 0;
    for (const g of typeGroups(split)) e += expected[(u * 2 + g) * M + m] as number;
    return {
      code,
      observed: a.events,
      expected: e,
      n: a.n,
      ...standardisedRatio(a.events, e, region.rate, options.confidence ?? 0.95),
    };
  });
}
