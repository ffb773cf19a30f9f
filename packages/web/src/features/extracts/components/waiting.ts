import type { QuarterSubmissions, Submission } from '../../../lib/api/types';

/** Still being checked, or checked and waiting for someone to confirm or cancel it. */
export const isWaiting = (s: Submission) =>
  s.status === 'processing' || s.status === 'awaiting_confirmation';

export interface QuarterState {
  current: Submission | null;
  /** Every extract still waiting, latest first */
  waiting: Submission[];
  /** The newest waiting extract uploaded after the current one (the one a decision is about) */
  newest: Submission | null;
  /**
   * Waiting extracts behind it: older than the newest waiting one, or than the current one (which
   * can then no longer be confirmed). Only those the signed-in person may cancel.
   */
  older: Submission[];
}

/** Where a practice stands in one audit quarter: its current submission and what waits. */
export function quarterState(entry: QuarterSubmissions | undefined): QuarterState {
  const submissions = entry?.submissions ?? [];
  const current = submissions.find((s) => s.id === entry?.currentSubmissionId) ?? null;
  const waiting = submissions.filter(isWaiting).sort((a, b) => b.id - a.id);
  const newest = waiting.find((s) => current === null || s.id > current.id) ?? null;
  const older = waiting.filter(
    (s) => s !== newest && s.status === 'awaiting_confirmation' && s.actions.cancel,
  );
  return { current, waiting, newest, older };
}
