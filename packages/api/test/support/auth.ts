/**
 * Signing in, in API tests, exactly as a browser does: Cairn's
 * /api/auth/saml/login → the fake identity provider's persona picker
 * (driven in-process with supertest, from the same config as the app) → a
 * signed SAML Response posted to Cairn's real ACS. The returned agent keeps
 * the session cookie and sends X-CSRF-Token on every request.
 *
 *   const lead = await signInAs(t, 'regional_lead');
 *   await lead.get('/api/users').expect(200);
 *   await lead.post('/api/...').send({...});          // CSRF header already set
 *
 * `who` is a persona key from config/personas.json ('regional_lead',
 * 'auditor', 'practice_lead_one' (OV102), 'practice_lead_two' (OV103 + OV101),
 * 'practice_lead_three' (OV201), 'deactivated', 'unknown') or an e-mail
 * address. A persona key goes through the picker's form; an e-mail address
 * not among the personas gets an assertion built by the same fake IdP (for
 * people a test created itself) and posted to the same ACS.
 *
 * seedDemoOrganisation(t) loads the invented demo organisation (Ostrevale:
 * 30 practices, the personas' users) into the test's database.
 */
import { join } from 'node:path';
import request from 'supertest';
import type TestAgent from 'supertest/lib/agent.js';
import { findRepoRoot, resolvePath } from '../../src/config/load-config.js';
import { createFakeIdp, type FakeIdp } from '../../src/dev/idp/fake-idp.js';
import type { Persona } from '../../src/dev/idp/personas.js';
import {
  type DemoOrganisation,
  seedDemoOrganisation as seed,
} from '../../src/organisations/demo-seed.js';
import type { TestApp } from './test-app.js';

export type PersonaKey =
  | 'regional_lead'
  | 'auditor'
  | 'practice_lead_one'
  | 'practice_lead_two'
  | 'practice_lead_three'
  | 'deactivated'
  | 'unknown';

export interface SessionUser {
  id: number;
  email: string;
  displayName: string;
  role: 'regional_lead' | 'practice_lead' | 'auditor';
  regionName: string;
  practices: { id: number; code: string; name: string }[];
}

export type SignedInAgent = TestAgent & {
  /** The session's CSRF token (already sent as X-CSRF-Token by this agent) */
  csrfToken: string;
  /** GET /api/session's user right after sign-in */
  user: SessionUser;
  /** The session cookie as a Cookie header value, for a client other than this agent */
  cookie: string;
};

const idps = new WeakMap<TestApp, Promise<FakeIdp>>();

/** The fake identity provider this test app trusts (same config, same signing key). */
export function fakeIdpFor(t: TestApp): Promise<FakeIdp> {
  let idp = idps.get(t);
  if (!idp) {
    idp = createFakeIdp(t.config, resolvePath(findRepoRoot(), t.config.devFakes.dataDir));
    idps.set(t, idp);
  }
  return idp;
}

export interface StartedSignIn {
  agent: TestAgent;
  /** The AuthnRequest id (what the answer's InResponseTo must be) */
  requestId: string;
  /** The IdP address Cairn redirected to (path and query, for the in-process IdP) */
  idpPath: string;
  samlRequest: string;
  relayState: string;
}

/** Step 1: asks Cairn to start a sign-in; returns the AuthnRequest it sent to the IdP. */
export async function startSignIn(
  t: TestApp,
  agent: TestAgent = request.agent(t.http),
  returnTo = '/',
): Promise<StartedSignIn> {
  const idp = await fakeIdpFor(t);
  const res = await agent.get('/api/auth/saml/login').query({ returnTo });
  if (res.status !== 302) {
    throw new Error(`GET /api/auth/saml/login answered ${res.status}: ${res.text}`);
  }
  const location = new URL(String(res.headers.location));
  if (`${location.origin}${location.pathname}` !== idp.ssoUrl) {
    throw new Error(`Cairn redirected to ${location.href}, not to the fake IdP at ${idp.ssoUrl}`);
  }
  const samlRequest = location.searchParams.get('SAMLRequest') ?? '';
  const relayState = location.searchParams.get('RelayState') ?? '';
  const { id } = await idp.parseLoginRequest({ SAMLRequest: samlRequest, RelayState: relayState });
  return {
    agent,
    requestId: id,
    idpPath: location.pathname + location.search,
    samlRequest,
    relayState,
  };
}

/** Step 3: posts a SAMLResponse to Cairn's ACS; returns Cairn's answer (a 303 redirect). */
export async function postToAcs(agent: TestAgent, samlResponse: string, relayState = '') {
  return agent
    .post('/api/auth/saml/acs')
    .type('form')
    .send(
      relayState
        ? { SAMLResponse: samlResponse, RelayState: relayState }
        : { SAMLResponse: samlResponse },
    )
    .redirects(0);
}

/** The refusal code in a redirect to /sign-in?refused=…, or null when the sign-in went through. */
export function refusalOf(res: {
  status: number;
  headers: Record<string, unknown>;
}): string | null {
  const location = String(res.headers.location ?? '');
  const match = /^\/sign-in\?refused=([a-z-]+)$/.exec(location);
  return match ? match[1]! : null;
}

function fieldValue(html: string, name: string): string {
  const match = new RegExp(`name="${name}" value="([^"]*)"`).exec(html);
  return match
    ? match[1]!
        .replace(/&quot;/g, '"')
        .replace(/&#39;/g, "'")
        .replace(/&lt;/g, '<')
        .replace(/&gt;/g, '>')
        .replace(/&amp;/g, '&')
    : '';
}

export interface SignInOptions {
  /** Where to return in the web app after sign-in (default /) */
  returnTo?: string;
  /** Overrides of what the identity provider says about the person (e.g. other practice codes) */
  persona?: Partial<Persona>;
}

/** Signs in through the fake IdP and Cairn's ACS; throws when Cairn refuses the sign-in. */
export async function signInAs(
  t: TestApp,
  who: PersonaKey | string,
  options: SignInOptions = {},
): Promise<SignedInAgent> {
  const idp = await fakeIdpFor(t);
  const started = await startSignIn(t, request.agent(t.http), options.returnTo ?? '/');
  const known = idp.findPersona(who);
  let samlResponse: string;
  let relayState = started.relayState;
  if (known && !options.persona) {
    const picker = await request(idp.app).get(started.idpPath).expect(200);
    if (!picker.text.includes(`value="${known.key}"`))
      throw new Error(`the picker does not offer ${known.key}`);
    const posted = await request(idp.app)
      .post('/idp/sso')
      .type('form')
      .send({
        SAMLRequest: started.samlRequest,
        RelayState: started.relayState,
        persona: known.key,
      })
      .expect(200);
    samlResponse = fieldValue(posted.text, 'SAMLResponse');
    relayState = fieldValue(posted.text, 'RelayState');
  } else {
    if (!known && !who.includes('@')) throw new Error(`no persona ${who} in config/personas.json`);
    const persona: Persona = {
      key: known?.key ?? 'test_person',
      email: known?.email ?? who,
      displayName: known?.displayName ?? who,
      role: known?.role ?? 'practice_lead',
      practices: known?.practices ?? [],
      note: 'test',
      ...options.persona,
    };
    samlResponse = (await idp.buildLoginResponse({ persona, inResponseTo: started.requestId }))
      .samlResponse;
  }
  const res = await postToAcs(started.agent, samlResponse, relayState);
  const refused = refusalOf(res);
  if (res.status !== 303 || refused) {
    throw new Error(`sign-in as ${who} was refused (${refused ?? `HTTP ${res.status}`})`);
  }
  const cookie = ((res.headers['set-cookie'] as string[] | undefined) ?? [])
    .map((c) => c.split(';')[0]!)
    .join('; ');
  const session = await started.agent.get('/api/session').expect(200);
  const body = session.body as { user: SessionUser | null; csrfToken: string | null };
  if (!body.user || !body.csrfToken)
    throw new Error(`after signing in as ${who}, /api/session has no user`);
  started.agent.set('X-CSRF-Token', body.csrfToken);
  return Object.assign(started.agent, { csrfToken: body.csrfToken, user: body.user, cookie });
}

/** Loads the invented demo organisation (seed-data/generate.ts) into the test's database. */
export async function seedDemoOrganisation(t: TestApp): Promise<DemoOrganisation> {
  // Imported by path: seed-data is a script folder outside the API's TypeScript project.
  const generator = join(findRepoRoot(), 'seed-data', 'generate.ts');
  const { generateOrganisation } = (await import(generator)) as {
    generateOrganisation: () => DemoOrganisation;
  };
  const org = generateOrganisation();
  const seeded = await seed(t.db, org);
  if (!seeded) throw new Error('the test database already holds a region');
  return org;
}

/** Ids of the demo organisation's rows, by code / e-mail. */
export async function demoIds(t: TestApp) {
  const { QueryTypes } = await import('sequelize');
  const practices = await t.db.query<{ id: number; code: string }>(
    'SELECT id, code FROM practices',
    {
      type: QueryTypes.SELECT,
    },
  );
  const users = await t.db.query<{ id: number; email: string }>('SELECT id, email FROM users', {
    type: QueryTypes.SELECT,
  });
  return {
    practice: (code: string) => {
      const row = practices.find((p) => p.code === code);
      if (!row) throw new Error(`no practice ${code}`);
      return Number(row.id);
    },
    user: (email: string) => {
      const row = users.find((u) => u.email === email);
      if (!row) throw new Error(`no user ${email}`);
      return Number(row.id);
    },
  };
}
