/**
 * The regional lead's users API: list and filter, add, rename, change role,
 * assign and remove practices, deactivate and reactivate, with validation,
 * guard rails and an audit event for every change.
 */
import { QueryTypes } from 'sequelize';
import { demoIds, seedDemoOrganisation, signInAs, type SignedInAgent } from './support/auth.js';
import { createTestApp, type TestApp } from './support/test-app.js';

describe('users (regional lead)', () => {
  let t: TestApp;
  let lead: SignedInAgent;
  let ids: Awaited<ReturnType<typeof demoIds>>;

  const lastAudit = async (action: string) => {
    const [row] = await t.db.query<{
      summary: string;
      actor_label: string;
      practice_id: number | null;
    }>(
      'SELECT summary, actor_label, practice_id FROM audit_events WHERE action = ? ORDER BY id DESC LIMIT 1',
      { replacements: [action], type: QueryTypes.SELECT },
    );
    return row;
  };

  beforeAll(async () => {
    t = await createTestApp();
    await seedDemoOrganisation(t);
    ids = await demoIds(t);
    lead = await signInAs(t, 'regional_lead');
  });
  afterAll(async () => {
    await t?.close();
  });

  it('lists the region’s people with their practices', async () => {
    const res = await lead.get('/api/users').expect(200);
    expect(res.body.trustIdpRoles).toBe(false);
    expect(res.body.users.map((u: { displayName: string }) => u.displayName)).toEqual([
      'Daniel Oyelaran',
      'Hester Quill',
      'Imogen Varley',
      'Priya Calloway',
      'Ruth Penhallow',
      'Tobias Renwick',
    ]);
    const daniel = res.body.users.find(
      (u: { displayName: string }) => u.displayName === 'Daniel Oyelaran',
    );
    expect(daniel).toMatchObject({ role: 'practice_lead', status: 'active' });
    expect(daniel.practices.map((p: { code: string }) => p.code)).toEqual(['OV101', 'OV103']);
    expect(daniel.createdAt).toMatch(/^\d{4}-\d{2}-\d{2}T/);
  });

  it('filters by search text, role, status and practice', async () => {
    const bySearch = await lead.get('/api/users').query({ search: 'quarrybank' }).expect(200);
    expect(bySearch.body.users.map((u: { email: string }) => u.email)).toEqual([
      'priya.calloway@quarrybank.example',
    ]);
    const byRole = await lead.get('/api/users').query({ role: 'auditor' }).expect(200);
    expect(byRole.body.users).toHaveLength(1);
    const byStatus = await lead.get('/api/users').query({ status: 'deactivated' }).expect(200);
    expect(byStatus.body.users.map((u: { displayName: string }) => u.displayName)).toEqual([
      'Hester Quill',
    ]);
    const byPractice = await lead
      .get('/api/users')
      .query({ practiceId: ids.practice('OV101') })
      .expect(200);
    expect(byPractice.body.users.map((u: { displayName: string }) => u.displayName)).toEqual([
      'Daniel Oyelaran',
    ]);
    const wildcard = await lead.get('/api/users').query({ search: '%' }).expect(200);
    expect(wildcard.body.users).toEqual([]);
  });

  it('explains bad filters field by field', async () => {
    const res = await lead.get('/api/users').query({ role: 'boss', practiceId: 'x' }).expect(400);
    expect(res.body.type).toBe('/api/problems/validation');
    expect(res.body.errors).toEqual(
      expect.arrayContaining([
        { field: 'role', message: 'must be one of: regional_lead, practice_lead, auditor' },
        { field: 'practiceId', message: 'must be a whole number' },
      ]),
    );
  });

  it('offers the region’s practices for assignment', async () => {
    const res = await lead.get('/api/users/options').expect(200);
    expect(res.body.practices).toHaveLength(30);
    expect(res.body.practices[0]).toMatchObject({
      code: 'OV101',
      name: 'Wrenfield Health Centre',
      localityName: 'Harnleigh Fold',
    });
  });

  it('adds a practice lead who can then sign in', async () => {
    const res = await lead
      .post('/api/users')
      .send({
        email: '  Alys.Fenwick@Kettleholm.example ',
        displayName: 'Alys Fenwick',
        role: 'practice_lead',
        practiceIds: [ids.practice('OV304')],
      })
      .expect(201);
    expect(res.body).toMatchObject({
      email: 'alys.fenwick@kettleholm.example',
      role: 'practice_lead',
      lastSignInAt: null,
    });
    expect(res.body.practices.map((p: { code: string }) => p.code)).toEqual(['OV304']);
    expect((await lastAudit('user.created'))!.summary).toBe(
      'Imogen Varley added Alys Fenwick (alys.fenwick@kettleholm.example) as practice lead of OV304',
    );
    const alys = await signInAs(t, 'alys.fenwick@kettleholm.example');
    expect(alys.user.practices.map((p) => p.code)).toEqual(['OV304']);
  });

  it('refuses a bad or duplicate person, storing nothing', async () => {
    const bad = await lead
      .post('/api/users')
      .send({ email: 'not-an-address', displayName: ' ', role: 'boss', extra: 1 })
      .expect(400);
    expect(bad.body.errors).toEqual(
      expect.arrayContaining([
        { field: 'email', message: 'must be an e-mail address such as name@practice.example' },
        { field: 'displayName', message: 'must be 1 to 200 characters' },
        { field: 'role', message: 'must be one of: regional_lead, practice_lead, auditor' },
        { field: 'extra', message: 'is not an accepted field' },
      ]),
    );
    const duplicate = await lead
      .post('/api/users')
      .send({ email: 'PRIYA.calloway@quarrybank.example', displayName: 'Someone', role: 'auditor' })
      .expect(409);
    expect(duplicate.body).toMatchObject({
      type: '/api/problems/email-taken',
      detail: expect.stringContaining('Priya Calloway'),
    });
    const unknownPractice = await lead
      .post('/api/users')
      .send({
        email: 'x@y.example',
        displayName: 'X',
        role: 'practice_lead',
        practiceIds: [999999],
      })
      .expect(422);
    expect(unknownPractice.body.type).toBe('/api/problems/unknown-practice');
    const auditorWithPractice = await lead
      .post('/api/users')
      .send({
        email: 'x@y.example',
        displayName: 'X',
        role: 'auditor',
        practiceIds: [ids.practice('OV101')],
      })
      .expect(422);
    expect(auditorWithPractice.body.type).toBe('/api/problems/practices-need-practice-lead');
    const rows = await t.db.query("SELECT id FROM users WHERE email = 'x@y.example'", {
      type: QueryTypes.SELECT,
    });
    expect(rows).toEqual([]);
  });

  it('assigns and removes practices, auditing each change', async () => {
    const priya = ids.user('priya.calloway@quarrybank.example');
    const ov104 = ids.practice('OV104');
    const added = await lead.put(`/api/users/${priya}/practices/${ov104}`).expect(200);
    expect(added.body.practices.map((p: { code: string }) => p.code)).toEqual(['OV102', 'OV104']);
    await lead.put(`/api/users/${priya}/practices/${ov104}`).expect(200); // idempotent
    const audit = await lastAudit('membership.added');
    expect(audit!.summary).toBe(
      'Imogen Varley made Priya Calloway a lead of Fellgate Family Practice (OV104)',
    );
    expect(Number(audit!.practice_id)).toBe(ov104);
    const removed = await lead.delete(`/api/users/${priya}/practices/${ov104}`).expect(200);
    expect(removed.body.practices.map((p: { code: string }) => p.code)).toEqual(['OV102']);
    const missing = await lead.delete(`/api/users/${priya}/practices/${ov104}`).expect(404);
    expect(missing.body.type).toBe('/api/problems/membership-not-found');
    await lead.put(`/api/users/${priya}/practices/999999`).expect(404);
    const tobias = ids.user('tobias.renwick@ostrevale.example');
    const notLead = await lead.put(`/api/users/${tobias}/practices/${ov104}`).expect(409);
    expect(notLead.body.detail).toMatch(/is an auditor/);
  });

  it('changes a role; a practice lead’s practices go with the old role', async () => {
    const ruth = ids.user('ruth.penhallow@cindermere.example');
    const res = await lead.patch(`/api/users/${ruth}`).send({ role: 'auditor' }).expect(200);
    expect(res.body).toMatchObject({ role: 'auditor', practices: [] });
    expect((await lastAudit('user.role_changed'))!.summary).toBe(
      "Imogen Varley changed Ruth Penhallow's role from practice lead to auditor; their practices (OV201) were removed",
    );
    await lead.patch(`/api/users/${ruth}`).send({ role: 'practice_lead' }).expect(200);
    await lead.put(`/api/users/${ruth}/practices/${ids.practice('OV201')}`).expect(200);
    const renamed = await lead
      .patch(`/api/users/${ruth}`)
      .send({ displayName: 'Ruth Penhallow-Vane' })
      .expect(200);
    expect(renamed.body.displayName).toBe('Ruth Penhallow-Vane');
  });

  it('deactivates (ending sessions) and reactivates', async () => {
    const daniel = await signInAs(t, 'practice_lead_two');
    const id = daniel.user.id;
    const res = await lead.post(`/api/users/${id}/deactivate`).expect(200);
    expect(res.body.status).toBe('deactivated');
    expect((await lastAudit('user.deactivated'))!.summary).toBe(
      'Imogen Varley deactivated Daniel Oyelaran and ended 1 open session',
    );
    await daniel.get('/api/me').expect(401);
    await expect(signInAs(t, 'practice_lead_two')).rejects.toThrow(/refused \(deactivated\)/);
    await lead.post(`/api/users/${id}/reactivate`).expect(200);
    await signInAs(t, 'practice_lead_two');
  });

  it('keeps the regional lead from locking themselves or the region out', async () => {
    const me = lead.user.id;
    const self = await lead.post(`/api/users/${me}/deactivate`).expect(409);
    expect(self.body.type).toBe('/api/problems/own-account');
    await lead.patch(`/api/users/${me}`).send({ role: 'auditor' }).expect(409);
    // A second regional lead cannot take away the only other one either.
    const created = await lead
      .post('/api/users')
      .send({
        email: 'second.lead@ostrevale.example',
        displayName: 'Second Lead',
        role: 'regional_lead',
      })
      .expect(201);
    const second = await signInAs(t, 'second.lead@ostrevale.example');
    await second.post(`/api/users/${me}/deactivate`).expect(200);
    const last = await second.post(`/api/users/${me}/reactivate`).expect(200);
    expect(last.body.status).toBe('active');
    await lead.post(`/api/users/${created.body.id}/deactivate`).expect(401); // lead was deactivated meanwhile
    const again = await signInAs(t, 'regional_lead');
    await again.post(`/api/users/${created.body.id}/deactivate`).expect(200);
    const onlyOne = await again
      .patch(`/api/users/${again.user.id}`)
      .send({ role: 'auditor' })
      .expect(409);
    expect(onlyOne.body.type).toBe('/api/problems/own-account');
    lead = again;
  });

  it('answers 404 for people and ids that do not exist, 400 for ids that are not numbers', async () => {
    await lead.get('/api/users/999999').expect(404);
    const bad = await lead.get('/api/users/abc').expect(400);
    expect(bad.body.status).toBe(400);
  });

  it('is for regional leads only', async () => {
    const auditor = await signInAs(t, 'auditor');
    const res = await auditor.get('/api/users').expect(403);
    expect(res.body.type).toBe('/api/problems/role-not-allowed');
    const practiceLead = await signInAs(t, 'practice_lead_one');
    await practiceLead.get('/api/users').expect(403);
  });
});
