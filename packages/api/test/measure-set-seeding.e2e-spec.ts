/**
 * Seeding measure sets from config/measure-sets/ refuses loudly a file that
 * no longer matches the published version stored under its id: the API does
 * not start, and the message names the file, the id and both hashes. (Its
 * own file: a second application in one test file would take over the
 * first one's database models.)
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { parseMeasureSet } from '@cairn/metrics';
import { QueryTypes } from 'sequelize';
import { createApp } from '../src/app.factory.js';
import { createRootLogger } from '../src/common/logger.js';
import { findRepoRoot } from '../src/config/load-config.js';
import { canonicalJson, contentHash } from '../src/measure-sets/canonical.js';
import { freshDatabase, testConfig } from './support/test-app.js';

const DEFAULT = 'cairn-default-2026.1';
const shipped = () =>
  JSON.parse(
    readFileSync(join(findRepoRoot(), 'config', 'measure-sets', `${DEFAULT}.json`), 'utf8'),
  ) as Record<string, unknown>;

/** Starts an API on a fresh database after `arrange`; returns why its start failed. */
async function startFailure(arrange: (db: import('sequelize').Sequelize) => Promise<void>) {
  const { config, secrets } = testConfig();
  const fresh = await freshDatabase(config, secrets);
  try {
    await arrange(fresh.db);
    const app = await createApp({
      config: fresh.config,
      secrets,
      logger: createRootLogger('silent'),
    });
    const failure = await app.init().then(
      () => null,
      (error: unknown) => error as Error,
    );
    await app.close().catch(() => undefined);
    return failure;
  } finally {
    await fresh.drop();
  }
}

const insert = (db: import('sequelize').Sequelize, status: string, definition: string) =>
  db.query(
    `INSERT INTO measure_sets (id, region_id, label, status, definition, content_hash, created_by,
       created_at, updated_at, published_by, published_at)
     VALUES (?, NULL, 'Edited in place', ?, ?, ?, 'Cairn', NOW(3), NOW(3), 'Cairn', ${status === 'published' ? 'NOW(3)' : 'NULL'})`,
    {
      replacements: [DEFAULT, status, definition, contentHash(definition)],
      type: QueryTypes.INSERT,
    },
  );

describe('seeding measure sets', () => {
  it('refuses to start when a file no longer matches the version stored under its id', async () => {
    const changed = canonicalJson({ ...parseMeasureSet(shipped()), label: 'Edited in place' });
    const failure = await startFailure(async (db) => {
      await insert(db, 'published', changed);
    });
    expect(failure?.message).toMatch(
      new RegExp(
        `^measure set config/measure-sets/${DEFAULT.replace(/\./g, '\\.')}\\.json differs from the published version "${DEFAULT.replace(/\./g, '\\.')}" stored in the database \\(stored SHA-256 [0-9a-f]{64}, file [0-9a-f]{64}\\)\\. A published version never changes`,
      ),
    );
  });

  it('refuses to start when a draft already holds the id of a shipped file', async () => {
    const same = canonicalJson(parseMeasureSet(shipped()));
    const failure = await startFailure(async (db) => {
      await insert(db, 'draft', same);
    });
    expect(failure?.message).toBe(
      `measure set config/measure-sets/${DEFAULT}.json: the id "${DEFAULT}" is already used by a draft version in the database; give the file another version id`,
    );
  });
});
