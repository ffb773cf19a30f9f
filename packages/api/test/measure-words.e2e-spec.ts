/**
 * Every text of a measure that people read names measures by their labels, never by key: the
 * measure set, the region benchmark and its funnel, a practice's results, detail and recall
 * list, the outlier list and drill-down, a published report (region and practice parts, data
 * pack) and a practice's digest. The shipped composite target's guideline is written with its parts' keys;
 * what is sent reads their labels.
 */
import { gunzipSync } from 'node:zlib';
import { QueryTypes } from 'sequelize';
import { canonicalJson } from '../src/measure-sets/canonical.js';
import { encodeSnapshot, type ReportSnapshot } from '../src/reports/snapshot.js';
import { arrange, type ExtractsWorld, uploadAndWait } from './extracts-fixtures/api.js';
import { csvOf, goodRows } from './extracts-fixtures/rows.js';
import { binary, cellsOf } from './support/downloads.js';
import { signInAs, type SignedInAgent } from './support/auth.js';
import { createTestApp, type TestApp } from './support/test-app.js';

/** Fields whose text a person reads (identifiers such as `key` and `components` are not). */
const WORDS = new Set([
  'label',
  'definition',
  'denominatorText',
  'source',
  'note',
  'text',
  'title',
  'message',
  'caution',
  'subject',
  'html',
]);

/** Every string under a field people read, anywhere in a JSON body. */
function readTexts(body: unknown, out: string[] = []): string[] {
  if (Array.isArray(body)) {
    for (const item of body) readTexts(item, out);
  } else if (body !== null && typeof body === 'object') {
    for (const [field, value] of Object.entries(body)) {
      if (typeof value === 'string' && WORDS.has(field)) out.push(value);
      else readTexts(value, out);
    }
  }
  return out;
}

/** Every text cell of a workbook. */
async function workbookTexts(bytes: Buffer): Promise<string[]> {
  const sheets = await cellsOf(bytes);
  return Object.values(sheets).flatMap((rows) =>
    rows.flatMap((row) => row.filter((v): v is string => typeof v === 'string')),
  );
}

describe('measure texts', () => {
  let t: TestApp;
  let w: ExtractsWorld;
  let regional: SignedInAgent;
  let auditor: SignedInAgent;
  let q3: number;
  let ov102: number;
  let reportId: number;
  /** Keys that no sentence holds by chance (an underscore or a digit in them) */
  let codeKeys: string[];
  let labels: Map<string, string>;

  beforeAll(async () => {
    t = await createTestApp();
    w = await arrange(t);
    q3 = w.quarter('2026 Q3');
    ov102 = w.practice('OV102');
    regional = await signInAs(t, 'regional_lead');
    auditor = await signInAs(t, 'auditor');
    for (const [code, rows] of [
      ['OV102', 40],
      ['OV201', 25],
    ] as const) {
      const id = w.practice(code);
      const done = await uploadAndWait(regional, id, q3, csvOf(goodRows(rows)), {
        name: `${code}.csv`,
      });
      await regional.post(`/api/practices/${id}/submissions/${done.id}/confirm`).expect(200);
    }
    reportId = (
      await regional
        .post(`/api/quarters/${q3}/reports`)
        .send({ releaseNote: 'Measure texts.' })
        .expect(201)
    ).body.id;
    const set = (await regional.get('/api/measure-sets/cairn-default-2026.1').expect(200)).body;
    const measures = set.measures as { key: string; label: string }[];
    codeKeys = measures.map((m) => m.key).filter((key) => /[_0-9]/.test(key));
    labels = new Map(measures.map((m) => [m.key, m.label]));
  }, 180_000);
  afterAll(async () => {
    await t?.close();
  });

  const rawKeysIn = (texts: string[]) =>
    texts.flatMap((text) =>
      codeKeys
        .filter((key) => new RegExp(`(?<![A-Za-z0-9_])${key}(?![A-Za-z0-9_])`).test(text))
        .map((key) => `${key} in “${text.slice(0, 120)}”`),
    );
  const composite = () =>
    `Cairn composite of “${labels.get('hba1c_le_53')}”, “${labels.get('bp_target')}” and “${labels.get('lipid_managed')}”`;

  it('sends the composite’s guideline in its parts’ labels from the measure set', async () => {
    const set = (await regional.get('/api/measure-sets/cairn-default-2026.1').expect(200)).body;
    const target = set.measures.find((m: { key: string }) => m.key === 'targets_composite');
    expect(target.source).toBe(composite());
    expect(codeKeys).toEqual(expect.arrayContaining(['hba1c_le_53', 'bp_target']));
    expect(rawKeysIn(readTexts(set.measures))).toEqual([]);
  });

  it.each([
    ['the region benchmark', () => `/api/quarters/${q3}/benchmark`],
    ['a measure’s funnel', () => `/api/quarters/${q3}/benchmark/measures/targets_composite`],
    ['the region over time', () => `/api/quarters/${q3}/benchmark/trend?measure=targets_composite`],
    ['a practice’s results', () => `/api/practices/${ov102}/quarters/${q3}/results`],
    ['a practice’s detail', () => `/api/practices/${ov102}/quarters/${q3}/results/detail`],
    [
      'a practice’s recall list',
      () => `/api/practices/${ov102}/quarters/${q3}/recall-list?measure=targets_composite`,
    ],
    ['the report’s region part', () => `/api/reports/${reportId}/region`],
    ['the report’s practice part', () => `/api/reports/${reportId}/practices/${ov102}`],
    ['a digest’s preview', () => `/api/digests/${reportId}/practices/${ov102}/preview`],
  ])('%s holds no measure key in its words', async (_name, path) => {
    const body = (await regional.get(path()).expect(200)).body;
    const texts = readTexts(body);
    expect(texts.length).toBeGreaterThan(0);
    expect(rawKeysIn(texts)).toEqual([]);
  });

  it('the outlier list and drill-down hold no measure key in their words', async () => {
    const list = (await auditor.get(`/api/quarters/${q3}/outliers?level=inner`).expect(200)).body;
    expect(rawKeysIn(readTexts(list))).toEqual([]);
    const drill = (
      await auditor
        .get(`/api/quarters/${q3}/outliers/practices/${ov102}/measures/targets_composite`)
        .expect(200)
    ).body;
    expect(drill.measure.source).toBe(composite());
    expect(rawKeysIn(readTexts(drill))).toEqual([]);
  });

  it('the report’s data pack and the digest as sent read the labels', async () => {
    const pack = await binary(regional.get(`/api/reports/${reportId}/data-pack.xlsx`)).expect(200);
    const cells = await workbookTexts(pack.body as Buffer);
    expect(cells).toContain(composite());
    // Cells of a data pack hold keys as identifiers (a column of keys); the words never do.
    expect(rawKeysIn(cells.filter((c) => c.includes(' ')))).toEqual([]);

    const preview = (
      await regional.get(`/api/digests/${reportId}/practices/${ov102}/preview`).expect(200)
    ).body;
    const html = await regional.get(preview.htmlPath).expect(200);
    expect(rawKeysIn([preview.text, html.text])).toEqual([]);
  });

  it('reads a report frozen with the parts named by key in their labels, its bytes as stored', async () => {
    const [row] = await t.db.query<{ snapshot: Buffer }>(
      'SELECT snapshot FROM reports WHERE id = ?',
      {
        replacements: [reportId],
        type: QueryTypes.SELECT,
      },
    );
    // The snapshot as a report published before composites were named by label holds it.
    const OLD = 'Cairn composite of hba1c_le_53, bp_target and lipid_managed';
    const text = gunzipSync(row!.snapshot).toString('utf8').split(composite()).join(OLD);
    expect(text).toContain(OLD);
    const frozen = encodeSnapshot({
      ...(JSON.parse(text) as ReportSnapshot),
      identity: { ...(JSON.parse(text) as ReportSnapshot).identity, sequence: 90 },
    });
    await t.db.query(
      `INSERT INTO reports (region_id, quarter_id, sequence, measure_set_id, benchmark_result_id,
         submissions_key, submission_count, status, published_at, published_by_user_id, published_by,
         release_note, content_hash, snapshot_bytes, snapshot)
       SELECT region_id, quarter_id, 90, measure_set_id, benchmark_result_id, submissions_key,
         submission_count, 'replaced', published_at, published_by_user_id, published_by,
         release_note, ?, ?, ? FROM reports WHERE id = ?`,
      {
        replacements: [frozen.contentHash, frozen.canonical.length, frozen.stored, reportId],
        type: QueryTypes.INSERT,
      },
    );
    const [old] = await t.db.query<{ id: number }>(
      'SELECT id FROM reports WHERE quarter_id = ? AND sequence = 90',
      { replacements: [q3], type: QueryTypes.SELECT },
    );
    const oldId = Number(old!.id);

    const region = (await regional.get(`/api/reports/${oldId}/region`).expect(200)).body;
    expect(rawKeysIn(readTexts(region))).toEqual([]);
    const part = (await regional.get(`/api/reports/${oldId}/practices/${ov102}`).expect(200)).body;
    expect(rawKeysIn(readTexts(part))).toEqual([]);
    const target = part.results.measures
      .map((m: { measure: { key: string; source: string } }) => m.measure)
      .find((m: { key: string }) => m.key === 'targets_composite');
    expect(target?.source).toBe(composite());
    const pack = await binary(regional.get(`/api/reports/${oldId}/data-pack.xlsx`)).expect(200);
    const cells = Object.values(await cellsOf(pack.body as Buffer)).flat(2);
    expect(cells).toContain(composite());
    expect(cells).not.toContain(OLD);

    // The stored bytes and their hash are as they were inserted.
    const [after] = await t.db.query<{ snapshot: Buffer; content_hash: string }>(
      'SELECT snapshot, content_hash FROM reports WHERE id = ?',
      { replacements: [oldId], type: QueryTypes.SELECT },
    );
    expect(after!.content_hash).toBe(frozen.contentHash);
    expect(gunzipSync(after!.snapshot).toString('utf8')).toContain(OLD);
    expect(canonicalJson(JSON.parse(gunzipSync(after!.snapshot).toString('utf8')))).toBe(
      frozen.canonical.toString('utf8'),
    );
  });
});
