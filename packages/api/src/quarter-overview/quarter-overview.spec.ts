import { nextQuarter } from './quarter-overview.service.js';

describe('the quarter that would open next', () => {
  const today = new Date('2026-12-04T12:00:00Z');
  it.each([
    [[], { year: 2026, quarter: 4 }],
    [[{ year: 2026, quarter: 3 }], { year: 2026, quarter: 4 }],
    [[{ year: 2026, quarter: 4 }], { year: 2027, quarter: 1 }],
    [
      [
        { year: 2025, quarter: 4 },
        { year: 2026, quarter: 2 },
        { year: 2026, quarter: 1 },
      ],
      { year: 2026, quarter: 3 },
    ],
  ] as const)('after %j: %j', (quarters, next) => {
    expect(nextQuarter(quarters, today)).toEqual(next);
  });

  it('takes the calendar quarter of today when there is none yet', () => {
    expect(nextQuarter([], new Date('2027-02-01T00:00:00Z'))).toEqual({ year: 2027, quarter: 1 });
  });
});
