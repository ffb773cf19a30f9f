/**
 * The outlier rule (docs/methods.md §12) on hand-made results: limits and θ₀ chosen so that the
 * band is plain; z worked by hand.
 */
import type { UnitResult } from '@cairn/metrics';
import { flaggedLike, judge, type MeasureContext } from './outlier-rule.js';

function unit(events: number, n: number, adjustedRate: number | null = null): UnitResult {
  const limits = { inner: { lower: 0.4, upper: 0.6 }, outer: { lower: 0.3, upper: 0.7 } };
  return {
    code: 'P1',
    events,
    denominator: n,
    measured: n,
    n,
    rate: n > 0 ? events / n : null,
    interval: { lower: 0, upper: 1 },
    z: null,
    exact: { band: 'within', side: null, assessment: null, ...limits },
    adjusted: { band: 'within', side: null, assessment: null, ...limits },
    caseMix: {
      observed: events,
      expected: events,
      ratio: 1,
      interval: { lower: 0.5, upper: 1.5 },
      adjustedRate,
    },
    improvementPotential: 0,
  };
}

const context: MeasureContext = {
  theta0: 0.5,
  direction: 'higher',
  overdispersion: { phi: 2, tau2: 0.01, present: true },
  method: 'additive',
};

describe('outlier rule', () => {
  it.each([
    // events of 100, level, band, side, assessment
    [50, 'outer', null],
    [65, 'outer', null],
    [65, 'inner', ['notable', 'above', 'better']],
    [25, 'outer', ['outlier', 'below', 'worse']],
    [25, 'inner', ['outlier', 'below', 'worse']],
    [75, 'outer', ['outlier', 'above', 'better']],
    [70, 'outer', null], // on the limit counts as within
  ] as const)('%i of 100 at level %s', (events, level, expected) => {
    const j = judge(unit(events, 100), context, { level, caseMix: false });
    expect(j === null ? null : [j.band, j.side, j.assessment]).toEqual(expected);
  });

  it('reads a lower-is-better measure’s high rate as worse', () => {
    const j = judge(
      unit(80, 100),
      { ...context, direction: 'lower' },
      { level: 'outer', caseMix: false },
    );
    expect(j?.assessment).toBe('worse');
  });

  it('judges the case-mix adjusted rate when asked', () => {
    // Crude 25 % is an outlier; its adjusted rate of 50 % is not.
    expect(judge(unit(25, 100, 0.5), context, { level: 'outer', caseMix: true })).toBeNull();
    expect(judge(unit(50, 100, 0.2), context, { level: 'outer', caseMix: true })?.rate).toBe(0.2);
  });

  it('measures the evidence after widening: additive and multiplicative (by hand)', () => {
    // s² = 0.25/100 = 0.0025; additive: (0.25 − 0.5)/√(0.0025 + 0.01) = −0.25/0.1118 = −2.2361
    expect(judge(unit(25, 100), context, { level: 'outer', caseMix: false })!.z).toBeCloseTo(
      -2.2361,
      4,
    );
    // multiplicative: −0.25/√(2 × 0.0025) = −0.25/0.070711 = −3.5355
    const m = judge(
      unit(25, 100),
      { ...context, method: 'multiplicative' },
      { level: 'outer', caseMix: false },
    );
    expect(m!.z).toBeCloseTo(-3.5355, 4);
    // not present: the plain z, −0.25/0.05 = −5
    const plain = judge(
      unit(25, 100),
      { ...context, overdispersion: null },
      { level: 'outer', caseMix: false },
    );
    expect(plain!.z).toBeCloseTo(-5, 10);
  });

  it('places nothing without a rate or a region rate', () => {
    expect(judge(unit(0, 0), context, { level: 'inner', caseMix: false })).toBeNull();
    expect(
      judge(unit(25, 100), { ...context, theta0: null }, { level: 'inner', caseMix: false }),
    ).toBeNull();
  });

  it.each([
    [4, 'above', 'outer', true],
    [2, 'above', 'outer', false],
    [2, 'above', 'inner', true],
    [5, 'above', 'inner', false],
    [5, 'below', 'outer', true],
    [1, 'below', 'inner', false],
    [0, 'below', 'inner', false],
  ] as const)('an earlier flag code %i counts for %s at %s: %s', (code, side, level, expected) => {
    expect(flaggedLike(code, side, level)).toBe(expected);
  });
});
