import { assertConfidence, assertCount, assertProbability } from './assert.js';
import { funnelLimits } from './funnel-limits.js';
import { NO_INTERVAL, type Interval } from './interval.js';
import { zForConfidence } from './normal-quantile.js';
import type { Overdispersion } from './overdispersion.js';

/**
 * Funnel limits widened for over-dispersion (Spiegelhalter, Stat Med 2005;24:1185–202, §4):
 * additive random effects (default) θ₀ ± z √(s² + τ²), or multiplicative θ₀ ± z √φ · s, with
 * s² = θ₀(1 − θ₀)/n and z the two-sided normal critical value; clamped to [0, 1].
 *
 * When over-dispersion is not present (or could not be estimated) the exact binomial limits of
 * funnel-limits.ts are returned unchanged, unless `always` is set. n = 0 gives the empty
 * interval.
 */
export type OverdispersionMethod = 'additive' | 'multiplicative';

export interface OverdispersedLimitsOptions {
  method?: OverdispersionMethod;
  /** Widen even when the test found no over-dispersion (τ² = 0, φ as estimated). */
  always?: boolean;
}

export function overdispersedLimits(
  theta0: number,
  n: number,
  confidence: number,
  od: Pick<Overdispersion, 'phi' | 'tau2' | 'present'>,
  options: OverdispersedLimitsOptions = {},
): Interval {
  assertProbability(theta0, 'theta0');
  assertCount(n, 'n');
  assertConfidence(confidence);
  if (n === 0) return NO_INTERVAL;
  const method = options.method ?? 'additive';
  if (od.phi === null || od.tau2 === null || !(od.present || options.always)) {
    return funnelLimits(theta0, n, confidence);
  }
  const z = zForConfidence(confidence);
  const s2 = (theta0 * (1 - theta0)) / n;
  const half =
    method === 'additive' ? z * Math.sqrt(s2 + od.tau2) : z * Math.sqrt(od.phi) * Math.sqrt(s2);
  return { lower: Math.max(0, theta0 - half), upper: Math.min(1, theta0 + half) };
}
