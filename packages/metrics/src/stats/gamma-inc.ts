import { logGamma } from './log-gamma.js';

/**
 * Regularised incomplete gamma functions P(a, x) = γ(a, x)/Γ(a) and Q(a, x) = 1 − P(a, x),
 * for a > 0, x ≥ 0: the series P = e^(−x) x^a / Γ(a) · Σ xⁿ / (a(a+1)…(a+n)) when x < a + 1,
 * otherwise Legendre's continued fraction for Q evaluated by the modified Lentz method
 * (Abramowitz & Stegun 6.5.29 and 6.5.31; Press et al., Numerical Recipes, 3rd ed. 2007, §6.2).
 * Returns [P, Q], each accurate in its own tail.
 */
const TINY = 1e-300;

export function regularizedGamma(a: number, x: number): [number, number] {
  if (x <= 0) return [0, 1];
  if (x === Infinity) return [1, 0];
  const logPrefix = a * Math.log(x) - x - logGamma(a);
  if (x < a + 1) {
    let term = 1 / a;
    let sum = term;
    for (let n = 1; n < 100000; n++) {
      term *= x / (a + n);
      sum += term;
      if (term < sum * 1e-17) break;
    }
    const p = Math.exp(logPrefix) * sum;
    return [Math.min(1, p), Math.max(0, 1 - p)];
  }
  // Q by continued fraction: 1/(x+1−a− 1(1−a)/(x+3−a− 2(2−a)/(x+5−a− …))).
  let b = x + 1 - a;
  let c = 1 / TINY;
  let d = 1 / b;
  let h = d;
  for (let i = 1; i < 100000; i++) {
    const an = -i * (i - a);
    b += 2;
    d = an * d + b;
    if (Math.abs(d) < TINY) d = TINY;
    c = b + an / c;
    if (Math.abs(c) < TINY) c = TINY;
    d = 1 / d;
    const delta = d * c;
    h *= delta;
    if (Math.abs(delta - 1) < 1e-16) break;
  }
  const q = Math.exp(logPrefix) * h;
  return [Math.max(0, 1 - q), Math.min(1, q)];
}

/** Gamma density with shape a and scale 1 at x > 0. */
export function gammaDensity(a: number, x: number): number {
  return Math.exp((a - 1) * Math.log(x) - x - logGamma(a));
}
