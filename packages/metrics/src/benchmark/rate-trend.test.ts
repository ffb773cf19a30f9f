import { describe, expect, it } from 'vitest';
import { runChartSignals } from '../stats/run-chart.js';
import { rateTrend } from './rate-trend.js';

/** Run-chart rules of Perla, Provost & Murray (BMJ Qual Saf 2011;20:46–51) on quarterly rates. */
function quarters(
  n: number,
  from = { year: 2023, quarter: 1 },
): { year: number; quarter: 1 | 2 | 3 | 4 }[] {
  return Array.from({ length: n }, (_, i) => {
    const k = from.year * 4 + from.quarter - 1 + i;
    return { year: Math.floor(k / 4), quarter: ((k % 4) + 1) as 1 | 2 | 3 | 4 };
  });
}

describe('rateTrend', () => {
  it('gives each quarter’s rate and the run-chart signals of those rates', () => {
    // Completion out of 100 each quarter: six quarters below the median of 0.66, then six above.
    const events = [60, 62, 58, 61, 59, 60, 70, 72, 71, 74, 73, 75];
    const points = quarters(events.length).map((quarter, i) => ({
      quarter,
      events: events[i] as number,
      n: 100,
    }));
    const trend = rateTrend(points);
    expect(trend.points.map((p) => p.rate)).toEqual(events.map((e) => e / 100));
    expect(trend.signals).toEqual(runChartSignals(events.map((e) => e / 100)));
    expect(trend.signals.shifts).toEqual([
      { start: 0, end: 5, length: 6, side: 'below' },
      { start: 6, end: 11, length: 6, side: 'above' },
    ]);
  });

  it('skips quarters without a denominator and finds a trend', () => {
    const points = quarters(7).map((quarter, i) => ({
      quarter,
      events: i === 3 ? 0 : 10 + 5 * i,
      n: i === 3 ? 0 : 100,
    }));
    const trend = rateTrend(points);
    expect(trend.points[3]?.rate).toBeNull();
    expect(trend.signals.trends).toEqual([{ start: 0, end: 6, length: 6, direction: 'up' }]);
  });

  it('refuses quarters out of order, repeated, or counts that are not counts', () => {
    const [a, b] = quarters(2) as [
      { year: number; quarter: 1 | 2 | 3 | 4 },
      { year: number; quarter: 1 | 2 | 3 | 4 },
    ];
    expect(() =>
      rateTrend([
        { quarter: b, events: 1, n: 2 },
        { quarter: a, events: 1, n: 2 },
      ]),
    ).toThrow(/points\[1\] \(2023 Q1\) must come after/);
    expect(() =>
      rateTrend([
        { quarter: a, events: 1, n: 2 },
        { quarter: a, events: 1, n: 2 },
      ]),
    ).toThrow(/oldest first, each once/);
    expect(() => rateTrend([{ quarter: a, events: 3, n: 2 }])).toThrow(/points\[0\]\.events/);
    expect(() =>
      rateTrend([{ quarter: { year: 2023, quarter: 5 as 1 }, events: 1, n: 2 }]),
    ).toThrow(/quarter/);
  });
});
