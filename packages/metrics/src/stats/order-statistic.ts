/**
 * The k-th smallest of a list of numbers (k from 0) without sorting it, by Hoare's FIND
 * (C. A. R. Hoare, "Algorithm 65: Find", Commun ACM 1961;4:321–2): partition around a pivot
 * and keep the side that holds k, in expected linear time. Used where a few order statistics
 * of thousands of values are needed (medians, percentiles), so that the answer is exactly the
 * element a full sort would put at k. `work` is reordered; NaN must not occur.
 */
export function orderStatistic(work: Float64Array, k: number): number {
  if (!(k >= 0 && k < work.length) || !Number.isInteger(k)) {
    throw new RangeError(`k must be an index 0…${work.length - 1} (got ${k})`);
  }
  let lo = 0;
  let hi = work.length - 1;
  while (lo < hi) {
    // Median of three as the pivot.
    const mid = (lo + hi) >> 1;
    const a = work[lo] as number;
    const b = work[mid] as number;
    const c = work[hi] as number;
    const pivot = a < b ? (b < c ? b : a < c ? c : a) : a < c ? a : b < c ? c : b;
    let i = lo;
    let j = hi;
    while (i <= j) {
      while ((work[i] as number) < pivot) i++;
      while ((work[j] as number) > pivot) j--;
      if (i <= j) {
        const t = work[i] as number;
        work[i] = work[j] as number;
        work[j] = t;
        i++;
        j--;
      }
    }
    if (k <= j) hi = j;
    else if (k >= i) lo = i;
    else return work[k] as number;
  }
  return work[k] as number;
}

/** The smallest value at or after index k, after `orderStatistic(work, k)` placed work[k]. */
export function nextOrderStatistic(work: Float64Array, k: number): number {
  let next = work[k] as number;
  let found = false;
  for (let i = k + 1; i < work.length; i++) {
    const v = work[i] as number;
    if (!found || v < next) {
      next = v;
      found = true;
    }
  }
  return found ? next : (work[k] as number);
}
