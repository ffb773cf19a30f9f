/**
 * An interval, or the empty result: `{ lower: null, upper: null }` when there is nothing to
 * estimate (a denominator of zero). Test `interval.lower === null` to narrow.
 */
export type Interval = { lower: number; upper: number } | { lower: null; upper: null };

/** The empty interval returned for n = 0. */
export const NO_INTERVAL: { lower: null; upper: null } = Object.freeze({
  lower: null,
  upper: null,
});

/** The lower-tail probability of a two-sided confidence level: (1 − confidence) / 2. */
export function lowerTail(confidence: number): number {
  return (1 - confidence) / 2;
}
