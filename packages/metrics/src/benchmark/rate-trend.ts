import { type AuditQuarter, assertQuarter, formatQuarter } from '../measures/quarter.js';
import { assertEventsOfN } from '../stats/assert.js';
import { type RunChartOptions, type RunChartSignals, runChartSignals } from '../stats/run-chart.js';

/**
 * A unit's rate over audit quarters as a run chart (Perla, Provost & Murray, BMJ Qual Saf
 * 2011;20:46–51; stats/run-chart.ts): each quarter's rate y/n (null when n = 0, which the run
 * chart skips), and the signals — shifts, trends, too few or too many runs about the median.
 * Quarters must be given oldest first, each once.
 */
export interface TrendPoint {
  quarter: AuditQuarter;
  events: number;
  n: number;
}

export interface RateTrend {
  points: (TrendPoint & { rate: number | null })[];
  signals: RunChartSignals;
}

export function rateTrend(points: readonly TrendPoint[], options: RunChartOptions = {}): RateTrend {
  if (!Array.isArray(points)) throw new RangeError('points must be an array');
  let previous = -Infinity;
  const out = points.map((p, i) => {
    if (p === null || typeof p !== 'object') {
      throw new RangeError(`points[${i}] must be { quarter, events, n }`);
    }
    assertQuarter(p.quarter);
    assertEventsOfN(p.events, p.n, `points[${i}].events`, `points[${i}].n`);
    const index = p.quarter.year * 4 + p.quarter.quarter;
    if (index <= previous) {
      throw new RangeError(
        `points[${i}] (${formatQuarter(p.quarter)}) must come after the quarter before it: ` +
          'give quarters oldest first, each once',
      );
    }
    previous = index;
    return {
      quarter: { year: p.quarter.year, quarter: p.quarter.quarter },
      events: p.events,
      n: p.n,
      rate: p.n > 0 ? p.events / p.n : null,
    };
  });
  return {
    points: out,
    signals: runChartSignals(
      out.map((p) => p.rate),
      options,
    ),
  };
}
