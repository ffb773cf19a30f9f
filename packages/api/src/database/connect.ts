/** A bare Sequelize connection (no Nest) for the CLI and test set-up. */
import { QueryTypes, Sequelize } from 'sequelize';
import type { CairnConfig, CairnSecrets } from '../config/config.schema.js';
import { sequelizeOptions } from './sequelize-options.js';

type Secrets = Pick<CairnSecrets, 'CAIRN_DATABASE_PASSWORD'>;

export function connect(config: CairnConfig, secrets: Secrets, database?: string): Sequelize {
  return new Sequelize(
    sequelizeOptions(
      config.database,
      secrets.CAIRN_DATABASE_PASSWORD,
      database ? { database } : {},
    ),
  );
}

/** A connection to the server with no default database (to create or drop one). */
function serverConnection(config: CairnConfig, secrets: Secrets): Sequelize {
  const options = sequelizeOptions(config.database, secrets.CAIRN_DATABASE_PASSWORD);
  delete options.database;
  return new Sequelize(options);
}

const identifier = /^[a-z][a-z0-9_]{0,63}$/;

export async function createDatabase(
  config: CairnConfig,
  secrets: Secrets,
  name = config.database.name,
): Promise<void> {
  if (!identifier.test(name)) throw new Error(`not a valid database name: ${name}`);
  const server = serverConnection(config, secrets);
  try {
    await server.query(
      `CREATE DATABASE IF NOT EXISTS \`${name}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`,
      { type: QueryTypes.RAW },
    );
  } finally {
    await server.close();
  }
}

/** Drops a per-run test database; refuses outside the test profile or for the shared test database itself. */
export async function dropTestDatabase(
  config: CairnConfig,
  secrets: Secrets,
  name = config.database.name,
): Promise<void> {
  if (config.profile !== 'test')
    throw new Error('drop-test-database runs only with CAIRN_PROFILE=test');
  if (!identifier.test(name) || !name.startsWith('cairn_test_')) {
    throw new Error(
      `refusing to drop ${name}: only per-run databases named cairn_test_* are dropped`,
    );
  }
  const server = serverConnection(config, secrets);
  try {
    await server.query(`DROP DATABASE IF EXISTS \`${name}\``, { type: QueryTypes.RAW });
  } finally {
    await server.close();
  }
}
