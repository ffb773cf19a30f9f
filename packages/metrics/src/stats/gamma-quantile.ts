import { assertPositive, assertProbability } from './assert.js';
import { gammaDensity, regularizedGamma } from './gamma-inc.js';
import { logGamma } from './log-gamma.js';
import { normalQuantile } from './normal-quantile.js';

/**
 * Quantile of the gamma distribution with shape a and scale 1: x with P(a, x) = p.
 *
 * Starting value by the Wilson–Hilferty cube-root approximation x ≈ a(1 − 1/(9a) + z/(3√a))³
 * (Wilson & Hilferty, PNAS 1931;17:684–8), or x ≈ (p·Γ(a + 1))^(1/a) in the far lower tail;
 * then Newton steps on the tail that is small (P for p < ½, Q = 1 − P otherwise, so that upper
 * quantiles keep their precision), kept inside a bracket that shrinks by bisection when a step
 * would leave it.
 */
export function gammaQuantile(p: number, a: number): number {
  assertProbability(p, 'p');
  assertPositive(a, 'shape');
  if (p === 0) return 0;
  if (p === 1) return Infinity;
  const upper = p > 0.5;
  const target = upper ? 1 - p : p; // exact for p ≥ ½
  const tail = (x: number): number => {
    const [lo, hi] = regularizedGamma(a, x);
    return upper ? hi : lo;
  };
  // Initial value.
  const z = normalQuantile(p);
  let x: number;
  const c = 1 / (9 * a);
  const wh = a * Math.pow(1 - c + z * Math.sqrt(c), 3);
  const small = Math.exp((Math.log(p) + logGamma(a + 1)) / a);
  if (wh > 0 && !(a < 1 && small < 1)) x = wh;
  else x = Math.max(small, Number.MIN_VALUE);

  // Bracket [lo, hi] with P(lo) ≤ p ≤ P(hi).
  let lo = 0;
  let hi = Infinity;
  for (let i = 0; i < 200; i++) {
    const t = tail(x);
    // f(x) = P(a, x) − p, increasing in x. For the upper tail P − p = target − Q.
    const f = upper ? target - t : t - target;
    if (f === 0) return x;
    if (f < 0) lo = x;
    else hi = x;
    const density = gammaDensity(a, x);
    let next = density > 0 ? x - f / density : NaN;
    if (!(next > lo && next < hi)) {
      next = hi === Infinity ? Math.max(2 * x, x + 1) : 0.5 * (lo + hi);
    }
    if (Math.abs(next - x) <= 1e-15 * x) return next;
    x = next;
  }
  return x;
}
