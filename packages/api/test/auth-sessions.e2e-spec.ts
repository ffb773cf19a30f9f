/**
 * Sessions and their hardening, through the real HTTP stack: cookies, CSRF,
 * session fixation, idle/absolute timeouts, deactivation, sign-out with
 * single logout, throttling, and two API processes sharing one database.
 */
import type { Server } from 'node:http';
import { QueryTypes } from 'sequelize';
import request from 'supertest';
import { createApp } from '../src/app.factory.js';
import { createRootLogger } from '../src/common/logger.js';
import type { CairnConfig } from '../src/config/config.schema.js';
import {
  fakeIdpFor,
  postToAcs,
  refusalOf,
  seedDemoOrganisation,
  signInAs,
  startSignIn,
} from './support/auth.js';
import { createTestApp, type TestApp } from './support/test-app.js';

const cookieOf = (res: { headers: Record<string, unknown> }) => {
  const header = res.headers['set-cookie'] as string[] | undefined;
  const cookie = header?.find((c) => c.startsWith('cairn.sid='));
  return cookie ? { full: cookie, pair: cookie.split(';')[0]! } : null;
};

async function signInRaw(t: TestApp, persona: string, app: Server = t.http) {
  const idp = await fakeIdpFor(t);
  const agent = request.agent(app);
  const started = await startSignIn(t, agent);
  const built = await idp.buildLoginResponse({
    persona: idp.findPersona(persona)!,
    inResponseTo: started.requestId,
  });
  const res = await postToAcs(agent, built.samlResponse);
  expect(refusalOf(res)).toBeNull();
  const cookie = cookieOf(res)!;
  const session = await request(app).get('/api/session').set('Cookie', cookie.pair).expect(200);
  return { agent, cookie, res, csrfToken: session.body.csrfToken as string };
}

describe('sessions', () => {
  let t: TestApp;

  beforeAll(async () => {
    t = await createTestApp();
    await seedDemoOrganisation(t);
  });
  afterAll(async () => {
    await t?.close();
  });

  it('sets an httpOnly, SameSite=Lax session cookie that expires after the idle timeout', async () => {
    const { cookie } = await signInRaw(t, 'auditor');
    expect(cookie.full).toMatch(/HttpOnly/i);
    expect(cookie.full).toMatch(/SameSite=Lax/i);
    expect(cookie.full).toMatch(/Path=\//);
    expect(cookie.full).not.toMatch(/Secure/i);
    const expires = Date.parse(/Expires=([^;]+)/i.exec(cookie.full)![1]!);
    const idle = t.config.session.idleTimeoutMinutes * 60_000;
    expect(Math.abs(expires - Date.now() - idle)).toBeLessThan(10_000);
  });

  it('keeps sessions in MariaDB with the signed-in person', async () => {
    const { cookie } = await signInRaw(t, 'regional_lead');
    const sid = decodeURIComponent(cookie.pair.split('=')[1]!).slice(2).split('.')[0]!;
    const [row] = await t.db.query<{ user_id: number; data: string }>(
      'SELECT user_id, data FROM sessions WHERE sid = ?',
      { replacements: [sid], type: QueryTypes.SELECT },
    );
    expect(row).toBeDefined();
    const [user] = await t.db.query<{ id: number }>('SELECT id FROM users WHERE email = ?', {
      replacements: ['imogen.varley@ostrevale.example'],
      type: QueryTypes.SELECT,
    });
    expect(Number(row!.user_id)).toBe(Number(user!.id));
    expect(JSON.parse(row!.data).auth.csrfToken).toEqual(expect.any(String));
  });

  it('prevents session fixation: signing in always starts a new session id', async () => {
    const first = await signInRaw(t, 'practice_lead_one');
    // Someone planted this (valid) session cookie; the next sign-in in this browser replaces it.
    const agent = request.agent(t.http);
    const started = await startSignIn(t, agent);
    const idp = await fakeIdpFor(t);
    const built = await idp.buildLoginResponse({
      persona: idp.findPersona('practice_lead_two')!,
      inResponseTo: started.requestId,
    });
    const res = await agent
      .post('/api/auth/saml/acs')
      .set('Cookie', first.cookie.pair)
      .type('form')
      .send({ SAMLResponse: built.samlResponse })
      .redirects(0);
    const second = cookieOf(res)!;
    expect(second.pair).not.toBe(first.cookie.pair);
    const old = await request(t.http).get('/api/session').set('Cookie', first.cookie.pair);
    expect(old.body.user).toBeNull();
    const fresh = await request(t.http).get('/api/session').set('Cookie', second.pair);
    expect(fresh.body.user.email).toBe('daniel.oyelaran@harnleigh.example');
  });

  it('ignores a forged or unknown session cookie', async () => {
    const res = await request(t.http).get('/api/me').set('Cookie', 'cairn.sid=s%3Aforged.abc');
    expect(res.status).toBe(401);
    expect(res.body.type).toBe('/api/problems/sign-in-required');
  });

  it('requires the CSRF token on state-changing requests', async () => {
    const { cookie, csrfToken } = await signInRaw(t, 'practice_lead_three');
    const missing = await request(t.http).post('/api/auth/sign-out').set('Cookie', cookie.pair);
    expect(missing.status).toBe(403);
    expect(missing.headers['content-type']).toMatch(/problem\+json/);
    expect(missing.body.type).toBe('/api/problems/csrf');
    const wrong = await request(t.http)
      .post('/api/auth/sign-out')
      .set('Cookie', cookie.pair)
      .set(
        'X-CSRF-Token',
        csrfToken.replace(/.$/, (c) => (c === 'a' ? 'b' : 'a')),
      );
    expect(wrong.body.type).toBe('/api/problems/csrf');
    // Still signed in: the refused requests changed nothing.
    expect((await request(t.http).get('/api/me').set('Cookie', cookie.pair)).status).toBe(200);
    const ok = await request(t.http)
      .post('/api/auth/sign-out')
      .set('Cookie', cookie.pair)
      .set('X-CSRF-Token', csrfToken);
    expect(ok.status).toBe(200);
  });

  it('answers anonymous callers 401 on protected routes and null on /api/session', async () => {
    const me = await request(t.http).get('/api/me').expect(401);
    expect(me.body).toMatchObject({ type: '/api/problems/sign-in-required', status: 401 });
    const session = await request(t.http).get('/api/session').expect(200);
    expect(session.body).toMatchObject({ user: null, csrfToken: null, localSignIn: true });
    expect(session.headers['set-cookie']).toBeUndefined();
  });

  it('ends a session after the idle timeout, saying why', async () => {
    const { cookie } = await signInRaw(t, 'auditor');
    const sid = decodeURIComponent(cookie.pair.split('=')[1]!).slice(2).split('.')[0]!;
    const idle = (t.config.session.idleTimeoutMinutes + 1) * 60_000;
    await t.db.query(
      "UPDATE sessions SET data = JSON_SET(data, '$.auth.lastSeenAt', ?) WHERE sid = ?",
      { replacements: [Date.now() - idle, sid], type: QueryTypes.UPDATE },
    );
    const res = await request(t.http).get('/api/me').set('Cookie', cookie.pair).expect(401);
    expect(res.body.sessionEnded).toBe('idle');
    expect(res.body.detail).toMatch(/without activity/);
    const [ended] = await t.db.query<{ detail: unknown }>(
      "SELECT detail FROM audit_events WHERE action = 'auth.session_ended' ORDER BY id DESC LIMIT 1",
      { type: QueryTypes.SELECT },
    );
    expect(JSON.stringify(ended!.detail)).toContain('idle');
    const rows = await t.db.query('SELECT sid FROM sessions WHERE sid = ?', {
      replacements: [sid],
      type: QueryTypes.SELECT,
    });
    expect(rows).toEqual([]);
  });

  it('ends a session after the absolute timeout, even when active', async () => {
    const { cookie } = await signInRaw(t, 'auditor');
    const sid = decodeURIComponent(cookie.pair.split('=')[1]!).slice(2).split('.')[0]!;
    const absolute = (t.config.session.absoluteTimeoutHours + 1) * 3600_000;
    await t.db.query(
      "UPDATE sessions SET data = JSON_SET(data, '$.auth.signedInAt', ?) WHERE sid = ?",
      { replacements: [Date.now() - absolute, sid], type: QueryTypes.UPDATE },
    );
    const res = await request(t.http).get('/api/session').set('Cookie', cookie.pair).expect(200);
    expect(res.body).toMatchObject({ user: null, sessionEnded: 'absolute' });
  });

  it('signs a deactivated person out at their next request', async () => {
    const { cookie } = await signInRaw(t, 'practice_lead_three');
    await t.db.query("UPDATE users SET status = 'deactivated' WHERE email = ?", {
      replacements: ['ruth.penhallow@cindermere.example'],
      type: QueryTypes.UPDATE,
    });
    try {
      const res = await request(t.http).get('/api/me').set('Cookie', cookie.pair).expect(401);
      expect(res.body.sessionEnded).toBe('deactivated');
    } finally {
      await t.db.query("UPDATE users SET status = 'active' WHERE email = ?", {
        replacements: ['ruth.penhallow@cindermere.example'],
        type: QueryTypes.UPDATE,
      });
    }
  });

  it('signs out locally and through the identity provider’s single logout', async () => {
    const agent = await signInAs(t, 'regional_lead');
    const res = await agent.post('/api/auth/sign-out').expect(200);
    const idp = await fakeIdpFor(t);
    const slo = new URL(res.body.redirectUrl as string);
    expect(`${slo.origin}${slo.pathname}`).toBe(idp.sloUrl);
    expect(slo.searchParams.get('SAMLRequest')).toBeTruthy();
    expect((await agent.get('/api/session')).body.user).toBeNull();
    await agent.get('/api/me').expect(401);
    // The IdP answers with a LogoutResponse to Cairn's single logout service.
    const answer = await request(idp.app)
      .get(slo.pathname + slo.search)
      .expect(302);
    const back = new URL(String(answer.headers.location));
    expect(back.pathname).toBe('/api/auth/saml/slo');
    const done = await agent.get(back.pathname + back.search).redirects(0);
    expect(done.status).toBe(303);
    expect(done.headers.location).toBe('/sign-in?signedOut=1');
    const [event] = await t.db.query<{ actor_label: string }>(
      "SELECT actor_label FROM audit_events WHERE action = 'auth.sign_out' ORDER BY id DESC LIMIT 1",
      { type: QueryTypes.SELECT },
    );
    expect(event!.actor_label).toBe('imogen.varley@ostrevale.example');
  });

  it('sends the security headers on the sign-in routes', async () => {
    const res = await request(t.http).get('/api/auth/saml/metadata');
    expect(res.headers['content-security-policy']).toContain("default-src 'self'");
    expect(res.headers['content-security-policy']).toContain(
      `form-action 'self' http://${t.config.devFakes.host}:${t.config.devFakes.port}`,
    );
    expect(res.headers['x-frame-options']).toBe('SAMEORIGIN');
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['referrer-policy']).toBe('no-referrer');
  });
});

describe('secure cookies behind an HTTPS proxy', () => {
  let t: TestApp;
  beforeAll(async () => {
    t = await createTestApp({
      configure: (c) => ({
        ...c,
        server: { ...c.server, trustProxy: true },
        session: { ...c.session, secureCookie: true },
      }),
    });
    await seedDemoOrganisation(t);
  });
  afterAll(async () => {
    await t?.close();
  });

  it('marks the session cookie Secure and sends HSTS', async () => {
    const idp = await fakeIdpFor(t);
    const agent = request.agent(t.http);
    const started = await startSignIn(t, agent);
    const built = await idp.buildLoginResponse({
      persona: idp.findPersona('auditor')!,
      inResponseTo: started.requestId,
    });
    const res = await agent
      .post('/api/auth/saml/acs')
      .set('X-Forwarded-Proto', 'https')
      .type('form')
      .send({ SAMLResponse: built.samlResponse })
      .redirects(0);
    expect(refusalOf(res)).toBeNull();
    expect(cookieOf(res)!.full).toMatch(/; Secure/i);
    expect(res.headers['strict-transport-security']).toMatch(/max-age=/);
  });
});

describe('two API processes sharing one database', () => {
  let t: TestApp;
  let second: Awaited<ReturnType<typeof createApp>>;
  let urlA: string;
  let urlB: string;

  beforeAll(async () => {
    t = await createTestApp({
      listen: true,
      configure: (c: CairnConfig) => ({
        ...c,
        auth: { ...c.auth, throttle: { limit: 4, windowSeconds: 60 } },
      }),
    });
    await seedDemoOrganisation(t);
    second = await createApp({
      config: t.config,
      secrets: t.secrets,
      logger: createRootLogger('silent'),
    });
    await second.listen(0, '127.0.0.1');
    const port = (s: Server) => (s.address() as { port: number }).port;
    urlA = `http://127.0.0.1:${port(t.http as Server)}`;
    urlB = `http://127.0.0.1:${port(second.getHttpServer() as Server)}`;
  });
  afterAll(async () => {
    await second?.close();
    await t?.close();
  });

  it('accepts a sign-in started on one and completed on the other, and shares the session', async () => {
    const idp = await fakeIdpFor(t);
    const started = await startSignIn(t, request.agent(urlA));
    const built = await idp.buildLoginResponse({
      persona: idp.findPersona('practice_lead_two')!,
      inResponseTo: started.requestId,
    });
    const res = await postToAcs(request.agent(urlB), built.samlResponse);
    expect(refusalOf(res)).toBeNull();
    const cookie = cookieOf(res)!.pair;
    const onA = await request(urlA).get('/api/me').set('Cookie', cookie).expect(200);
    const onB = await request(urlB).get('/api/me').set('Cookie', cookie).expect(200);
    expect(onA.body.email).toBe('daniel.oyelaran@harnleigh.example');
    expect(onB.body).toEqual(onA.body);
    // A replay at the other process is refused too.
    const replay = await postToAcs(request.agent(urlA), built.samlResponse);
    expect(refusalOf(replay)).toBe('replayed');
    // Signing out at B ends the session at A.
    const session = await request(urlA).get('/api/session').set('Cookie', cookie);
    await request(urlB)
      .post('/api/auth/sign-out')
      .set('Cookie', cookie)
      .set('X-CSRF-Token', session.body.csrfToken as string)
      .expect(200);
    await request(urlA).get('/api/me').set('Cookie', cookie).expect(401);
  });

  it('throttles sign-in attempts across both processes', async () => {
    await t.db.query('DELETE FROM auth_throttle', { type: QueryTypes.DELETE });
    const statuses: string[] = [];
    for (const url of [urlA, urlB, urlA, urlB, urlA]) {
      const res = await request(url).get('/api/auth/saml/login').redirects(0);
      statuses.push(res.status === 302 ? 'idp' : String(res.headers.location));
      if (res.status === 303) expect(Number(res.headers['retry-after'])).toBeGreaterThan(0);
    }
    expect(statuses).toEqual(['idp', 'idp', 'idp', 'idp', '/sign-in?refused=throttled']);
    const [event] = await t.db.query<{ detail: unknown }>(
      "SELECT detail FROM audit_events WHERE action = 'auth.sign_in_refused' ORDER BY id DESC LIMIT 1",
      { type: QueryTypes.SELECT },
    );
    expect(JSON.stringify(event!.detail)).toContain('throttled');
  });
});
