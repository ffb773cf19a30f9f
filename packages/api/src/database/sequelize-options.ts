/** Sequelize options for Cairn's MariaDB, shared by the Nest module, the CLI and the tests. */
import type { SequelizeOptions } from 'sequelize-typescript';
import type { CairnConfig } from '../config/config.schema.js';

export function sequelizeOptions(
  database: CairnConfig['database'],
  password: string,
  overrides: { database?: string; logging?: (sql: string) => void } = {},
): SequelizeOptions {
  return {
    dialect: 'mariadb',
    host: database.host,
    port: database.port,
    database: overrides.database ?? database.name,
    username: database.user,
    password,
    logging: database.logQueries ? (overrides.logging ?? console.log) : false,
    benchmark: database.logQueries,
    // Timestamps are stored and read as UTC.
    timezone: '+00:00',
    pool: { max: database.poolMax, min: 0, acquire: 30_000, idle: 10_000 },
    dialectOptions: {
      connectTimeout: database.connectTimeoutMs,
      // BIGINT ids fit in a JS number for any table Cairn will have; DECIMALs are not used for
      // measurements (DOUBLE is), so numbers come back as numbers.
      bigIntAsNumber: true,
      decimalAsNumber: true,
      insertIdAsNumber: true,
      permitLocalInfile: true,
    },
    define: {
      underscored: true,
      timestamps: true,
      createdAt: 'created_at',
      updatedAt: 'updated_at',
      charset: 'utf8mb4',
      collate: 'utf8mb4_unicode_ci',
    },
  };
}
