/**
 * The extract path through the real HTTP stack: upload, processing as a job,
 * the validation report, confirm and history.
 */
import { recordPseudonym } from '@cairn/metrics';
import { QueryTypes } from 'sequelize';
import request from 'supertest';
import { signInAs } from './support/auth.js';
import { createTestApp, type TestApp } from './support/test-app.js';
import {
  arrange,
  currentState,
  upload,
  uploadAndWait,
  type ExtractsWorld,
} from './extracts-fixtures/api.js';
import { csvOf, goodRow, goodRows, xlsxOf } from './extracts-fixtures/rows.js';
import { alterWorkbook } from './extracts-fixtures/zip.js';

describe('extracts: upload, report, confirm', () => {
  let t: TestApp;
  let w: ExtractsWorld;

  beforeAll(async () => {
    t = await createTestApp();
    w = await arrange(t);
  });
  afterAll(async () => {
    await t?.close();
  });

  it('serves the templates publicly', async () => {
    const xlsx = await request(t.http).get('/api/extracts/template.xlsx').buffer(true).expect(200);
    expect(xlsx.headers['content-type']).toMatch(/spreadsheetml/);
    const csv = await request(t.http).get('/api/extracts/template.csv').expect(200);
    expect(csv.text.replace(/^\uFEFF/, '').split(',')[0]).toBe('record_ref');
  });

  it('checks a CSV extract as a job and confirms it', async () => {
    const lead = await signInAs(t, 'practice_lead_one');
    const practice = w.practice('OV102');
    const quarter = w.quarter('2026 Q3');
    const rows = goodRows(50);
    rows.push(goodRow(51, { hba1c_value: 900 }));
    const first = await upload(lead, practice, quarter, csvOf(rows), { name: 'q3.csv' });
    expect(first.status).toBe(202);
    expect(first.body.status).toBe('processing');
    const done = await uploadAndWait(lead, practice, quarter, csvOf(goodRows(10, 100)), {
      name: 'other.csv',
    });
    expect(done.status).toBe('awaiting_confirmation');
    const report = await lead
      .get(`/api/practices/${practice}/submissions/${first.body.id}`)
      .expect(200);
    expect(report.body.status).toBe('awaiting_confirmation');
    expect(report.body.counts).toMatchObject({
      rowsRead: 51,
      rowsAccepted: 50,
      rowsRejected: 1,
      errors: 1,
    });
    const issues = await lead
      .get(`/api/practices/${practice}/submissions/${first.body.id}/issues`)
      .expect(200);
    expect(issues.body.items[0]).toMatchObject({
      row: 52,
      code: 'out_of_range',
      column: 'hba1c_value',
      value: '900',
    });
    expect(await currentState(t, practice, quarter)).toMatchObject({ current: null, records: 0 });
    const confirmed = await lead
      .post(`/api/practices/${practice}/submissions/${first.body.id}/confirm`)
      .expect(200);
    expect(confirmed.body).toMatchObject({ status: 'accepted', isCurrent: true });
    expect(await currentState(t, practice, quarter)).toMatchObject({
      current: first.body.id,
      records: 50,
    });
    const [audit] = await t.db.query<{ n: number }>(
      "SELECT COUNT(*) AS n FROM audit_events WHERE subject_type = 'submission' AND subject_id = ?",
      { replacements: [String(first.body.id)], type: QueryTypes.SELECT },
    );
    expect(Number(audit!.n)).toBe(3);
  });

  it('reads an XLSX extract', async () => {
    const lead = await signInAs(t, 'practice_lead_one');
    const practice = w.practice('OV102');
    const quarter = w.quarter('2026 Q3');
    const done = await uploadAndWait(lead, practice, quarter, await xlsxOf(goodRows(30, 500)), {
      name: 'q3.xlsx',
    });
    expect(done).toMatchObject({ status: 'awaiting_confirmation', counts: { rowsAccepted: 30 } });
  });
  it('reads the date serials of a workbook in the 1904 date system from 1904', async () => {
    const lead = await signInAs(t, 'practice_lead_one');
    const practice = w.practice('OV102');
    const quarter = w.quarter('2026 Q3');
    // 14 May 2026 as a 1904-system serial: days since 1904-01-01 (ECMA-376 Part 1, §18.17.4.1).
    const serial1904 = (Date.UTC(2026, 4, 14) - Date.UTC(1904, 0, 1)) / 86_400_000;
    const rows = goodRows(4, 1200).map((r) => ({ ...r, hba1c_date: serial1904 }));
    const workbook = alterWorkbook(await xlsxOf(rows), (parts) =>
      parts.map((p) =>
        p.name === 'xl/workbook.xml'
          ? {
              ...p,
              data: Buffer.from(
                p.data.toString('utf8').includes('<workbookPr')
                  ? p.data.toString('utf8').replace('<workbookPr', '<workbookPr date1904="1"')
                  : p.data
                      .toString('utf8')
                      .replace(/(<workbook\b[^>]*>)/, '$1<workbookPr date1904="1"/>'),
              ),
            }
          : p,
      ),
    );
    const done = await uploadAndWait(lead, practice, quarter, workbook, { name: 'mac.xlsx' });
    expect(done).toMatchObject({ status: 'awaiting_confirmation', counts: { rowsAccepted: 4 } });
    const months = await t.db.query<{ hba1c_month: string }>(
      'SELECT hba1c_month FROM care_records WHERE submission_id = ? ORDER BY source_row',
      { replacements: [done.id], type: QueryTypes.SELECT },
    );
    expect(months.map((m) => m.hba1c_month)).toEqual(['2026-05', '2026-05', '2026-05', '2026-05']);
  });

  it('stores the keyed pseudonym of docs/methods.md §9, computed while loading, equal to @cairn/metrics', async () => {
    const lead = await signInAs(t, 'practice_lead_one');
    const practice = w.practice('OV102');
    const quarter = w.quarter('2026 Q3');
    const rows = goodRows(3, 900);
    // Refs beyond ASCII and with separators: the HMAC is over UTF-8 bytes.
    rows[1]!.record_ref = 'Ré-0042 ✓';
    rows[2]!.record_ref = 'a,b;c';
    const done = await uploadAndWait(lead, practice, quarter, csvOf(rows), { name: 'refs.csv' });
    expect(done.status).toBe('awaiting_confirmation');
    const stored = await t.db.query<{ record_ref: string; pseudonym: string; code: string }>(
      `SELECT r.record_ref, r.pseudonym, p.code FROM care_records r
         JOIN submissions s ON s.id = r.submission_id JOIN practices p ON p.id = s.practice_id
        WHERE r.submission_id = ? ORDER BY r.source_row`,
      { replacements: [done.id], type: QueryTypes.SELECT },
    );
    expect(stored.map((r) => r.record_ref)).toEqual(rows.map((r) => String(r.record_ref)));
    for (const r of stored) {
      expect(r.pseudonym).toBe(
        recordPseudonym(t.secrets.CAIRN_PSEUDONYM_SECRET, r.code, r.record_ref),
      );
    }
    expect(new Set(stored.map((r) => r.pseudonym)).size).toBe(3);
  });
});
