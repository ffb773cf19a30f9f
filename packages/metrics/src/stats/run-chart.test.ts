import { describe, expect, it } from 'vitest';
import { median, runChartSignals } from './run-chart.js';
import { runsLimits, runsProbability } from './runs-limits.js';

// Cases built by hand from the rules of Perla, Provost & Murray, BMJ Qual Saf 2011;20:46–51.
describe('runChartSignals', () => {
  it('finds a shift of six points above the median', () => {
    const values = [5, 5, 5, 5, 9, 9, 9, 9, 9, 9, 1, 1];
    const signals = runChartSignals(values, { median: 5 });
    expect(signals.shifts).toEqual([{ start: 4, end: 9, length: 6, side: 'above' }]);
  });

  it('does not call five points a shift', () => {
    const signals = runChartSignals([9, 9, 9, 9, 9, 1, 9], { median: 5 });
    expect(signals.shifts).toEqual([]);
  });

  it('skips points on the median: they neither break nor add to a shift', () => {
    // Below, below, on, below, below, on, below, below: six below with two on the median.
    const values = [2, 2, 5, 2, 2, 5, 2, 2, 8];
    const signals = runChartSignals(values, { median: 5 });
    expect(signals.shifts).toEqual([{ start: 0, end: 7, length: 6, side: 'below' }]);
    expect(signals.usefulObservations).toBe(7);
    expect(signals.runs).toBe(2);
  });

  it('finds a trend of five points going up, sharing its turning point with a trend down', () => {
    const values = [1, 2, 3, 4, 5, 4, 3, 2, 1];
    const signals = runChartSignals(values);
    expect(signals.trends).toEqual([
      { start: 0, end: 4, length: 5, direction: 'up' },
      { start: 4, end: 8, length: 5, direction: 'down' },
    ]);
  });

  it('ignores repeated values in a trend and skips missing points', () => {
    const signals = runChartSignals([1, 2, 2, null, 3, 4, 5]);
    expect(signals.trends).toEqual([{ start: 0, end: 6, length: 5, direction: 'up' }]);
    expect(runChartSignals([1, 2, 3, 4, 3]).trends).toEqual([]);
  });

  it('counts runs about the median and flags too few (one run in ten points)', () => {
    const values = [1, 1, 1, 1, 1, 9, 9, 9, 9, 9];
    const signals = runChartSignals(values, { median: 5 });
    expect(signals.runs).toBe(2);
    expect(signals.runsLimits).not.toBeNull();
    expect(signals.tooFewRuns).toBe(signals.runs < (signals.runsLimits?.lower ?? 0));
    const alternating = runChartSignals([1, 9, 1, 9, 1, 9, 1, 9, 1, 9, 1, 9], { median: 5 });
    expect(alternating.runs).toBe(12);
    expect(alternating.tooManyRuns).toBe(true);
  });

  it('uses the median of the data by default and refuses non-numbers', () => {
    expect(median([3, 1, 2])).toBe(2);
    expect(median([4, 1, 2, 3])).toBe(2.5);
    expect(median([])).toBeNull();
    expect(runChartSignals([1, 2, 3]).median).toBe(2);
    expect(() => runChartSignals([1, NaN])).toThrow(/values\[1\]/);
  });
});

describe('runsLimits (Swed & Eisenhart, Ann Math Stat 1943)', () => {
  it('has run probabilities that match a brute-force count for 5 + 5 points', () => {
    // Enumerate all 252 arrangements of five above and five below.
    const counts = new Map<number, number>();
    for (let mask = 0; mask < 1 << 10; mask++) {
      let ones = 0;
      for (let b = 0; b < 10; b++) ones += (mask >> b) & 1;
      if (ones !== 5) continue;
      let runs = 1;
      for (let b = 1; b < 10; b++) if (((mask >> b) & 1) !== ((mask >> (b - 1)) & 1)) runs++;
      counts.set(runs, (counts.get(runs) ?? 0) + 1);
    }
    for (let r = 2; r <= 10; r++) {
      expect(runsProbability(r, 5, 5)).toBeCloseTo((counts.get(r) ?? 0) / 252, 12);
    }
  });

  it('puts each limit where the tail probability first exceeds 5 %', () => {
    const limits = runsLimits(20);
    expect(limits).not.toBeNull();
    let below = 0;
    for (let r = 2; r < (limits?.lower ?? 0); r++) below += runsProbability(r, 10, 10);
    expect(below).toBeLessThanOrEqual(0.05);
    expect(below + runsProbability(limits?.lower ?? 0, 10, 10)).toBeGreaterThan(0.05);
    expect(runsLimits(9)).toBeNull();
  });
});
