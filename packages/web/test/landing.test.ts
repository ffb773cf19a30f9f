import { describe, expect, it } from 'vitest';
import type { Me, Quarter, SubmissionHistory } from '../src/lib/api/types';
import { landingPath, practicesByCode, quarterNow } from '../src/lib/landing';

const quarter = (id: number, status: Quarter['status']) => ({ id, status }) as Quarter;
const quarters = [quarter(9, 'closed'), quarter(8, 'open'), quarter(7, 'closed')];
const lead = (practices: { id: number; code: string }[]): Me => ({
  id: 1,
  email: 'daniel.oyelaran@ostrevale.example',
  displayName: 'Daniel Oyelaran',
  role: 'practice_lead',
  regionName: 'Ostrevale',
  practices: practices.map((p) => ({ ...p, name: `Practice ${p.code}` })),
  sessionExpiresAt: '2026-12-05T06:57:32.717Z',
});
/** A history in which the practice has (or has not) a current submission for quarter 8. */
const history = (current: number | null) =>
  ({
    quarters: [{ quarter: quarters[1], currentSubmissionId: current, submissions: [] }],
  }) as unknown as SubmissionHistory;

describe('where sign-in lands', () => {
  it('sends a practice lead to their practice’s results once it has a current submission', () => {
    const me = lead([{ id: 2, code: 'OV102' }]);
    expect(landingPath(me, quarters, new Map([[2, history(340)]]))).toBe('/practices/2/results');
    expect(landingPath(me, quarters, new Map([[2, history(null)]]))).toBe('/');
  });

  it('picks the first practice by code that has one, for a lead of several', () => {
    const me = lead([
      { id: 3, code: 'OV103' },
      { id: 1, code: 'OV101' },
    ]);
    expect(practicesByCode(me).map((p) => p.code)).toEqual(['OV101', 'OV103']);
    const both = new Map([
      [3, history(12)],
      [1, history(11)],
    ]);
    expect(landingPath(me, quarters, both)).toBe('/practices/1/results');
    const onlyOv103 = new Map([
      [3, history(12)],
      [1, history(null)],
    ]);
    expect(landingPath(me, quarters, onlyOv103)).toBe('/practices/3/results');
  });

  it('keeps everyone else, and a lead with nothing to read yet, on the home page', () => {
    const me = lead([{ id: 2, code: 'OV102' }]);
    expect(landingPath({ ...me, role: 'regional_lead' }, quarters, new Map())).toBe('/');
    expect(landingPath({ ...me, role: 'auditor' }, quarters, new Map())).toBe('/');
    expect(landingPath(lead([]), quarters, new Map())).toBe('/');
    expect(landingPath(me, [], new Map([[2, history(340)]]))).toBe('/');
    // A history still being read counts as nothing to read.
    expect(landingPath(me, quarters, new Map([[2, undefined]]))).toBe('/');
  });

  it('reads the open audit quarter, else the latest', () => {
    expect(quarterNow(quarters)?.id).toBe(8);
    expect(quarterNow([quarter(9, 'closed'), quarter(7, 'closed')])?.id).toBe(9);
    expect(quarterNow(undefined)).toBeNull();
  });
});
