/** The production build (dist/) of the API on a fresh test database, for the benchmarks. */
import { dirname, join } from 'node:path';
import { QueryTypes, type Sequelize } from 'sequelize';
import { fileURLToPath } from 'node:url';
import type { CairnConfig } from '../src/config/config.schema.js';

const dist = join(dirname(fileURLToPath(import.meta.url)), '..', 'dist');

/** A module of the production build (dist/), typed loosely: the benchmark runs what the API runs. */
// eslint-disable-next-line @typescript-eslint/no-explicit-any
export const fromDist = (path: string): Promise<any> => import(join(dist, path));

/**
 * `configure` adjusts the test profile's configuration (the mail benchmark points mail at its sink).
 * `keep` names a database to keep between runs: created, migrated and seeded only when missing
 * (`fresh` says which), never dropped.
 */
export async function benchApp(
  configure: (config: CairnConfig) => CairnConfig = (config) => config,
  keep?: string,
) {
  const { loadConfig, loadSecrets } = await fromDist('config/load-config.js');
  const { connect, createDatabase, dropTestDatabase } = await fromDist('database/connect.js');
  const { migrateUp } = await fromDist('database/migrator.js');
  const { createApp } = await fromDist('app.factory.js');
  const { createRootLogger } = await fromDist('common/logger.js');
  const { seedDemoOrganisation } = await fromDist('organisations/demo-seed.js');
  // Imported by path: seed-data is a script folder outside the API's TypeScript project.
  const { generateOrganisation } = (await import(
    join(dist, '..', '..', '..', 'seed-data', 'generate.ts')
  )) as {
    generateOrganisation: () => unknown;
  };
  const base: CairnConfig = loadConfig({ profile: 'test' });
  const secrets = loadSecrets();
  const databaseName = keep ?? `cairn_test_bench_${Date.now().toString(36)}`;
  const config = configure({ ...base, database: { ...base.database, name: databaseName } });
  await createDatabase(config, secrets);
  const db: Sequelize = connect(config, secrets);
  const [found] = await db.query<{ tables: number }>(
    'SELECT COUNT(*) AS tables FROM information_schema.tables WHERE table_schema = DATABASE()',
    { type: QueryTypes.SELECT },
  );
  const fresh = Number(found?.tables ?? 0) === 0;
  if (fresh || !keep) {
    await migrateUp(db);
    await seedDemoOrganisation(db, generateOrganisation());
  }
  const app = await createApp({ config, secrets, logger: createRootLogger('silent') });
  await app.init();
  return {
    app,
    http: app.getHttpServer(),
    db,
    config,
    secrets,
    databaseName,
    fresh,
    get: async (path: string, name: string) => app.get((await fromDist(path))[name]),
    close: async () => {
      await app.close();
      await db.close();
      if (!keep) await dropTestDatabase(config, secrets);
    },
  };
}
