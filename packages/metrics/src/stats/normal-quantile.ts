import { assertProbability } from './assert.js';
import { normalCdf } from './normal-cdf.js';

/**
 * Standard normal quantile Φ⁻¹(p).
 *
 * Starting value from Acklam's rational approximation (P. J. Acklam, "An algorithm for computing
 * the inverse normal cumulative distribution function", 2003; relative error < 1.2e-9), then
 * Halley steps on Φ(x) − p (Φ from normal-cdf.ts) until the step is below 1e-15·|x|. The upper
 * half uses Φ⁻¹(p) = −Φ⁻¹(1 − p), where 1 − p is exact for p ≥ ½.
 */
const A = [
  -3.969683028665376e1, 2.209460984245205e2, -2.759285104469687e2, 1.38357751867269e2,
  -3.066479806614716e1, 2.506628277459239,
] as const;
const B = [
  -5.447609879822406e1, 1.615858368580409e2, -1.556989798598866e2, 6.680131188771972e1,
  -1.328068155288572e1,
] as const;
const C = [
  -7.784894002430293e-3, -3.223964580411365e-1, -2.400758277161838, -2.549732539343734,
  4.374664141464968, 2.938163982698783,
] as const;
const D = [
  7.784695709041462e-3, 3.224671290700398e-1, 2.445134137142996, 3.754408661907416,
] as const;
const SQRT_2PI = 2.5066282746310002;

/** Acklam's approximation alone (relative error < 1.2e-9), for starting values. */
export function acklam(p: number): number {
  if (p < 0.02425) {
    const q = Math.sqrt(-2 * Math.log(p));
    return (
      (((((C[0] * q + C[1]) * q + C[2]) * q + C[3]) * q + C[4]) * q + C[5]) /
      ((((D[0] * q + D[1]) * q + D[2]) * q + D[3]) * q + 1)
    );
  }
  const q = p - 0.5;
  const r = q * q;
  return (
    ((((((A[0] * r + A[1]) * r + A[2]) * r + A[3]) * r + A[4]) * r + A[5]) * q) /
    (((((B[0] * r + B[1]) * r + B[2]) * r + B[3]) * r + B[4]) * r + 1)
  );
}

function lowerHalf(p: number): number {
  let x = acklam(p);
  for (let i = 0; i < 8; i++) {
    const e = normalCdf(x) - p;
    const u = e * SQRT_2PI * Math.exp(0.5 * x * x);
    const step = u / (1 + 0.5 * x * u);
    x -= step;
    if (Math.abs(step) <= 1e-15 * Math.abs(x)) break;
  }
  return x;
}

export function normalQuantile(p: number): number {
  assertProbability(p, 'p');
  if (p === 0) return -Infinity;
  if (p === 1) return Infinity;
  if (p === 0.5) return 0;
  return p < 0.5 ? lowerHalf(p) : -lowerHalf(1 - p);
}

// The few levels in use (0.95, 0.998 …) are computed once each; callers alternate between them.
const zCache = new Map<number, number>();

/** The two-sided critical value z with Φ(z) = (1 + confidence) / 2 (1.959964… for 0.95). */
export function zForConfidence(confidence: number): number {
  let z = zCache.get(confidence);
  if (z === undefined) {
    z = -normalQuantile((1 - confidence) / 2);
    if (zCache.size >= 16) zCache.clear();
    zCache.set(confidence, z);
  }
  return z;
}
