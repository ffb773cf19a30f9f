import { createHash } from 'node:crypto';

/** The key of a set of submissions: SHA-256 (hex) of their ids, sorted, comma-separated. */
export function submissionsKey(ids: readonly number[]): string {
  const sorted = [...ids].sort((a, b) => a - b);
  return createHash('sha256').update(sorted.join(',')).digest('hex');
}
