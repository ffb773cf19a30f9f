import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { egfrCkdEpi2021, egfrUnchecked } from '../kidney/egfr-ckd-epi-2021.js';
import { bandCode, bandOfCode, classifyRate, funnelFlag } from './funnel-flag.js';
import { nextOrderStatistic, orderStatistic } from './order-statistic.js';
import {
  overdispersion,
  overdispersionOfColumns,
  percentileOfUnsorted,
  percentileType7,
} from './overdispersion.js';
import { median, medianOfSorted, medianOfUnsorted } from './run-chart.js';

/**
 * The forms of existing functions that work on columns or numbers instead of objects give the
 * same numbers as the functions they serve.
 */
const units = fc.array(
  fc.nat({ max: 400 }).chain((n) => fc.record({ n: fc.constant(n), events: fc.nat({ max: n }) })),
  { maxLength: 40 },
);

describe('columnar forms', () => {
  it('overdispersionOfColumns equals overdispersion', () => {
    fc.assert(
      fc.property(units, fc.double({ min: 0, max: 1, noNaN: true }), (list, theta0) => {
        const od = overdispersion(list, theta0);
        const columns = overdispersionOfColumns(
          list.map((u) => u.events),
          list.map((u) => u.n),
          theta0,
        );
        expect({
          ...columns,
          z: Array.from(columns.z, (v) => (Number.isNaN(v) ? null : v)),
        }).toEqual(od);
      }),
    );
  });

  it('bandCode is funnelFlag’s band and side', () => {
    fc.assert(
      fc.property(
        fc
          .nat({ max: 300 })
          .chain((n) => fc.record({ n: fc.constant(n + 1), events: fc.nat({ max: n + 1 }) })),
        fc.double({ min: 0.01, max: 0.99, noNaN: true }),
        fc.constantFrom('higher' as const, 'lower' as const),
        (unit, theta0, direction) => {
          const flag = funnelFlag(unit, theta0, { direction });
          const inner = flag.inner as { lower: number; upper: number };
          const outer = flag.outer as { lower: number; upper: number };
          const code = bandCode(
            unit.events / unit.n,
            inner.lower,
            inner.upper,
            outer.lower,
            outer.upper,
          );
          expect(bandOfCode(code)).toEqual({ band: flag.band, side: flag.side });
          expect(classifyRate(unit.events / unit.n, inner, outer, direction)).toEqual({
            band: flag.band,
            side: flag.side,
            assessment: flag.assessment,
          });
        },
      ),
    );
  });

  it('medianOfSorted and medianOfUnsorted equal median', () => {
    fc.assert(
      fc.property(fc.array(fc.double({ noNaN: true, noDefaultInfinity: true })), (values) => {
        expect(medianOfSorted([...values].sort((a, b) => a - b))).toBe(median(values));
        expect(medianOfUnsorted(Float64Array.from(values))).toBe(median(values));
      }),
    );
  });

  it('orderStatistic is the element a sort puts at k; percentileOfUnsorted is percentileType7', () => {
    fc.assert(
      fc.property(
        fc.array(fc.integer({ min: -20, max: 20 }), { minLength: 1, maxLength: 200 }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        (values, q) => {
          const sorted = Float64Array.from(values).sort();
          for (let k = 0; k < values.length; k++) {
            const work = Float64Array.from(values);
            expect(orderStatistic(work, k)).toBe(sorted[k]);
            if (k + 1 < values.length) expect(nextOrderStatistic(work, k)).toBe(sorted[k + 1]);
          }
          expect(percentileOfUnsorted(Float64Array.from(values), q)).toBe(
            percentileType7(sorted, q),
          );
        },
      ),
    );
    expect(() => orderStatistic(new Float64Array(3), 3)).toThrow(/k must be an index 0…2/);
  });

  // The unchecked form is what the checked one calls; here against every factor by Math.pow.
  it('egfrUnchecked gives exactly the equation with every factor by Math.pow', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 20, max: 2000, noNaN: true }),
        fc.integer({ min: 18, max: 160 }),
        fc.boolean(),
        (creatinine, age, female) => {
          const kappa = female ? 0.7 : 0.9;
          const alpha = female ? -0.241 : -0.302;
          const ratio = creatinine / 88.42 / kappa;
          const direct =
            142 *
            Math.pow(Math.min(ratio, 1), alpha) *
            Math.pow(Math.max(ratio, 1), -1.2) *
            Math.pow(0.9938, age) *
            (female ? 1.012 : 1);
          expect(egfrUnchecked(creatinine, age, female)).toBe(direct);
          expect(
            egfrCkdEpi2021({ creatinineUmolL: creatinine, age, sex: female ? 'F' : 'M' }),
          ).toBe(direct);
        },
      ),
      { numRuns: 500 },
    );
  });
});
