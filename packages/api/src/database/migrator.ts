/**
 * Schema migrations with umzug over Sequelize. Migrations are the schema's
 * only author (no sync() outside tests). Each migration file in
 * ./migrations exports `up` (and `down` where reversing is safe).
 *
 * Several API processes may start at once against one database: `migrate`
 * holds a MariaDB named lock for its whole run, so only one applies changes.
 */
import { dirname, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { QueryTypes, type Sequelize } from 'sequelize';
import { SequelizeStorage, Umzug } from 'umzug';

export interface MigrationContext {
  sequelize: Sequelize;
  /** Runs one DDL or DML statement */
  exec: (sql: string) => Promise<void>;
}

export type MigrationLogger = Pick<Console, 'info' | 'warn' | 'error' | 'debug'>;

export type Migration = (params: { context: MigrationContext }) => Promise<void>;

const here = dirname(fileURLToPath(import.meta.url));

export function createMigrator(
  sequelize: Sequelize,
  logger: MigrationLogger | undefined = undefined,
) {
  const context: MigrationContext = {
    sequelize,
    exec: async (sql) => {
      await sequelize.query(sql, { type: QueryTypes.RAW, raw: true });
    },
  };
  return new Umzug<MigrationContext>({
    migrations: {
      // Compiled .js in dist/, .ts under Jest; never the .d.ts or .map files.
      glob: [
        'migrations/[0-9][0-9][0-9][0-9]-*.{js,ts}',
        { cwd: here, ignore: ['**/*.d.ts', '**/*.map'] },
      ],
      resolve: ({ name, path }) => ({
        name: name.replace(/\.(js|ts)$/, ''),
        up: async (params) => {
          const module = (await import(
            pathToFileURL(path ?? join(here, 'migrations', name)).href
          )) as {
            up: Migration;
          };
          await module.up(params);
        },
        down: async (params) => {
          const module = (await import(
            pathToFileURL(path ?? join(here, 'migrations', name)).href
          )) as {
            down?: Migration;
          };
          if (!module.down) throw new Error(`migration ${name} cannot be reversed`);
          await module.down(params);
        },
      }),
    },
    context,
    storage: new SequelizeStorage({ sequelize, tableName: 'schema_migrations' }),
    logger,
  });
}

/** Applies every pending migration under a database-wide lock; returns their names. */
export async function migrateUp(sequelize: Sequelize, logger?: MigrationLogger): Promise<string[]> {
  const [lock] = await sequelize.query<{ got: number | null }>(
    "SELECT GET_LOCK('cairn.migrate', 120) AS got",
    { type: QueryTypes.SELECT },
  );
  if (lock?.got !== 1)
    throw new Error('Timed out waiting for another process to finish migrating the database');
  try {
    const applied = await createMigrator(sequelize, logger).up();
    return applied.map((m) => m.name);
  } finally {
    await sequelize.query("SELECT RELEASE_LOCK('cairn.migrate')", { type: QueryTypes.SELECT });
  }
}
