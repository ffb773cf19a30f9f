import binomialCdfReference from '@stdlib/stats-base-dists-binomial-cdf';
import binomialQuantileReference from '@stdlib/stats-base-dists-binomial-quantile';
import jStat from 'jstat';
import { describe, expect, it } from 'vitest';
import { binomialCdf } from './binomial-cdf.js';
import { binomialPmf } from './binomial-pmf.js';
import { binomialQuantile } from './binomial-quantile.js';

const THETAS = [0.003, 0.05, 0.3, 0.5, 0.62, 0.9, 0.997];
const LEVELS = [0.001, 0.025, 0.5, 0.975, 0.999];

describe('binomialQuantile', () => {
  // Reference: @stdlib/stats-base-dists-binomial-quantile over every n in 1…5,000.
  it('equals @stdlib for every n = 1…5,000 at the funnel tail probabilities', () => {
    const mismatches: string[] = [];
    for (let n = 1; n <= 5000; n++) {
      for (const theta of n % 5 === 0 ? THETAS : [0.62]) {
        for (const p of [0.001, 0.025, 0.975, 0.999]) {
          const ours = binomialQuantile(p, n, theta);
          const ref = binomialQuantileReference(p, n, theta);
          if (ours !== ref) mismatches.push(`p=${p} n=${n} θ=${theta}: ${ours} vs ${ref}`);
        }
      }
    }
    expect(mismatches).toEqual([]);
  });

  it('equals @stdlib on a grid of levels and small n', () => {
    const mismatches: string[] = [];
    for (let n = 1; n <= 60; n++) {
      for (const theta of THETAS) {
        for (const p of LEVELS) {
          // At θ = ½ and p = ½ the distribution function equals p exactly for odd n, and
          // rounding decides the tie in either library: left out.
          if (theta === 0.5 && p === 0.5) continue;
          const ours = binomialQuantile(p, n, theta);
          const ref = binomialQuantileReference(p, n, theta);
          if (ours !== ref) mismatches.push(`p=${p} n=${n} θ=${theta}: ${ours} vs ${ref}`);
        }
      }
    }
    expect(mismatches).toEqual([]);
  });

  it('is the smallest r with P(X ≤ r) ≥ p (checked with @stdlib’s CDF)', () => {
    for (const [p, n, theta] of [
      [0.025, 137, 0.41],
      [0.999, 4999, 0.77],
      [0.001, 12, 0.08],
    ] as const) {
      const r = binomialQuantile(p, n, theta);
      expect(binomialCdfReference(r, n, theta)).toBeGreaterThanOrEqual(p);
      if (r > 0) expect(binomialCdfReference(r - 1, n, theta)).toBeLessThan(p);
    }
  });

  it('handles degenerate cases without throwing', () => {
    expect(binomialQuantile(0.5, 0, 0.3)).toBe(0);
    expect(binomialQuantile(0.975, 10, 0)).toBe(0);
    expect(binomialQuantile(0.025, 10, 1)).toBe(10);
    expect(binomialQuantile(0, 10, 0.4)).toBe(0);
    expect(binomialQuantile(1, 10, 0.4)).toBe(10);
  });

  it('refuses bad arguments with a RangeError naming them', () => {
    expect(() => binomialQuantile(1.2, 10, 0.5)).toThrow(/\bp\b/);
    expect(() => binomialQuantile(0.5, 10.5, 0.5)).toThrow(/\bn\b/);
    expect(() => binomialQuantile(0.5, 10, -0.1)).toThrow(/theta/);
  });
});

describe('binomialCdf and binomialPmf', () => {
  // References: @stdlib/stats-base-dists-binomial-cdf and jstat binomial.pdf.
  it('agree with @stdlib and jstat', () => {
    let worstCdf = 0;
    let worstPmf = 0;
    for (const n of [1, 2, 7, 30, 99, 500, 1234, 5000]) {
      for (const theta of THETAS) {
        for (const q of [0, 0.1, 0.3, 0.5, 0.7, 0.9, 1]) {
          const r = Math.round(q * n);
          worstCdf = Math.max(
            worstCdf,
            Math.abs(binomialCdf(r, n, theta) - binomialCdfReference(r, n, theta)),
          );
          if (n <= 1000) {
            const ref = jStat.binomial.pdf(r, n, theta);
            if (ref > 1e-250)
              worstPmf = Math.max(worstPmf, Math.abs(binomialPmf(r, n, theta) / ref - 1));
          }
        }
      }
    }
    expect(worstCdf).toBeLessThan(1e-12);
    expect(worstPmf).toBeLessThan(1e-9);
  });

  it('sums to one and matches a hand count for n = 4, θ = ½', () => {
    // P(X ≤ 1) = (1 + 4)/16 for X ~ Bin(4, ½), counted by hand.
    expect(binomialCdf(1, 4, 0.5)).toBeCloseTo(5 / 16, 15);
    let total = 0;
    for (let r = 0; r <= 40; r++) total += binomialPmf(r, 40, 0.37);
    expect(total).toBeCloseTo(1, 13);
    expect(binomialCdf(-1, 4, 0.5)).toBe(0);
    expect(binomialCdf(4, 4, 0.5)).toBe(1);
  });
});
