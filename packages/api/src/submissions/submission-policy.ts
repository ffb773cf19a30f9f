/**
 * Who may upload, confirm, cancel or retry: the one rule, held by
 * submission-policy.spec.ts. The services refuse with it (assertMay) and the
 * views send it to the web as each resource's allowed actions
 * (SubmissionDto.actions, the history's per-quarter actions, the upload
 * options); the web shows buttons from those actions only.
 *
 *   regional lead   any practice of their region, in open and closed audit quarters
 *                   (closing a quarter closes it to practice uploads; the regional
 *                   lead can still make late corrections)
 *   practice lead   only the practices they lead, and only while the quarter is open
 *   auditor         never (read-only)
 *   Cairn itself    always (demo seeding, benchmarks)
 *
 * The state a decision needs (what can be confirmed, cancelled, retried) is
 * here too; the repository's updates check the same lists atomically.
 */
import { HttpStatus } from '@nestjs/common';
import type { Actor } from '../auth/actor.js';
import { ProblemException } from '../common/problem.js';
import type { QuarterDto, QuarterStatus } from '../quarters/dto/quarter.dto.js';
import type { SubmissionActionsDto, SubmissionStatus } from './dto/submission.dto.js';

export type SubmissionAction = 'upload' | 'confirm' | 'cancel' | 'retry';

/** Why a write is refused. */
export type WriteRefusal = 'read-only' | 'not-your-practice' | 'quarter-closed';

/** A practice in an audit quarter: what every write is about. */
export interface WriteTarget {
  practiceId: number;
  practiceRegionId: number;
  quarterStatus: QuarterStatus;
}

export type PolicyActor = Pick<Actor, 'role' | 'regionId' | 'practiceIds'>;

/** Null when the actor may write to this practice and quarter; otherwise why not. */
export function writeRefusal(actor: PolicyActor, target: WriteTarget): WriteRefusal | null {
  if (actor.role === 'system') return null;
  if (actor.role === 'auditor') return 'read-only';
  if (target.practiceRegionId !== actor.regionId) return 'not-your-practice';
  if (actor.role === 'regional_lead') return null;
  if (!actor.practiceIds.includes(target.practiceId)) return 'not-your-practice';
  if (target.quarterStatus === 'closed') return 'quarter-closed';
  return null;
}

export const mayWrite = (actor: PolicyActor, target: WriteTarget): boolean =>
  writeRefusal(actor, target) === null;

/** States in which a submission can be confirmed, cancelled, retried. */
export const CONFIRMABLE: readonly SubmissionStatus[] = ['awaiting_confirmation'];
export const CANCELLABLE: readonly SubmissionStatus[] = [
  'processing',
  'awaiting_confirmation',
  'failed',
];
export const RETRYABLE: readonly SubmissionStatus[] = ['failed'];

/** A submission as the rule sees it. */
export interface SubmissionState extends WriteTarget {
  status: SubmissionStatus;
  /** Its file is still kept (a retry reads it again) */
  fileKept: boolean;
}

/** What the actor may do with this submission now. */
export function submissionActions(
  actor: PolicyActor,
  submission: SubmissionState,
): SubmissionActionsDto {
  const write = mayWrite(actor, submission);
  return {
    confirm: write && CONFIRMABLE.includes(submission.status),
    cancel: write && CANCELLABLE.includes(submission.status),
    retry: write && RETRYABLE.includes(submission.status) && submission.fileKept,
    upload: write,
  };
}

/** Practice leads of the practice see record references; everyone else sees pseudonyms (docs/methods.md §9). */
export function seesRecordRefs(actor: Pick<Actor, 'role' | 'practiceIds'>, practiceId: number) {
  return actor.role === 'practice_lead' && actor.practiceIds.includes(practiceId);
}

/**
 * Throws the problem the API answers when the actor may not take `action`
 * on this practice and quarter (403 practice-not-yours, 409 quarter-closed).
 */
export function assertMay(
  actor: PolicyActor,
  action: SubmissionAction,
  target: WriteTarget,
  quarter: Pick<QuarterDto, 'id' | 'label' | 'submissionDeadline'>,
): void {
  const refusal = writeRefusal(actor, target);
  if (refusal === null) return;
  if (refusal === 'quarter-closed') {
    throw new ProblemException(
      HttpStatus.CONFLICT,
      'quarter-closed',
      'This audit quarter is closed',
      action === 'upload'
        ? `${quarter.label} is closed to uploads (its deadline was ${quarter.submissionDeadline}). Ask your regional lead if a late extract should still be accepted.`
        : `${quarter.label} is closed, so its submissions can no longer be changed. Ask your regional lead if this one should still be confirmed.`,
      action === 'upload' ? { quarterId: quarter.id } : {},
    );
  }
  throw new ProblemException(
    HttpStatus.FORBIDDEN,
    'practice-not-yours',
    'Not one of your practices',
    'Only the practice’s own leads and regional leads can change its submissions.',
  );
}
