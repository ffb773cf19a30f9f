import { describe, expect, it } from 'vitest';
import { kaplanMeier } from './kaplan-meier.js';

describe('kaplanMeier (Kaplan & Meier, JASA 1958)', () => {
  it('matches a small example worked by hand', () => {
    // Times 1, 2, 2+, 3, 4+, 5 (+ censored).
    // t = 1: 6 at risk, 1 event → S = 5/6.
    // t = 2: 5 at risk, 1 event (and 1 censored after it) → S = 5/6 · 4/5 = 2/3.
    // t = 3: 3 at risk, 1 event → S = 2/3 · 2/3 = 4/9 ≤ ½: the median is 3.
    // t = 4: 2 at risk, censored. t = 5: 1 at risk, 1 event → S = 0.
    const km = kaplanMeier([1, 2, 2, 3, 4, 5], [1, 1, 0, 1, 0, 1]);
    expect(km.n).toBe(6);
    expect(km.events).toBe(4);
    expect(km.steps.map((s) => [s.time, s.atRisk, s.events, s.censored])).toEqual([
      [1, 6, 1, 0],
      [2, 5, 1, 1],
      [3, 3, 1, 0],
      [4, 2, 0, 1],
      [5, 1, 1, 0],
    ]);
    expect(km.steps.map((s) => s.survival)).toEqual(
      [5 / 6, 2 / 3, 4 / 9, 4 / 9, 0].map((v, i) => expect.closeTo(v, i === 4 ? 15 : 12)),
    );
    expect(km.median).toBe(3);
    // Greenwood at t = 1: S·√(1/(6·5)).
    expect(km.steps[0]?.standardError).toBeCloseTo((5 / 6) * Math.sqrt(1 / 30), 12);
    expect(km.steps[4]?.standardError).toBeNull();
  });

  it('has no median while survival stays above ½', () => {
    const km = kaplanMeier([1, 2, 3, 4], [true, false, false, false]);
    expect(km.median).toBeNull();
    expect(km.steps.at(-1)?.survival).toBeCloseTo(0.75, 15);
  });

  it('refuses mismatched or bad input', () => {
    expect(() => kaplanMeier([1, 2], [1])).toThrow(/events/);
    expect(() => kaplanMeier([-1], [1])).toThrow(/times\[0\]/);
    expect(() => kaplanMeier([1], [2 as 1])).toThrow(/events\[0\]/);
    expect(kaplanMeier([], [])).toMatchObject({ n: 0, events: 0, steps: [], median: null });
  });
});
