import type { Actor } from '../auth/actor.js';
import type { ReportActionsDto, ReportStatus } from './dto/report.dto.js';
import {
  assertMayPublish,
  assertMayWithdraw,
  mayPublish,
  mayWithdraw,
  reportActions,
  reportListActions,
} from './report-policy.js';

const roles: Record<string, Pick<Actor, 'role'>> = {
  'regional lead': { role: 'regional_lead' },
  system: { role: 'system' },
  auditor: { role: 'auditor' },
  'practice lead': { role: 'practice_lead' },
};

describe('report policy', () => {
  // [who, may publish]
  it.each([
    ['regional lead', true],
    ['system', true],
    ['auditor', false],
    ['practice lead', false],
  ] as const)('%s publishes: %s', (who, may) => {
    expect(mayPublish(roles[who]!)).toBe(may);
    expect(reportListActions(roles[who]!, 7)).toEqual({ publish: may });
    expect(reportListActions(roles[who]!, null)).toEqual({ publish: false });
    if (may) expect(() => assertMayPublish(roles[who]!)).not.toThrow();
    else
      expect(() => assertMayPublish(roles[who]!)).toThrow(
        expect.objectContaining({ status: 403 }) as unknown as Error,
      );
  });

  // [who, may withdraw]
  it.each([
    ['regional lead', true],
    ['system', false],
    ['auditor', false],
    ['practice lead', false],
  ] as const)('%s withdraws: %s', (who, may) => {
    expect(mayWithdraw(roles[who]!)).toBe(may);
    if (may) expect(() => assertMayWithdraw(roles[who]!)).not.toThrow();
    else
      expect(() => assertMayWithdraw(roles[who]!)).toThrow(
        expect.objectContaining({ status: 403 }) as unknown as Error,
      );
  });

  // [who, status, actions]
  it.each<[string, ReportStatus, ReportActionsDto]>([
    ['regional lead', 'published', { withdraw: true, region: true }],
    ['regional lead', 'replaced', { withdraw: true, region: true }],
    ['regional lead', 'withdrawn', { withdraw: false, region: false }],
    ['auditor', 'published', { withdraw: false, region: true }],
    ['auditor', 'replaced', { withdraw: false, region: true }],
    ['auditor', 'withdrawn', { withdraw: false, region: false }],
    ['practice lead', 'published', { withdraw: false, region: false }],
    ['practice lead', 'withdrawn', { withdraw: false, region: false }],
    ['system', 'published', { withdraw: false, region: false }],
  ])('%s, a %s report: %j', (who, status, actions) => {
    expect(reportActions(roles[who]!, status)).toEqual(actions);
  });
});
