import chiSquareQuantileReference from '@stdlib/stats-base-dists-chisquare-quantile';
import { describe, expect, it } from 'vitest';
import { poissonInterval } from './poisson-interval.js';

describe('poissonInterval (Garwood, Biometrika 1936)', () => {
  // Reference: the definition with @stdlib's χ² quantile: lower = χ²(2O; α/2)/2,
  // upper = χ²(2(O + 1); 1 − α/2)/2.
  it('equals χ²(2O, α/2)/2 and χ²(2O + 2, 1 − α/2)/2 computed with @stdlib', () => {
    for (const confidence of [0.95, 0.998]) {
      const a = 1 - confidence;
      for (const o of [0, 1, 2, 3, 5, 10, 17, 50, 100, 499]) {
        const interval = poissonInterval(o, confidence);
        const lower = o === 0 ? 0 : chiSquareQuantileReference(a / 2, 2 * o) / 2;
        const upper = chiSquareQuantileReference(1 - a / 2, 2 * o + 2) / 2;
        expect(interval.lower).toBeCloseTo(lower, 9);
        expect(Math.abs(interval.upper / upper - 1)).toBeLessThan(1e-10);
      }
    }
  });

  // Exact 95 % limits for a Poisson count as printed in standard tables (values recalled
  // from memory, three decimals).
  it.each([
    [0, 0, 3.689],
    [1, 0.0253, 5.572],
    [5, 1.6235, 11.668],
    [10, 4.795, 18.39],
  ])('O = %i → %f–%f (table values from memory)', (o, lower, upper) => {
    const interval = poissonInterval(o);
    expect(interval.lower).toBeCloseTo(lower, 3);
    expect(interval.upper).toBeCloseTo(upper, 2);
  });

  it('refuses bad counts and levels', () => {
    expect(() => poissonInterval(-1)).toThrow(/observed/);
    expect(() => poissonInterval(2.5)).toThrow(/observed/);
    expect(() => poissonInterval(3, 1.5)).toThrow(/confidence/);
  });
});
