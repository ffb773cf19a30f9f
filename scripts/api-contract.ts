/**
 * `npm run api:contract`: rewrites the web's API contract from the API's
 * controllers and DTO classes — packages/web/src/lib/api/openapi.json (the
 * OpenAPI document /api/docs serves) and schema.ts (its types, by
 * openapi-typescript). No database, no server: the document comes from a
 * preview-mode application. The API is built first when its build is stale
 * (tsc emits the decorator metadata the document is read from).
 */
import { join } from 'node:path';
import { buildIfStale, buildTargets } from './lib/build.ts';
import { fail, log, runMain } from './lib/log.ts';
import { runSync } from './lib/proc.ts';

runMain(async () => {
  const root = join(import.meta.dirname, '..');
  buildIfStale(root, buildTargets[0]!);
  buildIfStale(root, buildTargets[1]!);
  const result = runSync(
    process.execPath,
    [join(root, 'packages', 'api', 'dist', 'contract', 'write-contract.js')],
    { cwd: root, stdio: ['ignore', 'pipe', 'pipe'] },
  );
  if (result.status !== 0) fail(`writing the contract failed:\n${result.stdout}${result.stderr}`);
  process.stdout.write(result.stdout);
  log.ok('contract written; commit packages/web/src/lib/api/openapi.json and schema.ts');
});
