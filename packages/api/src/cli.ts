/**
 * Operator commands, run by `npm start` / `npm test` and usable by hand:
 *   node packages/api/dist/cli.js migrate [--create]   apply pending migrations (--create: create the database first)
 *   node packages/api/dist/cli.js seed-demo <folder>   load the demo scenario into an empty database: the
 *                                                      organisation, then every demo extract through the
 *                                                      upload → check → confirm pipeline
 *                                                      (CAIRN_SEED_DEMO_EXTRACTS=none: organisation only)
 *   node packages/api/dist/cli.js drop-test-database   drop the configured database (test profile only)
 *   node packages/api/dist/cli.js add-region --code NORTH --name "North Vale"
 *   node packages/api/dist/cli.js add-user --region NORTH --email lead@example.org --name "A Lead" \
 *        --role regional_lead|auditor|practice_lead [--practices P1,P2]
 *                                                      a new deployment's first region and first users
 *   node packages/api/dist/cli.js recompute --region NORTH [--quarter "2026 Q3"]
 *                                                      every current submission's sums and the benchmark
 *                                                      of each quarter (or the one named) computed again
 *                                                      from the records and stored
 */
import 'reflect-metadata';
import { join, resolve } from 'node:path';
import { loadConfig, loadSecrets } from './config/load-config.js';
import { connect, createDatabase, dropTestDatabase } from './database/connect.js';
import { migrateUp } from './database/migrator.js';
import { readDemoOrganisation, seedDemoOrganisation } from './organisations/demo-seed.js';
import { ingestDemoExtracts } from './submissions/demo-ingest.js';
import { recomputeResults } from './benchmarks/recompute-command.js';
import { addRegion, addUser, flags, OperatorError } from './users/operator-commands.js';

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
        if (seeded && process.env.CAIRN_SEED_DEMO_EXTRACTS !== 'none') {
          const loaded = await ingestDemoExtracts(dir, config, secrets, (line) =>
            console.log(line),
          );
          if (loaded) {
            console.log(
              `loaded ${loaded.extracts} demo extracts for ${loaded.quarters} audit quarters through the upload pipeline: ` +
                `${loaded.records} records accepted, ${loaded.refusedRows} rows refused by validation (${loaded.seconds.toFixed(1)} s)`,
            );
          }
        }
        break;
      }
      case 'add-region': {
        const f = flags(args);
        const id = await addRegion(sequelize, f.code ?? '', f.name ?? '');
        console.log(`region ${f.code} created (id ${id})`);
        break;
      }
      case 'add-user': {
        const f = flags(args);
        const id = await addUser(sequelize, {
          region: f.region ?? '',
          email: f.email ?? '',
          name: f.name ?? '',
          role: f.role ?? '',
          practices: (f.practices ?? '')
            .split(',')
            .map((c) => c.trim())
            .filter(Boolean),
        });
        console.log(`${f.email} added as ${f.role} (user id ${id}); they can now sign in`);
        break;
      }
      case 'recompute': {
        const f = flags(args);
        if (!f.region) throw new OperatorError('recompute needs --region CODE');
        const done = await recomputeResults(config, secrets, {
          region: f.region,
          quarter: f.quarter,
        });
        for (const q of done) {
          console.log(
            q.submissions === 0
              ? `${q.quarter}: no accepted submissions, nothing to compute`
              : `${q.quarter}: ${q.submissions} submissions recomputed from their records under ${q.measureSetId} in ${q.seconds.toFixed(2)} s; stored result ${q.resultId} ${q.sameAsStored ? 'agrees byte for byte' : 'DIFFERS from the recompute'}`,
          );
          if (!q.sameAsStored) process.exitCode = 1;
        }
        break;
      }
      default:
        console.error(
          'usage: cli.js migrate [--create] | seed-demo <folder> | drop-test-database | add-region --code C --name N | ' +
            'add-user --region C --email E --name N --role R [--practices P1,P2] | recompute --region C [--quarter "YYYY Qn"]',
        );
        process.exitCode = 2;
    }
  } finally {
    await sequelize.close();
  }
}

main().catch((error: unknown) => {
  const plain = (error as Error)?.name === 'ConfigError' || error instanceof OperatorError;
  console.error(plain ? (error as Error).message : error);
  process.exit(1);
});
