import { describe, expect, it } from 'vitest';
import { formatDate, formatMonth, parseDate } from '../src/lib/format';

describe('dates written the region’s way', () => {
  it.each([
    ['4/12/2026', '2026-12-04'],
    ['04/12/2026', '2026-12-04'],
    ['4.12.2026', '2026-12-04'],
    ['4 Dec 2026', '2026-12-04'],
    ['4 December 2026', '2026-12-04'],
    ['4 Sept 2026', '2026-09-04'],
    [' 2026-12-04 ', '2026-12-04'],
    ['29/2/2028', '2028-02-29'],
  ])('reads %s as %s', (text, iso) => {
    expect(parseDate(text)).toBe(iso);
  });

  it.each(['', '12/4', '31/4/2026', '29/2/2026', '4 Dex 2026', '2026-13-01', 'tomorrow'])(
    'refuses %j',
    (text) => {
      expect(parseDate(text)).toBeNull();
    },
  );

  it('writes days and months the same way whatever the browser’s language', () => {
    expect(formatDate('2026-12-04')).toBe('4 Dec 2026');
    expect(formatDate('2026-12-04T23:30:00.000Z')).toBe('4 Dec 2026');
    expect(formatDate(null)).toBe('—');
    expect(formatMonth('2025-10')).toBe('Oct 2025');
  });
});
