import { assertCount, assertProbability } from './assert.js';
import { stirlingError } from './log-gamma.js';

/**
 * Binomial probability P(X = x) for X ~ Bin(n, θ), by Loader's saddle-point expansion
 * (C. Loader, "Fast and accurate computation of binomial probabilities", 2000):
 * P = exp(δ(n) − δ(x) − δ(n − x) − D(x, nθ) − D(n − x, n(1 − θ))) / √(2π x (1 − x/n)),
 * with δ Stirling's error and D(x, m) = x ln(x/m) + m − x (the deviance term, by its series
 * when x is near m). Accurate to a few units in the last place across n, unlike exp of log
 * factorials.
 */
const LOG_2PI = 1.8378770664093453;

/** Deviance term D(x, m) = x ln(x/m) + m − x, accurate when x ≈ m (Loader 2000). */
export function deviance(x: number, m: number): number {
  if (Math.abs(x - m) < 0.1 * (x + m)) {
    let v = (x - m) / (x + m);
    let s = (x - m) * v;
    if (Math.abs(s) < Number.MIN_VALUE) return s;
    let ej = 2 * x * v;
    v *= v;
    for (let j = 1; j < 1000; j++) {
      ej *= v;
      const s1 = s + ej / (2 * j + 1);
      if (s1 === s) return s1;
      s = s1;
    }
    return s;
  }
  return x * Math.log(x / m) + m - x;
}

/** P(X = x) without argument checks (x, n integers, 0 ≤ θ ≤ 1). */
export function binomialPmfUnchecked(x: number, n: number, theta: number): number {
  const q = 1 - theta;
  if (x < 0 || x > n) return 0;
  if (theta === 0) return x === 0 ? 1 : 0;
  if (q === 0) return x === n ? 1 : 0;
  if (x === 0) {
    if (n === 0) return 1;
    return Math.exp(theta < 0.1 ? -deviance(n, n * q) - n * theta : n * Math.log(q));
  }
  if (x === n) {
    return Math.exp(q < 0.1 ? -deviance(n, n * theta) - n * q : n * Math.log(theta));
  }
  const lc =
    stirlingError(n) -
    stirlingError(x) -
    stirlingError(n - x) -
    deviance(x, n * theta) -
    deviance(n - x, n * q);
  const lf = LOG_2PI + Math.log(x) + Math.log1p(-x / n);
  return Math.exp(lc - 0.5 * lf);
}

/** P(X = x) for X ~ Bin(n, θ). */
export function binomialPmf(x: number, n: number, theta: number): number {
  assertCount(n, 'n');
  assertProbability(theta, 'theta');
  if (!Number.isInteger(x)) throw new RangeError(`x must be an integer (got ${x})`);
  return binomialPmfUnchecked(x, n, theta);
}
