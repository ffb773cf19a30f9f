/**
 * The audit trail as the regional lead browses it: sign-in events (refusals
 * with their reason), filters, paging, region scoping, and no way to change it.
 */
import { QueryTypes } from 'sequelize';
import request from 'supertest';
import {
  fakeIdpFor,
  postToAcs,
  seedDemoOrganisation,
  signInAs,
  startSignIn,
  type SignedInAgent,
} from './support/auth.js';
import { createTestApp, type TestApp } from './support/test-app.js';

describe('audit trail', () => {
  let t: TestApp;
  let lead: SignedInAgent;

  beforeAll(async () => {
    t = await createTestApp();
    await seedDemoOrganisation(t);
    await signInAs(t, 'practice_lead_one');
    const idp = await fakeIdpFor(t);
    const started = await startSignIn(t);
    const built = await idp.buildLoginResponse({
      persona: idp.findPersona('unknown')!,
      inResponseTo: started.requestId,
    });
    await postToAcs(started.agent, built.samlResponse);
    // An event of another region must never show.
    await t.db.query("INSERT INTO regions (code, name) VALUES ('ZZZ', 'Elsewhere')", {
      type: QueryTypes.INSERT,
    });
    await t.db.query(
      "INSERT INTO audit_events (occurred_at, action, actor_label, region_id, summary) SELECT NOW(3), 'auth.sign_in', 'other@elsewhere.example', id, 'Someone elsewhere signed in' FROM regions WHERE code = 'ZZZ'",
      { type: QueryTypes.INSERT },
    );
    lead = await signInAs(t, 'regional_lead');
  });
  afterAll(async () => {
    await t?.close();
  });

  it('lists sign-ins and refusals, newest first, with the refusal reason', async () => {
    const res = await lead.get('/api/audit-events').expect(200);
    const events = res.body.events as {
      id: number;
      action: string;
      outcome: string;
      summary: string;
      actorLabel: string;
      detail: { reason?: string } | null;
    }[];
    expect(events[0]).toMatchObject({
      action: 'auth.sign_in',
      actorLabel: 'imogen.varley@ostrevale.example',
      actorName: 'Imogen Varley',
    });
    const ids = events.map((e) => e.id);
    expect([...ids].sort((a, b) => b - a)).toEqual(ids);
    const refused = events.find((e) => e.action === 'auth.sign_in_refused')!;
    expect(refused).toMatchObject({
      outcome: 'refused',
      actorLabel: 'sam.ashdown@kettleholm.example',
      actorName: null,
    });
    expect(refused.summary).toBe('Sign-in refused: the person is not known to Cairn');
    expect(refused.detail!.reason).toBe('unknown-user');
    expect(events.some((e) => e.action === 'demo.seeded')).toBe(true);
    expect(events.some((e) => e.summary.includes('elsewhere'))).toBe(false);
  });

  it('filters by action, action prefix, outcome, search and dates', async () => {
    const byAction = await lead
      .get('/api/audit-events')
      .query({ action: 'auth.sign_in' })
      .expect(200);
    expect(byAction.body.events.every((e: { action: string }) => e.action === 'auth.sign_in')).toBe(
      true,
    );
    const byPrefix = await lead.get('/api/audit-events').query({ action: 'auth.' }).expect(200);
    expect(new Set(byPrefix.body.events.map((e: { action: string }) => e.action))).toEqual(
      new Set(['auth.sign_in', 'auth.sign_in_refused']),
    );
    const refused = await lead.get('/api/audit-events').query({ outcome: 'refused' }).expect(200);
    expect(refused.body.events).toHaveLength(1);
    const search = await lead.get('/api/audit-events').query({ search: 'quarrybank' }).expect(200);
    expect(search.body.events.map((e: { actorLabel: string }) => e.actorLabel)).toEqual([
      'priya.calloway@quarrybank.example',
    ]);
    const future = await lead.get('/api/audit-events').query({ from: '2999-01-01' }).expect(200);
    expect(future.body.events).toEqual([]);
    const today = new Date().toISOString().slice(0, 10);
    const upToToday = await lead.get('/api/audit-events').query({ to: today }).expect(200);
    expect(upToToday.body.events.length).toBeGreaterThan(0);
  });

  it('pages with before/nextBefore', async () => {
    const first = await lead.get('/api/audit-events').query({ limit: 2 }).expect(200);
    expect(first.body.events).toHaveLength(2);
    expect(first.body.nextBefore).toBe(first.body.events[1].id);
    const second = await lead
      .get('/api/audit-events')
      .query({ limit: 2, before: first.body.nextBefore })
      .expect(200);
    expect(second.body.events[0].id).toBeLessThan(first.body.events[1].id);
    const all = await lead.get('/api/audit-events').query({ limit: 500 }).expect(200);
    expect(all.body.nextBefore).toBeNull();
  });

  it('lists the recorded actions for the filter', async () => {
    const res = await lead.get('/api/audit-events/actions').expect(200);
    expect(res.body).toEqual(
      expect.arrayContaining([
        {
          action: 'auth.sign_in',
          label: 'Signed in',
          group: 'auth.',
          groupLabel: 'Sign-ins and sign-outs',
          count: 2,
        },
        {
          action: 'auth.sign_in_refused',
          label: 'Sign-in refused',
          group: 'auth.',
          groupLabel: 'Sign-ins and sign-outs',
          count: 1,
        },
        {
          action: 'demo.seeded',
          label: 'Demo data loaded',
          group: 'demo.',
          groupLabel: 'Other',
          count: 1,
        },
      ]),
    );
  });

  it('explains bad filters', async () => {
    const res = await lead
      .get('/api/audit-events')
      .query({ outcome: 'maybe', from: 'yesterday', limit: 9999, action: 'DROP TABLE' })
      .expect(400);
    expect(res.body.errors.map((e: { field: string }) => e.field).sort()).toEqual([
      'action',
      'from',
      'limit',
      'outcome',
    ]);
    const order = await lead
      .get('/api/audit-events')
      .query({ from: '2026-02-01', to: '2026-01-01' })
      .expect(400);
    expect(order.body.detail).toBe('from must not be after to.');
  });

  it('offers no way to change or delete an event', async () => {
    const [row] = await t.db.query<{ id: number }>('SELECT id FROM audit_events LIMIT 1', {
      type: QueryTypes.SELECT,
    });
    await lead.delete(`/api/audit-events/${row!.id}`).expect(404);
    await lead.put(`/api/audit-events/${row!.id}`).send({ summary: 'x' }).expect(404);
    await lead.patch(`/api/audit-events/${row!.id}`).send({ summary: 'x' }).expect(404);
  });

  it('is for regional leads and auditors', async () => {
    const auditor = await signInAs(t, 'auditor');
    expect((await auditor.get('/api/audit-events').expect(200)).body.events.length).toBeGreaterThan(
      0,
    );
    const practiceLead = await signInAs(t, 'practice_lead_one');
    expect((await practiceLead.get('/api/audit-events').expect(403)).body.type).toBe(
      '/api/problems/role-not-allowed',
    );
    await request(t.http).get('/api/audit-events').expect(401);
  });
});
