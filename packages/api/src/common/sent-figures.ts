/**
 * Every figure is computed at full double precision, and every flag, limit
 * comparison, median and order is decided from those full figures. Only when a
 * response is encoded is each non-integer number sent to six significant
 * figures: far finer than anything a page, export or report prints (a rate to
 * one decimal of a percent, a ratio to two decimals), and the noise digits of
 * full-precision doubles do not compress (the region benchmark's answer is a
 * sixth smaller and its gzip a third smaller). Integers (counts, ids, years)
 * are sent exactly. Every JSON response of the API goes through this
 * (Express's json replacer, app.factory.ts), and so do the stored answers of
 * the results routes (benchmarks/answers/answer-encoding.ts).
 */
/** Significant figures of every non-integer number sent. */
export const SENT_SIGNIFICANT_FIGURES = 6;

/**
 * x to six significant figures, as the nearest double; integers and non-finite
 * numbers are returned as they are. Scaling by a power of ten is exact up to
 * 10^22; beyond that (figures below 10^-17 or above 10^22) the decimal string
 * of the number is read back instead.
 */
export function toSignificant(x: number): number {
  if (Number.isInteger(x) || !Number.isFinite(x)) return x;
  const shift = SENT_SIGNIFICANT_FIGURES - 1 - Math.floor(Math.log10(Math.abs(x)));
  if (shift > 22 || shift < -22) return Number(x.toPrecision(SENT_SIGNIFICANT_FIGURES));
  const a = Math.abs(x);
  const rounded =
    shift >= 0
      ? Math.round(a * 10 ** shift) / 10 ** shift
      : Math.round(a / 10 ** -shift) * 10 ** -shift;
  return x < 0 ? -rounded : rounded;
}

/** A JSON.stringify replacer: every number to six significant figures (toSignificant). */
export const figuresAsSent = (_key: string, value: unknown): unknown =>
  typeof value === 'number' ? toSignificant(value) : value;
