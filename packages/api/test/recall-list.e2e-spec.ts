/**
 * Recall lists through the API, against records uploaded and confirmed here:
 * the expected lines are worked out by hand from the rows written below
 * (2026 Q3, review window 2025-10 … 2026-09; the shipped measure set).
 *
 *   row  ref     born  sex  type   HbA1c              on the lists of
 *   2    QB-001  1941  F    type2  62 in 2026-05      hba1c_le_53 (not met)
 *   3    QB-002  1942  M    type2  none               hba1c, hba1c_le_53 (not measured)
 *   4    QB-003  1943  F    type2  50 in 2025-06      hba1c, hba1c_le_53 (not measured: before the window)
 *   5    QB-010  1950  M    type1  80 in 2026-05      hba1c_le_53 (not met), hba1c_gt_75
 *   6    QB-004  1944  M    type2  52 in 2026-05      none
 *   7    QB-005  2018  F    type2  —                  none: aged 8, not eligible
 *   8    QB-006  1946  M    (none) —                  none: diabetes type unknown, not eligible
 *   9    QB-020  1960  M    type1  54 in 2026-05      hba1c_le_53 (not met); on_insulin "no" (a flag)
 *
 * Eligible: 6 (type 1: 2, type 2 and other: 4). hba1c_le_53 (eligible
 * denominator): 6 in n, 5 listed. hba1c_gt_75 (measured): n = 4 with a result
 * in the window, 1 listed (the one counted: lower is better).
 */
import ExcelJS from 'exceljs';
import Papa from 'papaparse';
import { QueryTypes } from 'sequelize';
import request from 'supertest';
import { pseudonymiser } from '../src/submissions/extract-processor.js';
import { SubmissionsService } from '../src/submissions/submissions.service.js';
import { arrange, type ExtractsWorld, uploadAndWait } from './extracts-fixtures/api.js';
import { csvOf, goodRow, type Row } from './extracts-fixtures/rows.js';
import { binary } from './support/downloads.js';
import { signInAs, type SignedInAgent } from './support/auth.js';
import { createTestApp, type TestApp } from './support/test-app.js';

const Q3 = '2026 Q3';

const ROWS: Row[] = [
  goodRow(1, { record_ref: 'QB-001', hba1c_value: 62 }),
  goodRow(2, { record_ref: 'QB-002', hba1c_date: null, hba1c_value: null }),
  goodRow(3, { record_ref: 'QB-003', hba1c_date: '2025-06-10', hba1c_value: 50 }),
  goodRow(10, { record_ref: 'QB-010', hba1c_value: 80 }),
  goodRow(4, { record_ref: 'QB-004', hba1c_value: 52 }),
  goodRow(5, { record_ref: 'QB-005', birth_year: 2018, diagnosis_year: 2024 }),
  goodRow(6, { record_ref: 'QB-006', diabetes_type: null }),
  goodRow(20, { record_ref: 'QB-020', hba1c_value: 54, on_insulin: 'no' }),
];

async function sheetRows(body: Buffer, name: string): Promise<unknown[][]> {
  const workbook = new ExcelJS.Workbook();
  await workbook.xlsx.load(body as unknown as ArrayBuffer);
  const sheet = workbook.getWorksheet(name);
  if (!sheet) throw new Error(`no sheet ${name}`);
  const rows: unknown[][] = [];
  sheet.eachRow((row) => rows.push((row.values as unknown[]).slice(1)));
  return rows;
}

const problem = (res: { body: Record<string, unknown> }) => res.body;

function csvRows(text: string): string[][] {
  expect(text.charCodeAt(0)).toBe(0xfeff);
  const parsed = Papa.parse<string[]>(text.slice(1), { skipEmptyLines: true });
  expect(parsed.errors).toEqual([]);
  return parsed.data;
}

describe('recall lists', () => {
  let t: TestApp;
  let w: ExtractsWorld;
  let own: SignedInAgent;
  let other: SignedInAgent;
  let regional: SignedInAgent;
  let auditor: SignedInAgent;
  let practice: number;
  let quarter: number;
  let submissionId: number;
  let pseudonym: (ref: string) => string;
  const base = () => `/api/practices/${practice}/quarters/${quarter}`;

  beforeAll(async () => {
    t = await createTestApp();
    w = await arrange(t);
    practice = w.practice('OV102');
    quarter = w.quarter(Q3);
    own = await signInAs(t, 'practice_lead_one');
    other = await signInAs(t, 'practice_lead_two');
    regional = await signInAs(t, 'regional_lead');
    auditor = await signInAs(t, 'auditor');
    const done = await uploadAndWait(own, practice, quarter, csvOf(ROWS), { name: 'q3.csv' });
    expect(done.status).toBe('awaiting_confirmation');
    expect(done.counts.rowsAccepted).toBe(8);
    await own.post(`/api/practices/${practice}/submissions/${done.id}/confirm`).expect(200);
    submissionId = done.id;
    const p = pseudonymiser(t.secrets.CAIRN_PSEUDONYM_SECRET);
    pseudonym = (ref) => p('OV102', ref);
  });
  afterAll(async () => {
    await t?.close();
  });

  describe('JSON', () => {
    it('lists the records that count against the practice on a target, with their values', async () => {
      const res = await own
        .get(`${base()}/recall-list`)
        .query({ measure: 'hba1c_le_53' })
        .expect(200);
      const body = res.body;
      expect(body).toMatchObject({
        practice: { id: practice, code: 'OV102', name: expect.any(String) },
        quarter: { id: quarter, label: Q3, windowStart: '2025-10', windowEnd: '2026-09' },
        measureSetId: 'cairn-default-2026.1',
        measure: {
          key: 'hba1c_le_53',
          kind: 'treatment_target',
          denominator: 'eligible',
          direction: 'higher',
          source: expect.stringContaining('NICE NG28'),
        },
        split: 'all',
        submission: { id: submissionId, records: 8, confirmedAt: expect.any(String) },
        recordReferences: 'record_ref',
        counts: { eligible: 6, denominator: 6, listed: 5 },
        total: 5,
        offset: 0,
        limit: 100,
      });
      expect(
        body.items.map((i: { row: number; reference: string }) => [i.row, i.reference]),
      ).toEqual([
        [2, 'QB-001'],
        [3, 'QB-002'],
        [4, 'QB-003'],
        [5, 'QB-010'],
        [9, 'QB-020'],
      ]);
      expect(body.items[0]).toEqual({
        row: 2,
        reference: 'QB-001',
        birthYear: 1941,
        age: 85,
        ageBand: '80+',
        sex: 'F',
        diabetesType: 'type2',
        reason: 'not_met',
        reasonText: 'Latest result does not meet the target',
        lastRecorded: '2026-05',
        value: '62 mmol/mol',
        missing: [],
        readings: [
          {
            field: 'hba1c',
            label: 'HbA1c',
            month: '2026-05',
            counts: true,
            value: '62 mmol/mol',
            numbers: [62],
            text: '62 mmol/mol in 2026-05',
          },
        ],
        detail: 'HbA1c: 62 mmol/mol in 2026-05',
      });
      expect(body.items[1]).toMatchObject({
        reference: 'QB-002',
        sex: 'M',
        reason: 'not_measured',
        reasonText: 'No result in the review window',
        lastRecorded: null,
        value: 'not measured',
        detail: 'HbA1c: Not recorded',
      });
      expect(body.items[2]).toMatchObject({
        reference: 'QB-003',
        reason: 'not_measured',
        lastRecorded: '2025-06',
        value: 'not measured',
        detail: 'HbA1c: 50 mmol/mol in 2025-06, before the review window',
      });
      expect(body.items[3]).toMatchObject({
        reference: 'QB-010',
        diabetesType: 'type1',
        age: 76,
        ageBand: '65–79',
        reason: 'not_met',
        value: '80 mmol/mol',
      });
    });

    it('lists the care process not recorded in the window', async () => {
      const res = await own.get(`${base()}/recall-list`).query({ measure: 'hba1c' }).expect(200);
      expect(res.body.counts).toEqual({ eligible: 6, denominator: 6, listed: 2 });
      expect(res.body.items).toEqual([
        expect.objectContaining({
          reference: 'QB-002',
          reason: 'not_recorded',
          reasonText: 'Not recorded in the review window',
          lastRecorded: null,
          value: null,
        }),
        expect.objectContaining({
          reference: 'QB-003',
          reason: 'not_recorded',
          lastRecorded: '2025-06',
          value: '50 mmol/mol',
        }),
      ]);
    });

    it('lists the records a lower-is-better measure counts, among those measured', async () => {
      const res = await own
        .get(`${base()}/recall-list`)
        .query({ measure: 'hba1c_gt_75' })
        .expect(200);
      expect(res.body.counts).toEqual({ eligible: 6, denominator: 4, listed: 1 });
      expect(res.body.items).toEqual([
        expect.objectContaining({
          reference: 'QB-010',
          reason: 'adverse_result',
          reasonText: 'Latest result is in the range this measure counts (lower is better)',
          value: '80 mmol/mol',
        }),
      ]);
    });

    it.each([
      ['type1', { eligible: 2, denominator: 2, listed: 2 }, ['QB-010', 'QB-020']],
      ['type2_other', { eligible: 4, denominator: 4, listed: 3 }, ['QB-001', 'QB-002', 'QB-003']],
    ])('splits by diabetes type: %s', async (split, counts, refs) => {
      const res = await own
        .get(`${base()}/recall-list`)
        .query({ measure: 'hba1c_le_53', split })
        .expect(200);
      expect(res.body.split).toBe(split);
      expect(res.body.counts).toEqual(counts);
      expect(res.body.items.map((i: { reference: string }) => i.reference)).toEqual(refs);
    });

    it('pages in extract row order', async () => {
      const pages: string[][] = [];
      for (const offset of [0, 2, 4, 6]) {
        const res = await own
          .get(`${base()}/recall-list`)
          .query({ measure: 'hba1c_le_53', offset, limit: 2 })
          .expect(200);
        expect(res.body).toMatchObject({ total: 5, offset, limit: 2 });
        pages.push(res.body.items.map((i: { reference: string }) => i.reference));
      }
      expect(pages).toEqual([['QB-001', 'QB-002'], ['QB-003', 'QB-010'], ['QB-020'], []]);
    });

    it.each([
      ['the regional lead', () => regional],
      ['the auditor', () => auditor],
    ])('shows %s pseudonyms, never the practice’s references', async (_who, agent) => {
      const res = await agent()
        .get(`${base()}/recall-list`)
        .query({ measure: 'hba1c_le_53' })
        .expect(200);
      expect(res.body.recordReferences).toBe('pseudonym');
      expect(res.body.items.map((i: { reference: string }) => i.reference)).toEqual(
        ['QB-001', 'QB-002', 'QB-003', 'QB-010', 'QB-020'].map(pseudonym),
      );
      expect(JSON.stringify(res.body)).not.toMatch(/QB-0/);
    });

    it('describes a composite’s missing parts', async () => {
      const res = await own
        .get(`${base()}/recall-list`)
        .query({ measure: 'targets_composite', split: 'type1' })
        .expect(200);
      expect(res.body.items[0]).toMatchObject({
        reference: 'QB-010',
        reason: 'not_met',
        lastRecorded: null,
        value: null,
        missing: [{ key: 'hba1c_le_53', label: 'HbA1c 53 mmol/mol (7.0 %) or below' }],
      });
      expect(res.body.items[0].readings.map((r: { field: string }) => r.field)).toEqual([
        'hba1c',
        'bloodPressure',
        'onStatin',
        'cholesterol',
      ]);
    });
  });

  describe('downloads', () => {
    it('gives the whole list as CSV, with references for the practice’s lead', async () => {
      const res = await own
        .get(`${base()}/recall-list.csv`)
        .query({ measure: 'hba1c_le_53' })
        .expect(200)
        .expect('Content-Type', 'text/csv; charset=utf-8')
        .expect(
          'Content-Disposition',
          'attachment; filename="cairn-recall-OV102-2026Q3-hba1c_le_53.csv"',
        );
      const rows = csvRows(res.text);
      expect(rows[0]).toEqual([
        'Reference',
        'Extract row',
        'Birth year',
        'Age band',
        'Sex',
        'Diabetes type',
        'Why listed',
        'Last recorded',
        'Value',
        'Detail',
      ]);
      expect(rows.slice(1)).toEqual([
        [
          'QB-001',
          '2',
          '1941',
          '80+',
          'Female',
          'Type 2',
          'Latest result does not meet the target',
          '2026-05',
          '62 mmol/mol',
          'HbA1c: 62 mmol/mol in 2026-05',
        ],
        [
          'QB-002',
          '3',
          '1942',
          '80+',
          'Male',
          'Type 2',
          'No result in the review window',
          '',
          'not measured',
          'HbA1c: Not recorded',
        ],
        [
          'QB-003',
          '4',
          '1943',
          '80+',
          'Female',
          'Type 2',
          'No result in the review window',
          '2025-06',
          'not measured',
          'HbA1c: 50 mmol/mol in 2025-06, before the review window',
        ],
        [
          'QB-010',
          '5',
          '1950',
          '65–79',
          'Male',
          'Type 1',
          'Latest result does not meet the target',
          '2026-05',
          '80 mmol/mol',
          'HbA1c: 80 mmol/mol in 2026-05',
        ],
        [
          'QB-020',
          '9',
          '1960',
          '65–79',
          'Male',
          'Type 1',
          'Latest result does not meet the target',
          '2026-05',
          '54 mmol/mol',
          'HbA1c: 54 mmol/mol in 2026-05',
        ],
      ]);
    });

    it('gives the auditor pseudonyms in the CSV, one split', async () => {
      const res = await auditor
        .get(`${base()}/recall-list.csv`)
        .query({ measure: 'hba1c_le_53', split: 'type1' })
        .expect(200)
        .expect(
          'Content-Disposition',
          'attachment; filename="cairn-recall-OV102-2026Q3-hba1c_le_53-type1.csv"',
        );
      const rows = csvRows(res.text);
      expect(rows[0]![0]).toBe('Pseudonym');
      expect(rows.slice(1).map((r) => r[0])).toEqual([pseudonym('QB-010'), pseudonym('QB-020')]);
      expect(res.text).not.toMatch(/QB-0/);
    });

    it('gives the whole list as XLSX, with a sheet about the measure and the caution', async () => {
      const res = await binary(own.get(`${base()}/recall-list.xlsx`).query({ measure: 'hba1c' }))
        .expect(200)
        .expect(
          'Content-Type',
          'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet',
        );
      const body = res.body as Buffer;
      const rows = await sheetRows(body, 'Recall list');
      expect(rows[0]![0]).toBe('Reference');
      expect(rows.slice(1)).toEqual([
        [
          'QB-002',
          3,
          1942,
          '80+',
          'Male',
          'Type 2',
          'Not recorded in the review window',
          undefined,
          undefined,
          'HbA1c: Not recorded',
        ],
        [
          'QB-003',
          4,
          1943,
          '80+',
          'Female',
          'Type 2',
          'Not recorded in the review window',
          '2025-06',
          '50 mmol/mol',
          'HbA1c: 50 mmol/mol in 2025-06, before the review window',
        ],
      ]);
      const about = new Map((await sheetRows(body, 'About this list')).map((r) => [r[0], r[1]]));
      expect(about.get('Measure')).toBe('HbA1c recorded (hba1c)');
      expect(about.get('Guideline')).toMatch(/^NICE NG28/);
      expect(about.get('Listed')).toBe(2);
      expect(about.get('Read from')).toMatch(new RegExp(`^Submission ${submissionId}, confirmed `));
      expect(about.get('Caution')).toMatch(/not clinical advice/);
    });

    it('gives the regional lead pseudonyms in the XLSX', async () => {
      const res = await binary(
        regional.get(`${base()}/recall-list.xlsx`).query({ measure: 'hba1c_gt_75' }),
      ).expect(200);
      const rows = await sheetRows(res.body as Buffer, 'Recall list');
      expect(rows.map((r) => r[0])).toEqual(['Pseudonym', pseudonym('QB-010')]);
      const about = new Map(
        (await sheetRows(res.body as Buffer, 'About this list')).map((r) => [r[0], r[1]]),
      );
      expect(about.get('References')).toBe('Pseudonyms (you are not a lead of this practice)');
    });
  });

  describe('bad input and access', () => {
    it.each(['recall-list', 'recall-list.csv', 'recall-list.xlsx'])(
      '%s: a practice lead of another practice gets 403 and no data',
      async (path) => {
        const res = await other.get(`${base()}/${path}`).query({ measure: 'hba1c' }).expect(403);
        expect(res.headers['content-type']).toMatch(/^application\/problem\+json/);
        expect(problem(res)).toMatchObject({ type: '/api/problems/practice-not-yours' });
        expect(res.text).not.toMatch(/QB-0|items/);
      },
    );

    it.each(['recall-list', 'recall-list.csv', 'recall-list.xlsx'])(
      '%s: nobody signed in gets 401',
      async (path) => {
        const res = await request(t.http).get(`${base()}/${path}`).query({ measure: 'hba1c' });
        expect(res.status).toBe(401);
        expect(res.body.type).toBe('/api/problems/sign-in-required');
      },
    );

    it.each(['recall-list', 'recall-list.csv', 'recall-list.xlsx'])(
      '%s: an unknown measure is 404 naming it and the measures there are',
      async (path) => {
        const res = await own
          .get(`${base()}/${path}`)
          .query({ measure: 'hba1c_le_40' })
          .expect(404);
        expect(problem(res)).toMatchObject({
          type: '/api/problems/measure-not-found',
          measure: 'hba1c_le_40',
          measureSetId: 'cairn-default-2026.1',
          detail: expect.stringMatching(
            /^The measure set of 2026 Q3 \(cairn-default-2026\.1\) has no measure "hba1c_le_40"\. Its measures are: hba1c, blood_pressure, /,
          ),
        });
        expect(problem(res).knownMeasures).toHaveLength(20);
      },
    );

    it.each(['recall-list', 'recall-list.csv', 'recall-list.xlsx'])(
      '%s: an unknown quarter is 404 naming it',
      async (path) => {
        const res = await own
          .get(`/api/practices/${practice}/quarters/987654/${path}`)
          .query({ measure: 'hba1c' })
          .expect(404);
        expect(problem(res)).toMatchObject({
          type: '/api/problems/quarter-not-found',
          quarterId: 987654,
          detail: 'There is no audit quarter 987654 in your region.',
        });
      },
    );

    it('an unknown practice is 404 naming it', async () => {
      const res = await regional
        .get(`/api/practices/987654/quarters/${quarter}/recall-list`)
        .query({ measure: 'hba1c' })
        .expect(404);
      expect(problem(res)).toMatchObject({
        type: '/api/problems/practice-not-found',
        practiceId: 987654,
      });
    });

    it.each<[string, Record<string, string | number>, string, string]>([
      ['no measure', {}, 'measure', 'must be a string'],
      [
        'a split that is not one',
        { measure: 'hba1c', split: 'type2' },
        'split',
        'must be one of the following values',
      ],
      ['a page size of 0', { measure: 'hba1c', limit: 0 }, 'limit', 'must not be less than 1'],
      [
        'a page size above 1000',
        { measure: 'hba1c', limit: 1001 },
        'limit',
        'must not be greater than 1000',
      ],
      ['a negative offset', { measure: 'hba1c', offset: -1 }, 'offset', 'must not be less than 0'],
      [
        'an offset that is not a number',
        { measure: 'hba1c', offset: 'two' },
        'offset',
        'must be an integer number',
      ],
      [
        'a field it does not take',
        { measure: 'hba1c', sort: 'row' },
        'sort',
        'is not an accepted field',
      ],
    ])('refuses %s with 400 naming the field', async (_what, query, field, message) => {
      const res = await own.get(`${base()}/recall-list`).query(query).expect(400);
      expect(problem(res).type).toBe('/api/problems/validation');
      expect(problem(res).errors).toEqual(
        expect.arrayContaining([{ field, message: expect.stringContaining(message) }]),
      );
    });

    it('does not take paging on a download', async () => {
      const res = await own
        .get(`${base()}/recall-list.csv`)
        .query({ measure: 'hba1c', limit: 5 })
        .expect(400);
      expect(problem(res).errors).toEqual([
        { field: 'limit', message: 'is not an accepted field' },
      ]);
    });

    it('refuses a quarter id that is not a number', async () => {
      const res = await own
        .get(`/api/practices/${practice}/quarters/q3/recall-list`)
        .query({ measure: 'hba1c' })
        .expect(400);
      expect(problem(res).status).toBe(400);
    });
  });

  describe('a practice without a current submission', () => {
    it('answers 404 no-current-submission with an upload hint for those who may upload', async () => {
      const empty = w.practice('OV103');
      const res = await regional
        .get(`/api/practices/${empty}/quarters/${quarter}/recall-list`)
        .query({ measure: 'hba1c' })
        .expect(404);
      expect(problem(res)).toEqual({
        type: '/api/problems/no-current-submission',
        title: 'No confirmed extract for this quarter',
        status: 404,
        detail:
          "This practice has no confirmed extract for 2026 Q3, so it has no recall list yet. Upload the practice's extract for 2026 Q3 and confirm it; the recall list is built from it.",
        instance: `/api/practices/${empty}/quarters/${quarter}/recall-list`,
        practiceId: empty,
        quarterId: quarter,
        canUpload: true,
        uploadPath: `/extracts/upload?practice=${empty}&quarter=${quarter}`,
      });
      const asAuditor = await auditor
        .get(`/api/practices/${empty}/quarters/${quarter}/recall-list.xlsx`)
        .query({ measure: 'hba1c' })
        .expect(404);
      expect(problem(asAuditor)).toMatchObject({
        type: '/api/problems/no-current-submission',
        canUpload: false,
        uploadPath: null,
      });
    });

    it('does not read an extract that is only awaiting confirmation', async () => {
      const lead = await signInAs(t, 'practice_lead_two');
      const waiting = w.practice('OV101');
      const done = await uploadAndWait(lead, waiting, quarter, csvOf(ROWS), {
        name: 'waiting.csv',
      });
      expect(done.status).toBe('awaiting_confirmation');
      const res = await lead
        .get(`/api/practices/${waiting}/quarters/${quarter}/recall-list`)
        .query({ measure: 'hba1c' })
        .expect(404);
      expect(problem(res)).toMatchObject({
        type: '/api/problems/no-current-submission',
        canUpload: true,
      });
    });

    it('answers the closed quarter’s practice lead without an upload hint', async () => {
      const res = await own
        .get(`/api/practices/${practice}/quarters/${w.quarter('2026 Q2')}/recall-list`)
        .query({ measure: 'hba1c' })
        .expect(404);
      expect(problem(res)).toMatchObject({
        type: '/api/problems/no-current-submission',
        canUpload: false,
        uploadPath: null,
      });
      expect(String(problem(res).detail)).toContain('once the practice');
    });
  });

  it('follows the current submission when a new extract replaces it', async () => {
    const lead = await signInAs(t, 'practice_lead_two');
    const replaced = w.practice('OV103');
    const first = await uploadAndWait(lead, replaced, quarter, csvOf(ROWS), { name: 'first.csv' });
    await lead.post(`/api/practices/${replaced}/submissions/${first.id}/confirm`).expect(200);
    const before = await lead
      .get(`/api/practices/${replaced}/quarters/${quarter}/recall-list`)
      .query({ measure: 'hba1c_le_53' })
      .expect(200);
    expect(before.body.submission.id).toBe(first.id);
    expect(before.body.total).toBe(5);
    const fixed = ROWS.map((r) => (r.record_ref === 'QB-001' ? { ...r, hba1c_value: 50 } : r));
    const second = await uploadAndWait(lead, replaced, quarter, csvOf(fixed), {
      name: 'second.csv',
    });
    await lead.post(`/api/practices/${replaced}/submissions/${second.id}/confirm`).expect(200);
    const after = await lead
      .get(`/api/practices/${replaced}/quarters/${quarter}/recall-list`)
      .query({ measure: 'hba1c_le_53' })
      .expect(200);
    expect(after.body.submission.id).toBe(second.id);
    expect(after.body.items.map((i: { reference: string }) => i.reference)).toEqual([
      'QB-002',
      'QB-003',
      'QB-010',
      'QB-020',
    ]);
  });

  it('documents the recall list in the OpenAPI document, every DTO and named enum', async () => {
    const doc = (await request(t.http).get('/api/docs/openapi.json').expect(200)).body;
    const path = '/api/practices/{practiceId}/quarters/{quarterId}/recall-list';
    expect(Object.keys(doc.paths)).toEqual(
      expect.arrayContaining([path, `${path}.csv`, `${path}.xlsx`]),
    );
    expect(doc.paths[path].get.responses['200'].content['application/json'].schema).toEqual({
      $ref: '#/components/schemas/RecallListDto',
    });
    const schemas = doc.components.schemas;
    for (const name of [
      'RecallListDto',
      'RecallItemDto',
      'RecallReadingDto',
      'RecallCountsDto',
      'RecallReason',
      'TypeSplit',
      'RecordReferenceKind',
      'Sex',
      'DiabetesType',
    ])
      expect(schemas[name]).toBeDefined();
    expect(schemas.RecallReason.enum).toEqual([
      'not_recorded',
      'not_measured',
      'not_met',
      'adverse_result',
    ]);
    expect(schemas.RecallListDto.properties.items).toEqual({
      type: 'array',
      items: { $ref: '#/components/schemas/RecallItemDto' },
      description: expect.any(String),
    });
  });

  it('counts the clinical data-quality flags of a submission by code, with titles', async () => {
    const submissions = t.app.get(SubmissionsService);
    expect(await submissions.dataQualityFlags(submissionId)).toEqual([
      { code: 'type1_not_on_insulin', title: 'Type 1 diabetes but not on insulin', count: 1 },
      {
        code: 'diagnostic_below_threshold',
        title: 'Diagnostic result below the WHO threshold',
        count: 0,
      },
    ]);
    await expect(submissions.dataQualityFlags(987654)).rejects.toMatchObject({
      slug: 'submission-not-found',
    });
  });

  it('neutralises stored references that could start a formula in both downloads', async () => {
    // References that begin with = + − @ are refused on upload; these are written straight into
    // the table to show that the downloads hold even if one were stored.
    const refs: Record<string, string> = {
      'QB-001': '=HYPERLINK("http://example.invalid","open")',
      'QB-002': '@SUM(A1:A9)',
      'QB-003': '+cmd',
      'QB-010': '−12',
      'QB-020': '-5',
    };
    for (const [from, to] of Object.entries(refs)) {
      await t.db.query(
        'UPDATE care_records SET record_ref = ? WHERE submission_id = ? AND record_ref = ?',
        {
          replacements: [to, submissionId, from],
          type: QueryTypes.UPDATE,
        },
      );
    }
    const expected = [
      '\'=HYPERLINK("http://example.invalid","open")',
      "'@SUM(A1:A9)",
      "'+cmd",
      "'−12",
      '-5',
    ];
    const csv = await own
      .get(`${base()}/recall-list.csv`)
      .query({ measure: 'hba1c_le_53' })
      .expect(200);
    expect(
      csvRows(csv.text)
        .slice(1)
        .map((r) => r[0]),
    ).toEqual(expected);
    const xlsx = await binary(
      own.get(`${base()}/recall-list.xlsx`).query({ measure: 'hba1c_le_53' }),
    ).expect(200);
    expect((await sheetRows(xlsx.body as Buffer, 'Recall list')).slice(1).map((r) => r[0])).toEqual(
      expected,
    );
    // JSON is data, not a spreadsheet: it carries the reference as stored.
    const json = await own
      .get(`${base()}/recall-list`)
      .query({ measure: 'hba1c_le_53' })
      .expect(200);
    expect(json.body.items.map((i: { reference: string }) => i.reference)).toEqual(
      Object.values(refs),
    );
  });
});
