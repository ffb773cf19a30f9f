import { nextOrderStatistic, orderStatistic } from './order-statistic.js';
import { runsLimits } from './runs-limits.js';

/**
 * Run-chart rules (R. J. Perla, L. P. Provost & S. K. Murray, "The run chart: a simple
 * analytical tool for learning from variation in healthcare processes", BMJ Qual Saf
 * 2011;20:46–51):
 * - shift: 6 or more consecutive points all above or all below the median; points on the
 *   median neither break nor add to a shift;
 * - trend: 5 or more consecutive points all going up or all going down; a point equal to the
 *   one before it neither breaks nor adds to a trend;
 * - runs: the number of runs about the median (a run is a sequence of points on one side)
 *   compared with the limits of runs-limits.ts; too few or too many runs signal non-random
 *   variation.
 * Missing values (null) are skipped: they neither break nor add. Positions are indices into
 * the input (inclusive start and end).
 */
export interface Shift {
  start: number;
  end: number;
  length: number;
  side: 'above' | 'below';
}

export interface Trend {
  start: number;
  end: number;
  length: number;
  direction: 'up' | 'down';
}

export interface RunChartSignals {
  median: number | null;
  /** Points that are neither missing nor on the median. */
  usefulObservations: number;
  runs: number;
  runsLimits: { lower: number; upper: number } | null;
  tooFewRuns: boolean;
  tooManyRuns: boolean;
  shifts: Shift[];
  trends: Trend[];
}

export interface RunChartOptions {
  /** Centre line; default the median of the values (or of the first `baseline` values). */
  median?: number;
  /** Number of leading values that define the median (default: all). */
  baseline?: number;
  shiftLength?: number;
  trendLength?: number;
}

export function median(values: readonly number[]): number | null {
  return medianOfSorted([...values].sort((a, b) => a - b));
}

/**
 * The median of values in any order from its middle order statistics (order-statistic.ts)
 * instead of a full sort: the same number as `median`. `work` is reordered.
 */
export function medianOfUnsorted(work: Float64Array): number | null {
  const n = work.length;
  if (n === 0) return null;
  const mid = n >> 1;
  if (n % 2 === 1) return orderStatistic(work, mid);
  const a = orderStatistic(work, mid - 1);
  return (a + nextOrderStatistic(work, mid - 1)) / 2;
}

/** The median of values already sorted ascending (null when there are none). */
export function medianOfSorted(sorted: ArrayLike<number>): number | null {
  if (sorted.length === 0) return null;
  const mid = sorted.length >> 1;
  return sorted.length % 2 === 1
    ? (sorted[mid] as number)
    : ((sorted[mid - 1] as number) + (sorted[mid] as number)) / 2;
}

export function runChartSignals(
  values: readonly (number | null)[],
  options: RunChartOptions = {},
): RunChartSignals {
  const shiftLength = options.shiftLength ?? 6;
  const trendLength = options.trendLength ?? 5;
  values.forEach((v, i) => {
    if (v !== null && (typeof v !== 'number' || !Number.isFinite(v))) {
      throw new RangeError(`values[${i}] must be a finite number or null (got ${String(v)})`);
    }
  });
  const present = values
    .slice(0, options.baseline ?? values.length)
    .filter((v): v is number => v !== null);
  const centre = options.median ?? median(present);
  const shifts: Shift[] = [];
  const trends: Trend[] = [];
  let useful = 0;
  let runs = 0;
  if (centre !== null) {
    let side: 'above' | 'below' | null = null;
    let start = -1;
    let end = -1;
    let length = 0;
    const close = (): void => {
      if (side !== null && length >= shiftLength) shifts.push({ start, end, length, side });
    };
    values.forEach((v, i) => {
      if (v === null || v === centre) return;
      const s = v > centre ? 'above' : 'below';
      useful++;
      if (s !== side) {
        close();
        runs++;
        side = s;
        start = i;
        length = 0;
      }
      end = i;
      length++;
    });
    close();
  }
  // Trends.
  let previous: number | null = null;
  let direction: 'up' | 'down' | null = null;
  let start = -1;
  let lastIndex = -1;
  let end = -1;
  let length = 0;
  const closeTrend = (): void => {
    if (direction !== null && length >= trendLength) trends.push({ start, end, length, direction });
  };
  values.forEach((v, i) => {
    if (v === null) return;
    if (previous === null) {
      previous = v;
      lastIndex = i;
      return;
    }
    if (v === previous) return;
    const d = v > previous ? 'up' : 'down';
    if (d !== direction) {
      closeTrend();
      direction = d;
      start = lastIndex;
      length = 1;
    }
    length++;
    end = i;
    previous = v;
    lastIndex = i;
  });
  closeTrend();
  const limits = runsLimits(useful);
  return {
    median: centre,
    usefulObservations: useful,
    runs,
    runsLimits: limits,
    tooFewRuns: limits !== null && runs < limits.lower,
    tooManyRuns: limits !== null && runs > limits.upper,
    shifts,
    trends,
  };
}
