import { assertCount, assertProbability } from './assert.js';
import { binomialPmfUnchecked } from './binomial-pmf.js';
import { acklam } from './normal-quantile.js';

/**
 * Binomial quantile: the smallest integer r with P(X ≤ r) ≥ p for X ~ Bin(n, θ).
 *
 * Starts from the Cornish–Fisher approximation r₀ ≈ nθ + σ(z + γ(z² − 1)/6) − ½ (σ² = nθ(1 − θ),
 * skewness γ = (1 − 2θ)/σ; Johnson, Kemp & Kotz, Univariate Discrete Distributions, 3rd ed.
 * 2005, §3.6), computes P(X ≤ r₀) from the shorter tail (see binomial-cdf.ts) and walks to the
 * answer with the probability recurrence, so each quantile costs a few dozen operations.
 */
export interface BinomialQuantileDetail {
  /** The quantile r. */
  r: number;
  /** P(X ≤ r). */
  cdf: number;
  /** P(X ≤ r − 1) (0 when r = 0). */
  cdfBelow: number;
}

export function binomialQuantileDetail(
  p: number,
  n: number,
  theta: number,
): BinomialQuantileDetail {
  if (n === 0 || theta === 0) return { r: 0, cdf: 1, cdfBelow: 0 };
  if (theta === 1) {
    return p === 0 ? { r: 0, cdf: n === 0 ? 1 : 0, cdfBelow: 0 } : { r: n, cdf: 1, cdfBelow: 0 };
  }
  const q = 1 - theta;
  if (p === 0) return { r: 0, cdf: binomialPmfUnchecked(0, n, theta), cdfBelow: 0 };
  if (p === 1) return { r: n, cdf: 1, cdfBelow: 1 - binomialPmfUnchecked(n, n, theta) };

  const mode = Math.min(n, Math.floor((n + 1) * theta));
  const sigma = Math.sqrt(n * theta * q);
  const z = acklam(p);
  const guess = n * theta + sigma * z + ((z * z - 1) * (q - theta)) / 6 - 0.5;
  let r = Math.min(n, Math.max(0, Math.round(guess)));
  let pmf = binomialPmfUnchecked(r, n, theta);
  if (!(pmf > 0)) {
    // Deep in a tail where the probability underflows: start from the mode instead.
    r = mode;
    pmf = binomialPmfUnchecked(r, n, theta);
  }

  // P(X ≤ r) from the shorter tail.
  let cdf: number;
  if (r < mode) {
    let term = pmf;
    let sum = pmf;
    for (let k = r; k > 0; k--) {
      term *= (k * q) / ((n - k + 1) * theta);
      sum += term;
      if (term <= sum * 1e-17) break;
    }
    cdf = sum;
  } else {
    let term = pmf;
    let sum = 0;
    for (let k = r; k < n; k++) {
      term *= ((n - k) * theta) / ((k + 1) * q);
      sum += term;
      if (term <= sum * 1e-17) break;
    }
    cdf = 1 - sum;
  }

  if (cdf >= p) {
    // Walk down while P(X ≤ r − 1) still reaches p.
    while (r > 0) {
      const below = cdf - pmf;
      if (below < p) break;
      pmf *= (r * q) / ((n - r + 1) * theta);
      r -= 1;
      cdf = below;
    }
    return { r, cdf, cdfBelow: r === 0 ? 0 : Math.max(0, cdf - pmf) };
  }
  // Walk up until P(X ≤ r) reaches p.
  while (cdf < p && r < n) {
    pmf *= ((n - r) * theta) / ((r + 1) * q);
    r += 1;
    cdf += pmf;
  }
  if (r === n) return { r, cdf: 1, cdfBelow: Math.max(0, Math.min(1, cdf - pmf)) };
  return { r, cdf, cdfBelow: Math.max(0, cdf - pmf) };
}

/** The smallest integer r with P(X ≤ r) ≥ p for X ~ Bin(n, θ). */
export function binomialQuantile(p: number, n: number, theta: number): number {
  assertProbability(p, 'p');
  assertCount(n, 'n');
  assertProbability(theta, 'theta');
  return binomialQuantileDetail(p, n, theta).r;
}
