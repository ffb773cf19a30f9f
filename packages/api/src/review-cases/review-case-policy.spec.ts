import {
  actionsFor,
  maySee,
  refusal,
  type CaseStatus,
  type PolicyActor,
} from './review-case-policy.js';

const auditor: PolicyActor = { role: 'auditor', regionId: 1, practiceIds: [] };
const regional: PolicyActor = { role: 'regional_lead', regionId: 1, practiceIds: [] };
const lead: PolicyActor = { role: 'practice_lead', regionId: 1, practiceIds: [7] };
const otherLead: PolicyActor = { role: 'practice_lead', regionId: 1, practiceIds: [8] };
const elsewhere: PolicyActor = { role: 'auditor', regionId: 2, practiceIds: [] };
const at = (status: CaseStatus) => ({ regionId: 1, practiceId: 7, status });

describe('review case policy', () => {
  it.each([
    // who, state, action, refusal
    [auditor, 'open', 'ask', null],
    [auditor, 'responded', 'ask', null],
    [auditor, 'awaiting_practice', 'ask', 'wrong-state'],
    [auditor, 'closed', 'ask', 'case-closed'],
    [auditor, 'open', 'close', null],
    [auditor, 'responded', 'close', null],
    [auditor, 'closed', 'close', 'case-closed'],
    [auditor, 'closed', 'reopen', null],
    [auditor, 'open', 'reopen', 'wrong-state'],
    [auditor, 'open', 'note', null],
    [auditor, 'awaiting_practice', 'answer', 'not-allowed'],
    [lead, 'awaiting_practice', 'answer', null],
    [lead, 'responded', 'answer', null],
    [lead, 'open', 'answer', 'wrong-state'],
    [lead, 'closed', 'answer', 'case-closed'],
    [lead, 'closed', 'comment', 'case-closed'],
    [lead, 'awaiting_practice', 'note', 'not-allowed'],
    [lead, 'responded', 'close', 'not-allowed'],
    [otherLead, 'awaiting_practice', 'answer', 'not-allowed'],
    [regional, 'open', 'ask', 'not-allowed'],
    [regional, 'responded', 'close', 'not-allowed'],
    [elsewhere, 'open', 'ask', 'not-allowed'],
  ] as const)('%o in %s: %s → %s', (who, status, action, expected) => {
    expect(refusal(who, at(status), action)).toBe(expected);
  });

  it('lets practice leads see only their own practices’ cases, everyone only their region’s', () => {
    expect(maySee(lead, at('open'))).toBe(true);
    expect(maySee(otherLead, at('open'))).toBe(false);
    expect(maySee(regional, at('open'))).toBe(true);
    expect(maySee(elsewhere, at('open'))).toBe(false);
  });

  it('sends every action with whether it is allowed now', () => {
    expect(actionsFor(auditor, at('responded'))).toEqual({
      ask: true,
      answer: false,
      comment: true,
      note: true,
      close: true,
      reopen: false,
    });
    expect(actionsFor(regional, at('responded'))).toEqual({
      ask: false,
      answer: false,
      comment: false,
      note: false,
      close: false,
      reopen: false,
    });
  });
});
