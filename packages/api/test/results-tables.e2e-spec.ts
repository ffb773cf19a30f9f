/**
 * The tables results are stored in (migrations 0300, 0301): a submission's
 * sums, one row per measure-set version; built benchmarks, immutable, one
 * row per (quarter, measure set, format, set of current submissions).
 */
import { createHash } from 'node:crypto';
import { QueryTypes } from 'sequelize';
import { arrange, type ExtractsWorld, uploadAndWait } from './extracts-fixtures/api.js';
import { csvOf, goodRows } from './extracts-fixtures/rows.js';
import { signInAs } from './support/auth.js';
import { createTestApp, type TestApp } from './support/test-app.js';

describe('results tables', () => {
  let t: TestApp;
  let w: ExtractsWorld;
  let submissionId: number;

  const exec = (sql: string, replacements: unknown[]) =>
    t.db.query(sql, { replacements, type: QueryTypes.INSERT });
  const select = <T extends object>(sql: string, replacements: unknown[] = []) =>
    t.db.query<T>(sql, { replacements, type: QueryTypes.SELECT });

  beforeAll(async () => {
    t = await createTestApp();
    w = await arrange(t);
    const lead = await signInAs(t, 'practice_lead_one');
    const done = await uploadAndWait(
      lead,
      w.practice('OV102'),
      w.quarter('2026 Q3'),
      csvOf(goodRows(3)),
      {
        name: 'three.csv',
      },
    );
    submissionId = done.id;
  });
  afterAll(async () => {
    await t?.close();
  });

  it('keeps a submission’s sums per measure-set version, once each', async () => {
    const insert = (measureSet: string, bytes: Buffer) =>
      exec(
        `INSERT INTO submission_sums (submission_id, measure_set_id, format_version, records, bytes, computed_at)
         VALUES (?, ?, 1, 3, ?, NOW(3))`,
        [submissionId, measureSet, bytes],
      );
    await insert('cairn-default-2026.1', Buffer.from([1, 2, 3]));
    await insert('cairn-default-2027.1', Buffer.from([4, 5]));
    await expect(insert('cairn-default-2026.1', Buffer.from([9]))).rejects.toMatchObject({
      name: 'SequelizeUniqueConstraintError',
    });
    const rows = await select<{ measure_set_id: string; bytes: Buffer }>(
      'SELECT measure_set_id, bytes FROM submission_sums WHERE submission_id = ? ORDER BY measure_set_id',
      [submissionId],
    );
    expect(rows.map((r) => [r.measure_set_id, [...r.bytes]])).toEqual([
      ['cairn-default-2026.1', [1, 2, 3]],
      ['cairn-default-2027.1', [4, 5]],
    ]);
    await expect(
      exec(
        `INSERT INTO submission_sums (submission_id, measure_set_id, format_version, records, bytes, computed_at)
         VALUES (987654, 'cairn-default-2026.1', 1, 0, '', NOW(3))`,
        [],
      ),
    ).rejects.toThrow(/foreign key constraint fails/);
  });

  it('keeps the first of two identical benchmark builds (INSERT IGNORE) and refuses an unknown quarter', async () => {
    const quarter = w.quarter('2026 Q3');
    const key = createHash('sha256').update(String(submissionId)).digest('hex');
    const build = (body: Buffer, ms: number) =>
      exec(
        `INSERT IGNORE INTO benchmark_results
           (quarter_id, measure_set_id, format_version, submissions_key, submission_count, body, built_at, build_ms)
         VALUES (?, 'cairn-default-2026.1', 1, ?, 1, ?, NOW(3), ?)`,
        [quarter, key, body, ms],
      );
    await build(Buffer.from('first'), 12);
    await build(Buffer.from('second'), 15);
    const rows = await select<{ body: Buffer; build_ms: number; submissions_key: string }>(
      'SELECT body, build_ms, submissions_key FROM benchmark_results WHERE quarter_id = ?',
      [quarter],
    );
    expect(rows.map((r) => [r.body.toString(), r.build_ms, r.submissions_key])).toEqual([
      ['first', 12, key],
    ]);
    await expect(
      exec(
        `INSERT INTO benchmark_results
           (quarter_id, measure_set_id, format_version, submissions_key, submission_count, body, built_at, build_ms)
         VALUES (987654, 'cairn-default-2026.1', 1, ?, 0, '', NOW(3), 0)`,
        [key],
      ),
    ).rejects.toThrow(/foreign key constraint fails/);
  });
});
