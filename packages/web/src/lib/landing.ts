import type { Me, Quarter, SubmissionHistory } from './api/types';

/** The audit quarter that is open for extracts, else the latest one. */
export function quarterNow(quarters: readonly Quarter[] | undefined): Quarter | null {
  const list = quarters ?? [];
  return list.find((q) => q.status === 'open') ?? list[0] ?? null;
}

/** A practice lead's practices by code (OV101 before OV103): the order every choice follows. */
export function practicesByCode(me: Me): Me['practices'] {
  return [...me.practices].sort((a, b) => a.code.localeCompare(b.code));
}

/**
 * Where a person lands after signing in. A practice lead whose practice has a current submission
 * for the audit quarter now (the open one, else the latest) lands on that practice's results —
 * the first such practice by code; everyone else, and a practice lead with nothing to read yet,
 * lands on the home page (which says what to do next). `histories` maps a practice's id to its
 * submission history (missing while it is read).
 */
export function landingPath(
  me: Me,
  quarters: readonly Quarter[],
  histories: ReadonlyMap<number, SubmissionHistory | undefined>,
): string {
  if (me.role !== 'practice_lead') return '/';
  const quarter = quarterNow(quarters);
  if (!quarter) return '/';
  for (const practice of practicesByCode(me)) {
    const entry = histories.get(practice.id)?.quarters.find((q) => q.quarter.id === quarter.id);
    if (entry?.currentSubmissionId != null) return `/practices/${practice.id}/results`;
  }
  return '/';
}
