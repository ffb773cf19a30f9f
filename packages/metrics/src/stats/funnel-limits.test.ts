import binomialCdfReference from '@stdlib/stats-base-dists-binomial-cdf';
import { describe, expect, it } from 'vitest';
import { funnelLimits } from './funnel-limits.js';

/**
 * The exact binomial limit with interpolation (Spiegelhalter, Stat Med 2005;24:1185–202),
 * recomputed here independently from @stdlib's binomial CDF: r_p by a linear search of the CDF
 * from 0, α = (F(r_p) − p)/(F(r_p) − F(r_p − 1)), limit = (r_p − α)/n clamped to [0, 1].
 */
function referenceLimit(p: number, n: number, theta: number, start: number): number {
  let r = start;
  while (binomialCdfReference(r, n, theta) < p) r++;
  while (r > 0 && binomialCdfReference(r - 1, n, theta) >= p) r--;
  const f = binomialCdfReference(r, n, theta);
  const below = r > 0 ? binomialCdfReference(r - 1, n, theta) : 0;
  const alpha = (f - p) / (f - below);
  return Math.min(1, Math.max(0, (r - alpha) / n));
}

describe('funnelLimits', () => {
  it('matches the limits recomputed from @stdlib’s binomial CDF over n = 1…5,000', () => {
    let worst = 0;
    for (const theta of [0.08, 0.5, 0.83]) {
      for (let n = 1; n <= 5000; n += n < 100 ? 1 : 53) {
        for (const confidence of [0.95, 0.998]) {
          const pLow = (1 - confidence) / 2;
          const start = Math.max(
            0,
            Math.floor(n * theta - 4 * Math.sqrt(n * theta * (1 - theta)) - 2),
          );
          const limits = funnelLimits(theta, n, confidence);
          worst = Math.max(
            worst,
            Math.abs((limits.lower as number) - referenceLimit(pLow, n, theta, start)),
            Math.abs((limits.upper as number) - referenceLimit(1 - pLow, n, theta, start)),
          );
        }
      }
    }
    expect(worst).toBeLessThan(1e-9);
  });

  it('nests the 99.8 % limits outside the 95 % ones and narrows with n', () => {
    const inner = funnelLimits(0.7, 200, 0.95);
    const outer = funnelLimits(0.7, 200, 0.998);
    expect(outer.lower!).toBeLessThan(inner.lower!);
    expect(outer.upper!).toBeGreaterThan(inner.upper!);
    const wide = funnelLimits(0.7, 50, 0.95);
    expect(wide.upper! - wide.lower!).toBeGreaterThan(inner.upper! - inner.lower!);
  });

  it('handles n = 0 and θ₀ = 0 or 1 without throwing', () => {
    expect(funnelLimits(0.5, 0, 0.95)).toEqual({ lower: null, upper: null });
    expect(funnelLimits(0, 40, 0.95)).toEqual({ lower: 0, upper: 0 });
    expect(funnelLimits(1, 40, 0.998)).toEqual({ lower: 1, upper: 1 });
  });

  it('refuses bad arguments with a RangeError naming them', () => {
    expect(() => funnelLimits(1.5, 10, 0.95)).toThrow(/theta0/);
    expect(() => funnelLimits(0.5, -1, 0.95)).toThrow(/\bn\b/);
    expect(() => funnelLimits(0.5, 2.5, 0.95)).toThrow(/\bn\b/);
    expect(() => funnelLimits(0.5, 10, 95)).toThrow(/confidence/);
  });
});
