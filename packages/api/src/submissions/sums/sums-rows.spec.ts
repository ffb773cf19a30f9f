/**
 * The sums read's own reading of a row's text (sums-rows.ts, RowText) gives what the connector
 * gives for the same field without a type cast (`+text`, i.e. Number) and the month index of
 * @cairn/metrics (monthIndex), for any double, any integer and any month.
 */
import { monthIndex } from '@cairn/metrics';
import fc from 'fast-check';
import { RowText } from './sums-rows.js';

/** Decimal texts as a server may write a double: shortest, fixed, with exponent, signed. */
const doubleText = fc.oneof(
  fc.double({ noNaN: true, noDefaultInfinity: true }).map((x) => String(x)),
  fc.double({ noNaN: true, noDefaultInfinity: true, min: -1e6, max: 1e6 }).map((x) => String(x)),
  fc
    .tuple(fc.integer({ min: 0, max: 99999 }), fc.integer({ min: 0, max: 6 }))
    .map(([m, k]) => (m / 10 ** k).toFixed(k)),
  fc.integer({ min: -1e15, max: 1e15 }).map(String),
  fc.bigInt({ min: 0n, max: 10n ** 20n }).map(String),
  fc
    .tuple(fc.integer({ min: 0, max: 9999 }), fc.integer({ min: 0, max: 25 }))
    .map(([m, k]) => `0.${'0'.repeat(k)}${m}`),
  fc.constantFrom('0', '-0', '00071', '5.', '1e-5', '-2.5E+20', '0.1', '3.5', '46.6'),
);

describe('reading the fields of a sums row', () => {
  it('reads a number as Number does, bit for bit', () => {
    fc.assert(
      fc.property(fc.array(fc.option(doubleText, { nil: null }), { minLength: 1 }), (fields) => {
        const f = new RowText();
        f.start(fields.map((x) => x ?? '').join(','));
        for (const x of fields) {
          const read = f.number();
          if (x === null) expect(read).toBeNull();
          else expect(Object.is(read, Number(x))).toBe(true);
        }
      }),
      { numRuns: 2000 },
    );
  });

  it('reads a month as its month index, and a malformed one as NaN', () => {
    fc.assert(
      fc.property(
        fc.array(
          fc.option(
            fc
              .tuple(fc.integer({ min: 1, max: 2730 }), fc.integer({ min: 1, max: 12 }))
              .map(([y, m]) => `${String(y).padStart(4, '0')}-${String(m).padStart(2, '0')}`),
            { nil: null },
          ),
          { minLength: 1 },
        ),
        (months) => {
          const f = new RowText();
          f.start(months.map((x) => x ?? '').join(','));
          for (const x of months) expect(f.month()).toBe(x === null ? null : monthIndex(x));
        },
      ),
    );
    const f = new RowText();
    f.start('2026/03,202603,2026-3,2026-03,20x6-03');
    expect(f.month()).toBeNaN();
    expect(f.month()).toBeNaN();
    expect(f.month()).toBe(2026 * 12 + 2);
    expect(f.month()).toBe(2026 * 12 + 2);
    expect(f.month()).toBeNaN();
  });
});
