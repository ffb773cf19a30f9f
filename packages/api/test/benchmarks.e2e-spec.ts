/**
 * Results and benchmarks through the API, on extracts uploaded and confirmed
 * here (the demo organisation; audit quarters 2026 Q1 closed, Q2 closed, Q3
 * open):
 *
 *   practice  2026 Q2       2026 Q3
 *   OV102     40 records    40 records (better HbA1c completion than in Q2)
 *   OV103     —             60 records
 *   OV201     —             25 records, half without an HbA1c
 *
 * What is checked: a confirmed submission has its sums, equal to sums made by
 * the plain per-record path from the same stored records; every response says
 * what it was built from, and the key is that of the current set read here;
 * one stored result per set; a second API process on the same database serves
 * the same stored result, and fills sums that are missing or unreadable from
 * the records; a full recompute gives a stored benchmark byte for byte equal
 * to the incremental one; the practice page's figures agree with the region
 * table; empty states; bad input answered with problem details and nothing
 * stored lost.
 */
import { createHash } from 'node:crypto';
import { createColumnBuilder, encodeSums, sumsLayout, sumsOfColumns } from '@cairn/metrics';
import type { NestExpressApplication } from '@nestjs/platform-express';
import { QueryTypes } from 'sequelize';
import request from 'supertest';
import { createApp } from '../src/app.factory.js';
import { BenchmarkStore } from '../src/benchmarks/benchmark-store.service.js';
import { recomputeResults } from '../src/benchmarks/recompute-command.js';
import { createRootLogger } from '../src/common/logger.js';
import { MeasureSetsService } from '../src/measure-sets/measure-sets.service.js';
import { QuartersService } from '../src/quarters/quarters.service.js';
import { SubmissionsService } from '../src/submissions/submissions.service.js';
import { arrange, type ExtractsWorld, uploadAndWait } from './extracts-fixtures/api.js';
import { csvOf, goodRows } from './extracts-fixtures/rows.js';
import { signInAs, type SignedInAgent } from './support/auth.js';
import { createTestApp, type TestApp } from './support/test-app.js';

const MEASURE_SET = 'cairn-default-2026.1';

describe('results and benchmarks', () => {
  let t: TestApp;
  let w: ExtractsWorld;
  let regional: SignedInAgent;
  let auditor: SignedInAgent;
  let leadOne: SignedInAgent;
  let q1: number;
  let q2: number;
  let q3: number;
  const confirmed = new Map<string, number>();

  const select = <T extends object>(sql: string, replacements: unknown[] = []) =>
    t.db.query<T>(sql, { replacements, type: QueryTypes.SELECT });

  async function confirm(code: string, quarterId: number, rows: ReturnType<typeof goodRows>) {
    const practiceId = w.practice(code);
    const done = await uploadAndWait(regional, practiceId, quarterId, csvOf(rows), {
      name: `${code}.csv`,
    });
    expect(done.status).toBe('awaiting_confirmation');
    await regional.post(`/api/practices/${practiceId}/submissions/${done.id}/confirm`).expect(200);
    confirmed.set(`${code}/${quarterId}`, done.id);
    return done.id as number;
  }

  /** The key of the quarter's current set, read here from the pointers. */
  async function currentKey(quarterId: number): Promise<{ key: string; count: number }> {
    const rows = await select<{ id: number }>(
      'SELECT current_submission_id AS id FROM practice_quarters WHERE quarter_id = ? AND current_submission_id IS NOT NULL',
      [quarterId],
    );
    const ids = rows.map((r) => Number(r.id)).sort((a, b) => a - b);
    return { key: createHash('sha256').update(ids.join(',')).digest('hex'), count: ids.length };
  }

  const counts = async () => {
    const [r] = await select<{ results: number; sums: number }>(
      'SELECT (SELECT COUNT(*) FROM benchmark_results) AS results, (SELECT COUNT(*) FROM submission_sums) AS sums',
    );
    return { results: Number(r!.results), sums: Number(r!.sums) };
  };

  beforeAll(async () => {
    t = await createTestApp();
    w = await arrange(t, ['2026 Q1', '2026 Q2', '2026 Q3']);
    q1 = w.quarter('2026 Q1');
    q2 = w.quarter('2026 Q2');
    q3 = w.quarter('2026 Q3');
    regional = await signInAs(t, 'regional_lead');
    auditor = await signInAs(t, 'auditor');
    leadOne = await signInAs(t, 'practice_lead_one');
    // 2026 Q2's review window is 2025-07 … 2026-06: the rows' dates lie in it too.
    await confirm(
      'OV102',
      q2,
      goodRows(40).map((r, i) => (i % 2 ? { ...r, hba1c_date: null, hba1c_value: null } : r)),
    );
    await confirm('OV102', q3, goodRows(40));
    await confirm('OV103', q3, goodRows(60, 100));
    await confirm(
      'OV201',
      q3,
      goodRows(25, 300).map((r, i) => (i % 2 ? { ...r, hba1c_date: null, hba1c_value: null } : r)),
    );
  }, 300_000);
  afterAll(async () => {
    await t?.close();
  });

  describe('sums at confirm', () => {
    it('stores every confirmed submission’s sums under its quarter’s measure set', async () => {
      const rows = await select<{ submission_id: number; measure_set_id: string; records: number }>(
        'SELECT submission_id, measure_set_id, records FROM submission_sums ORDER BY submission_id',
      );
      expect(
        rows.map((r) => [Number(r.submission_id), r.measure_set_id, Number(r.records)]),
      ).toEqual([
        [confirmed.get(`OV102/${q2}`), MEASURE_SET, 40],
        [confirmed.get(`OV102/${q3}`), MEASURE_SET, 40],
        [confirmed.get(`OV103/${q3}`), MEASURE_SET, 60],
        [confirmed.get(`OV201/${q3}`), MEASURE_SET, 25],
      ]);
    });

    it('makes the same bytes as sums of the same stored records read one by one', async () => {
      const submissions = t.app.get(SubmissionsService);
      const version = await t.app.get(MeasureSetsService).get(MEASURE_SET);
      const id = confirmed.get(`OV103/${q3}`)!;
      const builder = createColumnBuilder({ practiceCodes: ['OV103'] });
      for await (const batch of submissions.records({ id, practiceCode: 'OV103' }, 7)) {
        for (const stored of batch) builder.append(stored.record);
      }
      const expected = encodeSums(
        sumsOfColumns(builder.finish(), sumsLayout(version.compiled), {
          year: 2026,
          quarter: 3,
        }).get('OV103')!,
      );
      const [row] = await select<{ bytes: Buffer }>(
        'SELECT bytes FROM submission_sums WHERE submission_id = ?',
        [id],
      );
      expect(Buffer.from(expected).equals(row!.bytes)).toBe(true);
    });
  });

  describe('the region benchmark', () => {
    it('says what it was built from: the current set read here', async () => {
      const res = await regional.get(`/api/quarters/${q3}/benchmark`).expect(200);
      const { key, count } = await currentKey(q3);
      expect(res.body.state).toBe('results');
      expect(res.body.builtFrom).toMatchObject({
        quarterId: q3,
        quarterLabel: '2026 Q3',
        measureSetId: MEASURE_SET,
        submissions: count,
        submissionsKey: key,
      });
      expect(count).toBe(3);
      expect(
        res.body.practices.map((p: { practice: { code: string } }) => p.practice.code),
      ).toEqual(['OV102', 'OV103', 'OV201']);
      // Every other active practice is missing, not a row of zeros.
      expect(res.body.coverage.withSubmission).toBe(3);
      expect(res.body.coverage.missing).toHaveLength(res.body.coverage.practices - 3);
      expect(res.body.coverage.missing.map((p: { code: string }) => p.code)).toContain('OV303');
      const measures = res.body.measures.map((m: { key: string }) => m.key);
      for (const row of res.body.practices) {
        expect(row.cells.map((c: { measure: string }) => c.measure)).toEqual(measures);
      }
      expect(res.body.region.map((r: { measure: string }) => r.measure)).toEqual(measures);
    });

    it('counts what the records say: HbA1c done for every OV102 record, half of OV201’s', async () => {
      const res = await auditor.get(`/api/quarters/${q3}/benchmark`).expect(200);
      const cellOf = (code: string, measure: string) =>
        res.body.practices
          .find((p: { practice: { code: string } }) => p.practice.code === code)
          .cells.find((c: { measure: string }) => c.measure === measure);
      expect(cellOf('OV102', 'hba1c')).toMatchObject({ n: 40, events: 40, rate: 1 });
      expect(cellOf('OV201', 'hba1c')).toMatchObject({ n: 25, events: 13 });
      const region = res.body.region.find((r: { measure: string }) => r.measure === 'hba1c');
      expect(region).toMatchObject({ n: 125, events: 113 });
      expect(region.theta0).toBeCloseTo(113 / 125, 12);
      expect(cellOf('OV201', 'hba1c').exact).toEqual({
        band: 'outlier',
        side: 'below',
        assessment: 'worse',
      });
    });

    it('filters by locality and keeps the region’s statistics', async () => {
      const all = await regional.get(`/api/quarters/${q3}/benchmark`).expect(200);
      const res = await regional
        .get(`/api/quarters/${q3}/benchmark`)
        .query({ locality: 'CND', split: 'type2_other' })
        .expect(200);
      expect(res.body.locality).toEqual({ code: 'CND', name: 'Cindermere' });
      expect(res.body.split).toBe('type2_other');
      expect(
        res.body.practices.map((p: { practice: { code: string } }) => p.practice.code),
      ).toEqual(['OV201']);
      expect(res.body.builtFrom.resultId).toBe(all.body.builtFrom.resultId);
    });

    it('pages the practices: each page with the region’s figures, together the whole list', async () => {
      const all = await regional.get(`/api/quarters/${q3}/benchmark`).expect(200);
      const codes = (body: { practices: { practice: { code: string } }[] }) =>
        body.practices.map((p) => p.practice.code);
      expect(all.body.page).toEqual({
        page: 1,
        pageSize: 100,
        pages: 1,
        total: all.body.practices.length,
      });
      const pages = [];
      for (let page = 1; page <= Math.ceil(all.body.practices.length / 2); page++) {
        const res = await regional
          .get(`/api/quarters/${q3}/benchmark`)
          .query({ page, pageSize: 2 })
          .expect(200);
        expect(res.body.page).toMatchObject({
          page,
          pageSize: 2,
          total: all.body.practices.length,
        });
        expect(res.body.builtFrom).toEqual(all.body.builtFrom);
        expect(res.body.region).toEqual(all.body.region);
        expect(res.body.coverage).toEqual(all.body.coverage);
        pages.push(...res.body.practices);
      }
      expect(pages).toEqual(all.body.practices);
      expect(codes({ practices: pages })).toEqual(codes(all.body));
    });

    it('keeps one stored result per set, and a new one when the set changes', async () => {
      const first = await regional.get(`/api/quarters/${q3}/benchmark`).expect(200);
      const again = await regional
        .get(`/api/quarters/${q3}/benchmark/measures/bp_target`)
        .expect(200);
      expect(again.body.builtFrom).toEqual(first.body.builtFrom);
      const before = await counts();
      await confirm('OV104', q3, goodRows(30, 500));
      const after = await regional.get(`/api/quarters/${q3}/benchmark`).expect(200);
      expect(after.body.builtFrom.submissions).toBe(4);
      expect(after.body.builtFrom.resultId).not.toBe(first.body.builtFrom.resultId);
      expect(after.body.builtFrom.submissionsKey).toBe((await currentKey(q3)).key);
      expect(await counts()).toEqual({ results: before.results + 1, sums: before.sums + 1 });
    });

    it('rebuilds the set after a confirm from the previous result: the bytes of a recompute from records', async () => {
      const store = t.app.get(BenchmarkStore);
      const submissions = t.app.get(SubmissionsService);
      await store.resultOf((await t.app.get(QuartersService).find(q3))!);
      const replaced = confirmed.get(`OV103/${q3}`)!;
      const calls: number[][] = [];
      const read = submissions.sumsOfCurrent.bind(submissions);
      submissions.sumsOfCurrent = (subjects, version, at) => {
        calls.push(subjects.map((s) => s.submissionId).sort((a, b) => a - b));
        return read(subjects, version, at);
      };
      let id: number;
      try {
        id = await confirm('OV103', q3, goodRows(45, 700));
        const result = await store.resultOf((await t.app.get(QuartersService).find(q3))!);
        expect(result!.key).toBe((await currentKey(q3)).key);
      } finally {
        submissions.sumsOfCurrent = read;
      }
      // Only the replaced submission's sums and the new one's were read, not every practice's.
      expect(calls).toEqual([[replaced, id].sort((a, b) => a - b)]);
      const [stored] = await select<{ body: Buffer }>(
        'SELECT body FROM benchmark_results WHERE quarter_id = ? AND submissions_key = ?',
        [q3, (await currentKey(q3)).key],
      );
      const recomputed = await store.recompute((await t.app.get(QuartersService).find(q3))!);
      expect(recomputed.body!.equals(stored!.body)).toBe(true);
    });

    it('answers a quarter without accepted submissions with an empty state', async () => {
      const res = await regional.get(`/api/quarters/${q1}/benchmark`).expect(200);
      expect(res.body).toMatchObject({
        state: 'no-accepted-submissions',
        builtFrom: null,
        practices: [],
        region: [],
        coverage: { withSubmission: 0 },
      });
      expect(res.body.coverage.missing).toHaveLength(res.body.coverage.practices);
      const funnel = await regional.get(`/api/quarters/${q1}/benchmark/measures/hba1c`).expect(200);
      expect(funnel.body).toMatchObject({
        state: 'no-accepted-submissions',
        points: [],
        curves: null,
      });
    });
  });

  describe('one measure’s funnel and the trend', () => {
    it('gives every point with its limits, and the curves', async () => {
      const res = await regional
        .get(`/api/quarters/${q3}/benchmark/measures/hba1c`)
        .query({ split: 'all' })
        .expect(200);
      expect(res.body.measure.key).toBe('hba1c');
      expect(res.body.points.length).toBe(res.body.builtFrom.submissions);
      for (const p of res.body.points) {
        expect(p.exact.outer.lower).toBeLessThanOrEqual(p.exact.inner.lower);
        expect(p.exact.inner.upper).toBeLessThanOrEqual(p.exact.outer.upper);
      }
      expect(res.body.curves.n.length).toBeGreaterThan(1);
      expect(res.body.curves.exact.innerLower).toHaveLength(res.body.curves.n.length);
      expect(res.body.overdispersion).toEqual(
        expect.objectContaining({ phi: expect.any(Number), present: expect.any(Boolean) }),
      );
    });

    it('follows the region and every practice over the quarters, gaps as gaps', async () => {
      const res = await regional
        .get(`/api/quarters/${q3}/benchmark/trend`)
        .query({ measure: 'hba1c' })
        .expect(200);
      expect(res.body.quarters.map((q: { quarterLabel: string }) => q.quarterLabel)).toEqual([
        '2026 Q1',
        '2026 Q2',
        '2026 Q3',
      ]);
      const series = (code: string) =>
        res.body.practices.find((p: { practice: { code: string } }) => p.practice.code === code)
          .trend.points;
      expect(
        series('OV102').map((p: { state: string; rate: number | null }) => [p.state, p.rate]),
      ).toEqual([
        ['no-submission', null],
        ['value', 0.5],
        ['value', 1],
      ]);
      expect(series('OV303').every((p: { state: string }) => p.state === 'no-submission')).toBe(
        true,
      );
      expect(res.body.region.points[0]).toMatchObject({ state: 'no-submission', rate: null });
    });
  });

  describe('a practice’s results', () => {
    it('gives its own figures, the region’s and its trend, under disclosure control for its lead', async () => {
      const res = await leadOne
        .get(`/api/practices/${w.practice('OV102')}/quarters/${q3}/results`)
        .expect(200);
      const table = await regional.get(`/api/quarters/${q3}/benchmark`).expect(200);
      expect(res.body.state).toBe('results');
      expect(res.body.disclosure).toBe('applied');
      expect(res.body.builtFrom).toEqual(table.body.builtFrom);
      expect(res.body.submission.id).toBe(confirmed.get(`OV102/${q3}`));
      const hba1c = res.body.measures.find(
        (m: { measure: { key: string } }) => m.measure.key === 'hba1c',
      );
      const all = hba1c.splits.find((s: { split: string }) => s.split === 'all');
      const cell = table.body.practices
        .find((p: { practice: { code: string } }) => p.practice.code === 'OV102')
        .cells.find((c: { measure: string }) => c.measure === 'hba1c');
      expect(all.own).toMatchObject({ n: cell.n, events: cell.events, rate: cell.rate });
      expect(all.own.exact).toMatchObject(cell.exact);
      const region = table.body.region.find((r: { measure: string }) => r.measure === 'hba1c');
      expect(all.region).toMatchObject({ rate: region.theta0, median: region.median });
      expect(all.change).toMatchObject({ previousQuarterLabel: '2026 Q2', previousRate: 0.5 });
      expect(all.change.difference).toBeCloseTo(0.5, 12);
      expect(res.body.quarters.map((q: { quarterLabel: string }) => q.quarterLabel)).toEqual([
        '2026 Q1',
        '2026 Q2',
        '2026 Q3',
      ]);
      expect(all.trend.points.map((p: { rate: number | null }) => p.rate)).toEqual([null, 0.5, 1]);
      // Peers are unnamed points; OV104's 30 records are shown, nothing names a practice.
      expect(JSON.stringify(all.peers)).not.toMatch(/OV\d/);
      expect(all.peers.n.length + all.peers.withheld).toBe(res.body.builtFrom.submissions - 1);
      // The detail is on its own route, not in the results.
      expect(res.body).not.toHaveProperty('detail');
      expect(res.body.dataQuality.map((d: { code: string }) => d.code)).toEqual([
        'type1_not_on_insulin',
        'diagnostic_below_threshold',
      ]);
    });

    it('gives its detail on its own route, built from the same stored result as its results', async () => {
      const path = `/api/practices/${w.practice('OV102')}/quarters/${q3}/results`;
      const results = await leadOne.get(path).expect(200);
      const res = await leadOne.get(`${path}/detail`).expect(200);
      expect(res.body).toMatchObject({
        state: 'results',
        disclosure: 'applied',
        practice: results.body.practice,
        quarter: results.body.quarter,
        builtFrom: results.body.builtFrom,
        caution: results.body.caution,
      });
      expect(res.body.detail.kidney.rows).toContain('G3a');
      expect(res.body.detail.progression.ruleOfThumbYears).toBe(7);
      expect(res.body.detail.measures.map((m: { measure: string }) => m.measure)).toEqual(
        results.body.measures.map((m: { measure: { key: string } }) => m.measure.key),
      );
      // The same figures as the practice's results: everyone of a split is its own n and events.
      for (const m of results.body.measures as {
        measure: { key: string };
        splits: { split: string; own: { n: number; events: number } }[];
      }[]) {
        const detail = res.body.detail.measures.find(
          (d: { measure: string }) => d.measure === m.measure.key,
        );
        for (const s of m.splits) {
          const everyone = detail.splits.find((d: { split: string }) => d.split === s.split)
            .everyone.practice;
          expect([everyone.n, everyone.events]).toEqual([s.own.n, s.own.events]);
        }
      }
    });

    it('sends the detail with an ETag, and 304 to a reader who has it', async () => {
      const path = `/api/practices/${w.practice('OV102')}/quarters/${q3}/results/detail`;
      const first = await leadOne.get(path).expect(200);
      const etag = first.headers.etag as string;
      // The gzip form's tag: the test agent accepts gzip.
      expect(etag).toMatch(/^"[0-9a-f]{64}-gzip"$/);
      const again = await leadOne.get(path).set('If-None-Match', etag).expect(304);
      expect(again.headers.etag).toBe(etag);
      // Another reader's view (no disclosure control) is another answer.
      const audit = await auditor.get(path).expect(200);
      expect(audit.headers.etag).not.toBe(etag);
      // The results answer is another answer too.
      const results = await leadOne
        .get(`/api/practices/${w.practice('OV102')}/quarters/${q3}/results`)
        .expect(200);
      expect(results.headers.etag).not.toBe(etag);
    });

    it('suppresses small region counts for a practice lead, and not for the auditor', async () => {
      const path = `/api/practices/${w.practice('OV102')}/quarters/${q3}/results/detail`;
      const lead = await leadOne.get(path).expect(200);
      const audit = await auditor.get(path).expect(200);
      expect(audit.body.disclosure).toBe('none');
      const cells = (body: {
        detail: {
          measures: {
            splits: {
              breakdowns: {
                cells: { region: { n: { value: number | null; display: string } } }[];
              }[];
            }[];
          }[];
        };
      }) =>
        body.detail.measures.flatMap((m) =>
          m.splits.flatMap((s) => s.breakdowns.flatMap((b) => b.cells.map((c) => c.region.n))),
        );
      const shown = cells(lead.body);
      const all = cells(audit.body);
      expect(shown).toHaveLength(all.length);
      let suppressed = 0;
      shown.forEach((n, i) => {
        if (n.value === null) {
          suppressed++;
          expect(['< 5', 'withheld']).toContain(n.display);
        } else expect(n.value).toBe(all[i]!.value);
      });
      expect(suppressed).toBeGreaterThan(0);
      expect(all.every((n) => n.value !== null)).toBe(true);
    });

    it('says when the practice has no confirmed extract, with the upload action its reader has', async () => {
      const path = `/api/practices/${w.practice('OV303')}/quarters/${q3}/results`;
      const lead = await regional.get(path).expect(200);
      expect(lead.body).toMatchObject({
        state: 'no-current-submission',
        measures: [],
        builtFrom: null,
        actions: {
          upload: true,
          uploadPath: `/extracts/upload?practice=${w.practice('OV303')}&quarter=${q3}`,
        },
      });
      expect(lead.body.message).toMatch(/no confirmed extract for 2026 Q3/);
      const audit = await auditor.get(path).expect(200);
      expect(audit.body.actions).toEqual({ upload: false, uploadPath: null });
      const detail = await regional.get(`${path}/detail`).expect(200);
      expect(detail.body).toMatchObject({
        state: 'no-current-submission',
        practice: { code: 'OV303' },
        builtFrom: null,
        detail: null,
      });
      expect(detail.body.caution).toBe(lead.body.caution);
    });
  });

  describe('bad input', () => {
    it.each([
      [
        'an unknown quarter',
        () => `/api/quarters/999999/benchmark`,
        404,
        'quarter-not-found',
        /999999/,
      ],
      [
        'an unknown measure',
        () => `/api/quarters/${q3}/benchmark/measures/nope`,
        404,
        'measure-not-found',
        /"nope"/,
      ],
      [
        'an unknown measure in a trend',
        () => `/api/quarters/${q3}/benchmark/trend?measure=nope`,
        404,
        'measure-not-found',
        /"nope"/,
      ],
      [
        'an unknown locality',
        () => `/api/quarters/${q3}/benchmark?locality=ZZZ`,
        404,
        'locality-not-found',
        /"ZZZ"/,
      ],
      [
        'an unknown quarter of a practice',
        () => `/api/practices/${w.practice('OV102')}/quarters/999999/results`,
        404,
        'quarter-not-found',
        /999999/,
      ],
      [
        'an unknown quarter of a practice’s detail',
        () => `/api/practices/${w.practice('OV102')}/quarters/999999/results/detail`,
        404,
        'quarter-not-found',
        /999999/,
      ],
    ])('answers %s with problem details naming it', async (_what, path, status, type, detail) => {
      const before = await counts();
      const res = await regional.get(path()).expect(status);
      expect(res.body.type).toBe(`/api/problems/${type}`);
      expect(res.body.detail).toMatch(detail);
      expect(await counts()).toEqual(before);
    });

    it.each([
      ['a bad split', () => `/api/quarters/${q3}/benchmark?split=type3`, 'split'],
      [
        'a bad split of a funnel',
        () => `/api/quarters/${q3}/benchmark/measures/hba1c?split=all,type1`,
        'split',
      ],
      ['a trend without a measure', () => `/api/quarters/${q3}/benchmark/trend`, 'measure'],
      [
        'a locality that is not a code',
        () => `/api/quarters/${q3}/benchmark?locality=a%20b`,
        'locality',
      ],
      ['an unknown query field', () => `/api/quarters/${q3}/benchmark?measure=hba1c`, 'measure'],
      ['a page that is not a number', () => `/api/quarters/${q3}/benchmark?page=two`, 'page'],
      ['page 0', () => `/api/quarters/${q3}/benchmark?page=0`, 'page'],
      ['a page size too large', () => `/api/quarters/${q3}/benchmark?pageSize=5000`, 'pageSize'],
      ['a page past the last', () => `/api/quarters/${q3}/benchmark?page=3&pageSize=250`, 'page'],
    ])('answers %s with 400 naming the field', async (_what, path, field) => {
      const before = await counts();
      const res = await regional.get(path()).expect(400);
      expect(res.body.errors.map((e: { field: string }) => e.field)).toContain(field);
      expect(await counts()).toEqual(before);
    });

    it('refuses a quarter id that is not a number', async () => {
      const res = await request(t.http).get('/api/quarters/abc/benchmark');
      expect(res.status).toBe(401);
      const signedIn = await regional.get('/api/quarters/abc/benchmark').expect(400);
      expect(signedIn.body.type).toBe('/api/problems/bad-request');
      expect(signedIn.body.detail).toMatch(/numeric/);
    });
  });
  describe('access', () => {
    it('refuses a lead of another practice with 403 and none of the practice’s figures', async () => {
      const leadTwo = await signInAs(t, 'practice_lead_two');
      const practice = w.practice('OV102');
      // The same reader may see its own practice's results.
      await leadTwo.get(`/api/practices/${w.practice('OV103')}/quarters/${q3}/results`).expect(200);
      for (const path of [
        `/api/practices/${practice}/quarters/${q3}/results`,
        `/api/practices/${practice}/quarters/${q3}/results/detail`,
        `/api/practices/${practice}/quarters/${q3}/recall-list?measure=hba1c`,
        `/api/practices/${practice}/quarters/${q3}/recall-list.csv?measure=hba1c`,
        `/api/practices/${practice}/quarters/${q3}/recall-list.xlsx?measure=hba1c`,
      ]) {
        const res = await leadTwo.get(path).expect(403);
        expect(res.headers['content-type']).toMatch(/^application\/problem\+json/);
        expect(res.body.type).toBe('/api/problems/practice-not-yours');
        // The problem and the practice asked for, nothing of its results.
        expect(Object.keys(res.body).sort()).toEqual([
          'detail',
          'instance',
          'practiceCode',
          'practiceId',
          'status',
          'title',
          'type',
        ]);
        expect([res.body.practiceId, res.body.practiceCode]).toEqual([practice, 'OV102']);
        expect(JSON.stringify(res.body)).not.toMatch(/rate|events|records|measure|\d+ of \d+/i);
      }
    });

    it('refuses the region’s benchmark to practice leads, naming no practice', async () => {
      for (const path of [
        `/api/quarters/${q3}/benchmark`,
        `/api/quarters/${q3}/benchmark/measures/hba1c`,
        `/api/quarters/${q3}/benchmark/trend?measure=hba1c`,
      ]) {
        const res = await leadOne.get(path).expect(403);
        expect(res.body.type).toBe('/api/problems/role-not-allowed');
        expect(JSON.stringify(res.body)).not.toMatch(/OV\d/);
      }
    });
  });

  // Last: a second Nest app in this process binds the (static) Sequelize models to its own
  // connection, which it closes when it stops, so this file's own app is not used after these.
  describe('several API processes on one database', () => {
    /** Another API process on the same database: nothing in its memory yet. */
    async function otherProcess<T>(work: (app: NestExpressApplication) => Promise<T>): Promise<T> {
      const app = await createApp({
        config: t.config,
        secrets: t.secrets,
        logger: createRootLogger('silent'),
      });
      await app.init();
      try {
        return await work(app);
      } finally {
        await app.close();
      }
    }
    const quarter = async (id: number) => (await t.app.get(QuartersService).find(id))!;
    const sumsRows = () =>
      select<{ submission_id: number; bytes: Buffer }>(
        'SELECT submission_id, bytes FROM submission_sums ORDER BY submission_id',
      ).then((rows) => rows.map((r) => [Number(r.submission_id), r.bytes.toString('base64')]));

    it('serves the stored result another process built', async () => {
      const mine = await t.app.get(BenchmarkStore).resultOf(await quarter(q3));
      const theirs = await otherProcess(async (app) =>
        app.get(BenchmarkStore).resultOf(await quarter(q3)),
      );
      expect(theirs!.id).toBe(mine!.id);
      expect(theirs!.key).toBe(mine!.key);
      expect(JSON.stringify(theirs!.benchmark)).toBe(JSON.stringify(mine!.benchmark));
    });

    it('fills sums that are missing or unreadable from the records, the same bytes as before', async () => {
      const before = await sumsRows();
      await t.db.query('DELETE FROM submission_sums WHERE submission_id = ?', {
        replacements: [confirmed.get(`OV102/${q2}`)],
        type: QueryTypes.DELETE,
      });
      await t.db.query("UPDATE submission_sums SET bytes = 'not sums' WHERE submission_id = ?", {
        replacements: [confirmed.get(`OV201/${q3}`)],
        type: QueryTypes.UPDATE,
      });
      // Two of 2026 Q3's at once: read together in one streamed SELECT.
      await t.db.query('DELETE FROM submission_sums WHERE submission_id IN (?)', {
        replacements: [[confirmed.get(`OV103/${q3}`), confirmed.get(`OV104/${q3}`)]],
        type: QueryTypes.DELETE,
      });
      // Built results go too, so that the sums are needed again.
      await t.db.query('DELETE FROM benchmark_results', { type: QueryTypes.DELETE });
      const built = await otherProcess(async (app) => [
        (await app.get(BenchmarkStore).resultOf(await quarter(q2)))!.submissionCount,
        (await app.get(BenchmarkStore).resultOf(await quarter(q3)))!.submissionCount,
      ]);
      expect(built).toEqual([1, 4]);
      expect(await sumsRows()).toEqual(before);
    });

    it('recomputes from every record to the same stored bytes as the incremental path', async () => {
      const { key } = await currentKey(q3);
      const [stored] = await select<{ id: number; body: Buffer }>(
        'SELECT id, body FROM benchmark_results WHERE quarter_id = ? AND submissions_key = ?',
        [q3, key],
      );
      expect(stored).toBeDefined();
      const sumsBefore = await sumsRows();
      const recomputed = await otherProcess(async (app) =>
        app.get(BenchmarkStore).recompute(await quarter(q3)),
      );
      expect(recomputed.result!.id).toBe(Number(stored!.id));
      expect(recomputed.body!.equals(stored!.body)).toBe(true);
      expect(await sumsRows()).toEqual(sumsBefore);
    });

    it('recomputes a region’s quarters on the operator’s command, and says they agree', async () => {
      const [region] = await select<{ code: string }>('SELECT code FROM regions');
      const before = await counts();
      const done = await recomputeResults(t.config, t.secrets, { region: region!.code });
      expect(done.map((q) => [q.quarter, q.submissions, q.sameAsStored])).toEqual([
        ['2026 Q3', 4, true],
        ['2026 Q2', 1, true],
        ['2026 Q1', 0, true],
      ]);
      expect(await counts()).toEqual(before);
      await expect(
        recomputeResults(t.config, t.secrets, { region: region!.code, quarter: '2019 Q1' }),
      ).rejects.toThrow(/no audit quarter "2019 Q1" \(it has 2026 Q3, 2026 Q2, 2026 Q1\)/);
      await expect(recomputeResults(t.config, t.secrets, { region: 'NOPE' })).rejects.toThrow(
        /no region with the code "NOPE"/,
      );
    });
  });
});
