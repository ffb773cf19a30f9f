/**
 * Display formatting only: the web never computes a statistic the API did not send. Dates and
 * numbers are written the region's way (British English: 4 Dec 2026, day before month), whatever
 * the browser's own language, so that every screen and every filter reads alike.
 */
export const REGION_LOCALE = 'en-GB';

const integer = new Intl.NumberFormat(REGION_LOCALE, { maximumFractionDigits: 0 });

export function formatCount(value: number | null | undefined): string {
  return value == null ? '—' : integer.format(value);
}

export function formatPercent(proportion: number | null | undefined, digits = 1): string {
  if (proportion == null || Number.isNaN(proportion)) return '—';
  return `${(proportion * 100).toFixed(digits)} %`;
}

export function formatDateTime(iso: string | null | undefined): string {
  if (!iso) return '—';
  return new Date(iso).toLocaleString(REGION_LOCALE, { dateStyle: 'medium', timeStyle: 'short' });
}

/** A calendar day ("2026-12-04…") → "4 Dec 2026". */
export function formatDate(iso: string | null | undefined): string {
  if (!iso) return '—';
  return new Date(`${iso.slice(0, 10)}T12:00:00Z`).toLocaleDateString(REGION_LOCALE, {
    dateStyle: 'medium',
    timeZone: 'UTC',
  });
}

/** "2025-10" → "Oct 2025" */
export function formatMonth(month: string): string {
  return new Date(`${month}-01T12:00:00Z`).toLocaleDateString(REGION_LOCALE, {
    month: 'short',
    year: 'numeric',
    timeZone: 'UTC',
  });
}

/** Month names as written in the region, short and long, by month index (0 = January). */
const MONTH_NAMES = new Map<string, number>(
  [
    'january',
    'february',
    'march',
    'april',
    'may',
    'june',
    'july',
    'august',
    'september',
    'october',
    'november',
    'december',
  ].flatMap((name, i) => [
    [name, i],
    [name.slice(0, 3), i],
    ...(i === 8 ? [['sept', 8] as [string, number]] : []),
  ]),
);

/**
 * A day as a person of the region writes it → "YYYY-MM-DD", or null when it is not a date:
 * "4/12/2026" (day first), "4 Dec 2026", "4 December 2026", or "2026-12-04".
 */
export function parseDate(text: string): string | null {
  const t = text.trim();
  let year: number;
  let month: number;
  let day: number;
  let m: RegExpExecArray | null;
  if ((m = /^(\d{4})-(\d{1,2})-(\d{1,2})$/.exec(t))) {
    [year, month, day] = [Number(m[1]), Number(m[2]), Number(m[3])];
  } else if ((m = /^(\d{1,2})[/.-](\d{1,2})[/.-](\d{4})$/.exec(t))) {
    [day, month, year] = [Number(m[1]), Number(m[2]), Number(m[3])];
  } else if ((m = /^(\d{1,2})\s+([a-z]+)\.?,?\s+(\d{4})$/i.exec(t))) {
    const index = MONTH_NAMES.get(m[2]!.toLowerCase());
    if (index === undefined) return null;
    [day, month, year] = [Number(m[1]), index + 1, Number(m[3])];
  } else return null;
  const date = new Date(Date.UTC(year, month - 1, day));
  if (
    date.getUTCFullYear() !== year ||
    date.getUTCMonth() !== month - 1 ||
    date.getUTCDate() !== day
  )
    return null;
  return `${String(year).padStart(4, '0')}-${String(month).padStart(2, '0')}-${String(day).padStart(2, '0')}`;
}
