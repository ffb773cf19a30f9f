/**
 * Test profile and secrets for the cross-package suites: from the
 * environment (set by `npm test`) or from .data/secrets-test.json.
 */
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { repoRoot } from './paths.ts';

process.env.CAIRN_PROFILE = 'test';
const file = join(repoRoot, '.data', 'secrets-test.json');
if (!process.env.CAIRN_DATABASE_PASSWORD && existsSync(file)) {
  const secrets = JSON.parse(readFileSync(file, 'utf8')) as Record<string, string>;
  for (const [name, value] of Object.entries(secrets)) process.env[name] ??= value;
}
