/**
 * Writes the demo scenario into seed-data/out/ (git-ignored), deterministically:
 *   organisation.json  the invented region, localities, practices and users
 *
 * Run: npx tsx seed-data/generate.ts [outDir]
 */
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

export function generate(outDir: string): void {
  mkdirSync(outDir, { recursive: true });
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
