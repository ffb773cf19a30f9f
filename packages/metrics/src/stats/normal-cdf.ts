/**
 * Standard normal distribution function Φ(x) = ½ erfc(−x / √2).
 *
 * erfc(t) for t ≥ 0: for t < 2, 1 − erf(t) with erf from the series of positive terms
 * erf(t) = (2/√π) e^(−t²) Σ 2ⁿ t^(2n+1) / (1·3·…·(2n+1)) (Abramowitz & Stegun 7.1.6);
 * for t ≥ 2 the continued fraction erfc(t) = (e^(−t²)/√π) · 1/(t + ½/(t + 1/(t + (3/2)/(t + …))))
 * (A&S 7.1.14), evaluated by the modified Lentz method.
 */
const SQRT_PI = 1.7724538509055159;
const TINY = 1e-300;

/** erf(t) for 0 ≤ t, by the series of positive terms. */
function erfSeries(t: number): number {
  const t2 = t * t;
  let term = t;
  let sum = t;
  for (let n = 1; n < 200; n++) {
    term *= (2 * t2) / (2 * n + 1);
    sum += term;
    if (term < sum * 1e-17) break;
  }
  return (2 / SQRT_PI) * Math.exp(-t2) * sum;
}

/** erfc(t) for t ≥ 2 by Lentz's method on the continued fraction. */
function erfcFraction(t: number): number {
  // f = t + a1/(t + a2/(t + …)), a_k = k/2.
  let f = t;
  let c = t;
  let d = 0;
  for (let k = 1; k < 500; k++) {
    const a = k / 2;
    d = t + a * d;
    d = d === 0 ? TINY : d;
    c = t + a / c;
    c = c === 0 ? TINY : c;
    d = 1 / d;
    const delta = c * d;
    f *= delta;
    if (Math.abs(delta - 1) < 1e-16) break;
  }
  return Math.exp(-t * t) / SQRT_PI / f;
}

/** Complementary error function erfc(t). */
export function erfc(t: number): number {
  if (Number.isNaN(t)) return NaN;
  if (t < 0) return 2 - erfc(-t);
  if (t < 2) return 1 - erfSeries(t);
  if (t > 27) return 0;
  return erfcFraction(t);
}

/** Standard normal distribution function Φ(x). */
export function normalCdf(x: number): number {
  return 0.5 * erfc(-x / Math.SQRT2);
}

/** Standard normal density φ(x). */
export function normalDensity(x: number): number {
  return Math.exp(-0.5 * x * x) / Math.sqrt(2 * Math.PI);
}
