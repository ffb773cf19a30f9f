import { bandCode, FUNNEL_INNER, FUNNEL_OUTER } from '../stats/funnel-flag.js';
import { funnelLimits } from '../stats/funnel-limits.js';
import { overdispersedLimits, type OverdispersionMethod } from '../stats/overdispersed-limits.js';
import type { FlagCode, FunnelCurves, OverdispersionSummary } from './benchmark.js';

/**
 * Funnel limits (Spiegelhalter, Stat Med 2005;24:1185–202) once per distinct n rather than once
 * per unit: the exact binomial limits with interpolation at 95 % and 99.8 % (funnel-limits.ts)
 * and the over-dispersion-adjusted limits (overdispersed-limits.ts; the exact ones where no
 * over-dispersion is present, as that function gives). The build and the accessors use the same
 * table, so a unit's stored flag and its recomputed limits always agree.
 */
export interface LimitsTable {
  /** The distinct n > 0, ascending. */
  n: Float64Array;
  /** Per n at 4i: inner lower, inner upper, outer lower, outer upper. */
  exact: Float64Array;
  adjusted: Float64Array;
}

function widened(od: OverdispersionSummary | null): boolean {
  return od !== null && od.present && od.phi !== null && od.tau2 !== null;
}

function fill(
  out: Float64Array,
  i: number,
  inner: { lower: number | null; upper: number | null },
  outer: { lower: number | null; upper: number | null },
): void {
  out[4 * i] = inner.lower as number;
  out[4 * i + 1] = inner.upper as number;
  out[4 * i + 2] = outer.lower as number;
  out[4 * i + 3] = outer.upper as number;
}

/** Limits at each distinct n of `ns` (zeros are skipped) around θ₀. */
export function limitsTable(
  theta0: number,
  ns: ArrayLike<number>,
  od: OverdispersionSummary | null,
  method: OverdispersionMethod,
  known: LimitsTable | null = null,
): LimitsTable {
  // The distinct n (whole numbers) in ascending order, by marking rather than sorting.
  let largest = 0;
  for (let i = 0; i < ns.length; i++) {
    const v = ns[i] as number;
    if (!Number.isInteger(v) || v < 0) throw new RangeError(`n must be counts (got ${v})`);
    if (v > largest) largest = v;
  }
  const seen = new Uint8Array(largest + 1);
  let count = 0;
  for (let i = 0; i < ns.length; i++) {
    const v = ns[i] as number;
    if (v > 0 && seen[v] === 0) {
      seen[v] = 1;
      count++;
    }
  }
  const n = new Float64Array(count);
  for (let v = 1, k = 0; v <= largest; v++) if (seen[v] === 1) n[k++] = v;
  const exact = new Float64Array(4 * count);
  const adjusted = new Float64Array(4 * count);
  const wide = widened(od);
  // Limits already computed for the same θ₀ and over-dispersion (`known`) are copied.
  let j = 0;
  for (let i = 0; i < count; i++) {
    const size = n[i] as number;
    if (known !== null) {
      while (j < known.n.length && (known.n[j] as number) < size) j++;
      if (j < known.n.length && known.n[j] === size) {
        exact.set(known.exact.subarray(4 * j, 4 * j + 4), 4 * i);
        adjusted.set(known.adjusted.subarray(4 * j, 4 * j + 4), 4 * i);
        continue;
      }
    }
    const inner = funnelLimits(theta0, size, FUNNEL_INNER);
    const outer = funnelLimits(theta0, size, FUNNEL_OUTER);
    fill(exact, i, inner, outer);
    if (wide) {
      const o = od as OverdispersionSummary;
      fill(
        adjusted,
        i,
        overdispersedLimits(theta0, size, FUNNEL_INNER, o, { method }),
        overdispersedLimits(theta0, size, FUNNEL_OUTER, o, { method }),
      );
    } else fill(adjusted, i, inner, outer);
  }
  return { n, exact, adjusted };
}

/** The flag code of events/n against the limits at table index i (funnel-flag.ts's rule). */
export function flagCode(events: number, n: number, limits: Float64Array, i: number): FlagCode {
  if (n === 0 || i < 0) return 0;
  return bandCode(
    events / n,
    limits[4 * i] as number,
    limits[4 * i + 1] as number,
    limits[4 * i + 2] as number,
    limits[4 * i + 3] as number,
  );
}

/** Integer n spaced evenly on a log scale from the smallest to the largest n > 0. */
export function curveGrid(ns: ArrayLike<number>, points: number): number[] {
  let lo = Infinity;
  let hi = 0;
  for (let i = 0; i < ns.length; i++) {
    const v = ns[i] as number;
    if (v > 0 && v < lo) lo = v;
    if (v > hi) hi = v;
  }
  if (hi === 0) return [];
  const grid: number[] = [];
  for (let k = 0; k < points; k++) {
    const v =
      k === points - 1 ? hi : Math.round(lo * Math.pow(hi / lo, k / Math.max(1, points - 1)));
    if (grid.length === 0 || v > (grid[grid.length - 1] as number)) grid.push(v);
  }
  return grid;
}

/** A curve value rounded to 6 decimals: plenty for drawing, and a third of the text. */
export function forPlotting(value: number): number {
  return Math.round(value * 1e6) / 1e6;
}

/**
 * Funnel curves over a grid of n (see `curveGrid`), for drawing: values rounded to 6 decimals.
 * The limits a unit is flagged against are the exact ones at its own n (benchmark-views.ts).
 */
export function funnelCurves(
  theta0: number,
  grid: readonly number[],
  od: OverdispersionSummary | null,
  method: OverdispersionMethod,
  known: LimitsTable | null = null,
): FunnelCurves {
  const table = limitsTable(theta0, grid, od, method, known);
  const columns = (limits: Float64Array): FunnelCurves['exact'] => {
    const column = (k: number): number[] =>
      Array.from({ length: table.n.length }, (_, i) => forPlotting(limits[4 * i + k] as number));
    return {
      innerLower: column(0),
      innerUpper: column(1),
      outerLower: column(2),
      outerUpper: column(3),
    };
  };
  return {
    n: Array.from(table.n),
    exact: columns(table.exact),
    adjusted: widened(od) ? columns(table.adjusted) : null,
  };
}
