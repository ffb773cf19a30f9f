import { assertPositive, assertProbability } from './assert.js';
import { gammaQuantile } from './gamma-quantile.js';

/**
 * Quantile of the χ² distribution with k degrees of freedom: χ²ₖ(p) = 2 · Γ⁻¹(p; k/2, 1),
 * since χ²ₖ is the gamma distribution with shape k/2 and scale 2.
 */
export function chiSquareQuantile(p: number, degreesOfFreedom: number): number {
  assertProbability(p, 'p');
  assertPositive(degreesOfFreedom, 'degreesOfFreedom');
  return 2 * gammaQuantile(p, degreesOfFreedom / 2);
}
