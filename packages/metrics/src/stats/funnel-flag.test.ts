import { describe, expect, it } from 'vitest';
import { compareUnits } from './compare-units.js';
import { funnelFlag } from './funnel-flag.js';
import { funnelLimits } from './funnel-limits.js';

describe('funnelFlag', () => {
  const theta0 = 0.7;
  const n = 200;
  const inner = funnelLimits(theta0, n, 0.95);
  const outer = funnelLimits(theta0, n, 0.998);

  it('places a rate within, notable (beyond 95 %) or outlier (beyond 99.8 %)', () => {
    expect(funnelFlag({ events: 140, n }, theta0).band).toBe('within');
    const notableHigh = Math.floor(inner.upper! * n) + 1;
    expect(notableHigh / n).toBeLessThan(outer.upper!);
    const high = funnelFlag({ events: notableHigh, n }, theta0);
    expect(high).toMatchObject({ band: 'notable', side: 'above', assessment: 'better' });
    const outlierLow = Math.ceil(outer.lower! * n) - 1;
    const low = funnelFlag({ events: outlierLow, n }, theta0);
    expect(low).toMatchObject({ band: 'outlier', side: 'below', assessment: 'worse' });
  });

  it('reads the side through the direction: a high rate of a lower-is-better measure is worse', () => {
    const high = funnelFlag({ events: 190, n }, theta0, { direction: 'lower' });
    expect(high).toMatchObject({ band: 'outlier', side: 'above', assessment: 'worse' });
  });

  it('counts a rate on a limit as within', () => {
    // θ₀ = 0: both limits are 0, and a rate of 0 lies on them.
    expect(funnelFlag({ events: 0, n: 30 }, 0).band).toBe('within');
    expect(funnelFlag({ events: 1, n: 30 }, 0).band).toBe('outlier');
  });

  it('follows the plotted (interpolated) limits even for tiny n', () => {
    // n = 1, θ₀ = ½: the 99.8 % upper limit interpolates to (1 − 0.002)/1 = 0.998, so a rate of
    // 1 lies beyond it. Such denominators are withheld from outside views (disclosure control).
    expect(funnelLimits(0.5, 1, 0.998).upper).toBeCloseTo(0.998, 12);
    expect(funnelFlag({ events: 1, n: 1 }, 0.5).band).toBe('outlier');
  });

  it('has nothing to flag for n = 0', () => {
    expect(funnelFlag({ events: 0, n: 0 }, theta0)).toMatchObject({
      rate: null,
      band: null,
      side: null,
      assessment: null,
    });
  });

  it('widens with over-dispersion so that fewer units are flagged', () => {
    const od = { phi: 4, tau2: 0.01, present: true };
    const events = Math.floor(inner.upper! * n) + 1;
    expect(funnelFlag({ events, n }, theta0, { overdispersion: od }).band).toBe('within');
  });

  it('refuses a bad direction or unit', () => {
    expect(() => funnelFlag({ events: 1, n: 2 }, 0.5, { direction: 'up' as 'higher' })).toThrow(
      /direction/,
    );
    expect(() => funnelFlag({ events: 3, n: 2 }, 0.5)).toThrow(/events/);
  });
});

describe('compareUnits', () => {
  it('uses the pooled proportion as target and flags each unit', () => {
    const result = compareUnits(
      [
        { key: 'A', events: 80, n: 100 },
        { key: 'B', events: 60, n: 100 },
        { key: 'C', events: 0, n: 0 },
      ],
      { adjustment: 'none' },
    );
    expect(result.theta0).toBeCloseTo(0.7, 15);
    expect(result.overdispersion).toBeNull();
    expect(result.units[0]?.flag.band).toBe('notable');
    expect(result.units[0]?.flag.side).toBe('above');
    expect(result.units[2]?.rate).toBeNull();
    expect(result.units[2]?.flag.band).toBeNull();
  });

  it('gives no target when every denominator is zero', () => {
    expect(compareUnits([{ key: 'A', events: 0, n: 0 }]).theta0).toBeNull();
  });
});
