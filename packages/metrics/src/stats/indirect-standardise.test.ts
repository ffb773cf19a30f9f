import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { indirectStandardise } from './indirect-standardise.js';
import { poissonInterval } from './poisson-interval.js';

describe('indirectStandardise', () => {
  it('works a small example by hand', () => {
    // Two strata: young (region 30/100 = 0.3) and old (region 70/100 = 0.7).
    const result = indirectStandardise([
      { unit: 'A', stratum: 'young', events: 20, n: 80 },
      { unit: 'A', stratum: 'old', events: 10, n: 20 },
      { unit: 'B', stratum: 'young', events: 10, n: 20 },
      { unit: 'B', stratum: 'old', events: 60, n: 80 },
    ]);
    const a = result.units.find((u) => u.unit === 'A')!;
    // E_A = 80·0.3 + 20·0.7 = 38; O_A = 30; θ₀ = 100/200 = 0.5.
    expect(a.expected).toBeCloseTo(38, 12);
    expect(a.observed).toBe(30);
    expect(a.ratio).toBeCloseTo(30 / 38, 12);
    expect(a.adjustedRate).toBeCloseTo((30 / 38) * 0.5, 12);
    const garwood = poissonInterval(30);
    expect(a.interval.lower).toBeCloseTo(garwood.lower / 38, 12);
    expect(a.interval.upper).toBeCloseTo(garwood.upper / 38, 12);
    expect(a.crudeRate).toBeCloseTo(0.3, 12);
  });

  const cells = fc.array(
    fc
      .record({
        unit: fc.constantFrom('A', 'B', 'C', 'D'),
        stratum: fc.integer({ min: 0, max: 5 }),
        n: fc.integer({ min: 0, max: 50 }),
        share: fc.double({ min: 0, max: 1, noNaN: true }),
      })
      .map(({ unit, stratum, n, share }) => ({ unit, stratum, n, events: Math.floor(share * n) })),
    { minLength: 1, maxLength: 40 },
  );

  it('keeps Σ O = Σ E over the region (property)', () => {
    fc.assert(
      fc.property(cells, (input) => {
        const result = indirectStandardise(input);
        const o = result.units.reduce((s, u) => s + u.observed, 0);
        const e = result.units.reduce((s, u) => s + u.expected, 0);
        expect(e).toBeCloseTo(o, 8);
      }),
    );
  });

  it('gives O/E = 1 for every unit when every stratum has the same rate (property)', () => {
    fc.assert(
      fc.property(
        fc.array(
          fc.record({
            unit: fc.constantFrom('A', 'B', 'C'),
            stratum: fc.integer({ min: 0, max: 4 }),
            half: fc.integer({ min: 1, max: 30 }),
          }),
          { minLength: 1, maxLength: 30 },
        ),
        (input) => {
          // Every cell has rate ½ exactly, so every stratum rate is ½.
          const result = indirectStandardise(
            input.map(({ unit, stratum, half }) => ({ unit, stratum, events: half, n: 2 * half })),
          );
          for (const u of result.units) expect(u.ratio).toBeCloseTo(1, 12);
        },
      ),
    );
  });

  it('has no ratio when nothing is expected', () => {
    const result = indirectStandardise([{ unit: 'A', stratum: 's', events: 0, n: 10 }]);
    expect(result.units[0]).toMatchObject({ expected: 0, ratio: null, adjustedRate: null });
    expect(result.units[0]?.interval).toEqual({ lower: null, upper: null });
  });

  it('refuses bad cells', () => {
    expect(() => indirectStandardise([{ unit: 'A', stratum: 1, events: 4, n: 2 }])).toThrow(
      /cells\[0\]\.events/,
    );
  });
});
