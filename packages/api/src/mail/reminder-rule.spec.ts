import { addDays, reminderDue, todayUtc } from './reminder-rule.js';

describe('reminderDue (deadline 2026-12-16, 7 days before)', () => {
  it.each([
    ['2026-12-08', false], // 8 days before: too early
    ['2026-12-09', true], // 7 days before: the first day
    ['2026-12-12', true],
    ['2026-12-16', true], // the deadline itself
    ['2026-12-17', false], // after the deadline
    ['2027-01-01', false],
  ])('on %s: %s', (today, due) => {
    expect(reminderDue('2026-12-16', today, 7)).toBe(due);
  });

  it('crosses month and year ends', () => {
    expect(addDays('2027-01-03', -7)).toBe('2026-12-27');
    expect(addDays('2028-03-01', -1)).toBe('2028-02-29');
    expect(reminderDue('2027-01-03', '2026-12-27', 7)).toBe(true);
    expect(todayUtc(new Date('2026-12-04T23:59:59Z'))).toBe('2026-12-04');
  });
});
