/**
 * Published reports through the API, against extracts uploaded and confirmed
 * here: publishing freezes the draft benchmark (byte-for-byte, whatever is
 * confirmed later), readers by role, republishing, withdrawal, the tombstone,
 * and every bad input refused with nothing stored lost.
 */
import { spawnSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import ExcelJS from 'exceljs';
import { gunzipSync } from 'node:zlib';
import { QueryTypes } from 'sequelize';
import { arrange, type ExtractsWorld, uploadAndWait } from './extracts-fixtures/api.js';
import { csvOf, goodRows, type Row } from './extracts-fixtures/rows.js';
import { binary } from './support/downloads.js';
import { signInAs, type SignedInAgent } from './support/auth.js';
import { createTestApp, type TestApp } from './support/test-app.js';

const Q3 = '2026 Q3';

/** A practice's extract: n clean rows, `off` of them with an HbA1c above every target. */
const rowsOf = (n: number, off: number, from: number): Row[] =>
  goodRows(n, from).map((r, i) => (i < off ? { ...r, hba1c_value: 95 } : r));

async function workbookOf(body: Buffer) {
  const workbook = new ExcelJS.Workbook();
  await workbook.xlsx.load(body as unknown as ArrayBuffer);
  return workbook;
}

function rowsOfSheet(workbook: ExcelJS.Workbook, name: string): unknown[][] {
  const sheet = workbook.getWorksheet(name);
  if (!sheet) throw new Error(`no sheet ${name}`);
  const rows: unknown[][] = [];
  sheet.eachRow((row) => rows.push((row.values as unknown[]).slice(1)));
  return rows;
}

/** The text of a PDF as poppler's pdftotext reads it. */
function pdfText(body: Buffer): string {
  const file = join(mkdtempSync(join(tmpdir(), 'cairn-pdf-')), 'report.pdf');
  writeFileSync(file, body);
  const out = spawnSync('pdftotext', ['-layout', file, '-'], { encoding: 'utf8' });
  if (out.status !== 0) throw new Error(`pdftotext failed: ${out.stderr}`);
  return out.stdout;
}

const pct = (x: number | null) => (x === null ? '–' : `${(x * 100).toFixed(1)} %`);

interface Downloads {
  regionPack: Buffer;
  practicePack: Buffer;
  regionPdf: string;
  practicePdf: string;
  /** Every download as it came, in the order above */
  bytes: Buffer[];
}

describe('reports', () => {
  let t: TestApp;
  let w: ExtractsWorld;
  let regional: SignedInAgent;
  let auditor: SignedInAgent;
  let lead: SignedInAgent;

  const select = <T extends object>(sql: string, replacements: unknown[] = []) =>
    t.db.query<T>(sql, { replacements, type: QueryTypes.SELECT });

  async function confirmExtract(code: string, rows: Row[], name: string) {
    const practice = w.practice(code);
    const done = await uploadAndWait(regional, practice, w.quarter(Q3), csvOf(rows), { name });
    expect(done.status).toBe('awaiting_confirmation');
    await regional.post(`/api/practices/${practice}/submissions/${done.id}/confirm`).expect(200);
    return done.id as number;
  }

  beforeAll(async () => {
    t = await createTestApp();
    w = await arrange(t);
    regional = await signInAs(t, 'regional_lead');
    auditor = await signInAs(t, 'auditor');
    lead = await signInAs(t, 'practice_lead_one');
  });
  afterAll(async () => {
    await t?.close();
  });

  it('refuses to publish a quarter without a confirmed extract, and a blank release note', async () => {
    const empty = await regional
      .post(`/api/quarters/${w.quarter(Q3)}/reports`)
      .send({ releaseNote: 'First report' })
      .expect(409);
    expect(empty.body).toMatchObject({ type: '/api/problems/nothing-to-publish' });
    expect(empty.body.detail).toMatch(/2026 Q3 has no confirmed extract yet/);
    const blank = await regional
      .post(`/api/quarters/${w.quarter(Q3)}/reports`)
      .send({ releaseNote: '   ' })
      .expect(400);
    expect(blank.body.errors).toEqual([
      expect.objectContaining({
        field: 'releaseNote',
        message: 'must not be blank',
      }),
    ]);
    // An empty note is refused by the request's own validation, in the same words.
    const empty2 = await regional
      .post(`/api/quarters/${w.quarter(Q3)}/reports`)
      .send({ releaseNote: '' })
      .expect(400);
    expect(empty2.body.errors).toEqual([
      expect.objectContaining({
        field: 'releaseNote',
        message: 'must not be blank',
      }),
    ]);
    const missing = await regional
      .post(`/api/quarters/${w.quarter(Q3)}/reports`)
      .send({})
      .expect(400);
    expect(missing.body.errors.map((e: { field: string }) => e.field)).toContain('releaseNote');
    const unknown = await regional
      .post('/api/quarters/987654/reports')
      .send({ releaseNote: 'x' })
      .expect(404);
    expect(unknown.body.type).toBe('/api/problems/quarter-not-found');
    expect((await regional.get('/api/reports').expect(200)).body).toEqual({
      reports: [],
      actions: { publish: false },
    });
  });

  describe('a published report', () => {
    let reportId: number;
    let region: Record<string, unknown>;
    let ownPart: Record<string, unknown>;
    let storedBefore: Buffer;
    let before: Downloads;

    async function downloads(id: number): Promise<Downloads> {
      const ov102 = w.practice('OV102');
      const get = async (agent: SignedInAgent, path: string, type: string) => {
        const res = await binary(agent.get(path)).expect(200);
        expect(res.headers['content-type']).toBe(type);
        return res.body as Buffer;
      };
      const XLSX_TYPE = 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet';
      const regionPack = await get(regional, `/api/reports/${id}/data-pack.xlsx`, XLSX_TYPE);
      const practicePack = await get(
        lead,
        `/api/reports/${id}/practices/${ov102}/data-pack.xlsx`,
        XLSX_TYPE,
      );
      const regionPdf = await get(auditor, `/api/reports/${id}/report.pdf`, 'application/pdf');
      const practicePdf = await get(
        lead,
        `/api/reports/${id}/practices/${ov102}/report.pdf`,
        'application/pdf',
      );
      return {
        regionPack,
        practicePack,
        regionPdf: pdfText(regionPdf),
        practicePdf: pdfText(practicePdf),
        bytes: [regionPack, practicePack, regionPdf, practicePdf],
      };
    }

    beforeAll(async () => {
      await confirmExtract('OV101', rowsOf(40, 3, 1), 'ov101.csv');
      await confirmExtract('OV102', rowsOf(30, 12, 100), 'ov102.csv');
      await confirmExtract('OV103', rowsOf(25, 20, 200), 'ov103.csv');
      await confirmExtract('OV201', rowsOf(12, 2, 300), 'ov201.csv');
    }, 120_000);

    it('freezes the draft benchmark with its identity and content hash', async () => {
      const draft = await regional.get(`/api/quarters/${w.quarter(Q3)}/benchmark`).expect(200);
      const res = await regional
        .post(`/api/quarters/${w.quarter(Q3)}/reports`)
        .send({ releaseNote: '  First published report of the quarter.  ' })
        .expect(201);
      reportId = res.body.id;
      expect(res.body).toMatchObject({
        label: '2026 Q3 · report 1',
        sequence: 1,
        quarterLabel: Q3,
        status: 'published',
        publishedBy: regional.user.displayName,
        releaseNote: 'First published report of the quarter.',
        submissionCount: 4,
        replacedBy: null,
        withdrawal: null,
        permalink: `/reports/${reportId}`,
        actions: { withdraw: true, region: true },
      });
      expect(res.body.contentHash).toMatch(/^[0-9a-f]{64}$/);
      expect(res.body.practices.map((p: { code: string }) => p.code)).toEqual(
        expect.arrayContaining(['OV101', 'OV102', 'OV103', 'OV201']),
      );
      region = (await regional.get(`/api/reports/${reportId}/region`).expect(200)).body;
      const splits = region.splits as { split: string; practices: unknown[]; region: unknown[] }[];
      expect(splits.map((s) => s.split)).toEqual(['all', 'type1', 'type2_other']);
      expect(splits[0]!.practices).toEqual(draft.body.practices);
      expect(splits[0]!.region).toEqual(draft.body.region);
      const [row] = await select<{
        snapshot: Buffer;
        content_hash: string;
        snapshot_bytes: number;
      }>('SELECT snapshot, content_hash, snapshot_bytes FROM reports WHERE id = ?', [reportId]);
      storedBefore = row!.snapshot;
      const canonical = gunzipSync(row!.snapshot);
      expect(canonical.length).toBe(row!.snapshot_bytes);
      expect(createHash('sha256').update(canonical).digest('hex')).toBe(res.body.contentHash);
      const parsed = JSON.parse(canonical.toString('utf8'));
      expect(parsed.identity).toMatchObject({
        releaseNote: 'First published report of the quarter.',
        publishedBy: { name: regional.user.displayName },
      });
      expect(parsed.submissions).toHaveLength(4);
    });

    it('shows a practice lead their own practice in full and other practices under disclosure control', async () => {
      const ov102 = w.practice('OV102');
      const report = await lead.get(`/api/reports/${reportId}`).expect(200);
      expect(report.body.practices.map((p: { code: string }) => p.code)).toEqual(['OV102']);
      expect(report.body.actions).toEqual({ withdraw: false, region: false });
      const part = await lead.get(`/api/reports/${reportId}/practices/${ov102}`).expect(200);
      ownPart = part.body;
      expect(part.body.state).toBe('results');
      expect(part.body.results.disclosure).toBe('applied');
      const hba1c = (
        part.body.peers as {
          measure: string;
          rows: { own: boolean; practice: { code: string }; met: { value: number | null } }[];
        }[]
      )[0]!;
      const own = hba1c.rows.find((r) => r.own)!;
      expect(own.practice.code).toBe('OV102');
      expect(own.met.value).not.toBeNull();
      // OV201's 12 people: any of its counts of 1–4 reads "< 5", never the number.
      for (const table of part.body.peers as {
        rows: { own: boolean; met: { value: number | null; display: string } }[];
      }[]) {
        for (const r of table.rows.filter((x) => !x.own)) {
          if (r.met.value !== null) expect(r.met.value === 0 || r.met.value >= 5).toBe(true);
        }
      }
      // Everyone reads a practice's part as its leads do; the region's figures are in the region part.
      const same = await regional.get(`/api/reports/${reportId}/practices/${ov102}`).expect(200);
      expect(same.body.results).toEqual(part.body.results);
      expect((await lead.get(`/api/reports/${reportId}/region`).expect(403)).body.type).toBe(
        '/api/problems/role-not-allowed',
      );
      expect(
        (await lead.get(`/api/reports/${reportId}/practices/${w.practice('OV103')}`).expect(403))
          .body.type,
      ).toBe('/api/problems/practice-not-yours');
      expect(
        (await lead.get(`/api/quarters/${w.quarter(Q3)}/benchmark`).expect(403)).body.type,
      ).toBe('/api/problems/role-not-allowed');
      await auditor.get(`/api/reports/${reportId}/region`).expect(200);
    });

    it('hands out a data pack that reads back as the report’s figures', async () => {
      before = await downloads(reportId);
      const region = await workbookOf(before.regionPack);
      expect(region.worksheets.map((ws) => ws.name)).toEqual([
        'About',
        'Region',
        'Measures by practice',
        'Funnel data',
        'Breakdowns',
        'Trends',
      ]);
      const about = new Map(rowsOfSheet(region, 'About').map((r) => [r[0], r[1]]));
      expect(about.get('Content hash (SHA-256)')).toMatch(/^[0-9a-f]{64}$/);
      expect(about.get('Release note')).toBe('First published report of the quarter.');
      expect(String(about.get('Caution'))).toMatch(/not clinical advice/);
      const regionDto = (await regional.get(`/api/reports/${reportId}/region`).expect(200)).body;
      const measures = regionDto.splits[0].measures as { key: string; source: string }[];
      const aboutRows = rowsOfSheet(region, 'About');
      for (const m of measures) {
        expect(aboutRows.some((r) => r[0] === m.key && r[6] === m.source)).toBe(true);
      }
      // Measures by practice: exactly the protected tables, numbers as numbers.
      const byPractice = rowsOfSheet(region, 'Measures by practice').slice(1);
      const expected = (
        regionDto.peerTables as {
          measure: string;
          rows: {
            practice: { code: string };
            met: { value: number | null; display: string };
            n: { value: number | null; display: string };
            rate: number | null;
          }[];
          met: { value: number | null; display: string };
          n: { value: number | null; display: string };
          rate: number | null;
        }[]
      ).flatMap((t) => [
        ...t.rows.map((r) => [
          r.practice.code,
          t.measure,
          r.met.value ?? r.met.display,
          r.n.value ?? r.n.display,
          r.rate ?? undefined,
        ]),
        [
          'Region',
          t.measure,
          t.met.value ?? t.met.display,
          t.n.value ?? t.n.display,
          t.rate ?? undefined,
        ],
      ]);
      expect(byPractice.map((r) => [r[0], r[3], r[5], r[7], r[8] ?? undefined])).toEqual(expected);
      expect(byPractice.some((r) => typeof r[5] === 'number' && typeof r[8] === 'number')).toBe(
        true,
      );
      const sheet = region.getWorksheet('Measures by practice')!;
      expect(sheet.views[0]).toMatchObject({ state: 'frozen', ySplit: 1 });
      expect(sheet.autoFilter).toBe('A1:I1');
      expect(sheet.getCell('I2').numFmt).toBe('0.0%');

      // The practice's pack: its own results in full, as its part of the report says.
      const practice = await workbookOf(before.practicePack);
      const results = rowsOfSheet(practice, 'Your results').slice(1);
      const own = (
        ownPart.results as {
          measures: {
            measure: { key: string };
            splits: { split: string; own: { events: number; n: number; rate: number | null } }[];
          }[];
        }
      ).measures.flatMap((m) =>
        m.splits.map((x) => [m.measure.key, x.own.events, x.own.n, x.own.rate ?? undefined]),
      );
      expect(results.map((r) => [r[0], r[3], r[4], r[5] ?? undefined])).toEqual(own);
    });

    it('makes PDFs whose text holds the figures', async () => {
      const results = (
        ownPart.results as {
          measures: {
            measure: { label: string };
            splits: { split: string; own: { events: number; n: number; rate: number | null } }[];
          }[];
        }
      ).measures;
      const text = before.practicePdf.replace(/\s+/g, ' ');
      expect(text).toContain('OV102');
      expect(text).toContain((ownPart.report as { contentHash: string }).contentHash);
      expect(text).toMatch(/not clinical advice/);
      expect(text).toMatch(/Page 1 of \d+/);
      for (const m of results) {
        const all = m.splits.find((x) => x.split === 'all')!;
        expect(text).toMatch(new RegExp(`\\b${all.own.events} ?/ ?${all.own.n}\\b`));
        expect(text).toContain(pct(all.own.rate));
      }
      expect(before.regionPdf.replace(/\s+/g, ' ')).toMatch(/Funnel plots/);
    });

    it('says which practices had no results when it was published', async () => {
      const ov303 = w.practice('OV303');
      const res = await regional.get(`/api/reports/${reportId}/practices/${ov303}`).expect(200);
      expect(res.body).toMatchObject({ state: 'not-in-report', results: null, peers: [] });
      expect(res.body.message).toMatch(/OV303 had no confirmed extract for 2026 Q3/);
      const pack = await regional
        .get(`/api/reports/${reportId}/practices/${ov303}/data-pack.xlsx`)
        .expect(404);
      expect(pack.body.type).toBe('/api/problems/practice-not-in-report');
    });

    it('does not change when a new extract is confirmed for one of its practices', async () => {
      const draftBefore = await regional
        .get(`/api/quarters/${w.quarter(Q3)}/benchmark`)
        .expect(200);
      await confirmExtract('OV102', rowsOf(30, 0, 100), 'ov102-again.csv');
      const after = await regional.get(`/api/quarters/${w.quarter(Q3)}/benchmark`).expect(200);
      expect(after.body.builtFrom.resultId).not.toBe(draftBefore.body.builtFrom.resultId);
      expect((await regional.get(`/api/reports/${reportId}/region`).expect(200)).body).toEqual(
        region,
      );
      expect(
        (await lead.get(`/api/reports/${reportId}/practices/${w.practice('OV102')}`).expect(200))
          .body,
      ).toEqual(ownPart);
      const [row] = await select<{ snapshot: Buffer }>(
        'SELECT snapshot FROM reports WHERE id = ?',
        [reportId],
      );
      expect(row!.snapshot.equals(storedBefore)).toBe(true);
      const again = await downloads(reportId);
      // The same bytes on every request, before and after the new confirm.
      const repeat = await downloads(reportId);
      for (const [i, bytes] of before.bytes.entries()) {
        expect(again.bytes[i]!.equals(bytes)).toBe(true);
        expect(repeat.bytes[i]!.equals(bytes)).toBe(true);
      }
      expect(again.regionPdf).toBe(before.regionPdf);
      expect(again.practicePdf).toBe(before.practicePdf);
      for (const [a, b] of [
        [again.regionPack, before.regionPack],
        [again.practicePack, before.practicePack],
      ] as const) {
        const [x, y] = [await workbookOf(a), await workbookOf(b)];
        for (const ws of y.worksheets)
          expect(rowsOfSheet(x, ws.name)).toEqual(rowsOfSheet(y, ws.name));
      }
    });

    it('refuses any change to what was published, and deletion', async () => {
      await expect(
        t.db.query("UPDATE reports SET release_note = 'changed' WHERE id = ?", {
          replacements: [reportId],
          type: QueryTypes.UPDATE,
        }),
      ).rejects.toThrow(/a published report cannot be changed/);
      await expect(
        t.db.query('DELETE FROM reports WHERE id = ?', {
          replacements: [reportId],
          type: QueryTypes.DELETE,
        }),
      ).rejects.toThrow(/withdraw a report instead/);
    });

    it('is replaced by a republished report and stays readable', async () => {
      const res = await regional
        .post(`/api/quarters/${w.quarter(Q3)}/reports`)
        .send({ releaseNote: '=HYPERLINK("x") OV102 sent a corrected extract.' })
        .expect(201);
      const pack = await workbookOf(
        (await binary(regional.get(`/api/reports/${res.body.id}/data-pack.xlsx`)).expect(200))
          .body as Buffer,
      );
      const note = rowsOfSheet(pack, 'About').find((r) => r[0] === 'Release note');
      expect(note?.[1]).toBe(`'=HYPERLINK("x") OV102 sent a corrected extract.`);
      expect(res.body).toMatchObject({ label: '2026 Q3 · report 2', status: 'published' });
      expect(res.body.contentHash).not.toBe(
        region.report && (region.report as { contentHash: string }).contentHash,
      );
      const old = await regional.get(`/api/reports/${reportId}`).expect(200);
      expect(old.body).toMatchObject({
        status: 'replaced',
        replacedBy: { id: res.body.id, label: '2026 Q3 · report 2' },
      });
      const oldRegion = (await regional.get(`/api/reports/${reportId}/region`).expect(200)).body;
      expect(oldRegion.splits).toEqual(region.splits);
      const list = await lead.get(`/api/reports?quarterId=${w.quarter(Q3)}`).expect(200);
      expect(list.body.reports.map((r: { id: number }) => r.id)).toEqual([res.body.id, reportId]);
      expect(list.body.actions).toEqual({ publish: false });
      expect(
        (await regional.get(`/api/reports?quarterId=${w.quarter(Q3)}`).expect(200)).body.actions,
      ).toEqual({ publish: true });
      const overview = await regional.get('/api/quarter-overview').expect(200);
      expect(JSON.stringify(overview.body)).toContain('2026 Q3 · report 2');
      const events = await select<{ action: string }>(
        "SELECT action FROM audit_events WHERE action LIKE 'report.%' ORDER BY id",
      );
      expect(events.map((e) => e.action)).toEqual(['report.published', 'report.published']);
    });

    it('is withdrawn with a reason and leaves a tombstone', async () => {
      const blank = await regional
        .post(`/api/reports/${reportId}/withdraw`)
        .send({ reason: ' ' })
        .expect(400);
      expect(blank.body.errors).toEqual([
        expect.objectContaining({ field: 'reason', message: 'must not be blank' }),
      ]);
      expect((await regional.get(`/api/reports/${reportId}`).expect(200)).body.status).toBe(
        'replaced',
      );
      await lead.post(`/api/reports/${reportId}/withdraw`).send({ reason: 'x' }).expect(403);
      const res = await regional
        .post(`/api/reports/${reportId}/withdraw`)
        .send({ reason: 'An extract held the wrong quarter.' })
        .expect(200);
      expect(res.body).toMatchObject({
        status: 'withdrawn',
        withdrawal: { by: regional.user.displayName, reason: 'An extract held the wrong quarter.' },
        practices: [],
        actions: { withdraw: false, region: false },
      });
      const gone = await regional.get(`/api/reports/${reportId}/region`).expect(410);
      expect(gone.body).toMatchObject({ type: '/api/problems/report-withdrawn' });
      expect(gone.body.detail).toMatch(/An extract held the wrong quarter\./);
      await lead.get(`/api/reports/${reportId}/practices/${w.practice('OV102')}`).expect(410);
      await regional.get(`/api/reports/${reportId}/data-pack.xlsx`).expect(410);
      await lead
        .get(`/api/reports/${reportId}/practices/${w.practice('OV102')}/report.pdf`)
        .expect(410);
      const again = await regional
        .post(`/api/reports/${reportId}/withdraw`)
        .send({ reason: 'twice' })
        .expect(409);
      expect(again.body.type).toBe('/api/problems/report-withdrawn');
      const [row] = await select<{ snapshot: Buffer; withdrawn_reason: string }>(
        'SELECT snapshot, withdrawn_reason FROM reports WHERE id = ?',
        [reportId],
      );
      expect(row!.snapshot.equals(storedBefore)).toBe(true);
      expect(row!.withdrawn_reason).toBe('An extract held the wrong quarter.');
      expect((await regional.get('/api/reports/987654').expect(404)).body.type).toBe(
        '/api/problems/report-not-found',
      );
    });
  });
});
