/**
 * Operator commands, run by `npm start` / `npm test` and usable by hand:
 *   node packages/api/dist/cli.js migrate [--create]   apply pending migrations (--create: create the database first)
 *   node packages/api/dist/cli.js seed-demo <folder>   load the demo scenario into an empty database
 *   node packages/api/dist/cli.js drop-test-database   drop the configured database (test profile only)
 */
import 'reflect-metadata';
import { join, resolve } from 'node:path';
import { loadConfig, loadSecrets } from './config/load-config.js';
import { connect, createDatabase, dropTestDatabase } from './database/connect.js';
import { migrateUp } from './database/migrator.js';
import { readDemoOrganisation, seedDemoOrganisation } from './organisations/demo-seed.js';

const quietLogger = { info: () => {}, debug: () => {}, warn: console.warn, error: console.error };

async function main(): Promise<void> {
  const [command, ...args] = process.argv.slice(2);
  const config = loadConfig();
  const secrets = loadSecrets();
  if (command === 'migrate' && args.includes('--create')) {
    await createDatabase(config, secrets);
  }
  if (command === 'drop-test-database') {
    await dropTestDatabase(config, secrets);
    return;
  }
  const sequelize = connect(config, secrets);
  try {
    switch (command) {
      case 'migrate': {
        const applied = await migrateUp(sequelize, quietLogger);
        console.log(
          applied.length
            ? `applied ${applied.length} migration(s): ${applied.join(', ')}`
            : 'schema is up to date',
        );
        break;
      }
      case 'seed-demo': {
        const dir = resolve(args[0] ?? 'seed-data/out');
        const org = readDemoOrganisation(join(dir, 'organisation.json'));
        const seeded = await seedDemoOrganisation(sequelize, org);
        console.log(
          seeded
            ? `seeded the demo organisation ${org.region.name}`
            : 'the database already holds a region; demo organisation not seeded',
        );
        break;
      }
      default:
        console.error('usage: cli.js migrate [--create] | seed-demo <folder> | drop-test-database');
        process.exitCode = 2;
    }
  } finally {
    await sequelize.close();
  }
}

main().catch((error: unknown) => {
  console.error((error as Error)?.name === 'ConfigError' ? (error as Error).message : error);
  process.exit(1);
});
