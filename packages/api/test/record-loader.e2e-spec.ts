/**
 * The record loader against the test MariaDB: what it stages reads back as
 * written (escapes, text beyond ASCII, NULLs, fractions), and stopping it
 * while statements are still queued behind the one MariaDB is reading rolls
 * everything back without bringing the process down.
 */
import { QueryTypes, type Sequelize } from 'sequelize';
import { COL, RECORD_COLUMNS, type RecordRow } from '../src/database/bulk-load/record-columns.js';
import { RecordLoader, ROWS_PER_STATEMENT } from '../src/database/bulk-load/record-loader.js';
import { freshDatabase, testConfig } from './support/test-app.js';

const SECRET = 'record-loader-test-secret-0123456789';
// foreign_key_checks is off while the loader stages, so a submission id needs no row of its own.
const SUBMISSION = 4_000_000;

function record(row: number, ref: string, extra: Partial<Record<string, string | number>> = {}) {
  const r: RecordRow = RECORD_COLUMNS.map(() => null);
  r[COL.submission_id] = SUBMISSION;
  r[COL.source_row] = row;
  r[COL.record_ref] = ref;
  r[COL.birth_year] = 1950 + (row % 50);
  r[COL.sex] = row % 2 ? 'F' : 'M';
  for (const [k, v] of Object.entries(extra)) r[COL[k as keyof typeof COL]] = v ?? null;
  return r;
}

describe('RecordLoader', () => {
  let db: Sequelize;
  let drop: () => Promise<void>;
  const staged = async (submission = SUBMISSION) =>
    db.query<Record<string, unknown>>(
      `SELECT * FROM care_records WHERE submission_id = ? ORDER BY source_row`,
      { replacements: [submission], type: QueryTypes.SELECT },
    );

  beforeAll(async () => {
    const { config, secrets } = testConfig();
    ({ db, drop } = await freshDatabase(config, secrets));
  });
  afterAll(async () => {
    await drop();
  });
  afterEach(async () => {
    await db.query('DELETE FROM care_records WHERE submission_id = ?', {
      replacements: [SUBMISSION],
    });
  });

  it('stages values that read back exactly as written', async () => {
    const rows = [
      record(1, 'plain-001', {
        hba1c_month: '2026-03',
        hba1c_mmol_mol: 53.2,
        systolic: 138,
        diabetes_type: 'type2',
      }),
      record(2, 'tab\there', { acr_mg_mmol: 0.1, on_statin: 1 }),
      record(3, 'back\\slash\nand line', { total_cholesterol_mmol_l: 4.75 }),
      record(4, 'Zoë·µ→😀', { bmi_kg_m2: 31.4, insulin_start_year: 2019 }),
      record(5, 'ref 5'),
    ];
    const loader = await RecordLoader.open(db, { practiceCode: 'ZZ001', secret: SECRET });
    await loader.write(rows);
    expect(await loader.finish()).toBe(5);
    const back = await staged();
    expect(back.map((r) => r.record_ref)).toEqual([
      'plain-001',
      'tab\there',
      'back\\slash\nand line',
      'Zoë·µ→😀',
      'ref 5',
    ]);
    expect(back[0]).toMatchObject({
      hba1c_month: '2026-03',
      hba1c_mmol_mol: 53.2,
      systolic: 138,
      diabetes_type: 'type2',
      diastolic: null,
      birth_year: 1951,
      sex: 'F',
    });
    expect(back[1]).toMatchObject({ acr_mg_mmol: 0.1, on_statin: 1, hba1c_month: null });
    expect(back[2]!.total_cholesterol_mmol_l).toBe(4.75);
    expect(back[3]).toMatchObject({ bmi_kg_m2: 31.4, insulin_start_year: 2019 });
    for (const r of back) expect(r.pseudonym).toMatch(/^[0-9a-f]{12}$/);
  });

  it('rolls back, and keeps the process up, when stopped with statements still queued', async () => {
    const errors: unknown[] = [];
    const onError = (error: unknown) => errors.push(error);
    process.on('uncaughtException', onError);
    try {
      const loader = await RecordLoader.open(db, { practiceCode: 'ZZ001', secret: SECRET });
      // Enough rows for several statements: MariaDB reads the first while the others wait.
      const rows: RecordRow[] = [];
      for (let i = 1; i <= ROWS_PER_STATEMENT * 3 + 10; i++) rows.push(record(i, `q-${i}`));
      await loader.write(rows.slice(0, ROWS_PER_STATEMENT * 2 + 5));
      const pending = loader.write(rows.slice(ROWS_PER_STATEMENT * 2 + 5));
      await loader.abort();
      await pending.catch(() => undefined);
      await new Promise((resolve) => setTimeout(resolve, 200));
      expect(errors).toEqual([]);
      expect(await staged()).toHaveLength(0);
    } finally {
      process.off('uncaughtException', onError);
    }
  });
});
