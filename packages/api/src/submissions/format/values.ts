/**
 * Reading one cell of an extract: text, numbers, years, codes, yes/no and
 * dates, from XLSX cells (numbers, booleans, Date objects, formula results)
 * and CSV text alike. Pure functions; the validator turns failures into
 * plain-language issues.
 */

/** A cell as the file readers hand it over. */
export type Cell = string | number | boolean | Date | null | CellProblem;

/** A cell that holds no usable value: a spreadsheet error, or a formula without a saved result. */
export class CellProblem {
  constructor(
    readonly kind: 'error' | 'no_result',
    /** '#N/A', '#DIV/0!'…, or the formula text */
    readonly text: string,
  ) {}
}

/** The value as given, as text for the report (dates as ISO, numbers as written). */
export function cellText(cell: Cell): string {
  if (cell === null) return '';
  if (typeof cell === 'string') return cell;
  if (typeof cell === 'number') return Number.isFinite(cell) ? String(cell) : '';
  if (typeof cell === 'boolean') return cell ? 'TRUE' : 'FALSE';
  if (cell instanceof Date)
    return Number.isNaN(cell.getTime()) ? '' : cell.toISOString().slice(0, 10);
  return cell.kind === 'error' ? cell.text : `=${cell.text}`;
}

export function isBlank(cell: Cell): boolean {
  return cell === null || (typeof cell === 'string' && cell.trim() === '');
}

// ───────────────────────────── numbers ─────────────────────────────

export type NumberRead =
  | { ok: true; value: number; unitText: string | null }
  | { ok: false; reason: 'not_a_number' | 'ambiguous_separator' };

const NUMBER_WITH_UNIT = /^([-+]?(?:\d+(?:[.,]\d*)?|[.,]\d+))\s*([^\d\s].*)?$/;

/** Digits with an optional decimal point: read directly (the common case). */
const PLAIN_NUMBER = /^\d{1,9}(\.\d{1,9})?$/;

/** A number, possibly written with a decimal comma or followed by a unit ("7.2 %"). */
export function readNumber(cell: Cell): NumberRead {
  if (typeof cell === 'string' && PLAIN_NUMBER.test(cell))
    return { ok: true, value: Number(cell), unitText: null };
  if (typeof cell === 'number') {
    return Number.isFinite(cell)
      ? { ok: true, value: cell, unitText: null }
      : { ok: false, reason: 'not_a_number' };
  }
  if (typeof cell !== 'string') return { ok: false, reason: 'not_a_number' };
  const text = cell.trim().replace(/\u00a0/g, ' ');
  const match = NUMBER_WITH_UNIT.exec(text);
  if (!match) return { ok: false, reason: 'not_a_number' };
  let digits = match[1]!;
  if (digits.includes(',')) {
    // One comma: a decimal comma ("7,2"), unless it reads as a thousands separator ("1,200").
    if (/^[-+]?\d{1,3},\d{3}$/.test(digits)) return { ok: false, reason: 'ambiguous_separator' };
    digits = digits.replace(',', '.');
  }
  const value = Number(digits);
  if (!Number.isFinite(value)) return { ok: false, reason: 'not_a_number' };
  const unitText = match[2]?.trim() || null;
  return { ok: true, value, unitText };
}

// ───────────────────────────── years ─────────────────────────────

export type YearRead =
  { ok: true; year: number } | { ok: false; reason: 'not_a_year' | 'two_digit_year' | 'full_date' };

const FOUR_DIGITS = /^\d{4}$/;

/** A four-digit year. A full date (a Date cell or date text) is reported as such. */
export function readYear(cell: Cell): YearRead {
  if (typeof cell === 'string' && FOUR_DIGITS.test(cell)) return { ok: true, year: Number(cell) };
  if (cell instanceof Date) return { ok: false, reason: 'full_date' };
  if (typeof cell === 'number') {
    return Number.isInteger(cell) && cell >= 1000 && cell <= 9999
      ? { ok: true, year: cell }
      : { ok: false, reason: 'not_a_year' };
  }
  if (typeof cell !== 'string') return { ok: false, reason: 'not_a_year' };
  const text = cell.trim();
  if (/^\d{4}(\.0+)?$/.test(text)) return { ok: true, year: Number.parseInt(text, 10) };
  if (/^\d{2}$/.test(text)) return { ok: false, reason: 'two_digit_year' };
  if (looksLikeDateText(text)) return { ok: false, reason: 'full_date' };
  return { ok: false, reason: 'not_a_year' };
}

/** Text that reads as a day or month date (not a bare year). */
export function looksLikeDateText(text: string): boolean {
  return (
    /^\d{1,4}[/.-]\d{1,2}([/.-]\d{1,4})?([ T].*)?$/.test(text) ||
    /^\d{1,2}[ -]?[a-z]{3,9}[ -]?\d{2,4}$/i.test(text) ||
    /^[a-z]{3,9}[ -]\d{4}$/i.test(text)
  );
}

// ───────────────────────────── codes ─────────────────────────────

/** Lower case without spaces, hyphens, underscores or dots: "Type 2" → "type2". */
export function normaliseCode(text: string): string {
  return text
    .trim()
    .toLowerCase()
    .replace(/[\s_.-]+/g, '');
}

export type YesNo = boolean | null;
const YES = new Set(['yes', 'y', 'true', '1', 'ja', 'oui']);
const NO = new Set(['no', 'n', 'false', '0', 'nein', 'non']);
const NOT_RECORDED = new Set(['', 'unknown', 'notrecorded', 'notknown', 'na', 'n/a']);

export type YesNoRead = { ok: true; value: YesNo } | { ok: false };

const YES_NO_EXACT: Record<string, YesNoRead> = {
  yes: { ok: true, value: true },
  no: { ok: true, value: false },
  Yes: { ok: true, value: true },
  No: { ok: true, value: false },
};

export function readYesNo(cell: Cell): YesNoRead {
  if (typeof cell === 'string') {
    const exact = YES_NO_EXACT[cell];
    if (exact) return exact;
  }
  if (typeof cell === 'boolean') return { ok: true, value: cell };
  if (typeof cell === 'number') {
    if (cell === 1) return { ok: true, value: true };
    if (cell === 0) return { ok: true, value: false };
    return { ok: false };
  }
  if (cell === null) return { ok: true, value: null };
  if (typeof cell !== 'string') return { ok: false };
  const code = normaliseCode(cell);
  if (YES.has(code)) return { ok: true, value: true };
  if (NO.has(code)) return { ok: true, value: false };
  if (NOT_RECORDED.has(code)) return { ok: true, value: null };
  return { ok: false };
}

// ───────────────────────────── dates ─────────────────────────────

export type DateConvention = 'day_first' | 'month_first' | null;

export type DateRead =
  | { ok: true; year: number; month: number }
  | {
      ok: false;
      reason:
        | 'not_a_date'
        | 'ambiguous'
        | 'contradicts_convention'
        | 'two_digit_year'
        | 'year_only'
        | 'impossible';
      /** For ambiguous dates: the two readings */
      readings?: [string, string];
    };

const MONTHS: Record<string, number> = {
  jan: 1,
  feb: 2,
  mar: 3,
  apr: 4,
  may: 5,
  jun: 6,
  jul: 7,
  aug: 8,
  sep: 9,
  sept: 9,
  oct: 10,
  nov: 11,
  dec: 12,
  january: 1,
  february: 2,
  march: 3,
  april: 4,
  june: 6,
  july: 7,
  august: 8,
  september: 9,
  october: 10,
  november: 11,
  december: 12,
};

const DAYS = [31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31];
const daysIn = (year: number, month: number) =>
  month === 2 && ((year % 4 === 0 && year % 100 !== 0) || year % 400 === 0) ? 29 : DAYS[month - 1]!;

function valid(year: number, month: number, day: number | null): DateRead {
  if (month < 1 || month > 12) return { ok: false, reason: 'impossible' };
  if (day !== null && (day < 1 || day > daysIn(year, month)))
    return { ok: false, reason: 'impossible' };
  return { ok: true, year, month };
}

/**
 * An Excel serial day number as a calendar month. Serial 1 is 1900-01-01 in
 * the 1900 date system (which counts a 29 February 1900 that never was, so
 * serials after 60 are one day early); serial 0 is 1904-01-01 in the 1904
 * system. Serials 1…73050 cover 1900 to 2099.
 */
export function monthOfSerial(
  serial: number,
  date1904 = false,
): { year: number; month: number } | null {
  if (!Number.isFinite(serial) || serial < 1 || serial > 73050) return null;
  const days = Math.floor(serial);
  const epoch = date1904
    ? Date.UTC(1904, 0, 1)
    : days > 60
      ? Date.UTC(1899, 11, 30)
      : Date.UTC(1899, 11, 31);
  const date = new Date(epoch + days * 86_400_000);
  return { year: date.getUTCFullYear(), month: date.getUTCMonth() + 1 };
}

const ISO = /^(\d{4})-(\d{1,2})-(\d{1,2})(?:[T ][\d:.]+(?:Z|[+-]\d{2}:?\d{2})?)?$/;
const ISO_MONTH = /^(\d{4})[-/](\d{1,2})$/;
const YMD_SLASH = /^(\d{4})[/.](\d{1,2})[/.](\d{1,2})$/;
const DMY = /^(\d{1,2})[/.-](\d{1,2})[/.-](\d{4})(?:\s+[\d:.]+(?:\s*[ap]m)?)?$/i;
const DMY_SHORT = /^(\d{1,2})[/.-](\d{1,2})[/.-](\d{2})$/;
const MY = /^(\d{1,2})[/.-](\d{4})$/;
const D_MON_Y = /^(\d{1,2})[ -]([a-z]{3,9})[ -](\d{2,4})$/i;
const MON_Y = /^([a-z]{3,9})[ -](\d{2,4})$/i;

const two = (n: number) => String(n).padStart(2, '0');

/**
 * A date as a calendar month. Text may be ISO (2026-05-14, 2026-05), day
 * first or month first with / . or - (14/05/2026), or use month names
 * (14 May 2026, May 2026). Text such as 04/05/2026 reads two ways: it is
 * refused as ambiguous unless the upload declared its convention.
 */
export function readDate(cell: Cell, convention: DateConvention, date1904 = false): DateRead {
  if (cell instanceof Date) {
    if (Number.isNaN(cell.getTime())) return { ok: false, reason: 'not_a_date' };
    return { ok: true, year: cell.getUTCFullYear(), month: cell.getUTCMonth() + 1 };
  }
  if (typeof cell === 'number') {
    if (Number.isInteger(cell) && cell >= 1900 && cell <= 2100)
      return { ok: false, reason: 'year_only' };
    const month = monthOfSerial(cell, date1904);
    return month ? { ok: true, ...month } : { ok: false, reason: 'not_a_date' };
  }
  if (typeof cell !== 'string') return { ok: false, reason: 'not_a_date' };
  const fast = isoDateFast(cell);
  if (fast !== null) return fast;
  const text = cell.trim();
  let m: RegExpExecArray | null;
  if ((m = ISO.exec(text))) return valid(Number(m[1]), Number(m[2]), Number(m[3]));
  if ((m = YMD_SLASH.exec(text))) return valid(Number(m[1]), Number(m[2]), Number(m[3]));
  if ((m = ISO_MONTH.exec(text))) return valid(Number(m[1]), Number(m[2]), null);
  if ((m = DMY.exec(text))) {
    const a = Number(m[1]);
    const b = Number(m[2]);
    const year = Number(m[3]);
    if (a === b) return valid(year, a, a);
    if (a > 12 && b > 12) return { ok: false, reason: 'impossible' };
    if (a > 12) {
      // Only day-first reads: 23/04/2026.
      return convention === 'month_first'
        ? { ok: false, reason: 'contradicts_convention' }
        : valid(year, b, a);
    }
    if (b > 12) {
      return convention === 'day_first'
        ? { ok: false, reason: 'contradicts_convention' }
        : valid(year, a, b);
    }
    if (convention === 'day_first') return valid(year, b, a);
    if (convention === 'month_first') return valid(year, a, b);
    return {
      ok: false,
      reason: 'ambiguous',
      readings: [`${year}-${two(b)}-${two(a)}`, `${year}-${two(a)}-${two(b)}`],
    };
  }
  if ((m = MY.exec(text))) return valid(Number(m[2]), Number(m[1]), null);
  if ((m = D_MON_Y.exec(text))) {
    const month = MONTHS[m[2]!.toLowerCase()];
    if (!month) return { ok: false, reason: 'not_a_date' };
    if (m[3]!.length !== 4) return { ok: false, reason: 'two_digit_year' };
    return valid(Number(m[3]), month, Number(m[1]));
  }
  if ((m = MON_Y.exec(text))) {
    const month = MONTHS[m[1]!.toLowerCase()];
    if (!month) return { ok: false, reason: 'not_a_date' };
    if (m[2]!.length !== 4) return { ok: false, reason: 'two_digit_year' };
    return valid(Number(m[2]), month, null);
  }
  if (DMY_SHORT.test(text)) return { ok: false, reason: 'two_digit_year' };
  if (/^\d{4}$/.test(text)) return { ok: false, reason: 'year_only' };
  if (/^\d{5}(\.\d+)?$/.test(text)) {
    // A serial number exported as text (CSV from a spreadsheet whose date column lost its format).
    const month = monthOfSerial(Number(text), date1904);
    if (month) return { ok: true, ...month };
  }
  return { ok: false, reason: 'not_a_date' };
}

/** 'YYYY-MM-DD' read by character codes (the common case), or null to take the general path. */
function isoDateFast(text: string): DateRead | null {
  if (text.length !== 10 || text.charCodeAt(4) !== 45 || text.charCodeAt(7) !== 45) return null;
  let year = 0;
  for (let i = 0; i < 4; i++) {
    const d = text.charCodeAt(i) - 48;
    if (d < 0 || d > 9) return null;
    year = year * 10 + d;
  }
  const m0 = text.charCodeAt(5) - 48;
  const m1 = text.charCodeAt(6) - 48;
  const d0 = text.charCodeAt(8) - 48;
  const d1 = text.charCodeAt(9) - 48;
  if (m0 < 0 || m0 > 9 || m1 < 0 || m1 > 9 || d0 < 0 || d0 > 9 || d1 < 0 || d1 > 9) return null;
  return valid(year, m0 * 10 + m1, d0 * 10 + d1);
}

export const monthString = (year: number, month: number) => `${year}-${two(month)}`;
