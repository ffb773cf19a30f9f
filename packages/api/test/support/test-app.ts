/**
 * A Cairn API for one test file: a fresh database (cairn_test_<random>),
 * migrated by the real migrations, and the real app (createApp: middleware,
 * pipes, filter, guards). `close()` drops the database.
 */
import { randomBytes } from 'node:crypto';
import type { DynamicModule, Type } from '@nestjs/common';
import type { NestExpressApplication } from '@nestjs/platform-express';
import type { Sequelize } from 'sequelize';
import { createApp } from '../../src/app.factory.js';
import { createRootLogger } from '../../src/common/logger.js';
import type { CairnConfig, CairnSecrets } from '../../src/config/config.schema.js';
import { loadConfig, loadSecrets } from '../../src/config/load-config.js';
import { connect, createDatabase, dropTestDatabase } from '../../src/database/connect.js';
import { migrateUp } from '../../src/database/migrator.js';

export interface TestApp {
  app: NestExpressApplication;
  /** The HTTP server, for supertest: request(t.http) */
  http: ReturnType<NestExpressApplication['getHttpServer']>;
  /** A separate connection to the same database, for arranging and inspecting data */
  db: Sequelize;
  config: CairnConfig;
  secrets: CairnSecrets;
  databaseName: string;
  close(): Promise<void>;
}

export interface TestAppOptions {
  /** Adjust the loaded test configuration */
  configure?: (config: CairnConfig) => CairnConfig;
  /** Extra modules to mount (test-only controllers) */
  modules?: (Type<unknown> | DynamicModule)[];
  /** Do not listen (supertest binds an ephemeral port itself) */
  listen?: boolean;
  /**
   * Runs on the migrated database before the app starts: for loading data through code that
   * starts a Nest context of its own (the demo extracts), which must be done before this app
   * binds the Sequelize models to its connection.
   */
  prepare?: (config: CairnConfig, secrets: CairnSecrets, db: Sequelize) => Promise<void>;
}

export function testConfig(): { config: CairnConfig; secrets: CairnSecrets } {
  return { config: loadConfig({ profile: 'test' }), secrets: loadSecrets() };
}

/** Creates and migrates a fresh database; returns its name and a connection to it. */
export async function freshDatabase(config: CairnConfig, secrets: CairnSecrets) {
  const databaseName = `cairn_test_${randomBytes(5).toString('hex')}`;
  const withName: CairnConfig = { ...config, database: { ...config.database, name: databaseName } };
  await createDatabase(withName, secrets);
  const db = connect(withName, secrets);
  await migrateUp(db);
  return {
    databaseName,
    config: withName,
    db,
    drop: async () => {
      await db.close();
      await dropTestDatabase(withName, secrets);
    },
  };
}

export async function createTestApp(options: TestAppOptions = {}): Promise<TestApp> {
  const base = testConfig();
  const configured = options.configure ? options.configure(base.config) : base.config;
  const fresh = await freshDatabase(configured, base.secrets);
  if (options.prepare) await options.prepare(fresh.config, base.secrets, fresh.db);
  const app = await createApp({
    config: fresh.config,
    secrets: base.secrets,
    logger: createRootLogger(process.env.CAIRN_TEST_LOG_LEVEL === 'debug' ? 'debug' : 'silent'),
    extraModules: options.modules,
  });
  await app.init();
  if (options.listen) await app.listen(0, '127.0.0.1');
  return {
    app,
    http: app.getHttpServer(),
    db: fresh.db,
    config: fresh.config,
    secrets: base.secrets,
    databaseName: fresh.databaseName,
    close: async () => {
      await app.close();
      await fresh.drop();
    },
  };
}
