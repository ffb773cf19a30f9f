import type { Actor } from '../auth/actor.js';
import type { QuarterActionsDto } from './dto/quarter.dto.js';
import { mayManageQuarters, type QuarterFacts, quarterActions } from './quarter-policy.js';

const roles: Record<string, Pick<Actor, 'role'>> = {
  'regional lead': { role: 'regional_lead' },
  system: { role: 'system' },
  auditor: { role: 'auditor' },
  'practice lead': { role: 'practice_lead' },
};
const NONE: QuarterActionsDto = {
  close: false,
  reopen: false,
  changeDeadline: false,
  changeMeasureSet: false,
};

// [who, status, has a report, actions]
const cases: [string, QuarterFacts['status'], boolean, QuarterActionsDto][] = [
  [
    'regional lead',
    'open',
    false,
    { close: true, reopen: false, changeDeadline: true, changeMeasureSet: true },
  ],
  [
    'regional lead',
    'open',
    true,
    { close: true, reopen: false, changeDeadline: true, changeMeasureSet: false },
  ],
  [
    'regional lead',
    'closed',
    false,
    { close: false, reopen: true, changeDeadline: true, changeMeasureSet: false },
  ],
  [
    'regional lead',
    'closed',
    true,
    { close: false, reopen: true, changeDeadline: true, changeMeasureSet: false },
  ],
  [
    'system',
    'open',
    false,
    { close: true, reopen: false, changeDeadline: true, changeMeasureSet: true },
  ],
  ['auditor', 'open', false, NONE],
  ['practice lead', 'open', false, NONE],
  ['practice lead', 'closed', true, NONE],
];

describe('what may be done with an audit quarter', () => {
  it.each(cases)('%s, %s quarter, report %s', (who, status, hasReport, actions) => {
    expect(quarterActions(roles[who]!, { status, hasReport })).toEqual(actions);
  });

  it('lets regional leads and Cairn itself open quarters', () => {
    expect(
      Object.entries(roles)
        .filter(([, r]) => mayManageQuarters(r))
        .map(([k]) => k),
    ).toEqual(['regional lead', 'system']);
  });
});
