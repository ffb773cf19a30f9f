/**
 * Loads and validates Cairn's configuration (see config.schema.ts for the
 * sources and their order). Used by the API at boot and by the start/test
 * scripts, so both read exactly the same values.
 */
import { existsSync, readFileSync } from 'node:fs';
import { dirname, isAbsolute, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { z } from 'zod';
import {
  type CairnConfig,
  type CairnSecrets,
  configSchema,
  secretNames,
  secretsSchema,
} from './config.schema.js';

export class ConfigError extends Error {
  constructor(readonly problems: string[]) {
    super(
      `Cairn's configuration is not valid:\n${problems.map((p) => `  - ${p}`).join('\n')}\n` +
        `Fix the ${problems.length === 1 ? 'value' : 'values'} named above (config/*.json or the environment variable) and start again.`,
    );
    this.name = 'ConfigError';
  }
}

type Json = null | boolean | number | string | Json[] | { [key: string]: Json };
type JsonObject = { [key: string]: Json };

/** The folder that holds config/default.json: CAIRN_ROOT, else found upward from this file. */
export function findRepoRoot(start = dirname(fileURLToPath(import.meta.url))): string {
  if (process.env.CAIRN_ROOT) return resolve(process.env.CAIRN_ROOT);
  let dir = start;
  for (;;) {
    if (existsSync(join(dir, 'config', 'default.json'))) return dir;
    const parent = dirname(dir);
    if (parent === dir) {
      throw new ConfigError([
        'config/default.json was not found above ' + start + '; set CAIRN_ROOT to the checkout',
      ]);
    }
    dir = parent;
  }
}

/** database.poolMax → CAIRN_DATABASE_POOL_MAX; devFakes.smtpPort → CAIRN_DEV_FAKES_SMTP_PORT. */
export function envNameFor(path: string[]): string {
  return (
    'CAIRN_' +
    path.map((part) => part.replace(/([a-z0-9])([A-Z])/g, '$1_$2').toUpperCase()).join('_')
  );
}

function isObject(value: unknown): value is JsonObject {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}

function readJson(file: string, problems: string[]): JsonObject {
  if (!existsSync(file)) return {};
  try {
    const parsed: unknown = JSON.parse(readFileSync(file, 'utf8'));
    if (!isObject(parsed)) {
      problems.push(`${file}: expected a JSON object at the top level`);
      return {};
    }
    return parsed;
  } catch (error) {
    problems.push(`${file}: not valid JSON (${(error as Error).message})`);
    return {};
  }
}

function merge(
  target: JsonObject,
  source: JsonObject,
  origin: string,
  origins: Map<string, string>,
  prefix: string[] = [],
): void {
  for (const [key, value] of Object.entries(source)) {
    if (key === '$comment') continue;
    const path = [...prefix, key];
    const existing = target[key];
    if (isObject(value) && isObject(existing)) {
      merge(existing, value, origin, origins, path);
    } else {
      target[key] = isObject(value) ? structuredClone(value) : value;
      origins.set(path.join('.'), origin);
    }
  }
}

/** Parses an environment string into the type the default has (number, boolean, string). */
function parseEnvValue(raw: string, like: Json): Json {
  if (typeof like === 'number') {
    const trimmed = raw.trim();
    return trimmed !== '' && Number.isFinite(Number(trimmed)) ? Number(trimmed) : raw;
  }
  if (typeof like === 'boolean') {
    if (/^(true|1|yes)$/i.test(raw.trim())) return true;
    if (/^(false|0|no)$/i.test(raw.trim())) return false;
    return raw;
  }
  return raw;
}

function applyEnv(
  target: JsonObject,
  env: NodeJS.ProcessEnv,
  origins: Map<string, string>,
  prefix: string[] = [],
): void {
  for (const [key, value] of Object.entries(target)) {
    const path = [...prefix, key];
    if (isObject(value)) {
      applyEnv(value, env, origins, path);
      continue;
    }
    const name = envNameFor(path);
    const raw = env[name];
    if (raw !== undefined) {
      target[key] = parseEnvValue(raw, value);
      origins.set(path.join('.'), `environment variable ${name}`);
    }
  }
}

function describeExpected(path: PropertyKey[]): string | undefined {
  let schema: z.ZodType | undefined = configSchema;
  for (const part of path) {
    const shape: Record<string, z.ZodType> | undefined = (
      schema as unknown as { shape?: Record<string, z.ZodType> }
    ).shape;
    schema = shape?.[String(part)];
    if (!schema) return undefined;
  }
  return schema.description;
}

export function profileFromEnv(env: NodeJS.ProcessEnv = process.env): CairnConfig['profile'] {
  const value = env.CAIRN_PROFILE ?? (env.NODE_ENV === 'production' ? 'production' : 'development');
  if (value !== 'development' && value !== 'test' && value !== 'production') {
    throw new ConfigError([
      `CAIRN_PROFILE = ${JSON.stringify(value)}: expected one of development, test, production`,
    ]);
  }
  return value;
}

/**
 * Test-only fault points (CAIRN_TEST_PAUSE_<STEP>_MS: pause inside a step so
 * that a test can kill the process there). They act only under the test
 * profile; anywhere else, and whenever NODE_ENV is production, setting one
 * is refused at start so that it can never slow or weaken a real deployment.
 */
export const FAULT_POINT_PATTERN = /^CAIRN_TEST_PAUSE_(PROCESSING|CONFIRM)_MS$/;

function faultPointProblems(env: NodeJS.ProcessEnv, profile: CairnConfig['profile']): string[] {
  const problems: string[] = [];
  for (const [name, raw] of Object.entries(env)) {
    if (!name.startsWith('CAIRN_TEST_PAUSE_') || raw === undefined) continue;
    if (env.NODE_ENV === 'production' || profile !== 'test') {
      problems.push(
        `${name} is a test-only fault point: it is refused unless the profile is test and NODE_ENV is not production (here profile ${profile}, NODE_ENV ${env.NODE_ENV ?? 'unset'}); remove it from the environment`,
      );
    } else if (!FAULT_POINT_PATTERN.test(name)) {
      problems.push(
        `${name} is not a known fault point: expected CAIRN_TEST_PAUSE_PROCESSING_MS or CAIRN_TEST_PAUSE_CONFIRM_MS`,
      );
    } else if (!/^\d{1,7}$/.test(raw.trim())) {
      problems.push(
        `${name} = ${JSON.stringify(raw)}: expected a whole number of milliseconds from 0 to 9999999`,
      );
    }
  }
  return problems;
}

export interface LoadOptions {
  root?: string;
  profile?: CairnConfig['profile'];
  env?: NodeJS.ProcessEnv;
}

export function loadConfig(options: LoadOptions = {}): CairnConfig {
  const env = options.env ?? process.env;
  const root = options.root ?? findRepoRoot();
  const profile = options.profile ?? profileFromEnv(env);
  const problems: string[] = [];
  const origins = new Map<string, string>();
  const merged: JsonObject = { profile };

  const files = [
    join(root, 'config', 'default.json'),
    join(root, 'config', `${profile}.json`),
    join(root, 'config', 'local.json'),
  ];
  for (const file of files) {
    const data = readJson(file, problems);
    for (const secret of secretNames) {
      if (JSON.stringify(data).includes(secret)) {
        problems.push(`${file}: ${secret} is a secret and is read only from the environment`);
      }
    }
    merge(merged, data, file.slice(root.length + 1), origins);
  }
  applyEnv(merged, env, origins);
  problems.push(...faultPointProblems(env, profile));
  if (problems.length > 0) throw new ConfigError(problems);

  const result = configSchema.safeParse(merged);
  if (!result.success) {
    throw new ConfigError(
      result.error.issues.map((issue) => {
        const key = issue.path.join('.');
        if (issue.code === 'unrecognized_keys') {
          const where = key ? `${key}.` : '';
          return `unknown key${issue.keys.length > 1 ? 's' : ''} ${issue.keys
            .map((k) => where + k)
            .join(', ')}: check the spelling against config/default.json`;
        }
        const origin = origins.get(key) ?? 'config/default.json';
        const value = key
          .split('.')
          .reduce<unknown>((v, k) => (isObject(v) ? v[k] : undefined), merged);
        const expected = describeExpected(issue.path) ?? issue.message;
        return `${key} = ${JSON.stringify(value)} (from ${origin}): expected ${expected}`;
      }),
    );
  }
  return result.data;
}

/**
 * Set by the npm scripts for the processes they start, once they have warned of unknown
 * CAIRN_* variables themselves (so that the API does not warn a second time).
 */
export const ENV_CHECKED = 'CAIRN_ENV_CHECKED';

/** CAIRN_* variables that are not settings: read by the scripts and the tests themselves. */
const OPERATIONAL_ENV = new Set([
  ENV_CHECKED,
  'CAIRN_ROOT',
  'CAIRN_CHROMIUM',
  'CAIRN_SEED_DEMO_EXTRACTS',
  'CAIRN_TEST_LOG_LEVEL',
]);
const OPERATIONAL_PREFIXES = ['CAIRN_TEST_PAUSE_'];

function settingNames(value: unknown, prefix: string[], into: Set<string>): Set<string> {
  if (isObject(value)) {
    for (const [key, child] of Object.entries(value)) settingNames(child, [...prefix, key], into);
  } else if (prefix.length > 0) {
    into.add(envNameFor(prefix));
  }
  return into;
}

function editDistance(a: string, b: string): number {
  let previous = Array.from({ length: b.length + 1 }, (_, j) => j);
  for (let i = 1; i <= a.length; i++) {
    const current = [i];
    for (let j = 1; j <= b.length; j++) {
      current[j] = Math.min(
        previous[j]! + 1,
        current[j - 1]! + 1,
        previous[j - 1]! + (a[i - 1] === b[j - 1] ? 0 : 1),
      );
    }
    previous = current;
  }
  return previous[b.length]!;
}

/**
 * CAIRN_* environment variables that Cairn does not read (a misspelt setting is otherwise
 * silently ignored), each with the nearest name Cairn knows when there is a close one.
 */
export function unknownEnvWarnings(
  config: CairnConfig,
  env: NodeJS.ProcessEnv = process.env,
): string[] {
  const known = settingNames(config, [], new Set<string>([...secretNames, ...OPERATIONAL_ENV]));
  const warnings: string[] = [];
  for (const name of Object.keys(env).sort()) {
    if (!name.startsWith('CAIRN_') || known.has(name)) continue;
    if (OPERATIONAL_PREFIXES.some((prefix) => name.startsWith(prefix))) continue;
    let nearest: string | null = null;
    let best = Infinity;
    for (const candidate of known) {
      const d = editDistance(name, candidate);
      if (d < best) {
        best = d;
        nearest = candidate;
      }
    }
    warnings.push(
      `${name} is set but is not a Cairn setting, so it has no effect` +
        (nearest !== null && best <= 3 ? `; did you mean ${nearest}?` : '.') +
        ' Every key of config/default.json has its variable (README, Configuration).',
    );
  }
  return warnings;
}

/** Reads and validates the secrets from the environment. */
export function loadSecrets(env: NodeJS.ProcessEnv = process.env): CairnSecrets {
  const result = secretsSchema.safeParse(env);
  if (!result.success) {
    throw new ConfigError(
      result.error.issues.map((issue) => {
        const name = String(issue.path[0]);
        const described = secretsSchema.shape[name as keyof CairnSecrets]?.description;
        return env[name] === undefined
          ? `${name} is not set: expected ${described}`
          : `${name} is set but not valid: expected ${described}`;
      }),
    );
  }
  return result.data;
}

/** Resolves a path from the configuration against the checkout. */
export function resolvePath(root: string, path: string): string {
  return isAbsolute(path) ? path : join(root, path);
}
