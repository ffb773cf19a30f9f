import type { Month } from './record.js';

/**
 * Month strings ('YYYY-MM') and integer month indices.
 *
 * index = year × 12 + (month − 1), so consecutive months differ by 1 and
 * `monthIndex('2026-09') − monthIndex('2025-10') = 11`. Indices of years 1…2730 fit the
 * Int16Array month columns of the columnar form.
 */

const MONTH_PATTERN = /^(\d{4})-(\d{2})$/;

/** True when `value` is a well-formed month string 'YYYY-MM' with month 01…12 and year ≥ 1. */
export function isMonth(value: unknown): value is Month {
  if (typeof value !== 'string') return false;
  const match = MONTH_PATTERN.exec(value);
  if (match === null) return false;
  const year = Number(match[1]);
  const month = Number(match[2]);
  return year >= 1 && month >= 1 && month <= 12;
}

/** The integer index of a month string. Throws a RangeError on a malformed month. */
export function monthIndex(month: Month): number {
  // Fast path by character codes (the columnar builder calls this per record).
  if (typeof month === 'string' && month.length === 7 && month.charCodeAt(4) === 45) {
    const y0 = month.charCodeAt(0) - 48;
    const y1 = month.charCodeAt(1) - 48;
    const y2 = month.charCodeAt(2) - 48;
    const y3 = month.charCodeAt(3) - 48;
    const m0 = month.charCodeAt(5) - 48;
    const m1 = month.charCodeAt(6) - 48;
    if (
      y0 >= 0 &&
      y0 <= 9 &&
      y1 >= 0 &&
      y1 <= 9 &&
      y2 >= 0 &&
      y2 <= 9 &&
      y3 >= 0 &&
      y3 <= 9 &&
      m0 >= 0 &&
      m0 <= 1 &&
      m1 >= 0 &&
      m1 <= 9
    ) {
      const year = y0 * 1000 + y1 * 100 + y2 * 10 + y3;
      const m = m0 * 10 + m1;
      if (year >= 1 && m >= 1 && m <= 12) return year * 12 + m - 1;
    }
  }
  throw new RangeError(`month must be a month 'YYYY-MM' (got ${JSON.stringify(month)})`);
}

/** The month string of an integer month index. Throws a RangeError on an invalid index. */
export function monthFromIndex(index: number): Month {
  if (!Number.isInteger(index) || index < 12 || index > 9999 * 12 + 11) {
    throw new RangeError(`index must be a month index of a year 1…9999 (got ${index})`);
  }
  const year = Math.floor(index / 12);
  const month = index - year * 12 + 1;
  return `${String(year).padStart(4, '0')}-${month < 10 ? '0' : ''}${month}`;
}

/** The calendar year of a month index. */
export function yearOfMonthIndex(index: number): number {
  return Math.floor(index / 12);
}
