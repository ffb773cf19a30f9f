/**
 * The results routes' stored answers and the quarter's current-set row, on
 * extracts uploaded and confirmed here (the demo organisation; 2026 Q2
 * closed, 2026 Q3 open).
 *
 * What is checked: the current-set row names the set the pointers make, and
 * changes in the confirm's transaction (version + 1, the new key), never on a
 * refused confirm or a cancel; the region benchmark and a practice's results
 * are sent as the bytes stored in benchmark_answers, the same bytes from a
 * second API process on the same database (and from the stored row alone),
 * with an ETag and 304 for If-None-Match; their brotli form, made after the
 * first serve (by any process that finds none), to readers that accept it; an answer is never served once what
 * it was built from changed (a confirm, a renamed practice, a moved deadline);
 * results() (what publishing and digests call) returns the route's DTO; bad
 * input keeps its problem details and stores no answer.
 */
import { createHash } from 'node:crypto';
import { get, type IncomingHttpHeaders, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { brotliDecompressSync, gunzipSync } from 'node:zlib';
import type { NestExpressApplication } from '@nestjs/platform-express';
import { QueryTypes } from 'sequelize';
import request from 'supertest';
import { createApp } from '../src/app.factory.js';
import { systemActor } from '../src/auth/actor.js';
import { MARK_USED_MS } from '../src/benchmarks/answers/benchmark-answers.repository.js';
import { StoredAnswers } from '../src/benchmarks/answers/stored-answers.service.js';
import { PracticeResultsService } from '../src/benchmarks/practice-results.service.js';
import { createRootLogger } from '../src/common/logger.js';
import { arrange, type ExtractsWorld, uploadAndWait } from './extracts-fixtures/api.js';
import { csvOf, goodRows } from './extracts-fixtures/rows.js';
import { signInAs, type SignedInAgent } from './support/auth.js';
import { createTestApp, type TestApp } from './support/test-app.js';

describe('stored answers and the current set', () => {
  let t: TestApp;
  let w: ExtractsWorld;
  let regional: SignedInAgent;
  let leadOne: SignedInAgent;
  let q2: number;
  let q3: number;

  const select = <T extends object>(sql: string, replacements: unknown[] = []) =>
    t.db.query<T>(sql, { replacements, type: QueryTypes.SELECT });

  async function upload(code: string, quarterId: number, rows: ReturnType<typeof goodRows>) {
    const done = await uploadAndWait(regional, w.practice(code), quarterId, csvOf(rows), {
      name: `${code}-${quarterId}-${rows.length}.csv`,
    });
    expect(done.status).toBe('awaiting_confirmation');
    return done.id as number;
  }
  async function confirm(code: string, quarterId: number, rows: ReturnType<typeof goodRows>) {
    const id = await upload(code, quarterId, rows);
    await regional.post(`/api/practices/${w.practice(code)}/submissions/${id}/confirm`).expect(200);
    return id;
  }

  /** The quarter's set as the pointers make it, read here. */
  async function pointersKey(quarterId: number) {
    const rows = await select<{ id: number }>(
      'SELECT current_submission_id AS id FROM practice_quarters WHERE quarter_id = ? AND current_submission_id IS NOT NULL',
      [quarterId],
    );
    const ids = rows.map((r) => Number(r.id)).sort((a, b) => a - b);
    return { key: createHash('sha256').update(ids.join(',')).digest('hex'), count: ids.length };
  }
  async function setRow(quarterId: number) {
    const [row] = await select<{
      submissions_key: string;
      submission_count: number;
      version: number;
    }>(
      'SELECT submissions_key, submission_count, version FROM quarter_current_sets WHERE quarter_id = ?',
      [quarterId],
    );
    return row
      ? {
          key: row.submissions_key,
          count: Number(row.submission_count),
          version: Number(row.version),
        }
      : null;
  }
  const answerCount = async () =>
    Number((await select<{ n: number }>('SELECT COUNT(*) AS n FROM benchmark_answers'))[0]!.n);

  /** A GET whose bytes are kept as sent (supertest would expand gzip). */
  async function rawGet(path: string, cookie: string, headers: Record<string, string>) {
    const server = t.http as Server;
    if (!server.listening) await new Promise<void>((done) => server.listen(0, '127.0.0.1', done));
    const { port } = server.address() as AddressInfo;
    return new Promise<{ status: number; headers: IncomingHttpHeaders; body: Buffer }>(
      (resolve, reject) => {
        get({ host: '127.0.0.1', port, path, headers: { ...headers, Cookie: cookie } }, (res) => {
          const chunks: Buffer[] = [];
          res.on('data', (c: Buffer) => chunks.push(c));
          res.on('end', () =>
            resolve({
              status: res.statusCode ?? 0,
              headers: res.headers,
              body: Buffer.concat(chunks),
            }),
          );
        }).on('error', reject);
      },
    );
  }

  /** The stored answer's key in a form's entity tag (`"key"`, `"key-gzip"`, `"key-br"`). */
  const keyOf = (etag: string) => /^"([0-9a-f]{64})(?:-gzip|-br)?"$/.exec(etag)![1]!;

  /** Another API process on the same database: nothing in its memory. */
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

  beforeAll(async () => {
    t = await createTestApp();
    w = await arrange(t, ['2026 Q2', '2026 Q3']);
    q2 = w.quarter('2026 Q2');
    q3 = w.quarter('2026 Q3');
    regional = await signInAs(t, 'regional_lead');
    leadOne = await signInAs(t, 'practice_lead_one');
    await confirm('OV102', q2, goodRows(30));
    await confirm('OV102', q3, goodRows(40));
    await confirm('OV103', q3, goodRows(35, 100));
  }, 300_000);
  afterAll(async () => {
    await t?.close();
  });

  describe('the current-set row', () => {
    it('names the set the pointers make, changed by each confirm', async () => {
      const row = await setRow(q3);
      expect(row).toEqual({ ...(await pointersKey(q3)), version: expect.any(Number) });
      expect(row!.count).toBe(2);
      await confirm('OV201', q3, goodRows(20, 300));
      const after = await setRow(q3);
      expect(after).toEqual({ ...(await pointersKey(q3)), version: row!.version + 1 });
      expect(after!.count).toBe(3);
    });

    it('stays as it was when a confirm is refused or a submission cancelled', async () => {
      const before = await setRow(q3);
      const accepted = Number(
        (
          await select<{ id: number }>(
            "SELECT id FROM submissions WHERE practice_id = ? AND quarter_id = ? AND status = 'accepted'",
            [w.practice('OV102'), q3],
          )
        )[0]!.id,
      );
      const refused = await regional
        .post(`/api/practices/${w.practice('OV102')}/submissions/${accepted}/confirm`)
        .expect(409);
      expect(refused.body.type).toMatch(/submission-not-awaiting-confirmation$/);
      const waiting = await upload('OV104', q3, goodRows(15, 700));
      await regional
        .post(`/api/practices/${w.practice('OV104')}/submissions/${waiting}/cancel`)
        .expect(200);
      expect(await setRow(q3)).toEqual(before);
    });

    it('is made from the pointers for a quarter that has none yet', async () => {
      await t.db.query('DELETE FROM quarter_current_sets WHERE quarter_id = ?', {
        replacements: [q2],
        type: QueryTypes.DELETE,
      });
      const res = await regional.get(`/api/quarters/${q2}/benchmark`).expect(200);
      expect(res.body.builtFrom.submissionsKey).toBe((await pointersKey(q2)).key);
      expect(await setRow(q2)).toEqual({ ...(await pointersKey(q2)), version: 1 });
    });
  });

  describe('stored answers', () => {
    const regionPath = () => `/api/quarters/${q3}/benchmark`;
    const resultsPath = () => `/api/practices/${w.practice('OV102')}/quarters/${q3}/results`;
    /** Each route with a reader of it: the region benchmark's regional lead, OV102's lead. */
    const readers = () =>
      [
        [regional, regionPath()],
        [leadOne, resultsPath()],
      ] as const;

    it('sends the stored bytes with an ETag, and 304 while nothing changed', async () => {
      for (const [agent, path] of readers()) {
        const first = await agent.get(path).expect(200);
        const etag = first.headers.etag as string;
        // The test agent accepts gzip: the gzip form's tag.
        expect(etag).toMatch(/^"[0-9a-f]{64}-gzip"$/);
        expect(first.headers['content-type']).toMatch(/^application\/json/);
        const [stored] = await select<{ body: Buffer }>(
          'SELECT body FROM benchmark_answers WHERE answer_key = ?',
          [keyOf(etag)],
        );
        expect(gunzipSync(stored!.body).toString('utf8')).toBe(first.text);
        const again = await agent.get(path).set('If-None-Match', etag).expect(304);
        expect(again.text ?? '').toBe('');
        const gzip = await rawGet(path, agent.cookie, { 'Accept-Encoding': 'gzip' });
        expect(gzip.status).toBe(200);
        expect(gzip.headers['content-encoding']).toBe('gzip');
        expect(gzip.headers.etag).toBe(etag);
        expect(gzip.body.equals(stored!.body)).toBe(true);
        // Plain JSON is another form of the same answer: its own tag, and 304 to the gzip one.
        const plain = await rawGet(path, agent.cookie, {});
        expect(plain.headers['content-encoding']).toBeUndefined();
        expect(plain.headers.etag).toBe(`"${keyOf(etag)}"`);
        expect(plain.body.toString('utf8')).toBe(first.text);
        const plainAgain = await rawGet(path, agent.cookie, { 'If-None-Match': etag });
        expect(plainAgain.status).toBe(304);
        expect(plainAgain.headers.etag).toBe(`"${keyOf(etag)}"`);
      }
    });

    it('sends the brotli form once made, to readers that accept it, and gzip to the others', async () => {
      for (const [agent, path] of readers()) {
        const first = await agent.get(path).expect(200);
        const key = keyOf(first.headers.etag as string);
        await t.app.get(StoredAnswers).brotliSettled();
        const [stored] = await select<{ body: Buffer; body_br: Buffer | null }>(
          'SELECT body, body_br FROM benchmark_answers WHERE answer_key = ?',
          [key],
        );
        expect(stored!.body_br).not.toBeNull();
        expect(brotliDecompressSync(stored!.body_br!).toString('utf8')).toBe(first.text);
        expect(stored!.body_br!.length).toBeLessThan(stored!.body.length);
        const br = await rawGet(path, agent.cookie, { 'Accept-Encoding': 'gzip, deflate, br' });
        expect(br.status).toBe(200);
        expect(br.headers['content-encoding']).toBe('br');
        expect(br.headers.etag).toBe(`"${key}-br"`);
        expect(br.headers.vary).toMatch(/Accept-Encoding/);
        expect(br.body.equals(stored!.body_br!)).toBe(true);
        const gzip = await rawGet(path, agent.cookie, { 'Accept-Encoding': 'gzip' });
        expect(gzip.headers['content-encoding']).toBe('gzip');
        expect(gzip.body.equals(stored!.body)).toBe(true);
      }
    });

    it('marks an answer served from memory used, at most once an hour', async () => {
      const answers = t.app.get(StoredAnswers);
      const first = await regional.get(regionPath()).expect(200);
      const key = keyOf(first.headers.etag as string);
      // A mark that reading the row may have sent lands first.
      await new Promise((resolve) => setTimeout(resolve, 300));
      const usedAt = async () =>
        (
          await select<{ used: string }>(
            "SELECT DATE_FORMAT(used_at, '%Y-%m-%d') AS used FROM benchmark_answers WHERE answer_key = ?",
            [key],
          )
        )[0]!.used;
      await t.db.query("UPDATE benchmark_answers SET used_at = '2020-01-01' WHERE answer_key = ?", {
        replacements: [key],
      });
      // Served from this process's memory within the hour: no write.
      await regional.get(regionPath()).expect(200);
      await new Promise((resolve) => setTimeout(resolve, 200));
      expect(await usedAt()).toBe('2020-01-01');
      // An hour later, still from memory: the row is marked (without the reader waiting for it).
      const clock = answers.clock;
      answers.clock = () => clock() + MARK_USED_MS;
      try {
        const later = await regional.get(regionPath()).expect(200);
        expect(later.headers.etag).toBe(first.headers.etag);
        for (let i = 0; i < 50 && (await usedAt()) === '2020-01-01'; i++) {
          await new Promise((resolve) => setTimeout(resolve, 100));
        }
        expect(await usedAt()).not.toBe('2020-01-01');
      } finally {
        answers.clock = clock;
      }
    });

    it('is never served once what it was built from changed', async () => {
      const before = await regional.get(regionPath()).expect(200);
      const beforeResults = await leadOne.get(resultsPath()).expect(200);
      // A confirm: a new set.
      await confirm('OV104', q3, goodRows(25, 900));
      const after = await regional
        .get(regionPath())
        .set('If-None-Match', before.headers.etag as string)
        .expect(200);
      expect(after.headers.etag).not.toBe(before.headers.etag);
      expect(after.body.builtFrom.submissionsKey).toBe((await pointersKey(q3)).key);
      expect(after.body.builtFrom.submissions).toBe(4);
      const afterResults = await leadOne
        .get(resultsPath())
        .set('If-None-Match', beforeResults.headers.etag as string)
        .expect(200);
      expect(afterResults.body.builtFrom.resultId).toBe(after.body.builtFrom.resultId);
      // A renamed practice.
      await t.db.query("UPDATE practices SET name = 'Renamed Surgery' WHERE code = 'OV103'", {
        type: QueryTypes.UPDATE,
      });
      const renamed = await regional.get(regionPath()).expect(200);
      expect(renamed.headers.etag).not.toBe(after.headers.etag);
      expect(
        renamed.body.practices.find(
          (p: { practice: { code: string } }) => p.practice.code === 'OV103',
        ).practice.name,
      ).toBe('Renamed Surgery');
      // A quarter's new deadline: the quarter is sent in the answer.
      await t.db.query(
        'UPDATE audit_quarters SET submission_deadline = DATE_ADD(submission_deadline, INTERVAL 1 DAY) WHERE id = ?',
        { replacements: [q3], type: QueryTypes.UPDATE },
      );
      const moved = await leadOne.get(resultsPath()).expect(200);
      expect(moved.headers.etag).not.toBe(afterResults.headers.etag);
      expect(moved.body.quarter.submissionDeadline).not.toBe(
        afterResults.body.quarter.submissionDeadline,
      );
    });

    it('gives results() the route’s DTO, and resultsWithDetail() the detail route’s detail with it', async () => {
      const route = await regional.get(resultsPath()).expect(200);
      const detail = await regional.get(`${resultsPath()}/detail`).expect(200);
      expect(detail.body.builtFrom).toEqual(route.body.builtFrom);
      const [region] = await select<{ id: number }>('SELECT id FROM regions');
      const service = t.app.get(PracticeResultsService);
      const reader = systemActor('publishing', region!.id);
      const dto = await service.results(reader, w.practice('OV102'), q3);
      expect(dto.builtFrom).toEqual(route.body.builtFrom);
      expect(dto.measures).toEqual(route.body.measures);
      const both = await service.resultsWithDetail(reader, w.practice('OV102'), q3);
      expect(both).toEqual({ ...dto, detail: detail.body.detail });
    });

    it('keeps problem details for bad input and stores no answer for it', async () => {
      const before = await answerCount();
      const locality = await regional.get(`${regionPath()}?locality=NOPE`).expect(404);
      expect(locality.body.type).toMatch(/locality-not-found$/);
      const split = await regional.get(`${regionPath()}?split=type3`).expect(400);
      expect(split.body.errors[0].field).toBe('split');
      const quarter = await leadOne
        .get(`/api/practices/${w.practice('OV102')}/quarters/999999/results`)
        .expect(404);
      expect(quarter.body.type).toMatch(/quarter-not-found$/);
      const detail = await leadOne
        .get(`/api/practices/${w.practice('OV102')}/quarters/999999/results/detail`)
        .expect(404);
      expect(detail.body.type).toMatch(/quarter-not-found$/);
      expect(await answerCount()).toBe(before);
    });

    // Last: a second app rebinds the models to its own connection, and closing it ends them.
    it('gives the same bytes from a second API process, and from the stored row alone', async () => {
      const mine = await regional.get(regionPath()).expect(200);
      const mineResults = await leadOne.get(resultsPath()).expect(200);
      const theirs = await otherProcess(async (app) => [
        await request(app.getHttpServer()).get(regionPath()).set('Cookie', regional.cookie),
        await request(app.getHttpServer()).get(resultsPath()).set('Cookie', leadOne.cookie),
      ]);
      expect(theirs[0]!.status).toBe(200);
      expect(theirs[0]!.text).toBe(mine.text);
      expect(theirs[0]!.headers.etag).toBe(mine.headers.etag);
      expect(theirs[1]!.text).toBe(mineResults.text);
      // A row without its brotli form: a process that finds it serves gzip and makes it. (This
      // process's own brotli forms are made first, so that none lands after the UPDATE.)
      await t.app.get(StoredAnswers).brotliSettled();
      await t.db.query('UPDATE benchmark_answers SET body_br = NULL', { type: QueryTypes.UPDATE });
      const [gzipFirst, brLater] = await otherProcess(async (app) => {
        const asBrowser = () =>
          request(app.getHttpServer())
            .get(regionPath())
            .set('Cookie', regional.cookie)
            .set('Accept-Encoding', 'gzip, deflate, br');
        const before = await asBrowser();
        await app.get(StoredAnswers).brotliSettled();
        return [before, await asBrowser()];
      });
      expect(gzipFirst!.headers['content-encoding']).toBe('gzip');
      expect(brLater!.headers['content-encoding']).toBe('br');
      // (supertest expands either encoding)
      expect(gzipFirst!.text).toBe(mine.text);
      expect(brLater!.text).toBe(mine.text);
      // Without any stored answer, a fresh process builds the same bytes again.
      await t.db.query('DELETE FROM benchmark_answers', { type: QueryTypes.DELETE });
      const rebuilt = await otherProcess(async (app) =>
        request(app.getHttpServer()).get(resultsPath()).set('Cookie', leadOne.cookie),
      );
      expect(rebuilt.text).toBe(mineResults.text);
    });
  });
});
