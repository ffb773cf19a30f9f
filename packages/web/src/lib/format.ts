/** Display formatting only: the web never computes a statistic the API did not send. */
const integer = new Intl.NumberFormat('en-GB', { maximumFractionDigits: 0 });

export function formatCount(value: number | null | undefined): string {
  return value == null ? '—' : integer.format(value);
}

export function formatPercent(proportion: number | null | undefined, digits = 1): string {
  if (proportion == null || Number.isNaN(proportion)) return '—';
  return `${(proportion * 100).toFixed(digits)} %`;
}

export function formatDateTime(iso: string | null | undefined): string {
  if (!iso) return '—';
  return new Date(iso).toLocaleString('en-GB', { dateStyle: 'medium', timeStyle: 'short' });
}
