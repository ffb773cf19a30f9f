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

/** A calendar day ("2026-12-04…") → "4 Dec 2026"; "2025-10" → "Oct 2025" (lib/region-dates.ts). */
export { formatRegionDate as formatDate, formatRegionMonth as formatMonth } from './region-dates';
