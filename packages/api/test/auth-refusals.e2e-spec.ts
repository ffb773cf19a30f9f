/**
 * The negative suite: every kind of bad SAML response Cairn must refuse.
 * The app trusts the identity provider's roles (trustIdpRoles true), and the
 * answers are about a person Cairn does not know yet, so that a response
 * wrongly accepted would provision them: each case checks that nothing was
 * provisioned, no session was started, and the reason was logged.
 */
import { DOMParser, XMLSerializer } from '@xmldom/xmldom';
import { QueryTypes } from 'sequelize';
import type { CairnConfig } from '../src/config/config.schema.js';
import type { LoginResponseOptions } from '../src/dev/idp/fake-idp.js';
import { generateSigningIdentity } from '../src/dev/idp/identity.js';
import {
  fakeIdpFor,
  postToAcs,
  refusalOf,
  seedDemoOrganisation,
  startSignIn,
} from './support/auth.js';
import { createTestApp, type TestApp } from './support/test-app.js';

const ASSERTION = 'urn:oasis:names:tc:SAML:2.0:assertion';
const minutes = (n: number) => new Date(Date.now() + n * 60_000);

describe('refused sign-ins', () => {
  let t: TestApp;
  const stranger = {
    key: 'stranger',
    email: 'olwen.strand@kettleholm.example',
    displayName: 'Olwen Strand',
    role: 'regional_lead' as const,
    practices: [],
    note: 'test',
  };

  beforeAll(async () => {
    t = await createTestApp({
      configure: (c: CairnConfig) => ({ ...c, auth: { ...c.auth, trustIdpRoles: true } }),
    });
    await seedDemoOrganisation(t);
  });
  afterAll(async () => {
    await t?.close();
  });

  /** A fresh sign-in, answered by a response built (and possibly tampered with) by the test. */
  async function attempt(
    options: Partial<LoginResponseOptions> = {},
    tamper: (xml: string) => string = (xml) => xml,
  ) {
    const idp = await fakeIdpFor(t);
    const started = await startSignIn(t);
    const built = await idp.buildLoginResponse({
      persona: stranger,
      inResponseTo: started.requestId,
      ...options,
    });
    const xml = tamper(built.xml);
    const samlResponse =
      xml === built.xml ? built.samlResponse : Buffer.from(xml).toString('base64');
    const res = await postToAcs(started.agent, samlResponse);
    return { res, agent: started.agent, started, samlResponse };
  }

  async function expectRefused(result: Awaited<ReturnType<typeof attempt>>, reason: string) {
    expect(result.res.status).toBe(303);
    expect(refusalOf(result.res)).toBe(reason);
    const session = await result.agent.get('/api/session').expect(200);
    expect(session.body.user).toBeNull();
    const users = await t.db.query('SELECT id FROM users WHERE email = ?', {
      replacements: [stranger.email],
      type: QueryTypes.SELECT,
    });
    expect(users).toEqual([]);
    const [last] = await t.db.query<{ outcome: string; detail: unknown; summary: string }>(
      "SELECT outcome, detail, summary FROM audit_events WHERE action = 'auth.sign_in_refused' ORDER BY id DESC LIMIT 1",
      { type: QueryTypes.SELECT },
    );
    const detail = (typeof last!.detail === 'string' ? JSON.parse(last!.detail) : last!.detail) as {
      reason: string;
    };
    expect(last!.outcome).toBe('refused');
    expect(detail.reason).toBe(reason);
    expect(last!.summary).toMatch(/^Sign-in refused: /);
  }

  it('accepts the untampered response (the control case)', async () => {
    // A different person, so the stranger stays unprovisioned for the cases below.
    const { res } = await attempt({
      persona: { ...stranger, email: 'control.case@kettleholm.example' },
    });
    expect(refusalOf(res)).toBeNull();
    expect(res.headers.location).toBe('/');
  });

  it('1. refuses an unsigned response (only the assertion signed)', async () => {
    await expectRefused(await attempt({ signResponse: false }), 'response-unsigned');
  });

  it('2. refuses an unsigned assertion (only the response signed)', async () => {
    await expectRefused(await attempt({ signAssertion: false }), 'assertion-unsigned');
  });

  it('3a. refuses signature wrapping: a forged assertion beside the signed one', async () => {
    const result = await attempt({ signResponse: false }, (xml) => {
      const doc = new DOMParser().parseFromString(xml, 'text/xml');
      const signed = doc.getElementsByTagNameNS(ASSERTION, 'Assertion')[0]!;
      const forged = signed.cloneNode(true) as unknown as Element;
      forged.setAttribute('ID', '_forged');
      const signature = forged.getElementsByTagNameNS(
        'http://www.w3.org/2000/09/xmldsig#',
        'Signature',
      )[0];
      if (signature) forged.removeChild(signature);
      forged.getElementsByTagNameNS(ASSERTION, 'NameID')[0]!.textContent =
        'imogen.varley@ostrevale.example';
      signed.parentNode!.insertBefore(forged, signed);
      return new XMLSerializer().serializeToString(doc);
    });
    await expectRefused(result, 'multiple-assertions');
  });

  it('3b. refuses signature wrapping: the signed assertion hidden inside a forged one', async () => {
    const result = await attempt({}, (xml) => {
      const doc = new DOMParser().parseFromString(xml, 'text/xml');
      const signed = doc.getElementsByTagNameNS(ASSERTION, 'Assertion')[0]!;
      const forged = signed.cloneNode(true) as unknown as Element;
      forged.setAttribute('ID', '_forged');
      const signature = forged.getElementsByTagNameNS(
        'http://www.w3.org/2000/09/xmldsig#',
        'Signature',
      )[0];
      if (signature) forged.removeChild(signature);
      const advice = doc.createElementNS(ASSERTION, 'saml:Advice');
      signed.parentNode!.replaceChild(forged as never, signed);
      advice.appendChild(signed);
      forged.appendChild(advice);
      return new XMLSerializer().serializeToString(doc);
    });
    await expectRefused(result, 'signature-invalid');
  });

  it('4. refuses an attribute altered after signing', async () => {
    await expectRefused(
      await attempt({}, (xml) => xml.replace('Olwen Strand', 'Imogen Varley')),
      'signature-invalid',
    );
  });

  it('5. refuses a wrong audience', async () => {
    await expectRefused(await attempt({ audience: 'urn:some-other-service' }), 'audience');
  });

  it('6. refuses a wrong destination', async () => {
    await expectRefused(
      await attempt({ destination: 'https://other-service.example/saml/acs' }),
      'destination',
    );
  });

  it('7. refuses an expired assertion (NotOnOrAfter in the past)', async () => {
    await expectRefused(
      await attempt({
        issueInstant: minutes(-20),
        notBefore: minutes(-20),
        notOnOrAfter: minutes(-10),
      }),
      'expired',
    );
  });

  it('8. refuses an assertion that is not valid yet (NotBefore in the future)', async () => {
    await expectRefused(await attempt({ notBefore: minutes(10) }), 'not-yet-valid');
  });

  it('9. refuses a replayed response', async () => {
    const idp = await fakeIdpFor(t);
    const started = await startSignIn(t);
    const built = await idp.buildLoginResponse({
      persona: idp.findPersona('auditor')!,
      inResponseTo: started.requestId,
    });
    expect(refusalOf(await postToAcs(started.agent, built.samlResponse))).toBeNull();
    const other = (await startSignIn(t)).agent;
    const replay = await postToAcs(other, built.samlResponse);
    expect(refusalOf(replay)).toBe('replayed');
    expect((await other.get('/api/session')).body.user).toBeNull();
  });

  it('9b. lets only one of two copies posted at the same moment through', async () => {
    const idp = await fakeIdpFor(t);
    const started = await startSignIn(t);
    const built = await idp.buildLoginResponse({
      persona: idp.findPersona('auditor')!,
      inResponseTo: started.requestId,
    });
    const [a, b] = await Promise.all([
      postToAcs((await startSignIn(t)).agent, built.samlResponse),
      postToAcs((await startSignIn(t)).agent, built.samlResponse),
    ]);
    expect([refusalOf(a), refusalOf(b)].filter((r) => r === null)).toHaveLength(1);
  });

  it('10. refuses an unknown InResponseTo', async () => {
    await expectRefused(
      await attempt({ inResponseTo: '_never-issued-by-cairn' }),
      'unknown-request',
    );
  });

  it('10b. refuses an unsolicited response (no InResponseTo)', async () => {
    await expectRefused(await attempt({ inResponseTo: null }), 'unsolicited');
  });

  it('10c. refuses an answer to a request older than auth.requestTtlMinutes', async () => {
    const idp = await fakeIdpFor(t);
    const started = await startSignIn(t);
    await t.db.query(
      'UPDATE saml_requests SET created_at = NOW(3) - INTERVAL 1 HOUR WHERE id = ?',
      {
        replacements: [started.requestId],
        type: QueryTypes.UPDATE,
      },
    );
    const built = await idp.buildLoginResponse({
      persona: stranger,
      inResponseTo: started.requestId,
    });
    await expectRefused(
      {
        res: await postToAcs(started.agent, built.samlResponse),
        agent: started.agent,
        started,
        samlResponse: '',
      },
      'request-expired',
    );
  });

  it('11. refuses a wrong issuer (right key, another entity)', async () => {
    await expectRefused(
      await attempt({ issuer: 'https://idp.elsewhere.example/metadata' }),
      'issuer',
    );
  });

  it('12. refuses a response signed with another key', async () => {
    const other = await generateSigningIdentity('Not the trusted identity provider');
    await expectRefused(await attempt({ signingIdentity: other }), 'signature-invalid');
  });

  it('refuses a wrong subject confirmation recipient', async () => {
    await expectRefused(
      await attempt({ recipient: 'https://other-service.example/acs' }),
      'recipient',
    );
  });

  it('refuses a post without a response, and one that is not SAML', async () => {
    const started = await startSignIn(t);
    const empty = await started.agent.post('/api/auth/saml/acs').type('form').send({}).redirects(0);
    expect(refusalOf(empty)).toBe('no-response');
    const junk = await postToAcs(started.agent, Buffer.from('not xml at all <').toString('base64'));
    expect(refusalOf(junk)).toBe('not-saml');
  });
});
