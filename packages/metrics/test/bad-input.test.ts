import { describe, expect, it } from 'vitest';
import * as metrics from '../src/index.js';

/** Bad input to the public API: a RangeError that names the argument; n = 0 is not an error. */
const cases: [string, () => unknown, RegExp][] = [
  ['wilsonInterval NaN events', () => metrics.wilsonInterval(NaN, 10), /events/],
  ['wilsonInterval negative n', () => metrics.wilsonInterval(0, -1), /\bn\b/],
  ['wilsonInterval events > n', () => metrics.wilsonInterval(11, 10), /events must not exceed n/],
  ['wilsonInterval confidence 1', () => metrics.wilsonInterval(1, 10, 1), /confidence/],
  ['funnelLimits non-integer n', () => metrics.funnelLimits(0.5, 10.5, 0.95), /\bn\b/],
  ['funnelLimits theta0 NaN', () => metrics.funnelLimits(NaN, 10, 0.95), /theta0/],
  ['funnelLimits confidence 0', () => metrics.funnelLimits(0.5, 10, 0), /confidence/],
  ['binomialQuantile p > 1', () => metrics.binomialQuantile(1.5, 10, 0.5), /\bp\b/],
  ['poissonInterval negative', () => metrics.poissonInterval(-2), /observed/],
  ['poissonInterval confidence', () => metrics.poissonInterval(2, -0.5), /confidence/],
  [
    'overdispersion events > n',
    () => metrics.overdispersion([{ events: 3, n: 2 }], 0.5),
    /units\[0\]\.events/,
  ],
  [
    'overdispersedLimits n',
    () => metrics.overdispersedLimits(0.5, -3, 0.95, { phi: 1, tau2: 0, present: false }),
    /\bn\b/,
  ],
  ['funnelFlag theta0', () => metrics.funnelFlag({ events: 1, n: 2 }, 3), /theta0/],
  [
    'compareUnits units',
    () => metrics.compareUnits([{ key: 'A', events: 1.5, n: 2 }]),
    /units\[0\]\.events/,
  ],
  [
    'indirectStandardise cells',
    () => metrics.indirectStandardise([{ unit: 'A', stratum: 1, events: -1, n: 2 }]),
    /cells\[0\]\.events/,
  ],
  ['improvementPotential n', () => metrics.improvementPotential(1, NaN, 0.5), /\bn\b/],
  ['chiSquareQuantile df', () => metrics.chiSquareQuantile(0.5, -1), /degreesOfFreedom/],
  ['discloseCount count', () => metrics.discloseCount(-1), /count/],
  ['runsLimits', () => metrics.runsLimits(2.5), /usefulObservations/],
  [
    'reviewWindow quarter',
    () => metrics.reviewWindow({ year: 2026, quarter: 5 as 1 }),
    /quarter\.quarter/,
  ],
];

describe('bad input', () => {
  it.each(cases)('%s throws a RangeError naming the argument', (_, call, pattern) => {
    expect(call).toThrow(RangeError);
    expect(call).toThrow(pattern);
  });

  it('treats n = 0 as no rate and no limits, without throwing', () => {
    expect(metrics.wilsonInterval(0, 0)).toEqual({ lower: null, upper: null });
    expect(metrics.funnelLimits(0.4, 0, 0.998)).toEqual({ lower: null, upper: null });
    expect(metrics.funnelFlag({ events: 0, n: 0 }, 0.4).rate).toBeNull();
    expect(metrics.improvementPotential(0, 0, 0.4)).toBeNull();
    expect(metrics.discloseRate(0, 0)).toBeNull();
  });

  it('handles events = 0, events = n and θ₀ = 0 or 1', () => {
    expect(metrics.wilsonInterval(0, 5).lower).toBe(0);
    expect(metrics.wilsonInterval(5, 5).upper).toBe(1);
    expect(metrics.funnelLimits(0, 5, 0.95)).toEqual({ lower: 0, upper: 0 });
    expect(metrics.funnelLimits(1, 5, 0.95)).toEqual({ lower: 1, upper: 1 });
    expect(metrics.funnelFlag({ events: 5, n: 5 }, 1).band).toBe('within');
    expect(
      metrics.overdispersion(
        [
          { events: 0, n: 5 },
          { events: 0, n: 7 },
        ],
        0,
      ).phi,
    ).toBeNull();
  });
});
