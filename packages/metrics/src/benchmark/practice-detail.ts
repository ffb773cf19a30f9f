import { type DimensionKey, TYPE_SPLITS, type TypeSplit } from '../measures/compile.js';
import type { AuditQuarter } from '../measures/quarter.js';
import type { MeasureSet } from '../measures/schema.js';
import type { CompiledMeasureSet } from '../measures/compile.js';
import type { Interval } from '../stats/interval.js';
import { kaplanMeierFromCounts, type SurvivalEstimate } from '../stats/kaplan-meier.js';
import { wilsonInterval } from '../stats/wilson-interval.js';
import { KIDNEY_COLUMNS, KIDNEY_ROWS } from '../sums/kidney-grid.js';
import { assertSumsOf, type PracticeSums } from '../sums/practice-sums.js';
import { sumsLayout, type SumsLayout } from '../sums/sums-layout.js';
import { addTallies } from '../sums/sums-tallies.js';
import { binEdges, histogramSlots, VALUE_HISTOGRAMS } from '../sums/value-bins.js';

/**
 * One practice's page, read at request time from its own sums and the region's merged sums
 * (merge-sums.ts), so that the stored benchmark need not carry it for every practice: each
 * measure by age band, sex, deprivation quintile and duration band against the region's rates
 * in the same categories (docs/methods.md §1), with the practice's Wilson interval; the KDIGO
 * grid (docs/methods.md §4); the type 2 time to insulin by Kaplan–Meier, steps and median
 * (docs/methods.md §5); and the value histograms. The region's figures include the practice.
 */
export interface DetailCounts {
  events: number;
  denominator: number;
  measured: number;
  n: number;
  rate: number | null;
}

export interface DetailCell {
  practice: DetailCounts & { interval: Interval };
  region: DetailCounts;
}

export interface PracticeDetail {
  measureSetId: string;
  quarter: AuditQuarter;
  dimensions: { key: DimensionKey; label: string; categories: { key: string; label: string }[] }[];
  measures: {
    key: string;
    label: string;
    direction: 'higher' | 'lower';
    denominator: 'eligible' | 'measured';
    splits: {
      split: TypeSplit;
      everyone: DetailCell;
      /** Per dimension key, one cell per category in the dimension's order. */
      categories: Record<DimensionKey, DetailCell[]>;
    }[];
  }[];
  kidney: {
    rows: readonly string[];
    columns: readonly string[];
    splits: { split: TypeSplit; practice: number[][]; region: number[][] }[];
  };
  progression: {
    practice: SurvivalEstimate & { excluded: number };
    region: SurvivalEstimate & { excluded: number };
  };
  values: {
    key: string;
    label: string;
    unit: string;
    /** Bin edges: bin i is edges[i] ≤ value < edges[i + 1]. */
    edges: number[];
    splits: { split: TypeSplit; practice: HistogramCounts; region: HistogramCounts }[];
  }[];
}

export interface HistogramCounts {
  notRecorded: number;
  below: number;
  bins: number[];
  above: number;
}

function groupsOf(split: TypeSplit): number[] {
  return split === 'all' ? [0, 1] : split === 'type1' ? [0] : [1];
}

/** Tallies of every measure for a split and category: events 3m, measured 3m + 1, denominator 3m + 2. */
function tallies(
  layout: SumsLayout,
  sums: PracticeSums,
  split: TypeSplit,
  c: number,
): Float64Array {
  const out = new Float64Array(3 * layout.compiled.measures.length);
  const block = new Float64Array(layout.cellsPerBlock);
  for (const g of groupsOf(split)) addTallies(layout, sums.cells, g, c, block, out);
  return out;
}

function counts(t: Float64Array, m: number, kind: 'eligible' | 'measured'): DetailCounts {
  const events = t[3 * m] as number;
  const measured = t[3 * m + 1] as number;
  const denominator = t[3 * m + 2] as number;
  const n = kind === 'eligible' ? denominator : measured;
  return { events, denominator, measured, n, rate: n > 0 ? events / n : null };
}

function survival(sums: PracticeSums): SurvivalEstimate & { excluded: number } {
  const c = sums.insulin.counts;
  const rows = [];
  for (let y = 0; 2 * y < c.length; y++) {
    rows.push({ time: y, events: c[2 * y] as number, censored: c[2 * y + 1] as number });
  }
  return { ...kaplanMeierFromCounts(rows), excluded: sums.insulin.excluded };
}

export function practiceDetail(
  practice: PracticeSums,
  region: PracticeSums,
  measureSet: MeasureSet | CompiledMeasureSet | SumsLayout,
  options: { confidence?: number } = {},
): PracticeDetail {
  const layout = sumsLayout(measureSet);
  assertSumsOf(practice, layout, null, "the practice's sums");
  assertSumsOf(region, layout, practice.quarter, "the region's sums");
  const confidence = options.confidence ?? 0.95;
  const compiled = layout.compiled;
  const C = layout.categories;
  const splits = [...TYPE_SPLITS];
  // Tallies per split and category, for the practice and the region.
  const table = (sums: PracticeSums): Float64Array[][] =>
    splits.map((split) => Array.from({ length: C }, (_, c) => tallies(layout, sums, split, c)));
  const ours = table(practice);
  const theirs = table(region);
  const cell = (k: number, c: number, m: number, kind: 'eligible' | 'measured'): DetailCell => {
    const p = counts((ours[k] as Float64Array[])[c] as Float64Array, m, kind);
    return {
      practice: { ...p, interval: wilsonInterval(p.events, p.n, confidence) },
      region: counts((theirs[k] as Float64Array[])[c] as Float64Array, m, kind),
    };
  };
  const measures = compiled.measures.map((measure, m) => ({
    key: measure.key,
    label: measure.label,
    direction: measure.direction,
    denominator: measure.denominator,
    splits: splits.map((split, k) => {
      const categories = {} as Record<DimensionKey, DetailCell[]>;
      for (const d of compiled.dimensions) {
        categories[d.key] = d.categories.map((_, i) =>
          cell(k, d.offset + i, m, measure.denominator),
        );
      }
      return { split, everyone: cell(k, 0, m, measure.denominator), categories };
    }),
  }));

  const R = KIDNEY_ROWS.length;
  const Q = KIDNEY_COLUMNS.length;
  const grid = (sums: PracticeSums, split: TypeSplit): number[][] =>
    Array.from({ length: R }, (_, r) =>
      Array.from({ length: Q }, (_, q) =>
        groupsOf(split).reduce(
          (sum, g) => sum + (sums.kidney[g * layout.kidneyPerGroup + r * Q + q] as number),
          0,
        ),
      ),
    );

  const histogram = (sums: PracticeSums, split: TypeSplit, h: number): HistogramCounts => {
    const spec = VALUE_HISTOGRAMS[h] as (typeof VALUE_HISTOGRAMS)[number];
    const slots = histogramSlots(spec);
    const at = (slot: number): number =>
      groupsOf(split).reduce(
        (sum, g) =>
          sum +
          (sums.values[
            g * layout.valuesPerGroup + (layout.valueOffsets[h] as number) + slot
          ] as number),
        0,
      );
    return {
      notRecorded: at(0),
      below: at(1),
      bins: Array.from({ length: spec.bins }, (_, i) => at(2 + i)),
      above: at(slots - 1),
    };
  };

  return {
    measureSetId: compiled.id,
    quarter: { year: practice.quarter.year, quarter: practice.quarter.quarter },
    dimensions: compiled.dimensions.map((d) => ({
      key: d.key,
      label: d.label,
      categories: d.categories.map((c) => ({ key: c.key, label: c.label })),
    })),
    measures,
    kidney: {
      rows: KIDNEY_ROWS,
      columns: KIDNEY_COLUMNS,
      splits: splits.map((split) => ({
        split,
        practice: grid(practice, split),
        region: grid(region, split),
      })),
    },
    progression: { practice: survival(practice), region: survival(region) },
    values: VALUE_HISTOGRAMS.map((spec, h) => ({
      key: spec.key,
      label: spec.label,
      unit: spec.unit,
      edges: binEdges(spec),
      splits: splits.map((split) => ({
        split,
        practice: histogram(practice, split, h),
        region: histogram(region, split, h),
      })),
    })),
  };
}
