import type { Actor } from '../auth/actor.js';
import { ProblemException } from '../common/problem.js';
import type { SubmissionStatus } from './dto/submission.dto.js';
import {
  assertMay,
  type PolicyActor,
  submissionActions,
  type WriteRefusal,
  writeRefusal,
} from './submission-policy.js';

const REGION = 1;
const OWN = 12;
const OTHER = 13;

const actors: Record<string, PolicyActor> = {
  'regional lead': { role: 'regional_lead', regionId: REGION, practiceIds: [] },
  'practice lead': { role: 'practice_lead', regionId: REGION, practiceIds: [OWN] },
  auditor: { role: 'auditor', regionId: REGION, practiceIds: [] },
  'regional lead of another region': { role: 'regional_lead', regionId: 2, practiceIds: [] },
  system: { role: 'system', regionId: REGION, practiceIds: [] } satisfies Partial<Actor>,
};

// [who, practice, quarter status, expected refusal (null: allowed)]
const cases: [string, number, 'open' | 'closed', WriteRefusal | null][] = [
  ['regional lead', OWN, 'open', null],
  ['regional lead', OWN, 'closed', null],
  ['regional lead', OTHER, 'open', null],
  ['regional lead', OTHER, 'closed', null],
  ['practice lead', OWN, 'open', null],
  ['practice lead', OWN, 'closed', 'quarter-closed'],
  ['practice lead', OTHER, 'open', 'not-your-practice'],
  ['practice lead', OTHER, 'closed', 'not-your-practice'],
  ['auditor', OWN, 'open', 'read-only'],
  ['auditor', OWN, 'closed', 'read-only'],
  ['regional lead of another region', OWN, 'open', 'not-your-practice'],
  ['system', OWN, 'closed', null],
];

describe('who may upload, confirm, cancel or retry', () => {
  it.each(cases)('%s, practice %i, %s quarter → %s', (who, practiceId, quarterStatus, refusal) => {
    const target = { practiceId, practiceRegionId: REGION, quarterStatus };
    expect(writeRefusal(actors[who]!, target)).toBe(refusal);
    // The actions sent to the web say the same as the checks.
    const allowed = refusal === null;
    expect(
      submissionActions(actors[who]!, {
        ...target,
        status: 'awaiting_confirmation',
        fileKept: false,
      }),
    ).toEqual({ confirm: allowed, cancel: allowed, retry: false, upload: allowed });
  });

  const states: [
    SubmissionStatus,
    boolean,
    { confirm: boolean; cancel: boolean; retry: boolean },
  ][] = [
    ['processing', true, { confirm: false, cancel: true, retry: false }],
    ['awaiting_confirmation', false, { confirm: true, cancel: true, retry: false }],
    ['failed', true, { confirm: false, cancel: true, retry: true }],
    ['failed', false, { confirm: false, cancel: true, retry: false }],
    ['rejected', false, { confirm: false, cancel: false, retry: false }],
    ['accepted', false, { confirm: false, cancel: false, retry: false }],
    ['superseded', false, { confirm: false, cancel: false, retry: false }],
    ['cancelled', false, { confirm: false, cancel: false, retry: false }],
  ];
  it.each(states)('a %s submission (file kept: %s) allows %o', (status, fileKept, expected) => {
    const target = { practiceId: OWN, practiceRegionId: REGION, quarterStatus: 'open' as const };
    expect(submissionActions(actors['practice lead']!, { ...target, status, fileKept })).toEqual({
      ...expected,
      upload: true,
    });
  });

  it('answers a refusal with the problem the API sends', () => {
    const quarter = { id: 7, label: '2026 Q2', submissionDeadline: '2026-09-15' };
    const closed = { practiceId: OWN, practiceRegionId: REGION, quarterStatus: 'closed' as const };
    const problem = (fn: () => void) => {
      try {
        fn();
      } catch (error) {
        return (error as ProblemException).toProblem();
      }
      return null;
    };
    expect(problem(() => assertMay(actors['practice lead']!, 'upload', closed, quarter))).toEqual({
      type: '/api/problems/quarter-closed',
      title: 'This audit quarter is closed',
      status: 409,
      detail:
        '2026 Q2 is closed to uploads (its deadline was 2026-09-15). Ask your regional lead if a late extract should still be accepted.',
      quarterId: 7,
    });
    expect(problem(() => assertMay(actors['practice lead']!, 'confirm', closed, quarter))).toEqual({
      type: '/api/problems/quarter-closed',
      title: 'This audit quarter is closed',
      status: 409,
      detail:
        '2026 Q2 is closed, so its submissions can no longer be changed. Ask your regional lead if this one should still be confirmed.',
    });
    expect(problem(() => assertMay(actors.auditor!, 'cancel', closed, quarter))?.status).toBe(403);
    expect(problem(() => assertMay(actors['regional lead']!, 'retry', closed, quarter))).toBeNull();
  });
});
