/**
 * ln Γ(x) for x > 0.
 *
 * Stirling's asymptotic series with Bernoulli-number coefficients (Abramowitz & Stegun 6.1.41):
 * ln Γ(x) = (x − ½) ln x − x + ½ ln 2π + 1/(12x) − 1/(360x³) + 1/(1260x⁵) − 1/(1680x⁷)
 *           + 1/(1188x⁹) − 691/(360360x¹¹) + 1/(156x¹³),
 * used for x ≥ 15 (truncation error below 1e-19) after the recurrence Γ(x + 1) = x Γ(x) moves a
 * smaller x up.
 */
const HALF_LOG_2PI = 0.9189385332046728; // ½ ln 2π

export function stirlingTail(x: number): number {
  const r = 1 / x;
  const r2 = r * r;
  return (
    r *
    (1 / 12 -
      r2 *
        (1 / 360 -
          r2 * (1 / 1260 - r2 * (1 / 1680 - r2 * (1 / 1188 - r2 * (691 / 360360 - r2 / 156))))))
  );
}

export function logGamma(x: number): number {
  if (!(x > 0)) return x === 0 ? Infinity : NaN;
  if (x === Infinity) return Infinity;
  let shift = 0;
  if (x < 15) {
    let product = 1;
    while (x < 15) {
      product *= x;
      x += 1;
    }
    shift = Math.log(product);
  }
  return (x - 0.5) * Math.log(x) - x + HALF_LOG_2PI + stirlingTail(x) - shift;
}

/**
 * Stirling's error for the factorial: ln n! − (n + ½) ln n + n − ½ ln 2π (Loader 2000), for
 * n > 0. Uses the series tail for n ≥ 15 and exact sums of logarithms below.
 */
export function stirlingError(n: number): number {
  if (n >= 15) return stirlingTail(n);
  let logFactorial: number;
  if (Number.isInteger(n)) {
    logFactorial = 0;
    for (let k = 2; k <= n; k++) logFactorial += Math.log(k);
  } else {
    logFactorial = logGamma(n + 1);
  }
  return logFactorial - (n + 0.5) * Math.log(n) + n - HALF_LOG_2PI;
}
