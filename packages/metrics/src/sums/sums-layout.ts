import { sha256, toHex } from '../disclosure/sha256.js';
import { utf8Bytes } from '../disclosure/utf8.js';
import {
  CODE_NOT_MET,
  CODE_UNKNOWN,
  compileMeasureSet,
  type CompiledMeasureSet,
} from '../measures/compile.js';
import {
  histogramLayout,
  type HistogramLayout,
  isRestricted,
  PACK_CELLS_WITH_PRACTICE_BREAKDOWNS,
} from '../measures/layout.js';
import type { MeasureSet } from '../measures/schema.js';
import { INSULIN_MAX_YEARS } from '../progression/insulin.js';
import { KIDNEY_CELLS, KIDNEY_COLUMNS, KIDNEY_ROWS } from './kidney-grid.js';
import { histogramSlots, VALUE_HISTOGRAMS } from './value-bins.js';

/**
 * The layout of a practice's benchmark sums under one measure set: the sizes and offsets of
 * every section of `PracticeSums` (practice-sums.ts), and a fingerprint of everything the sums
 * depend on (the measure set's id and content, the histogram packing, the strata, the bins),
 * written into the encoded sums so that sums made under another measure set, or by a build that
 * lays them out differently, are refused rather than misread.
 *
 * Sections (g = type group, 0 type 1, 1 type 2 and other):
 * - cells: the outcome histograms of every breakdown category, as `evaluateColumns` keeps them
 *   with `practiceBreakdowns: true` (result.ts): block (g·(C − 1) + c − 1)·K for category
 *   c = 1 … C − 1 (everyone is the sum of the four sex categories);
 * - eligible: eligible records per g·C + c (c = 0 everyone);
 * - strata: the case-mix strata the practice's eligible records fall in (compile.ts: type ×
 *   age band × sex × deprivation × duration band), sorted, with `valuesPerStratum` counts each:
 *   [records, events of each measure, n of each measure in `ownN`]. A measure not in `ownN` has
 *   n = the stratum's records (its population is everyone and its n cannot differ);
 * - insulin: the type 2 life table, events and censored per whole year since diagnosis;
 * - values: per g, the value histograms of value-bins.ts, one after another;
 * - kidney: per g, the KDIGO grid of kidney-grid.ts.
 */
export const SUMS_FORMAT_VERSION = 1;

export interface SumsLayout {
  readonly compiled: CompiledMeasureSet;
  /** The packed histogram layout (16-cell packs, as with practice breakdowns). */
  readonly histogram: HistogramLayout;
  /** First 16 hex characters of SHA-256 of the layout description. */
  readonly fingerprint: string;
  readonly categories: number;
  readonly cellsPerBlock: number;
  /** 2·(C − 1)·K. */
  readonly cellCount: number;
  /** 2·C. */
  readonly eligibleCount: number;
  readonly strataCount: number;
  /** Strata per diabetes type (a stratum's type is ⌊stratum / strataPerType⌋: 0 type 1). */
  readonly strataPerType: number;
  readonly valuesPerStratum: number;
  /** Measures with an n of their own in the strata, and each measure's n slot in a stratum. */
  readonly ownN: readonly number[];
  readonly nSlot: Int32Array;
  /** Offset of each value histogram within a type group's values, and the group's length. */
  readonly valueOffsets: readonly number[];
  readonly valuesPerGroup: number;
  readonly kidneyPerGroup: number;
  readonly insulinMaxYears: number;
  /** Per measure: whether a cell's outcome code is in its n, and whether it is an event. */
  readonly inN: (code: number, measure: number) => boolean;
}

/** Whether an outcome code counts in a measure's n (its declared denominator). */
function countsInN(compiled: CompiledMeasureSet, m: number, code: number): boolean {
  return compiled.measures[m]?.denominator === 'measured'
    ? code >= CODE_NOT_MET
    : code >= CODE_UNKNOWN;
}

function describe(compiled: CompiledMeasureSet, histogram: HistogramLayout): string {
  return JSON.stringify({
    format: SUMS_FORMAT_VERSION,
    id: compiled.id,
    eligibilityMinAge: compiled.eligibilityMinAge,
    retinalWindowMonths: compiled.retinalWindowMonths,
    measures: compiled.measures.map((m) => [m.key, m.denominator, m.population]),
    nodes: compiled.nodes,
    measureNode: compiled.measureNode,
    ageBands: compiled.ageBands,
    durationBands: compiled.durationBands,
    categories: compiled.dimensions.map((d) => [d.key, d.offset, d.categories.map((c) => c.key)]),
    strataCount: compiled.strataCount,
    packs: histogram.packs.map((p) => [p.offset, p.cells, p.measures]),
    radix: histogram.measureRadix,
    values: VALUE_HISTOGRAMS,
    kidney: [KIDNEY_ROWS, KIDNEY_COLUMNS],
    insulinMaxYears: INSULIN_MAX_YEARS,
  });
}

function build(compiled: CompiledMeasureSet): SumsLayout {
  const histogram = histogramLayout(compiled, PACK_CELLS_WITH_PRACTICE_BREAKDOWNS);
  const M = compiled.measures.length;
  const ownN: number[] = [];
  const nSlot = new Int32Array(M);
  compiled.measures.forEach((m, i) => {
    // n equals the stratum's records when the population is everyone and either the
    // denominator is every eligible record or the outcome is never unknown (radix 2).
    const same =
      !isRestricted(m) && (m.denominator === 'eligible' || histogram.measureRadix[i] === 2);
    if (same) nSlot[i] = 0;
    else {
      nSlot[i] = 1 + M + ownN.length;
      ownN.push(i);
    }
  });
  const valueOffsets: number[] = [];
  let offset = 0;
  for (const spec of VALUE_HISTOGRAMS) {
    valueOffsets.push(offset);
    offset += histogramSlots(spec);
  }
  const C = compiled.categoryCount;
  const K = histogram.cellsPerBlock;
  const A = compiled.ageBands.length;
  const D = compiled.durationBands.length + 1;
  return {
    compiled,
    histogram,
    fingerprint: toHex(sha256(utf8Bytes(describe(compiled, histogram)))).slice(0, 16),
    categories: C,
    cellsPerBlock: K,
    cellCount: 2 * (C - 1) * K,
    eligibleCount: 2 * C,
    strataCount: compiled.strataCount,
    strataPerType: A * 4 * 6 * D,
    valuesPerStratum: 1 + M + ownN.length,
    ownN,
    nSlot,
    valueOffsets,
    valuesPerGroup: offset,
    kidneyPerGroup: KIDNEY_CELLS,
    insulinMaxYears: INSULIN_MAX_YEARS,
    inN: (code, m) => countsInN(compiled, m, code),
  };
}

const cache = new WeakMap<object, SumsLayout>();

/** The sums layout of a measure set (cached per measure-set object). */
export function sumsLayout(measureSet: MeasureSet | CompiledMeasureSet | SumsLayout): SumsLayout {
  if ('fingerprint' in measureSet && 'compiled' in measureSet) return measureSet;
  const cached = cache.get(measureSet);
  if (cached !== undefined) return cached;
  const compiled = 'nodes' in measureSet ? measureSet : compileMeasureSet(measureSet);
  const layout = build(compiled);
  cache.set(measureSet, layout);
  if (compiled !== measureSet) cache.set(compiled, layout);
  return layout;
}
