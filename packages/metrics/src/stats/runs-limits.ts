import { assertCount } from './assert.js';

/**
 * Limits for the number of runs about the median among N useful observations (points not on
 * the median), from the exact distribution of the number of runs of two kinds (F. S. Swed &
 * C. Eisenhart, Ann Math Stat 1943;14:66–87) with the points split as evenly as possible
 * (⌊N/2⌋ and ⌈N/2⌉), which is the construction behind the run-chart table of Perla, Provost &
 * Murray (BMJ Qual Saf 2011;20:46–51). `lower` is the smallest count that is not too few and
 * `upper` the largest that is not too many, each tail at most `alpha` (default 0.05).
 * Defined for N ≥ 10 (the table's range); null below.
 */
function logChoose(n: number, k: number): number {
  if (k < 0 || k > n) return -Infinity;
  let s = 0;
  for (let i = 1; i <= k; i++) s += Math.log((n - k + i) / i);
  return s;
}

/** P(R = r) for the number of runs R of n1 and n2 items in random order. */
export function runsProbability(r: number, n1: number, n2: number): number {
  const total = logChoose(n1 + n2, n1);
  let ways: number;
  if (r % 2 === 0) {
    const k = r / 2;
    ways = 2 * Math.exp(logChoose(n1 - 1, k - 1) + logChoose(n2 - 1, k - 1) - total);
  } else {
    const k = (r - 1) / 2;
    ways =
      Math.exp(logChoose(n1 - 1, k) + logChoose(n2 - 1, k - 1) - total) +
      Math.exp(logChoose(n1 - 1, k - 1) + logChoose(n2 - 1, k) - total);
  }
  return ways;
}

export function runsLimits(
  usefulObservations: number,
  alpha = 0.05,
): { lower: number; upper: number } | null {
  assertCount(usefulObservations, 'usefulObservations');
  if (!(alpha > 0 && alpha < 0.5)) throw new RangeError(`alpha must be in (0, 0.5) (got ${alpha})`);
  const N = usefulObservations;
  if (N < 10) return null;
  const n1 = Math.floor(N / 2);
  const n2 = N - n1;
  let lower = 2;
  let cumulative = 0;
  for (let r = 2; r <= N; r++) {
    cumulative += runsProbability(r, n1, n2);
    if (cumulative > alpha + 1e-12) {
      lower = r;
      break;
    }
  }
  let upper = N;
  cumulative = 0;
  for (let r = N; r >= 2; r--) {
    cumulative += runsProbability(r, n1, n2);
    if (cumulative > alpha + 1e-12) {
      upper = r;
      break;
    }
  }
  return { lower, upper };
}
