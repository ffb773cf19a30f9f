import normalQuantileReference from '@stdlib/stats-base-dists-normal-quantile';
import jStat from 'jstat';
import { describe, expect, it } from 'vitest';
import { erfc, normalCdf } from './normal-cdf.js';
import { normalQuantile, zForConfidence } from './normal-quantile.js';

describe('normalQuantile', () => {
  // Reference: @stdlib/stats-base-dists-normal-quantile (registry library).
  it('agrees with @stdlib over p from 1e-6 to 1 − 1e-6', () => {
    let worst = 0;
    for (let k = -6; k <= 6; k += 0.01) {
      const p = 1 / (1 + Math.pow(10, -k)); // logistic grid in log-odds
      const ours = normalQuantile(p);
      const ref = normalQuantileReference(p, 0, 1);
      worst = Math.max(worst, Math.abs(ours - ref) / Math.max(1, Math.abs(ref)));
    }
    expect(worst).toBeLessThan(5e-12);
  });

  // Reference: jstat normal.inv (registry library); jstat is less precise, hence 1e-8.
  it('agrees with jstat to 1e-8', () => {
    for (const p of [0.001, 0.01, 0.025, 0.1, 0.3, 0.5, 0.7, 0.975, 0.999]) {
      expect(normalQuantile(p)).toBeCloseTo(jStat.normal.inv(p, 0, 1), 8);
    }
  });

  it('inverts the distribution function (round trip)', () => {
    for (const p of [1e-12, 1e-8, 0.001, 0.2, 0.5, 0.8, 0.999]) {
      expect(normalCdf(normalQuantile(p)) / p).toBeCloseTo(1, 12);
    }
  });

  it('gives the familiar critical values 1.96 and 3.09 (common practice)', () => {
    expect(zForConfidence(0.95)).toBeCloseTo(1.959964, 6);
    expect(zForConfidence(0.998)).toBeCloseTo(3.090232, 6);
  });

  it('handles 0, ½ and 1 and refuses p outside [0, 1]', () => {
    expect(normalQuantile(0)).toBe(-Infinity);
    expect(normalQuantile(0.5)).toBe(0);
    expect(normalQuantile(1)).toBe(Infinity);
    expect(() => normalQuantile(1.1)).toThrow(/\bp\b/);
    expect(() => normalQuantile(NaN)).toThrow(RangeError);
  });

  // erfc(5) = 1.5374597944280349e-12 (Abramowitz & Stegun, Table 7.1, value recalled from
  // memory to five figures: 1.5375e-12).
  it('computes erfc accurately in the tail', () => {
    expect(erfc(5) / 1.5375e-12).toBeCloseTo(1, 4);
    expect(erfc(0)).toBe(1);
    expect(erfc(-1) + erfc(1)).toBeCloseTo(2, 15);
  });
});
