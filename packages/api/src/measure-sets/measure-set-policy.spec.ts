import type { Actor } from '../auth/actor.js';
import type { MeasureSetActionsDto } from './dto/measure-set.dto.js';
import { mayRead, measureSetActions, type VersionFacts } from './measure-set-policy.js';

const REGION = 1;
const who: Record<string, Pick<Actor, 'role' | 'regionId'>> = {
  'regional lead': { role: 'regional_lead', regionId: REGION },
  auditor: { role: 'auditor', regionId: REGION },
  'practice lead': { role: 'practice_lead', regionId: REGION },
  'regional lead of another region': { role: 'regional_lead', regionId: 2 },
};
const versions: Record<string, VersionFacts> = {
  shipped: { regionId: null, status: 'published' },
  'published by the region': { regionId: REGION, status: 'published' },
  'draft of the region': { regionId: REGION, status: 'draft' },
};

const NONE: MeasureSetActionsDto = { clone: false, edit: false, publish: false, discard: false };
const CLONE: MeasureSetActionsDto = { ...NONE, clone: true };
const EDIT: MeasureSetActionsDto = { clone: false, edit: true, publish: true, discard: true };

// [who, version, reads, actions]
const cases: [string, string, boolean, MeasureSetActionsDto][] = [
  ['regional lead', 'shipped', true, CLONE],
  ['regional lead', 'published by the region', true, CLONE],
  ['regional lead', 'draft of the region', true, EDIT],
  ['auditor', 'shipped', true, NONE],
  ['auditor', 'draft of the region', true, NONE],
  ['practice lead', 'shipped', true, NONE],
  ['practice lead', 'published by the region', true, NONE],
  ['practice lead', 'draft of the region', false, NONE],
  ['regional lead of another region', 'shipped', true, CLONE],
  ['regional lead of another region', 'published by the region', false, NONE],
  ['regional lead of another region', 'draft of the region', false, NONE],
];

describe('who may read and change which measure-set version', () => {
  it.each(cases)('%s, %s: reads %s', (person, version, reads, actions) => {
    expect(mayRead(who[person]!, versions[version]!)).toBe(reads);
    expect(measureSetActions(who[person]!, versions[version]!)).toEqual(actions);
  });
});
