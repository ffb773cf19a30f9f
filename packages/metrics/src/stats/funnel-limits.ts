import { assertConfidence, assertCount, assertProbability } from './assert.js';
import { binomialQuantileDetail } from './binomial-quantile.js';
import { NO_INTERVAL, type Interval } from './interval.js';

/**
 * Exact binomial funnel-plot control limits with interpolation (D. J. Spiegelhalter, "Funnel
 * plots for comparing institutional performance", Stat Med 2005;24:1185–202):
 * for each tail probability p, r_p is the smallest r with P(X ≤ r) ≥ p for X ~ Bin(n, θ₀),
 * α = (P(X ≤ r_p) − p) / (P(X ≤ r_p) − P(X ≤ r_p − 1)), and the limit is (r_p − α) / n.
 * The two-sided level `confidence` gives p = (1 − confidence)/2 and 1 − p. Limits are clamped to
 * [0, 1]; θ₀ = 0 or 1 gives both limits at θ₀ (no variation is possible); n = 0 gives the empty
 * interval.
 */
export function funnelLimits(theta0: number, n: number, confidence: number): Interval {
  assertProbability(theta0, 'theta0');
  assertCount(n, 'n');
  assertConfidence(confidence);
  if (n === 0) return NO_INTERVAL;
  if (theta0 === 0 || theta0 === 1) return { lower: theta0, upper: theta0 };
  const pLow = (1 - confidence) / 2;
  return {
    lower: interpolatedLimit(pLow, n, theta0),
    upper: interpolatedLimit(1 - pLow, n, theta0),
  };
}

/** (r_p − α)/n for one tail probability p, clamped to [0, 1]. */
export function interpolatedLimit(p: number, n: number, theta0: number): number {
  const { r, cdf, cdfBelow } = binomialQuantileDetail(p, n, theta0);
  const step = cdf - cdfBelow;
  const alpha = step > 0 ? (cdf - p) / step : 0;
  const limit = (r - alpha) / n;
  return limit < 0 ? 0 : limit > 1 ? 1 : limit;
}
