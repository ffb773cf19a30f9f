import { describe, expect, it } from 'vitest';
import { formatDate, formatDateTime, formatMonth } from '../src/lib/format';
import { toRegionDate } from '../src/lib/region-dates';

describe('dates written the region’s way', () => {
  it('writes days, months and times the same way whatever the browser’s language', () => {
    expect(toRegionDate('2026-12-04')).toBe('04/12/2026');
    expect(formatDate('2026-12-04')).toBe('4 Dec 2026');
    expect(formatDate('2026-12-04T23:30:00.000Z')).toBe('4 Dec 2026');
    expect(formatDate(null)).toBe('—');
    expect(formatMonth('2025-10')).toBe('Oct 2025');
    expect(formatDateTime('2026-12-04T09:05:00.000Z')).toMatch(/^4 Dec 2026, \d\d:05$/);
  });
});
