/**
 * The allowed actions the API sends (submission-policy.ts), through the real HTTP stack: where
 * each role may upload (upload options, the history's per-quarter actions) agrees with what the
 * upload route then accepts. 2026 Q2 is closed, 2026 Q3 open.
 */
import { signInAs } from './support/auth.js';
import { createTestApp, type TestApp } from './support/test-app.js';
import { arrange, upload, type ExtractsWorld } from './extracts-fixtures/api.js';
import { csvOf, goodRows } from './extracts-fixtures/rows.js';

describe('extracts: allowed actions', () => {
  let t: TestApp;
  let w: ExtractsWorld;

  beforeAll(async () => {
    t = await createTestApp();
    w = await arrange(t);
  });
  afterAll(async () => {
    await t?.close();
  });

  const quarterActions = (body: { quarters: { quarter: { label: string }; actions: unknown }[] }) =>
    Object.fromEntries(body.quarters.map((q) => [q.quarter.label, q.actions]));

  it('lets a practice lead upload for their own practice in the open quarter only', async () => {
    const lead = await signInAs(t, 'practice_lead_one');
    const options = await lead.get('/api/extracts/upload-options').expect(200);
    expect(
      options.body.practices.map((p: { practice: { code: string }; quarterIds: number[] }) => [
        p.practice.code,
        p.quarterIds,
      ]),
    ).toEqual([['OV102', [w.quarter('2026 Q3')]]]);
    const history = await lead.get(`/api/practices/${w.practice('OV102')}/submissions`).expect(200);
    expect(quarterActions(history.body)).toEqual({
      '2026 Q3': { upload: true },
      '2026 Q2': { upload: false },
    });
    const late = await upload(
      lead,
      w.practice('OV102'),
      w.quarter('2026 Q2'),
      csvOf(goodRows(3, 7100)),
      { name: 'late.csv' },
    );
    expect(late.status).toBe(409);
    expect(late.body.type).toBe('/api/problems/quarter-closed');
  });

  it('lets a regional lead upload for any practice, in closed quarters too', async () => {
    const lead = await signInAs(t, 'regional_lead');
    const options = await lead.get('/api/extracts/upload-options').expect(200);
    expect(options.body.practices.length).toBeGreaterThan(1);
    for (const p of options.body.practices as { quarterIds: number[] }[])
      expect(p.quarterIds.sort()).toEqual([w.quarter('2026 Q2'), w.quarter('2026 Q3')].sort());
    const history = await lead.get(`/api/practices/${w.practice('OV104')}/submissions`).expect(200);
    expect(quarterActions(history.body)).toEqual({
      '2026 Q3': { upload: true },
      '2026 Q2': { upload: true },
    });
    const late = await upload(
      lead,
      w.practice('OV104'),
      w.quarter('2026 Q2'),
      csvOf(goodRows(3, 7200)),
      { name: 'late.csv' },
    );
    expect(late.status).toBe(202);
    expect(late.body.actions).toMatchObject({ upload: true, cancel: true, confirm: false });
  });

  it('gives an auditor no upload anywhere', async () => {
    const auditor = await signInAs(t, 'auditor');
    const options = await auditor.get('/api/extracts/upload-options').expect(200);
    expect(options.body.practices).toEqual([]);
    expect(options.body.quarters.map((q: { label: string }) => q.label)).toEqual([
      '2026 Q3',
      '2026 Q2',
    ]);
    const history = await auditor
      .get(`/api/practices/${w.practice('OV102')}/submissions`)
      .expect(200);
    expect(quarterActions(history.body)).toEqual({
      '2026 Q3': { upload: false },
      '2026 Q2': { upload: false },
    });
  });
});
