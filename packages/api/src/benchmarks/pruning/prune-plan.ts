/**
 * Which stored results pruning removes (pure; benchmark-pruning.service.ts applies it). Kept, in
 * each quarter: every result of the quarter's current set of submissions (what readers read
 * now, under any measure set or format), the `keepNewest` newest, and every result built less
 * than `graceMinutes` ago, so that a request that read the previous set finishes with it. A
 * result a published report names is kept by the table itself (its foreign key).
 */
import type { StoredResultInfo } from '../benchmark-results.repository.js';

export interface ResultRetention {
  keepNewest: number;
  graceMinutes: number;
}

/** Ids of the results to remove; `currentKeys` is each quarter's current-set key. */
export function resultsToRemove(
  rows: readonly StoredResultInfo[],
  currentKeys: ReadonlyMap<number, string>,
  retention: ResultRetention,
): number[] {
  const byQuarter = new Map<number, StoredResultInfo[]>();
  for (const row of rows) {
    const list = byQuarter.get(row.quarterId) ?? [];
    list.push(row);
    byQuarter.set(row.quarterId, list);
  }
  const remove: number[] = [];
  for (const [quarterId, list] of byQuarter) {
    const newest = [...list].sort((a, b) => b.id - a.id).slice(0, retention.keepNewest);
    const kept = new Set(newest.map((r) => r.id));
    for (const row of list) {
      if (kept.has(row.id)) continue;
      if (row.submissionsKey === currentKeys.get(quarterId)) continue;
      if (row.ageSeconds < retention.graceMinutes * 60) continue;
      remove.push(row.id);
    }
  }
  return remove.sort((a, b) => a - b);
}

/** Ids of each quarter's current results (those whose set is the quarter's current set). */
export function currentResultIds(
  rows: readonly StoredResultInfo[],
  currentKeys: ReadonlyMap<number, string>,
): Map<number, number[]> {
  const out = new Map<number, number[]>();
  for (const row of rows) {
    if (row.submissionsKey !== currentKeys.get(row.quarterId)) continue;
    out.set(row.quarterId, [...(out.get(row.quarterId) ?? []), row.id]);
  }
  return out;
}
