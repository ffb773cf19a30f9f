/** Display formatting for extracts (sizes, limits); dates are the region's (lib/format.ts). */
import { formatCount } from '../../../lib/format';

export { formatDate, formatMonth } from '../../../lib/format';

export function formatBytes(bytes: number): string {
  if (bytes < 1024) return `${bytes} bytes`;
  if (bytes < 1_048_576) return `${Math.round(bytes / 1024)} KB`;
  const mb = bytes / 1_048_576;
  return `${mb < 10 ? mb.toFixed(1).replace(/\.0$/, '') : Math.round(mb)} MB`;
}

export const plural = (n: number, one: string, many = `${one}s`) =>
  `${formatCount(n)} ${n === 1 ? one : many}`;
