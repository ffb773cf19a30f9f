import { figuresAsSent, toSignificant } from './sent-figures.js';

describe('toSignificant', () => {
  it.each<[number, number]>([
    [0.123456789, 0.123457],
    [0.9041666666666667, 0.904167],
    [-0.9041666666666667, -0.904167],
    [1.0000049, 1.0],
    [0.000123456789, 0.000123457],
    [3.14159265358979, 3.14159],
    [12345.678901, 12345.7],
    [1234567.89, 1234570],
    [2.5e-12, 2.5e-12],
    [1.23456789e-200, 1.23457e-200],
  ])('%p → %p', (x, expected) => {
    expect(toSignificant(x)).toBe(expected);
    expect(
      String(toSignificant(x))
        .replace(/^-|e.*$|\./g, '')
        .replace(/^0+/, '')
        .replace(/0+$/, '').length,
    ).toBeLessThanOrEqual(6);
  });

  it('keeps integers, zero and non-finite numbers as they are', () => {
    for (const x of [0, -0, 7, -12, 3_500_000, Number.MAX_SAFE_INTEGER, Infinity, -Infinity]) {
      expect(Object.is(toSignificant(x), x)).toBe(true);
    }
    expect(toSignificant(NaN)).toBeNaN();
  });

  it('is within half a unit of the sixth figure over many magnitudes', () => {
    let seed = 7;
    const next = () => (seed = (seed * 48271) % 2147483647) / 2147483647;
    for (let i = 0; i < 5_000; i++) {
      const x = (next() - 0.5) * 10 ** Math.floor(next() * 40 - 20);
      if (x === 0) continue;
      const r = toSignificant(x);
      expect(Math.abs(r - x)).toBeLessThanOrEqual(5e-6 * Math.abs(x) * (1 + 1e-9));
      // Idempotent: sending a sent figure again does not move it.
      expect(toSignificant(r)).toBe(r);
    }
  });
});

describe('figuresAsSent', () => {
  it('sends non-integers to six figures, integers and strings exactly', () => {
    expect(
      JSON.stringify(
        {
          rate: 0.8571428571428571,
          n: 14,
          limits: [0.5120499370447547, 0.9999999999999999],
          label: 'HbA1c 0.123456789',
          none: null,
        },
        figuresAsSent,
      ),
    ).toBe('{"rate":0.857143,"n":14,"limits":[0.51205,1],"label":"HbA1c 0.123456789","none":null}');
  });
});
