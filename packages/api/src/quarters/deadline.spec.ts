import { dateInWords, deadlineProblem, defaultDeadline, quarterEnd } from './deadline.js';

describe('quarter ends and deadlines', () => {
  it.each([
    [2026, 1, '2026-03-31'],
    [2026, 2, '2026-06-30'],
    [2026, 3, '2026-09-30'],
    [2026, 4, '2026-12-31'],
    [2024, 1, '2024-03-31'],
  ])('%i Q%i ends on %s', (year, quarter, end) => {
    expect(quarterEnd(year, quarter)).toBe(end);
  });

  it('puts the default deadline a number of days after the end', () => {
    expect(defaultDeadline(2026, 4, 45)).toBe('2027-02-14');
    expect(defaultDeadline(2026, 3, 1)).toBe('2026-10-01');
  });

  it.each([
    ['2026-10-01', null],
    ['2027-02-14', null],
    [
      '2026-09-30',
      'must fall after the quarter ends: 2026 Q3 ends on 30 September 2026, and its extracts cannot be complete before then',
    ],
    ['2026-01-15', expect.stringMatching(/^must fall after the quarter ends/)],
  ])('a 2026 Q3 deadline of %s: %s', (deadline, problem) => {
    expect(deadlineProblem(2026, 3, deadline)).toEqual(problem);
  });

  it('writes dates in words', () => {
    expect(dateInWords('2026-12-31')).toBe('31 December 2026');
  });
});
