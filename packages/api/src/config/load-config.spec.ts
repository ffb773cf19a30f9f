import { mkdtempSync, mkdirSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import {
  ConfigError,
  envNameFor,
  loadConfig,
  loadSecrets,
  unknownEnvWarnings,
} from './load-config.js';
import { findRepoRoot } from './load-config.js';

const root = findRepoRoot();

function withLocal(local: unknown): string {
  const dir = mkdtempSync(join(tmpdir(), 'cairn-config-'));
  mkdirSync(join(dir, 'config'));
  for (const name of ['default.json', 'test.json']) {
    writeFileSync(join(dir, 'config', name), JSON.stringify(require(join(root, 'config', name))));
  }
  writeFileSync(
    join(dir, 'config', 'local.json'),
    typeof local === 'string' ? local : JSON.stringify(local),
  );
  return dir;
}

function problemsOf(fn: () => unknown): string[] {
  try {
    fn();
  } catch (error) {
    if (error instanceof ConfigError) return error.problems;
    throw error;
  }
  throw new Error('expected a ConfigError');
}

// jest's ESM mode has no require(); read JSON through fs instead.
import { readFileSync } from 'node:fs';
function require(file: string): unknown {
  return JSON.parse(readFileSync(file, 'utf8'));
}

describe('configuration', () => {
  it('loads the defaults with the profile overlay', () => {
    const config = loadConfig({ root, profile: 'test', env: {} });
    expect(config.profile).toBe('test');
    expect(config.database.port).toBe(3308);
    expect(config.server.host).toBe('127.0.0.1');
  });

  it('maps keys to CAIRN_* environment variables', () => {
    expect(envNameFor(['database', 'poolMax'])).toBe('CAIRN_DATABASE_POOL_MAX');
    expect(envNameFor(['devFakes', 'smtpPort'])).toBe('CAIRN_DEV_FAKES_SMTP_PORT');
    const config = loadConfig({
      root,
      profile: 'development',
      env: { CAIRN_SERVER_PORT: '4100', CAIRN_SESSION_SECURE_COOKIE: 'true' },
    });
    expect(config.server.port).toBe(4100);
    expect(config.session.secureCookie).toBe(true);
  });

  it('names the key, where the value came from and the expected form', () => {
    const problems = problemsOf(() =>
      loadConfig({ root, profile: 'development', env: { CAIRN_DATABASE_PORT: 'abc' } }),
    );
    expect(problems).toEqual([
      'database.port = "abc" (from environment variable CAIRN_DATABASE_PORT): expected a TCP port: a whole number from 1 to 65535',
    ]);
  });

  it('ends by asking to fix the value, or the values when there are several', () => {
    expect(new ConfigError(['one']).message).toMatch(/\nFix the value named above /);
    expect(new ConfigError(['one', 'two']).message).toMatch(/\nFix the values named above /);
  });

  it('refuses an out-of-range value from a file', () => {
    const dir = withLocal({ server: { port: 70000 } });
    const problems = problemsOf(() => loadConfig({ root: dir, profile: 'test', env: {} }));
    expect(problems[0]).toBe(
      'server.port = 70000 (from config/local.json): expected a TCP port: a whole number from 1 to 65535',
    );
  });

  it('refuses unknown keys (a misspelling) by name', () => {
    const dir = withLocal({ database: { pool_max: 4 } });
    expect(problemsOf(() => loadConfig({ root: dir, profile: 'test', env: {} }))[0]).toMatch(
      /unknown key database\.pool_max/,
    );
  });

  it('warns of a CAIRN_* variable that names no setting, with the nearest name', () => {
    const config = loadConfig({ root, profile: 'test', env: {} });
    expect(
      unknownEnvWarnings(config, {
        CAIRN_SERVER_PROT: '3001',
        CAIRN_WIBBLE: '1',
        CAIRN_SERVER_PORT: '3001',
        CAIRN_DATABASE_PASSWORD: 'x',
        CAIRN_PROFILE: 'test',
        CAIRN_TEST_PAUSE_CONFIRM_MS: '10',
        CAIRN_CHROMIUM: '/usr/bin/chromium',
        PATH: '/usr/bin',
      }),
    ).toEqual([
      'CAIRN_SERVER_PROT is set but is not a Cairn setting, so it has no effect; did you mean CAIRN_SERVER_PORT? Every key of config/default.json has its variable (README, Configuration).',
      'CAIRN_WIBBLE is set but is not a Cairn setting, so it has no effect. Every key of config/default.json has its variable (README, Configuration).',
    ]);
  });

  it('refuses secrets in configuration files', () => {
    const dir = withLocal({ CAIRN_SESSION_SECRET: 'x'.repeat(40) });
    expect(problemsOf(() => loadConfig({ root: dir, profile: 'test', env: {} }))[0]).toMatch(
      /CAIRN_SESSION_SECRET is a secret and is read only from the environment/,
    );
  });

  it('refuses a file that is not JSON', () => {
    const dir = withLocal('{ nope');
    expect(problemsOf(() => loadConfig({ root: dir, profile: 'test', env: {} }))[0]).toMatch(
      /local\.json: not valid JSON/,
    );
  });

  it('refuses the test-only fault points in production, by name', () => {
    for (const env of [
      { NODE_ENV: 'production', CAIRN_TEST_PAUSE_CONFIRM_MS: '5000' },
      { NODE_ENV: 'production', CAIRN_TEST_PAUSE_PROCESSING_MS: '0' },
    ]) {
      const problems = problemsOf(() => loadConfig({ root, profile: 'production', env }));
      expect(problems).toEqual([
        expect.stringMatching(
          /^CAIRN_TEST_PAUSE_(CONFIRM|PROCESSING)_MS is a test-only fault point: it is refused unless the profile is test and NODE_ENV is not production \(here profile production, NODE_ENV production\)/,
        ),
      ]);
    }
    // NODE_ENV=production wins even if the test profile is asked for.
    expect(
      problemsOf(() =>
        loadConfig({
          root,
          profile: 'test',
          env: { NODE_ENV: 'production', CAIRN_TEST_PAUSE_CONFIRM_MS: '10' },
        }),
      )[0],
    ).toMatch(/CAIRN_TEST_PAUSE_CONFIRM_MS is a test-only fault point/);
    expect(
      problemsOf(() =>
        loadConfig({ root, profile: 'development', env: { CAIRN_TEST_PAUSE_CONFIRM_MS: '10' } }),
      )[0],
    ).toMatch(/here profile development, NODE_ENV unset/);
  });

  it('accepts a fault point under the test profile, and refuses a bad one', () => {
    expect(
      loadConfig({
        root,
        profile: 'test',
        env: { NODE_ENV: 'test', CAIRN_TEST_PAUSE_CONFIRM_MS: '8000' },
      }).profile,
    ).toBe('test');
    expect(
      problemsOf(() =>
        loadConfig({ root, profile: 'test', env: { CAIRN_TEST_PAUSE_CONFIRM_MS: 'soon' } }),
      ),
    ).toEqual([
      'CAIRN_TEST_PAUSE_CONFIRM_MS = "soon": expected a whole number of milliseconds from 0 to 9999999',
    ]);
    expect(
      problemsOf(() =>
        loadConfig({ root, profile: 'test', env: { CAIRN_TEST_PAUSE_UPLOAD_MS: '10' } }),
      ),
    ).toEqual([
      'CAIRN_TEST_PAUSE_UPLOAD_MS is not a known fault point: expected CAIRN_TEST_PAUSE_PROCESSING_MS or CAIRN_TEST_PAUSE_CONFIRM_MS',
    ]);
  });

  it('requires every secret, and says what form it takes', () => {
    const problems = problemsOf(() => loadSecrets({ CAIRN_DATABASE_PASSWORD: 'short' }));
    expect(problems).toEqual([
      'CAIRN_DATABASE_PASSWORD is set but not valid: expected the application database user password, at least 12 characters',
      'CAIRN_SESSION_SECRET is not set: expected a random string of at least 32 characters that signs session cookies',
      'CAIRN_PSEUDONYM_SECRET is not set: expected a random string of at least 32 characters, the region key for record pseudonyms',
    ]);
  });
});
