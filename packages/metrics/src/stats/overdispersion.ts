import { assertEventsOfN, assertProbability } from './assert.js';
import { chiSquareQuantile } from './chisquare-quantile.js';

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

/** Percentile by linear interpolation between order statistics (Hyndman & Fan type 7). */
export function percentileType7(sorted: readonly number[], q: number): number {
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
  const winsorise = options.winsorise ?? 0.1;
  if (!(winsorise >= 0 && winsorise < 0.5)) {
    throw new RangeError(`winsorise must be in [0, 0.5) (got ${winsorise})`);
  }
  const testLevel = options.testLevel ?? 0.95;
  if (!(testLevel > 0 && testLevel < 1)) {
    throw new RangeError(`testLevel must be in (0, 1) (got ${testLevel})`);
  }
  units.forEach((u, i) => assertEventsOfN(u.events, u.n, `units[${i}].events`, `units[${i}].n`));
  const used = units.filter((u) => u.n > 0);
  const I = used.length;
  const empty: Overdispersion = {
    theta0,
    units: I,
    phi: null,
    tau2: null,
    present: false,
    statistic: null,
    critical: null,
    z: units.map(() => null),
    bounds: null,
  };
  if (theta0 === 0 || theta0 === 1) return empty;
  const variance = theta0 * (1 - theta0);
  const z = units.map((u) =>
    u.n > 0 ? (u.events / u.n - theta0) / Math.sqrt(variance / u.n) : null,
  );
  if (I < 2) return { ...empty, z };
  const zs = z.filter((v): v is number => v !== null);
  const sorted = [...zs].sort((a, b) => a - b);
  const lower = percentileType7(sorted, winsorise);
  const upper = percentileType7(sorted, 1 - winsorise);
  let sumZ2 = 0;
  for (const v of zs) {
    const w = v < lower ? lower : v > upper ? upper : v;
    sumZ2 += w * w;
  }
  const phi = sumZ2 / I;
  let sumW = 0;
  let sumW2 = 0;
  for (const u of used) {
    const w = u.n / variance;
    sumW += w;
    sumW2 += w * w;
  }
  const statistic = I * phi;
  const critical = chiSquareQuantile(testLevel, I - 1);
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
