/**
 * What every orchestration script needs: the checkout's root, the validated
 * configuration for a profile, the secrets (generated for local use into
 * .data/, git-ignored), and the private MariaDB's paths.
 */
import { randomBytes } from 'node:crypto';
import { chmodSync, existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import {
  type CairnConfig,
  type CairnSecrets,
  requiredSecretNames,
  secretNames,
} from '../../packages/api/src/config/config.schema.ts';
import {
  ENV_CHECKED,
  loadConfig,
  resolvePath,
  unknownEnvWarnings,
} from '../../packages/api/src/config/load-config.ts';
import { log } from './log.ts';
import type { MariadbPaths } from './mariadb.ts';

export const root = join(dirname(fileURLToPath(import.meta.url)), '..', '..');

export interface Context {
  root: string;
  config: CairnConfig;
  secrets: CairnSecrets;
  mariadb: MariadbPaths;
  /** Environment for the API and the other child processes. */
  childEnv: NodeJS.ProcessEnv;
}

/**
 * Secrets for local use. Values already in the environment win; the rest are
 * generated once into .data/secrets-<profile>.json (mode 0600).
 */
function localSecrets(profile: CairnConfig['profile']): CairnSecrets {
  const file = join(root, '.data', `secrets-${profile}.json`);
  const stored: Partial<CairnSecrets> = existsSync(file)
    ? JSON.parse(readFileSync(file, 'utf8'))
    : {};
  let changed = false;
  for (const name of requiredSecretNames) {
    if (!stored[name]) {
      stored[name] = randomBytes(24).toString('base64url');
      changed = true;
    }
  }
  if (changed) {
    mkdirSync(dirname(file), { recursive: true });
    writeFileSync(file, JSON.stringify(stored, null, 2) + '\n', { mode: 0o600 });
    chmodSync(file, 0o600);
  }
  const secrets = { ...stored } as CairnSecrets;
  for (const name of secretNames) {
    const fromEnv = process.env[name];
    if (fromEnv) secrets[name] = fromEnv;
  }
  return secrets;
}

export function loadContext(profile: CairnConfig['profile']): Context {
  const config = loadConfig({ root, profile });
  for (const warning of unknownEnvWarnings(config)) log.warn(warning);
  const secrets = profile === 'production' ? ({} as CairnSecrets) : localSecrets(profile);
  const dataDir = resolvePath(root, config.mariadb.dataDir);
  const mariadb: MariadbPaths = {
    root,
    dataDir,
    socket: config.mariadb.socket
      ? resolvePath(root, config.mariadb.socket)
      : join(dataDir, 'mariadb.sock'),
    pidFile: join(dataDir, 'mariadb.pid'),
    logFile: join(dataDir, 'mariadb.err'),
    port: config.database.port,
    configHint: 'mariadb',
  };
  const childEnv: NodeJS.ProcessEnv = {
    ...process.env,
    ...secrets,
    CAIRN_ROOT: root,
    CAIRN_PROFILE: profile,
    // Unknown CAIRN_* variables were reported above; the API need not say so again.
    [ENV_CHECKED]: '1',
    NODE_ENV: profile === 'production' ? 'production' : profile === 'test' ? 'test' : 'development',
  };
  return { root, config, secrets, mariadb, childEnv };
}
