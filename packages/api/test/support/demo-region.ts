/**
 * The demo region in a test's database: the invented organisation and its
 * eight quarters of extracts (seed-data/), loaded through the same upload →
 * check → confirm pipeline `npm start` uses. The extracts are generated into
 * seed-data/out/ when missing or older than the generator (as `npm start` and
 * `npm test` do).
 *
 *   const t = await createTestApp({ prepare: loadDemoRegion });
 */
import { existsSync, readdirSync, statSync } from 'node:fs';
import { join } from 'node:path';
import type { Sequelize } from 'sequelize';
import type { CairnConfig, CairnSecrets } from '../../src/config/config.schema.js';
import { findRepoRoot } from '../../src/config/load-config.js';
import { type DemoOrganisation, seedDemoOrganisation } from '../../src/organisations/demo-seed.js';
import { type DemoIngestResult, ingestDemoExtracts } from '../../src/submissions/demo-ingest.js';

interface Generator {
  generate(outDir: string): void;
  generateOrganisation(): DemoOrganisation;
}

/** seed-data/out, generated first when missing or stale. */
export async function demoDataDir(): Promise<{ dir: string; generator: Generator }> {
  const root = join(findRepoRoot(), 'seed-data');
  // Imported by path: seed-data is a script folder outside the API's TypeScript project.
  const generator = (await import(join(root, 'generate.ts'))) as Generator;
  const out = join(root, 'out');
  const stamp = join(out, 'organisation.json');
  const newest = Math.max(
    ...readdirSync(root)
      .filter((f) => f.endsWith('.ts'))
      .map((f) => statSync(join(root, f)).mtimeMs),
  );
  if (!existsSync(stamp) || statSync(stamp).mtimeMs < newest) generator.generate(out);
  return { dir: out, generator };
}

/** Loads the demo organisation and every demo extract into a migrated, empty database. */
export async function loadDemoRegion(
  config: CairnConfig,
  secrets: CairnSecrets,
  db: Sequelize,
): Promise<DemoIngestResult> {
  const { dir, generator } = await demoDataDir();
  await seedDemoOrganisation(db, generator.generateOrganisation());
  const loaded = await ingestDemoExtracts(dir, config, secrets);
  if (!loaded) throw new Error(`no demo extracts in ${dir}`);
  return loaded;
}
