/**
 * Who may do what to a review case: the one rule, held by
 * review-case-policy.spec.ts. The service refuses with it (assertMay) and the
 * case's view sends it to the web as `actions`; the web shows a button only
 * when its action is true.
 *
 *   auditor         opens cases; asks the practice (open or responded → awaiting
 *                   practice), comments to the practice, writes internal notes,
 *                   closes with a finding (any state but closed), reopens (closed → open)
 *   practice lead   sees the cases of the practices they lead, never internal notes;
 *                   answers (awaiting practice or responded → responded, with
 *                   attachments) and comments while the case is not closed
 *   regional lead   sees every case of the region, internal notes included; writes none
 *
 * States:  open → awaiting_practice → responded → closed, and closed → open (reopen);
 * responded → awaiting_practice when the auditor asks again.
 */
import { HttpStatus } from '@nestjs/common';
import type { Actor } from '../auth/actor.js';
import { ProblemException } from '../common/problem.js';

export const CASE_STATUSES = ['open', 'awaiting_practice', 'responded', 'closed'] as const;
export type CaseStatus = (typeof CASE_STATUSES)[number];

export const CASE_ACTIONS = ['ask', 'answer', 'comment', 'note', 'close', 'reopen'] as const;
export type CaseAction = (typeof CASE_ACTIONS)[number];

/** The findings a case may be closed with (Cairn's own short list). */
export const FINDINGS = [
  'data_quality_issue',
  'explained_by_case_mix',
  'genuine_variation_improving',
  'genuine_variation_action_agreed',
  'no_concern',
] as const;
export type Finding = (typeof FINDINGS)[number];

export const FINDING_LABELS: Record<Finding, string> = {
  data_quality_issue: 'Data quality issue',
  explained_by_case_mix: 'Explained by case mix',
  genuine_variation_improving: 'Genuine variation, already improving',
  genuine_variation_action_agreed: 'Genuine variation, action agreed',
  no_concern: 'No concern',
};

export const STATUS_LABELS: Record<CaseStatus, string> = {
  open: 'Open',
  awaiting_practice: 'Awaiting the practice',
  responded: 'Practice responded',
  closed: 'Closed',
};

export type PolicyActor = Pick<Actor, 'role' | 'regionId' | 'practiceIds'>;

/** What a decision needs to know about a case. */
export interface PolicyCase {
  regionId: number;
  practiceId: number;
  status: CaseStatus;
}

/** Why an action is refused: not yours to do (403) or not in this state (409). */
export type CaseRefusal = 'not-allowed' | 'case-closed' | 'wrong-state';

/** The state each action moves the case to (null: the state stays). */
export const NEXT_STATUS: Record<CaseAction, CaseStatus | null> = {
  ask: 'awaiting_practice',
  answer: 'responded',
  comment: null,
  note: null,
  close: 'closed',
  reopen: 'open',
};

/** The states each action may start from. */
export const FROM_STATUSES: Record<CaseAction, readonly CaseStatus[]> = {
  ask: ['open', 'responded'],
  answer: ['awaiting_practice', 'responded'],
  comment: ['open', 'awaiting_practice', 'responded'],
  note: ['open', 'awaiting_practice', 'responded'],
  close: ['open', 'awaiting_practice', 'responded'],
  reopen: ['closed'],
};

const BY_ROLE: Record<Actor['role'], readonly CaseAction[]> = {
  auditor: ['ask', 'comment', 'note', 'close', 'reopen'],
  practice_lead: ['answer', 'comment'],
  regional_lead: [],
  system: [],
};

/** May this person see this case at all? (Practice leads: only their own practices'.) */
export function maySee(actor: PolicyActor, c: Pick<PolicyCase, 'regionId' | 'practiceId'>) {
  if (actor.role === 'system') return true;
  if (c.regionId !== actor.regionId) return false;
  return actor.role !== 'practice_lead' || actor.practiceIds.includes(c.practiceId);
}

/** Internal notes are for the region's side only. */
export const seesInternal = (actor: PolicyActor): boolean => actor.role !== 'practice_lead';

/** Only auditors open cases. */
export const mayOpen = (actor: PolicyActor): boolean => actor.role === 'auditor';

/** Null when the actor may take the action now; otherwise why not. */
export function refusal(actor: PolicyActor, c: PolicyCase, action: CaseAction): CaseRefusal | null {
  if (!maySee(actor, c) || !BY_ROLE[actor.role].includes(action)) return 'not-allowed';
  if (FROM_STATUSES[action].includes(c.status)) return null;
  return c.status === 'closed' ? 'case-closed' : 'wrong-state';
}

export const may = (actor: PolicyActor, c: PolicyCase, action: CaseAction): boolean =>
  refusal(actor, c, action) === null;

/** Every action with whether the actor may take it now (sent with the case). */
export function actionsFor(actor: PolicyActor, c: PolicyCase): Record<CaseAction, boolean> {
  return Object.fromEntries(CASE_ACTIONS.map((a) => [a, may(actor, c, a)])) as Record<
    CaseAction,
    boolean
  >;
}

const ACTION_WORDS: Record<CaseAction, string> = {
  ask: 'ask the practice',
  answer: 'answer',
  comment: 'comment on',
  note: 'add an internal note to',
  close: 'close',
  reopen: 'reopen',
};

/** Refuses with a specific problem unless the actor may take the action now. */
export function assertMay(
  actor: PolicyActor,
  c: PolicyCase,
  action: CaseAction,
  current: unknown,
): void {
  const why = refusal(actor, c, action);
  if (why === null) return;
  if (why === 'not-allowed') {
    throw new ProblemException(
      HttpStatus.FORBIDDEN,
      'case-action-not-allowed',
      'Not allowed on this review case',
      `As ${actor.role.replace('_', ' ')} you cannot ${ACTION_WORDS[action]} this review case.`,
    );
  }
  if (why === 'case-closed') {
    throw new ProblemException(
      HttpStatus.CONFLICT,
      'case-closed',
      'The review case is closed',
      `This review case is closed, so you cannot ${ACTION_WORDS[action]} it. Nothing was stored.${
        action === 'answer' || action === 'comment'
          ? ' If something needs adding, ask the auditor to reopen it.'
          : ''
      }`,
      { case: current },
    );
  }
  throw new ProblemException(
    HttpStatus.CONFLICT,
    'case-wrong-state',
    'Not possible in the case’s current state',
    `The review case is ${STATUS_LABELS[c.status].toLowerCase()}; you can ${ACTION_WORDS[action]} it only when it is ${FROM_STATUSES[
      action
    ]
      .map((s) => STATUS_LABELS[s].toLowerCase())
      .join(' or ')}. Nothing was stored.`,
    { case: current },
  );
}
