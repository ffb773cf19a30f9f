/** Display formatting for extracts (sizes, limits, dates). */
import { formatCount } from '../../../lib/format';

export function formatBytes(bytes: number): string {
  if (bytes < 1024) return `${bytes} bytes`;
  if (bytes < 1_048_576) return `${Math.round(bytes / 1024)} KB`;
  const mb = bytes / 1_048_576;
  return `${mb < 10 ? mb.toFixed(1).replace(/\.0$/, '') : Math.round(mb)} MB`;
}

export function formatDate(iso: string | null | undefined): string {
  if (!iso) return '—';
  return new Date(`${iso.slice(0, 10)}T12:00:00Z`).toLocaleDateString('en-GB', {
    dateStyle: 'medium',
  });
}

/** "2025-10" → "Oct 2025" */
export function formatMonth(month: string): string {
  return new Date(`${month}-01T12:00:00Z`).toLocaleDateString('en-GB', {
    month: 'short',
    year: 'numeric',
  });
}

export const plural = (n: number, one: string, many = `${one}s`) =>
  `${formatCount(n)} ${n === 1 ? one : many}`;
