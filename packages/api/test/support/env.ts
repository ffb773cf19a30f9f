/**
 * Runs before every test file: the test profile, and the test secrets from
 * the environment (set by `npm test`) or from .data/secrets-test.json (left
 * by `npm run db:start -- --profile test`) when a suite is run on its own.
 */
import 'reflect-metadata';
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { findRepoRoot } from '../../src/config/load-config.js';

process.env.CAIRN_PROFILE = 'test';
process.env.NODE_ENV = 'test';
const file = join(findRepoRoot(), '.data', 'secrets-test.json');
if (!process.env.CAIRN_DATABASE_PASSWORD && existsSync(file)) {
  const secrets = JSON.parse(readFileSync(file, 'utf8')) as Record<string, string>;
  for (const [name, value] of Object.entries(secrets)) process.env[name] ??= value;
}
