import { describe, expect, it } from 'vitest';
import { improvementPotential, medianRate } from './improvement-potential.js';

describe('improvementPotential (methods §8: ⌈m·n − y⌉ below the regional median)', () => {
  it('counts the records needed to reach the median', () => {
    expect(improvementPotential(50, 100, 0.62)).toBe(12);
    expect(improvementPotential(50, 101, 0.62)).toBe(13); // 62.62 − 50 → 13
    expect(improvementPotential(70, 100, 0.62)).toBe(0);
  });

  it('does not round an exact whole number up (0.07 · 100 is 7.000000000000001 in floating point)', () => {
    expect(0.07 * 100).not.toBe(7);
    expect(improvementPotential(5, 100, 0.07)).toBe(2);
  });

  it('works the other way for a lower-is-better measure', () => {
    expect(improvementPotential(30, 100, 0.12, 'lower')).toBe(18);
    expect(improvementPotential(5, 100, 0.12, 'lower')).toBe(0);
  });

  it('returns null for n = 0 and refuses bad input', () => {
    expect(improvementPotential(0, 0, 0.5)).toBeNull();
    expect(() => improvementPotential(5, 3, 0.5)).toThrow(/events/);
    expect(() => improvementPotential(1, 3, 1.5)).toThrow(/referenceRate/);
  });

  it('takes the median of unit rates, ignoring empty units', () => {
    expect(
      medianRate([
        { events: 1, n: 2 },
        { events: 3, n: 4 },
        { events: 0, n: 0 },
        { events: 9, n: 10 },
      ]),
    ).toBe(0.75);
    expect(medianRate([])).toBeNull();
  });
});
