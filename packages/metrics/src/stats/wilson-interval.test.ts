import { describe, expect, it } from 'vitest';
import { wilsonInterval } from './wilson-interval.js';

describe('wilsonInterval', () => {
  // Newcombe, Stat Med 1998;17:857–72, Table I (Wilson score method without continuity
  // correction), values as listed in docs/methods.md §8.
  it.each([
    [81, 263, 0.2553, 0.3662],
    [15, 148, 0.0624, 0.1605],
    [0, 20, 0, 0.1611],
    [1, 29, 0.0061, 0.1718],
  ])('%i/%i matches Newcombe 1998 Table I: %f–%f', (events, n, lower, upper) => {
    const interval = wilsonInterval(events, n);
    expect(interval.lower).toBeCloseTo(lower, 4);
    expect(interval.upper).toBeCloseTo(upper, 4);
  });

  it('is the closed form of Wilson (JASA 1927) at z = 1.959964', () => {
    const z = 1.959963984540054;
    const p = 81 / 263;
    const n = 263;
    const centre = (p + (z * z) / (2 * n)) / (1 + (z * z) / n);
    const half = (z * Math.sqrt((p * (1 - p)) / n + (z * z) / (4 * n * n))) / (1 + (z * z) / n);
    const interval = wilsonInterval(81, 263);
    expect(interval.lower).toBeCloseTo(centre - half, 12);
    expect(interval.upper).toBeCloseTo(centre + half, 12);
  });

  it('widens with the level and keeps 0 and 1 exact at the ends', () => {
    const i95 = wilsonInterval(10, 40, 0.95);
    const i998 = wilsonInterval(10, 40, 0.998);
    expect(i998.lower!).toBeLessThan(i95.lower!);
    expect(i998.upper!).toBeGreaterThan(i95.upper!);
    expect(wilsonInterval(0, 7).lower).toBe(0);
    expect(wilsonInterval(7, 7).upper).toBe(1);
  });

  it('gives the empty interval for n = 0 without throwing', () => {
    expect(wilsonInterval(0, 0)).toEqual({ lower: null, upper: null });
  });

  it('refuses bad counts and levels with a RangeError naming the argument', () => {
    expect(() => wilsonInterval(-1, 10)).toThrow(/events/);
    expect(() => wilsonInterval(1.5, 10)).toThrow(/events/);
    expect(() => wilsonInterval(NaN, 10)).toThrow(RangeError);
    expect(() => wilsonInterval(3, 2)).toThrow(/events must not exceed n/);
    expect(() => wilsonInterval(1, -2)).toThrow(/\bn\b/);
    expect(() => wilsonInterval(1, 10, 1)).toThrow(/confidence/);
    expect(() => wilsonInterval(1, 10, 0)).toThrow(/confidence/);
    expect(() => wilsonInterval(1, 10, NaN)).toThrow(/confidence/);
  });
});
