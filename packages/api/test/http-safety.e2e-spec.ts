/**
 * What every answer of the API carries and how it speaks, through the real HTTP stack: no answer
 * is kept in a browser's cache (Cache-Control: no-store), an upload with two files is refused
 * with nothing kept, problems name practices by their code, and the audit trail gives every
 * action in words.
 */
import { QueryTypes } from 'sequelize';
import request from 'supertest';
import { signInAs, type SignedInAgent } from './support/auth.js';
import { createTestApp, type TestApp } from './support/test-app.js';
import { arrange, uploadAndWait, type ExtractsWorld } from './extracts-fixtures/api.js';
import { csvOf, goodRows } from './extracts-fixtures/rows.js';

describe('answers of the API', () => {
  let t: TestApp;
  let w: ExtractsWorld;
  let priya: SignedInAgent;
  let imogen: SignedInAgent;

  beforeAll(async () => {
    t = await createTestApp();
    w = await arrange(t);
    priya = await signInAs(t, 'practice_lead_one');
    imogen = await signInAs(t, 'regional_lead');
  });
  afterAll(async () => {
    await t?.close();
  });

  it('sends Cache-Control: no-store on every API answer, signed in or not, success or problem', async () => {
    const ov102 = w.practice('OV102');
    const answers = [
      await priya.get('/api/session').expect(200),
      await priya.get(`/api/practices/${ov102}/submissions`).expect(200),
      await imogen.get('/api/audit-events').expect(200),
      await priya.get(`/api/practices/${w.practice('OV103')}/submissions`).expect(403),
      await request(t.http).get(`/api/practices/${ov102}/submissions`).expect(401),
      await request(t.http).get('/api/about').expect(200),
    ];
    for (const res of answers) expect(res.headers['cache-control']).toBe('no-store');
  });

  it('refuses an upload carrying two files, and keeps nothing of it', async () => {
    const ov102 = w.practice('OV102');
    const q3 = w.quarter('2026 Q3');
    const count = async () =>
      Number(
        (
          await t.db.query<{ n: number }>(
            'SELECT COUNT(*) AS n FROM submissions WHERE practice_id = ?',
            { replacements: [ov102], type: QueryTypes.SELECT },
          )
        )[0]!.n,
      );
    const chunks = async () =>
      Number(
        (
          await t.db.query<{ n: number }>('SELECT COUNT(*) AS n FROM extract_file_chunks', {
            type: QueryTypes.SELECT,
          })
        )[0]!.n,
      );
    const before = { submissions: await count(), chunks: await chunks() };
    for (const second of ['file', 'other']) {
      const res = await priya
        .post(`/api/practices/${ov102}/quarters/${q3}/extracts`)
        .attach('file', csvOf(goodRows(3, 10)), 'one.csv')
        .attach(second, csvOf(goodRows(3, 20)), 'two.csv');
      expect(res.status).toBe(400);
      expect(res.body).toMatchObject({
        type: '/api/problems/upload-several-files',
        title: 'Send one file at a time',
        detail:
          'The upload carried 2 files; Cairn takes one extract per upload, so none of them was kept. Send the extract alone, in a part named "file".',
      });
    }
    expect({ submissions: await count(), chunks: await chunks() }).toEqual(before);
    // One file alone is still taken.
    const done = await uploadAndWait(priya, ov102, q3, csvOf(goodRows(3, 10)), {
      name: 'one.csv',
    });
    expect(done.status).toBe('awaiting_confirmation');
  });

  it('names practices by their code in problems', async () => {
    const other = await priya.get(`/api/practices/${w.practice('OV103')}/submissions`).expect(403);
    expect(other.body.detail).toBe(
      'You lead one practice (OV102), and OV103 is not among them. Ask your regional lead if you should have access.',
    );
    expect(other.body.detail).not.toMatch(/practice \d/);
    const missing = await priya.get('/api/practices/999999/submissions').expect(404);
    expect(missing.body.detail).toBe(
      'The practice this address names is not one of your region’s practices. The link may be old, or the address mistyped.',
    );
  });

  it('gives every audit trail action in words, keeping the action name', async () => {
    const page = await imogen.get('/api/audit-events').expect(200);
    const events = page.body.events as { action: string; actionLabel: string }[];
    expect(events.length).toBeGreaterThan(0);
    for (const e of events) {
      expect(e.actionLabel).not.toBe('');
      expect(e.actionLabel).not.toMatch(/^Other/);
    }
    expect(events.find((e) => e.action === 'auth.sign_in')?.actionLabel).toBe('Signed in');
    const actions = await imogen.get('/api/audit-events/actions').expect(200);
    expect(actions.body).toEqual(
      expect.arrayContaining([
        {
          action: 'auth.sign_in',
          label: 'Signed in',
          group: 'auth.',
          groupLabel: 'Sign-ins and sign-outs',
          count: expect.any(Number),
        },
      ]),
    );
  });
});
