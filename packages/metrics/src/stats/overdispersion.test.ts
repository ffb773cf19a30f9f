import jStat from 'jstat';
import { describe, expect, it } from 'vitest';
import { funnelLimits } from './funnel-limits.js';
import { overdispersedLimits } from './overdispersed-limits.js';
import { overdispersion, percentileType7 } from './overdispersion.js';

describe('overdispersion (Spiegelhalter, Stat Med 2005 §4; Spiegelhalter et al., JRSS A 2012)', () => {
  // A hand-worked example: θ₀ = ½, n = 100 each, so s = 0.05 and z = (y/100 − ½)/0.05.
  const units = [40, 45, 50, 50, 55, 60, 70, 30, 52, 48].map((events) => ({ events, n: 100 }));
  const z = [-2, -1, 0, 0, 1, 2, 4, -4, 0.4, -0.4];

  it('computes z-scores, Winsorises at the 10th and 90th percentiles and averages z²', () => {
    const od = overdispersion(units, 0.5);
    od.z.forEach((v, i) => expect(v).toBeCloseTo(z[i] as number, 12));
    // Sorted z: −4 −2 −1 −0.4 0 0 0.4 1 2 4; type-7 10th percentile at h = 0.9:
    // −4 + 0.9·2 = −2.2; 90th at h = 8.1: 2 + 0.1·2 = 2.2.
    expect(od.bounds?.lower).toBeCloseTo(-2.2, 12);
    expect(od.bounds?.upper).toBeCloseTo(2.2, 12);
    const winsorised = z.map((v) => Math.min(2.2, Math.max(-2.2, v)));
    const phi = winsorised.reduce((s, v) => s + v * v, 0) / 10;
    expect(od.phi).toBeCloseTo(phi, 12);
    expect(od.statistic).toBeCloseTo(10 * phi, 12);
    // χ²₉ 95 % point from jstat (registry library).
    expect(od.critical).toBeCloseTo(jStat.chisquare.inv(0.95, 9), 8);
    expect(od.present).toBe(10 * phi > jStat.chisquare.inv(0.95, 9));
    // τ² = (Iφ − (I − 1)) / (Σw − Σw²/Σw), w = 1/s² = 400 each.
    const sumW = 10 * 400;
    const sumW2 = 10 * 400 * 400;
    expect(od.tau2).toBeCloseTo(Math.max(0, (10 * phi - 9) / (sumW - sumW2 / sumW)), 12);
  });

  it('finds no over-dispersion when every unit sits on the target', () => {
    const od = overdispersion(
      Array.from({ length: 20 }, () => ({ events: 30, n: 100 })),
      0.3,
    );
    expect(od.phi).toBeCloseTo(0, 12);
    expect(od.tau2).toBe(0);
    expect(od.present).toBe(false);
  });

  it('leaves out units with n = 0 and returns nulls when nothing can be estimated', () => {
    const od = overdispersion([{ events: 0, n: 0 }, ...units], 0.5);
    expect(od.units).toBe(10);
    expect(od.z[0]).toBeNull();
    expect(overdispersion(units, 0).phi).toBeNull();
    expect(overdispersion(units, 1).tau2).toBeNull();
    expect(overdispersion([{ events: 3, n: 10 }], 0.3).phi).toBeNull();
    expect(overdispersion([], 0.3).present).toBe(false);
  });

  it('refuses bad units', () => {
    expect(() => overdispersion([{ events: 5, n: 3 }], 0.5)).toThrow(/units\[0\]\.events/);
    expect(() => overdispersion([{ events: 1, n: -3 }], 0.5)).toThrow(/units\[0\]/);
    expect(() => overdispersion(units, 2)).toThrow(/theta0/);
  });

  it('type-7 percentile matches a hand computation', () => {
    expect(percentileType7([1, 2, 3, 4], 0.5)).toBe(2.5);
    expect(percentileType7([10], 0.9)).toBe(10);
  });
});

describe('overdispersedLimits', () => {
  const od = { phi: 2.5, tau2: 0.004, present: true };
  it('widens additively: θ₀ ± z √(s² + τ²)', () => {
    const z = 1.959963984540054;
    const s2 = (0.6 * 0.4) / 150;
    const limits = overdispersedLimits(0.6, 150, 0.95, od);
    expect(limits.lower).toBeCloseTo(0.6 - z * Math.sqrt(s2 + 0.004), 12);
    expect(limits.upper).toBeCloseTo(0.6 + z * Math.sqrt(s2 + 0.004), 12);
  });

  it('or multiplicatively: θ₀ ± z √φ s', () => {
    const z = 3.090232306167813;
    const s = Math.sqrt((0.6 * 0.4) / 150);
    const limits = overdispersedLimits(0.6, 150, 0.998, od, { method: 'multiplicative' });
    expect(limits.upper).toBeCloseTo(0.6 + z * Math.sqrt(2.5) * s, 12);
  });

  it('keeps the exact limits when over-dispersion is not present, and n = 0 is empty', () => {
    const none = { phi: 1.1, tau2: 0.0001, present: false };
    expect(overdispersedLimits(0.6, 150, 0.95, none)).toEqual(funnelLimits(0.6, 150, 0.95));
    expect(overdispersedLimits(0.6, 0, 0.95, od)).toEqual({ lower: null, upper: null });
    const clamped = overdispersedLimits(0.99, 5, 0.998, od);
    expect(clamped.upper).toBe(1);
  });
});
