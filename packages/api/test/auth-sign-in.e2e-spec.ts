/**
 * Sign-in round trips through the fake identity provider (plain HTTP, the
 * real ACS, guards and sessions), for every persona, with Cairn's own
 * assignments (trustIdpRoles false) and with the identity provider trusted.
 */
import { QueryTypes } from 'sequelize';
import request from 'supertest';
import {
  fakeIdpFor,
  postToAcs,
  refusalOf,
  seedDemoOrganisation,
  signInAs,
  startSignIn,
} from './support/auth.js';
import { createTestApp, type TestApp } from './support/test-app.js';

async function auditRows(t: TestApp, action: string) {
  return t.db.query<{ outcome: string; actor_label: string; summary: string; detail: unknown }>(
    'SELECT outcome, actor_label, summary, detail FROM audit_events WHERE action = ? ORDER BY id',
    { replacements: [action], type: QueryTypes.SELECT },
  );
}

const detailOf = (row: { detail: unknown }) =>
  (typeof row.detail === 'string' ? JSON.parse(row.detail) : row.detail) as Record<string, unknown>;

async function signInWithPicker(t: TestApp, persona: string) {
  const idp = await fakeIdpFor(t);
  const started = await startSignIn(t);
  const posted = await request(idp.app)
    .post('/idp/sso')
    .type('form')
    .send({ SAMLRequest: started.samlRequest, RelayState: started.relayState, persona })
    .expect(200);
  const samlResponse = /name="SAMLResponse" value="([^"]+)"/.exec(posted.text)![1]!;
  return { started, res: await postToAcs(started.agent, samlResponse, started.relayState) };
}

describe('sign-in with Cairn’s own role assignments', () => {
  let t: TestApp;

  beforeAll(async () => {
    t = await createTestApp();
    await seedDemoOrganisation(t);
  });
  afterAll(async () => {
    await t?.close();
  });

  it.each([
    ['regional_lead', 'imogen.varley@ostrevale.example', 'regional_lead', []],
    ['auditor', 'tobias.renwick@ostrevale.example', 'auditor', []],
    ['practice_lead_one', 'priya.calloway@quarrybank.example', 'practice_lead', ['OV102']],
    ['practice_lead_two', 'daniel.oyelaran@harnleigh.example', 'practice_lead', ['OV101', 'OV103']],
    ['practice_lead_three', 'ruth.penhallow@cindermere.example', 'practice_lead', ['OV201']],
  ])(
    '%s signs in and /api/me shows their role and practices',
    async (persona, email, role, codes) => {
      const agent = await signInAs(t, persona);
      const me = await agent.get('/api/me').expect(200);
      expect(me.body).toMatchObject({ email, role, regionName: 'Ostrevale' });
      expect(me.body.practices.map((p: { code: string }) => p.code)).toEqual(codes);
      const session = await agent.get('/api/session').expect(200);
      expect(session.body.user.email).toBe(email);
      expect(session.body.csrfToken).toEqual(expect.any(String));
      const [user] = await t.db.query<{ last_sign_in_at: Date | null; external_id: string | null }>(
        'SELECT last_sign_in_at, external_id FROM users WHERE email = ?',
        { replacements: [email], type: QueryTypes.SELECT },
      );
      expect(user!.last_sign_in_at).not.toBeNull();
      expect(user!.external_id).toBe(email);
    },
  );

  it('returns to the page the person started from', async () => {
    const idp = await fakeIdpFor(t);
    const started = await startSignIn(t, undefined, '/users?role=auditor');
    expect(started.relayState).toBe('/users?role=auditor');
    const persona = idp.findPersona('regional_lead')!;
    const built = await idp.buildLoginResponse({ persona, inResponseTo: started.requestId });
    const res = await postToAcs(started.agent, built.samlResponse, started.relayState);
    expect(res.status).toBe(303);
    expect(res.headers.location).toBe('/users?role=auditor');
  });

  it('never returns to another site or to the API', async () => {
    for (const returnTo of ['//evil.example/x', 'https://evil.example/', '/api/users', 'users']) {
      const started = await startSignIn(t, undefined, returnTo);
      expect(started.relayState).toBe('/');
    }
  });

  it('refuses a deactivated person with a clear reason, changing nothing', async () => {
    const before = await t.db.query('SELECT * FROM users WHERE email = ?', {
      replacements: ['hester.quill@ostrevale.example'],
      type: QueryTypes.SELECT,
    });
    const { res, started } = await signInWithPicker(t, 'deactivated');
    expect(res.status).toBe(303);
    expect(refusalOf(res)).toBe('deactivated');
    expect(res.headers['set-cookie']).toBeUndefined();
    const session = await started.agent.get('/api/session').expect(200);
    expect(session.body.user).toBeNull();
    const after = await t.db.query('SELECT * FROM users WHERE email = ?', {
      replacements: ['hester.quill@ostrevale.example'],
      type: QueryTypes.SELECT,
    });
    expect(after).toEqual(before);
    const refusals = await auditRows(t, 'auth.sign_in_refused');
    const last = refusals.at(-1)!;
    expect(last.outcome).toBe('refused');
    expect(last.actor_label).toBe('hester.quill@ostrevale.example');
    expect(last.summary).toMatch(/deactivated/);
    expect(detailOf(last).reason).toBe('deactivated');
  });

  it('refuses a person unknown to Cairn and provisions nothing', async () => {
    const { res } = await signInWithPicker(t, 'unknown');
    expect(refusalOf(res)).toBe('unknown-user');
    const rows = await t.db.query('SELECT id FROM users WHERE email = ?', {
      replacements: ['sam.ashdown@kettleholm.example'],
      type: QueryTypes.SELECT,
    });
    expect(rows).toEqual([]);
    const last = (await auditRows(t, 'auth.sign_in_refused')).at(-1)!;
    expect(detailOf(last)).toMatchObject({
      reason: 'unknown-user',
      email: 'sam.ashdown@kettleholm.example',
    });
  });

  it('uses Cairn’s role even when the identity provider says otherwise', async () => {
    const agent = await signInAs(t, 'priya.calloway@quarrybank.example', {
      persona: { role: 'regional_lead', practices: [] },
    });
    expect(agent.user.role).toBe('practice_lead');
    expect(agent.user.practices.map((p) => p.code)).toEqual(['OV102']);
  });

  it('records each sign-in in the audit trail', async () => {
    const rows = await auditRows(t, 'auth.sign_in');
    expect(rows.length).toBeGreaterThanOrEqual(5);
    expect(rows.map((r) => r.actor_label)).toContain('imogen.varley@ostrevale.example');
    expect(rows.every((r) => r.outcome === 'success')).toBe(true);
  });

  it('reports a sign-in cancelled at the identity provider', async () => {
    const idp = await fakeIdpFor(t);
    const started = await startSignIn(t);
    const posted = await request(idp.app)
      .post('/idp/sso')
      .type('form')
      .send({ SAMLRequest: started.samlRequest, RelayState: started.relayState, action: 'cancel' })
      .expect(200);
    const samlResponse = /name="SAMLResponse" value="([^"]+)"/.exec(posted.text)![1]!;
    const res = await postToAcs(started.agent, samlResponse);
    expect(refusalOf(res)).toBe('idp-refused');
  });

  it('publishes SP metadata with the ACS and SLO endpoints', async () => {
    const res = await request(t.http).get('/api/auth/saml/metadata').expect(200);
    expect(res.headers['content-type']).toMatch(/samlmetadata\+xml/);
    expect(res.text).toContain(`entityID="${t.config.auth.sp.entityId}"`);
    expect(res.text).toContain('/api/auth/saml/acs');
    expect(res.text).toContain('/api/auth/saml/slo');
    expect(res.text).toContain('WantAssertionsSigned="true"');
  });

  it('serves the fake IdP metadata, and its picker lists every persona', async () => {
    const idp = await fakeIdpFor(t);
    const metadata = await request(idp.app).get('/idp/metadata').expect(200);
    expect(metadata.text).toContain(idp.entityId);
    const started = await startSignIn(t);
    const picker = await request(idp.app).get(started.idpPath).expect(200);
    for (const persona of idp.personas) expect(picker.text).toContain(persona.displayName);
    expect(picker.text).toContain('Sam Ashdown');
    await request(idp.app).get('/idp/sso').expect(400);
  });
});

describe('sign-in trusting the identity provider’s roles', () => {
  let t: TestApp;

  beforeAll(async () => {
    t = await createTestApp({
      configure: (c) => ({ ...c, auth: { ...c.auth, trustIdpRoles: true } }),
    });
    await seedDemoOrganisation(t);
  });
  afterAll(async () => {
    await t?.close();
  });

  it('provisions a person unknown to Cairn from the assertion', async () => {
    const agent = await signInAs(t, 'unknown');
    expect(agent.user).toMatchObject({
      email: 'sam.ashdown@kettleholm.example',
      displayName: 'Sam Ashdown',
      role: 'practice_lead',
    });
    expect(agent.user.practices.map((p) => p.code)).toEqual(['OV304']);
    const provisioned = await auditRows(t, 'user.provisioned');
    expect(provisioned).toHaveLength(1);
    expect(provisioned[0]!.actor_label).toBe('identity provider');
    expect((await auditRows(t, 'membership.added')).length).toBe(1);
  });

  it('brings role and practices into line with the identity provider, auditing each change', async () => {
    const agent = await signInAs(t, 'priya.calloway@quarrybank.example', {
      persona: { role: 'practice_lead', practices: ['OV102', 'OV104'] },
    });
    expect(agent.user.practices.map((p) => p.code)).toEqual(['OV102', 'OV104']);
    const again = await signInAs(t, 'priya.calloway@quarrybank.example', {
      persona: { role: 'auditor', practices: [] },
    });
    expect(again.user.role).toBe('auditor');
    expect(again.user.practices).toEqual([]);
    const changes = await auditRows(t, 'user.role_changed');
    expect(changes.at(-1)!.summary).toMatch(/practice lead to auditor/);
    expect((await auditRows(t, 'membership.removed')).length).toBe(2);
  });

  it('still refuses a person deactivated in Cairn', async () => {
    const { res } = await signInWithPicker(t, 'deactivated');
    expect(refusalOf(res)).toBe('deactivated');
  });

  it('refuses, provisioning nothing, when the attributes name unknown practices or no role', async () => {
    const idp = await fakeIdpFor(t);
    const persona = { ...idp.findPersona('unknown')!, email: 'new.person@kettleholm.example' };
    let started = await startSignIn(t);
    let built = await idp.buildLoginResponse({
      persona: { ...persona, practices: ['OV999'] },
      inResponseTo: started.requestId,
    });
    expect(refusalOf(await postToAcs(started.agent, built.samlResponse))).toBe('unknown-practice');
    started = await startSignIn(t);
    built = await idp.buildLoginResponse({
      persona,
      inResponseTo: started.requestId,
      attributes: { [t.config.auth.attributes.role]: ['someone-else'] },
    });
    expect(refusalOf(await postToAcs(started.agent, built.samlResponse))).toBe('no-role');
    const rows = await t.db.query('SELECT id FROM users WHERE email = ?', {
      replacements: ['new.person@kettleholm.example'],
      type: QueryTypes.SELECT,
    });
    expect(rows).toEqual([]);
  });
});
