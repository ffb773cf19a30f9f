import { assertCount, assertProbability } from './assert.js';
import { binomialPmfUnchecked } from './binomial-pmf.js';

/**
 * Binomial distribution function P(X ≤ r) for X ~ Bin(n, θ), by summing probabilities
 * (binomial-pmf.ts) over the shorter tail with the recurrence
 * P(X = k − 1) = P(X = k) · k(1 − θ) / ((n − k + 1) θ), stopping when the terms no longer change
 * the sum. Below the mode the lower tail is summed; above it, 1 − P(X > r).
 */
export function binomialCdfUnchecked(r: number, n: number, theta: number): number {
  if (r < 0) return 0;
  if (r >= n) return 1;
  if (theta === 0) return 1;
  if (theta === 1) return 0;
  const q = 1 - theta;
  const mode = Math.min(n, Math.floor((n + 1) * theta));
  const pmf = binomialPmfUnchecked(r, n, theta);
  if (r < mode) {
    let term = pmf;
    let sum = pmf;
    for (let k = r; k > 0; k--) {
      term *= (k * q) / ((n - k + 1) * theta);
      sum += term;
      if (term <= sum * 1e-17) break;
    }
    return sum;
  }
  let term = pmf;
  let sum = 0;
  for (let k = r; k < n; k++) {
    term *= ((n - k) * theta) / ((k + 1) * q);
    sum += term;
    if (term <= sum * 1e-17) break;
  }
  return 1 - sum;
}

/** P(X ≤ r) for X ~ Bin(n, θ); r may be any integer (below 0 gives 0, n or above gives 1). */
export function binomialCdf(r: number, n: number, theta: number): number {
  assertCount(n, 'n');
  assertProbability(theta, 'theta');
  if (!Number.isInteger(r)) throw new RangeError(`r must be an integer (got ${r})`);
  return binomialCdfUnchecked(r, n, theta);
}
