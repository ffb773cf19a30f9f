import { assertConfidence, assertCount } from './assert.js';
import { gammaQuantile } from './gamma-quantile.js';

/**
 * Exact (Garwood) interval for a Poisson count O (F. Garwood, Biometrika 1936;28:437–42):
 * lower = χ²(2O; α/2)/2 (0 when O = 0), upper = χ²(2(O + 1); 1 − α/2)/2, α = 1 − confidence.
 * Computed as gamma quantiles with shapes O and O + 1, since χ²(2k; p)/2 = Γ⁻¹(p; k, 1).
 */
export function poissonInterval(
  observed: number,
  confidence = 0.95,
): { lower: number; upper: number } {
  assertCount(observed, 'observed');
  assertConfidence(confidence);
  const alpha = 1 - confidence;
  return {
    lower: observed === 0 ? 0 : gammaQuantile(alpha / 2, observed),
    upper: gammaQuantile(1 - alpha / 2, observed + 1),
  };
}
