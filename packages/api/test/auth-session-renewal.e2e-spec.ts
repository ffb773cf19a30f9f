/**
 * The session's renewal rule (session-store.ts): a request less than
 * RENEW_MS after the last renewal writes nothing; one past it writes the new
 * expiry (and, when lastSeenAt moves, the session and a fresh cookie); a row
 * past its expiry is refused and deleted, whatever its cookie says.
 */
import { QueryTypes } from 'sequelize';
import request from 'supertest';
import { RENEW_MS } from '../src/auth/session-store.js';
import {
  fakeIdpFor,
  postToAcs,
  refusalOf,
  seedDemoOrganisation,
  startSignIn,
} from './support/auth.js';
import { createTestApp, type TestApp } from './support/test-app.js';

interface Row {
  data: string;
  expires_ms: number;
  updated_ms: number;
}

describe('session renewal', () => {
  let t: TestApp;

  beforeAll(async () => {
    t = await createTestApp();
    await seedDemoOrganisation(t);
  });
  afterAll(async () => {
    await t?.close();
  });

  async function signIn(persona: string) {
    const idp = await fakeIdpFor(t);
    const agent = request.agent(t.http);
    const started = await startSignIn(t, agent);
    const built = await idp.buildLoginResponse({
      persona: idp.findPersona(persona)!,
      inResponseTo: started.requestId,
    });
    const res = await postToAcs(agent, built.samlResponse);
    expect(refusalOf(res)).toBeNull();
    const header = (res.headers['set-cookie'] as unknown as string[]).find((c) =>
      c.startsWith('cairn.sid='),
    )!;
    const pair = header.split(';')[0]!;
    const sid = decodeURIComponent(pair.split('=')[1]!).slice(2).split('.')[0]!;
    return { pair, sid };
  }

  async function row(sid: string): Promise<Row | undefined> {
    const [found] = await t.db.query<Row>(
      `SELECT data, ROUND(UNIX_TIMESTAMP(expires) * 1000) AS expires_ms,
              ROUND(UNIX_TIMESTAMP(updated_at) * 1000) AS updated_ms
         FROM sessions WHERE sid = ?`,
      { replacements: [sid], type: QueryTypes.SELECT },
    );
    return (
      found && {
        ...found,
        expires_ms: Number(found.expires_ms),
        updated_ms: Number(found.updated_ms),
      }
    );
  }

  /** Moves the row's expiry, and optionally its lastSeenAt, back by `ms`. */
  async function age(sid: string, ms: number, lastSeen: boolean): Promise<void> {
    await t.db.query(
      `UPDATE sessions SET expires = expires - INTERVAL ? MICROSECOND${
        lastSeen
          ? ", data = JSON_SET(data, '$.auth.lastSeenAt', JSON_VALUE(data, '$.auth.lastSeenAt') - ?)"
          : ''
      } WHERE sid = ?`,
      { replacements: lastSeen ? [ms * 1000, ms, sid] : [ms * 1000, sid], type: QueryTypes.UPDATE },
    );
  }

  const idleMs = () => t.config.session.idleTimeoutMinutes * 60_000;

  it('writes nothing for a request within a minute of the last renewal', async () => {
    const { pair, sid } = await signIn('auditor');
    const before = (await row(sid))!;
    await new Promise((resolve) => setTimeout(resolve, 20));
    for (let i = 0; i < 3; i++) {
      const res = await request(t.http).get('/api/me').set('Cookie', pair).expect(200);
      // Not renewed, so no cookie is sent again.
      expect(res.headers['set-cookie']).toBeUndefined();
    }
    expect(await row(sid)).toEqual(before);
  });

  it('renews the expiry, without rewriting the session, once it would move by a minute', async () => {
    const { pair, sid } = await signIn('auditor');
    await age(sid, RENEW_MS + 5_000, false);
    const aged = (await row(sid))!;
    const sent = Date.now();
    await request(t.http).get('/api/me').set('Cookie', pair).expect(200);
    const after = (await row(sid))!;
    expect(after.expires_ms).toBeGreaterThanOrEqual(sent + idleMs() - 1_000);
    expect(after.expires_ms).toBeLessThanOrEqual(Date.now() + idleMs() + 1_000);
    expect(after.data).toBe(aged.data);
  });

  it('saves the session with a new lastSeenAt and sends the cookie again after a minute of use', async () => {
    const { pair, sid } = await signIn('regional_lead');
    await age(sid, RENEW_MS + 5_000, true);
    const aged = JSON.parse((await row(sid))!.data) as { auth: { lastSeenAt: number } };
    const sent = Date.now();
    const res = await request(t.http).get('/api/me').set('Cookie', pair).expect(200);
    const cookie = (res.headers['set-cookie'] as unknown as string[]).find((c) =>
      c.startsWith('cairn.sid='),
    )!;
    expect(cookie.split(';')[0]).toBe(pair);
    const expires = Date.parse(/Expires=([^;]+)/i.exec(cookie)![1]!);
    expect(Math.abs(expires - sent - idleMs())).toBeLessThan(10_000);
    const after = (await row(sid))!;
    const seen = (JSON.parse(after.data) as { auth: { lastSeenAt: number } }).auth.lastSeenAt;
    expect(seen).toBeGreaterThan(aged.auth.lastSeenAt + RENEW_MS);
    expect(seen).toBeGreaterThanOrEqual(sent);
    expect(after.expires_ms).toBeGreaterThanOrEqual(sent + idleMs() - 1_000);
  });

  it('refuses and deletes a session whose row has expired, however fresh its data', async () => {
    const { pair, sid } = await signIn('practice_lead_one');
    await t.db.query('UPDATE sessions SET expires = NOW(3) - INTERVAL 1 SECOND WHERE sid = ?', {
      replacements: [sid],
      type: QueryTypes.UPDATE,
    });
    const res = await request(t.http).get('/api/me').set('Cookie', pair).expect(401);
    expect(res.body.type).toBe('/api/problems/sign-in-required');
    expect(await row(sid)).toBeUndefined();
  });

  it('does not bring back a session destroyed while a request of it was in flight', async () => {
    const { pair, sid } = await signIn('practice_lead_two');
    // lastSeenAt due: this request saves the session. Deleted (as a sign-out elsewhere would)
    // while the request is being answered.
    await age(sid, RENEW_MS + 5_000, true);
    const store = t.app.get(
      (await import('../src/auth/session-store.js')).SessionStoreProvider,
    ).store;
    const original = store.get.bind(store);
    store.get = (id, callback) =>
      original(id, (error, data) => {
        void t.db
          .query('DELETE FROM sessions WHERE sid = ?', {
            replacements: [sid],
            type: QueryTypes.DELETE,
          })
          .then(() => callback(error, data));
      });
    try {
      await request(t.http).get('/api/me').set('Cookie', pair).expect(200);
    } finally {
      store.get = original;
    }
    expect(await row(sid)).toBeUndefined();
    await request(t.http).get('/api/me').set('Cookie', pair).expect(401);
  });
});
