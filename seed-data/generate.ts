/**
 * Writes the demo scenario into seed-data/out/ (git-ignored), deterministically:
 *   organisation.json  the invented region, localities, practices and users
 *   extracts/          eight quarters of XLSX and CSV extracts and a manifest (extracts.ts)
 *
 * Run: npx tsx seed-data/generate.ts [outDir]
 */
import { spawnSync } from 'node:child_process';
import { mkdirSync, writeFileSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { localities, practices, region, users } from './demo-region.ts';

export function generateOrganisation() {
  return {
    region,
    localities,
    practices: practices.map(({ code, name, locality, listSize }) => ({
      code,
      name,
      locality,
      listSize,
    })),
    users,
  };
}

const here = dirname(fileURLToPath(import.meta.url));

export function generate(outDir: string): void {
  mkdirSync(outDir, { recursive: true });
  // The extracts are written by exceljs, which is asynchronous: run them as a child so that
  // generate() stays synchronous for its callers. organisation.json is written last, as the
  // stamp that says the output is complete.
  const extracts = spawnSync(
    process.execPath,
    ['--import', 'tsx', join(here, 'extracts.ts'), outDir],
    {
      cwd: dirname(here),
      stdio: ['ignore', 'inherit', 'inherit'],
    },
  );
  if (extracts.status !== 0)
    throw new Error(`writing the demo extracts failed (exit ${extracts.status})`);
  writeFileSync(
    join(outDir, 'organisation.json'),
    JSON.stringify(generateOrganisation(), null, 2) + '\n',
  );
}

const isMain = process.argv[1] && resolve(process.argv[1]) === fileURLToPath(import.meta.url);
if (isMain) {
  const out = resolve(process.argv[2] ?? join(dirname(fileURLToPath(import.meta.url)), 'out'));
  generate(out);
  console.log(`demo scenario written to ${out}`);
}
