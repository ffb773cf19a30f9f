import { assertEventsOfN, assertProbability } from './assert.js';
import { chiSquareQuantile } from './chisquare-quantile.js';
import { nextOrderStatistic, orderStatistic } from './order-statistic.js';

/**
 * Over-dispersion of unit proportions around a target θ₀ (D. J. Spiegelhalter, Stat Med
 * 2005;24:1185–202, §4; Spiegelhalter et al., JRSS A 2012;175:1–47):
 * z_i = (y_i/n_i − θ₀)/s_i with s_i² = θ₀(1 − θ₀)/n_i; the z-scores are Winsorised at their
 * 10th and 90th percentiles (linear interpolation between order statistics, Hyndman & Fan
 * type 7); φ = mean(z²). Over-dispersion is present when I·φ exceeds the 95 % point of
 * χ²(I − 1). Additive random effect: τ² = (Iφ − (I − 1)) / (Σw − Σw²/Σw), w_i = 1/s_i²,
 * and 0 when Iφ ≤ I − 1.
 *
 * Units with n = 0 are left out. With fewer than two units, or θ₀ = 0 or 1 (no binomial
 * variation, so no z-score), nothing can be estimated: φ and τ² are null and `present` false.
 */
export interface OverdispersionUnit {
  events: number;
  n: number;
}

export interface OverdispersionOptions {
  /** Fraction Winsorised at each end (default 0.1: the 10th and 90th percentiles). */
  winsorise?: number;
  /** Level of the χ² test for over-dispersion (default 0.95). */
  testLevel?: number;
}

export interface Overdispersion {
  /** The target the z-scores are measured against. */
  theta0: number;
  /** Number of units with n > 0 (I). */
  units: number;
  /** The over-dispersion factor φ (mean of Winsorised z²); null when it cannot be estimated. */
  phi: number | null;
  /** Additive between-unit variance τ² (≥ 0); null when it cannot be estimated. */
  tau2: number | null;
  /** True when I·φ exceeds the χ²(I − 1) critical value. */
  present: boolean;
  /** I·φ, the test statistic. */
  statistic: number | null;
  /** The χ²(I − 1) critical value at `testLevel`. */
  critical: number | null;
  /** The z-score of every input unit (null for n = 0), before Winsorising. */
  z: (number | null)[];
  /** The Winsorising bounds (10th and 90th percentiles of z by default). */
  bounds: { lower: number; upper: number } | null;
}

// χ² critical values by level and degrees of freedom: the same few are asked for again and again
// when many measures are compared over the same units.
const criticalCache = new Map<string, number>();

function criticalValue(level: number, df: number): number {
  const key = `${level}:${df}`;
  let value = criticalCache.get(key);
  if (value === undefined) {
    value = chiSquareQuantile(level, df);
    if (criticalCache.size >= 256) criticalCache.clear();
    criticalCache.set(key, value);
  }
  return value;
}

/**
 * `percentileType7` of values in any order, from the two order statistics it interpolates
 * (order-statistic.ts) instead of a full sort; the same number. `work` is reordered.
 */
export function percentileOfUnsorted(work: Float64Array, q: number): number {
  const h = (work.length - 1) * q;
  const lo = Math.floor(h);
  const a = orderStatistic(work, lo);
  const b = lo + 1 < work.length ? nextOrderStatistic(work, lo) : a;
  return a + (h - lo) * (b - a);
}

/** Percentile by linear interpolation between order statistics (Hyndman & Fan type 7). */
export function percentileType7(sorted: ArrayLike<number>, q: number): number {
  const h = (sorted.length - 1) * q;
  const lo = Math.floor(h);
  const hi = Math.min(sorted.length - 1, lo + 1);
  const a = sorted[lo] as number;
  const b = sorted[hi] as number;
  return a + (h - lo) * (b - a);
}

export function overdispersion(
  units: readonly OverdispersionUnit[],
  theta0: number,
  options: OverdispersionOptions = {},
): Overdispersion {
  assertProbability(theta0, 'theta0');
  const events = new Float64Array(units.length);
  const n = new Float64Array(units.length);
  units.forEach((u, i) => {
    assertEventsOfN(u.events, u.n, `units[${i}].events`, `units[${i}].n`);
    events[i] = u.events;
    n[i] = u.n;
  });
  const { z, ...rest } = overdispersionOfColumns(events, n, theta0, options);
  return { ...rest, z: Array.from(z, (v) => (Number.isNaN(v) ? null : v)) };
}

/**
 * `overdispersion` for units given as columns of events and n (checked by the caller to be
 * counts with events ≤ n): the same computation in the same order, without an object per
 * unit, for callers that compare thousands of units on many measures. z is NaN for n = 0.
 */
export function overdispersionOfColumns(
  events: ArrayLike<number>,
  n: ArrayLike<number>,
  theta0: number,
  options: OverdispersionOptions = {},
): Omit<Overdispersion, 'z'> & { z: Float64Array } {
  assertProbability(theta0, 'theta0');
  const winsorise = options.winsorise ?? 0.1;
  if (!(winsorise >= 0 && winsorise < 0.5)) {
    throw new RangeError(`winsorise must be in [0, 0.5) (got ${winsorise})`);
  }
  const testLevel = options.testLevel ?? 0.95;
  if (!(testLevel > 0 && testLevel < 1)) {
    throw new RangeError(`testLevel must be in (0, 1) (got ${testLevel})`);
  }
  const count = n.length;
  let I = 0;
  for (let i = 0; i < count; i++) if ((n[i] as number) > 0) I++;
  const z = new Float64Array(count).fill(NaN);
  const empty = {
    theta0,
    units: I,
    phi: null,
    tau2: null,
    present: false,
    statistic: null,
    critical: null,
    z,
    bounds: null,
  };
  if (theta0 === 0 || theta0 === 1) return empty;
  const variance = theta0 * (1 - theta0);
  const zs = new Float64Array(I);
  let k = 0;
  for (let i = 0; i < count; i++) {
    const ni = n[i] as number;
    if (ni > 0) {
      const v = ((events[i] as number) / ni - theta0) / Math.sqrt(variance / ni);
      z[i] = v;
      zs[k++] = v;
    }
  }
  if (I < 2) return empty;
  const work = zs.slice();
  const lower = percentileOfUnsorted(work, winsorise);
  const upper = percentileOfUnsorted(work, 1 - winsorise);
  let sumZ2 = 0;
  for (let i = 0; i < I; i++) {
    const v = zs[i] as number;
    const w = v < lower ? lower : v > upper ? upper : v;
    sumZ2 += w * w;
  }
  const phi = sumZ2 / I;
  let sumW = 0;
  let sumW2 = 0;
  for (let i = 0; i < count; i++) {
    const ni = n[i] as number;
    if (!(ni > 0)) continue;
    const w = ni / variance;
    sumW += w;
    sumW2 += w * w;
  }
  const statistic = I * phi;
  const critical = criticalValue(testLevel, I - 1);
  const denominator = sumW - sumW2 / sumW;
  const tau2 = statistic > I - 1 && denominator > 0 ? (statistic - (I - 1)) / denominator : 0;
  return {
    theta0,
    units: I,
    phi,
    tau2,
    present: statistic > critical,
    statistic,
    critical,
    z,
    bounds: { lower, upper },
  };
}
