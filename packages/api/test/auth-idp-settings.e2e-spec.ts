/**
 * Pointing Cairn at an identity provider other than the built-in fake: by
 * metadata URL, by metadata file, or by settings (entity ID, URLs,
 * certificate file). The fake IdP stands in for a real one here, served
 * over HTTP like any IdP. Also: a clear refusal to start on settings that
 * cannot work, and a clear page when the IdP cannot be reached.
 */
import type { Server } from 'node:http';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import request from 'supertest';
import { createApp } from '../src/app.factory.js';
import { createRootLogger } from '../src/common/logger.js';
import type { CairnConfig } from '../src/config/config.schema.js';
import { findRepoRoot, resolvePath } from '../src/config/load-config.js';
import { createFakeIdp, type FakeIdp } from '../src/dev/idp/fake-idp.js';
import { refusalOf, seedDemoOrganisation, signInAs } from './support/auth.js';
import { freePort } from './support/ports.js';
import { createTestApp, testConfig, type TestApp } from './support/test-app.js';

type IdpSettings = CairnConfig['auth']['idp'];

describe('identity provider settings', () => {
  let port: number;
  let idp: FakeIdp;
  let server: Server;
  const dir = mkdtempSync(join(tmpdir(), 'cairn-idp-'));

  const withIdp = (idpSettings: Partial<IdpSettings>) => (c: CairnConfig) => ({
    ...c,
    devFakes: { ...c.devFakes, port },
    auth: { ...c.auth, idp: { ...c.auth.idp, ...idpSettings } },
  });

  beforeAll(async () => {
    port = await freePort();
    const base = testConfig().config;
    const config = { ...base, devFakes: { ...base.devFakes, port } };
    idp = await createFakeIdp(config, resolvePath(findRepoRoot(), config.devFakes.dataDir));
    server = await new Promise<Server>((resolve) => {
      const s = idp.app.listen(port, '127.0.0.1', () => resolve(s));
    });
    writeFileSync(join(dir, 'idp-metadata.xml'), idp.metadataXml);
    writeFileSync(join(dir, 'idp-signing.pem'), idp.identity.cert);
  });
  afterAll(async () => {
    await new Promise<void>((resolve) => server?.close(() => resolve()));
  });

  const cases: [string, Partial<IdpSettings>][] = [
    ['a metadata URL', { source: 'metadata-url', metadataUrl: '' }],
    ['a metadata file', { source: 'metadata-file', metadataFile: '' }],
    ['settings and a certificate file', { source: 'settings' }],
  ];

  it.each(cases)('signs in with the IdP described by %s', async (_name, partial) => {
    const settings: Partial<IdpSettings> =
      partial.source === 'metadata-url'
        ? { ...partial, metadataUrl: `http://127.0.0.1:${port}/idp/metadata` }
        : partial.source === 'metadata-file'
          ? { ...partial, metadataFile: join(dir, 'idp-metadata.xml') }
          : {
              ...partial,
              entityId: idp.entityId,
              ssoUrl: idp.ssoUrl,
              sloUrl: idp.sloUrl,
              certFile: join(dir, 'idp-signing.pem'),
            };
    const t: TestApp = await createTestApp({ configure: withIdp(settings) });
    try {
      await seedDemoOrganisation(t);
      const agent = await signInAs(t, 'practice_lead_two');
      expect(agent.user.practices.map((p) => p.code)).toEqual(['OV101', 'OV103']);
      const session = await agent.get('/api/session').expect(200);
      expect(session.body.localSignIn).toBe(false);
    } finally {
      await t.close();
    }
  });

  it('sends the browser to a clear page when the IdP metadata cannot be read', async () => {
    const unused = await freePort();
    const t = await createTestApp({
      configure: withIdp({
        source: 'metadata-url',
        metadataUrl: `http://127.0.0.1:${unused}/metadata`,
      }),
    });
    try {
      const res = await request(t.http).get('/api/auth/saml/login').redirects(0);
      expect(res.status).toBe(303);
      expect(refusalOf(res)).toBe('idp-unavailable');
    } finally {
      await t.close();
    }
  });

  it('refuses to start on settings that can never work, naming the key to set', async () => {
    const { config, secrets } = testConfig();
    const start = (c: CairnConfig) =>
      createApp({ config: c, secrets, logger: createRootLogger('silent') });
    await expect(start({ ...config, profile: 'production' })).rejects.toThrow(
      /never serves production.*auth\.idp\.source/,
    );
    await expect(
      start({
        ...config,
        auth: {
          ...config.auth,
          idp: { ...config.auth.idp, source: 'metadata-url', metadataUrl: null },
        },
      }),
    ).rejects.toThrow(/CAIRN_AUTH_IDP_METADATA_URL/);
    await expect(
      start({
        ...config,
        auth: { ...config.auth, idp: { ...config.auth.idp, source: 'settings' } },
      }),
    ).rejects.toThrow(/auth\.idp\.entityId, auth\.idp\.ssoUrl and auth\.idp\.certFile/);
  });
});
