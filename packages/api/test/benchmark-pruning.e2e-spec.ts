/**
 * Pruning of stored results and answers (benchmarks/pruning/) on extracts confirmed here: four
 * sets of 2026 Q3, one published in a report, their results and answers aged by hand. Pruning
 * removes exactly the results that are neither current, nor the newest, nor young, nor named
 * by a report, and exactly the answers unused for the configured days and not built for the
 * current result; the routes answer afterwards; a second process's lease keeps this one out.
 */
import { QueryTypes } from 'sequelize';
import { BenchmarkAnswersRepository } from '../src/benchmarks/answers/benchmark-answers.repository.js';
import {
  BenchmarkPruning,
  PRUNING_JOB,
} from '../src/benchmarks/pruning/benchmark-pruning.service.js';
import { arrange, type ExtractsWorld, uploadAndWait } from './extracts-fixtures/api.js';
import { csvOf, goodRows } from './extracts-fixtures/rows.js';
import { signInAs, type SignedInAgent } from './support/auth.js';
import { createTestApp, type TestApp } from './support/test-app.js';

describe('pruning stored results and answers', () => {
  let t: TestApp;
  let w: ExtractsWorld;
  let regional: SignedInAgent;
  let q3: number;
  let ov102: number;
  let reportId: number;
  /** Q3's result ids and the answer keys each step made, in order */
  const steps: { result: number; answers: string[] }[] = [];

  const select = <T extends object>(sql: string, replacements: unknown[] = []) =>
    t.db.query<T>(sql, { replacements, type: QueryTypes.SELECT });
  const resultIds = async () =>
    (
      await select<{ id: number }>('SELECT id FROM benchmark_results WHERE quarter_id = ?', [q3])
    ).map((r) => Number(r.id));
  const answerKeys = async () =>
    (
      await select<{ answer_key: string }>(
        'SELECT answer_key FROM benchmark_answers WHERE quarter_id = ?',
        [q3],
      )
    ).map((r) => r.answer_key);
  const allRows = async () => ({
    results: (await select<{ id: number }>('SELECT id FROM benchmark_results ORDER BY id')).map(
      (r) => Number(r.id),
    ),
    answers: (
      await select<{ answer_key: string }>(
        'SELECT answer_key FROM benchmark_answers ORDER BY answer_key',
      )
    ).map((r) => r.answer_key),
  });
  const age = (table: string, column: string, days: number, where: string, values: unknown[]) =>
    t.db.query(`UPDATE ${table} SET ${column} = NOW(3) - INTERVAL ? DAY WHERE ${where}`, {
      replacements: [days, ...values],
      type: QueryTypes.UPDATE,
    });

  /** Confirms an extract of `code` and reads Q3's benchmark and OV102's results. */
  async function step(code: string, rows: number) {
    const beforeResults = await resultIds();
    const beforeAnswers = await answerKeys();
    const id = w.practice(code);
    const done = await uploadAndWait(regional, id, q3, csvOf(goodRows(rows)), {
      name: `${code}-${rows}.csv`,
    });
    await regional.post(`/api/practices/${id}/submissions/${done.id}/confirm`).expect(200);
    await regional.get(`/api/quarters/${q3}/benchmark`).expect(200);
    await regional.get(`/api/practices/${ov102}/quarters/${q3}/results`).expect(200);
    const made = (await resultIds()).filter((r) => !beforeResults.includes(r));
    expect(made).toHaveLength(1);
    const answers = (await answerKeys()).filter((k) => !beforeAnswers.includes(k));
    expect(answers.length).toBeGreaterThanOrEqual(2);
    steps.push({ result: made[0]!, answers });
  }

  beforeAll(async () => {
    t = await createTestApp({
      configure: (config) => ({
        ...config,
        benchmarks: {
          pruning: {
            ...config.benchmarks.pruning,
            answersUnusedDays: 14,
            resultsKeepNewest: 1,
            resultsGraceMinutes: 60,
          },
        },
      }),
    });
    w = await arrange(t);
    q3 = w.quarter('2026 Q3');
    ov102 = w.practice('OV102');
    regional = await signInAs(t, 'regional_lead');
    await step('OV102', 12);
    reportId = (
      await regional
        .post(`/api/quarters/${q3}/reports`)
        .send({ releaseNote: 'Before pruning.' })
        .expect(201)
    ).body.id;
    await step('OV102', 13);
    await step('OV102', 14);
    await step('OV201', 9);
  }, 240_000);
  afterAll(async () => {
    await t?.close();
  });

  it('removes exactly the rows no reader needs, and the routes answer afterwards', async () => {
    const [s1, s2, s3, s4] = steps as [(typeof steps)[0], ...(typeof steps)[0][]];
    const inKeys = (keys: string[]) => `answer_key IN (${keys.map(() => '?').join(', ')})`;
    // s1: the report's result; s2: old; s3: built just now; s4: the current set.
    await age('benchmark_results', 'built_at', 50, 'id = ?', [s1.result]);
    await age('benchmark_results', 'built_at', 48, 'id = ?', [s2!.result]);
    await age('benchmark_results', 'built_at', 30, 'id = ?', [s4!.result]);
    // Answers of old sets: built long ago, never read.
    await age('benchmark_answers', 'built_at', 49, inKeys(s1.answers), s1.answers);
    await age('benchmark_answers', 'built_at', 47, inKeys(s2!.answers), s2!.answers);
    // s3's: built long ago, but read yesterday.
    await age('benchmark_answers', 'built_at', 40, inKeys(s3!.answers), s3!.answers);
    await age('benchmark_answers', 'used_at', 1, inKeys(s3!.answers), s3!.answers);
    // The current result's: unused for 29 days, but built for the current result.
    await age('benchmark_answers', 'built_at', 29, inKeys(s4!.answers), s4!.answers);
    await t.db.query('UPDATE benchmark_answers SET used_at = NULL WHERE ' + inKeys(s4!.answers), {
      replacements: s4!.answers,
      type: QueryTypes.UPDATE,
    });

    const before = await allRows();
    const pruning = t.app.get(BenchmarkPruning);
    const outcome = await pruning.run();
    expect(outcome).toEqual({
      answersRemoved: s1.answers.length + s2!.answers.length,
      resultsRemoved: 1,
    });
    const after = await allRows();
    const removedAnswers = new Set([...s1.answers, ...s2!.answers]);
    expect(after.results).toEqual(before.results.filter((id) => id !== s2!.result));
    expect(after.answers).toEqual(before.answers.filter((k) => !removedAnswers.has(k)));
    const [job] = await select<{ lease_owner: string | null; last_outcome: string }>(
      'SELECT lease_owner, last_outcome FROM benchmark_upkeep WHERE job = ?',
      [PRUNING_JOB],
    );
    expect(job).toEqual({
      lease_owner: null,
      last_outcome: `removed ${removedAnswers.size} answers and 1 results`,
    });

    // Nothing more to remove.
    expect(await pruning.run()).toEqual({ answersRemoved: 0, resultsRemoved: 0 });

    // Every route still answers: the current set's, the report's (its result kept).
    const benchmark = await regional.get(`/api/quarters/${q3}/benchmark`).expect(200);
    expect(benchmark.body.builtFrom.resultId).toBe(s4!.result);
    await regional.get(`/api/practices/${ov102}/quarters/${q3}/results`).expect(200);
    await regional.get(`/api/reports/${reportId}/region`).expect(200);
    await regional.get(`/api/reports/${reportId}/practices/${ov102}`).expect(200);
    expect((await allRows()).results).toEqual(after.results);
  });

  it('marks an answer used when it is read from the table', async () => {
    const key = steps[3]!.answers[0]!;
    expect(await t.app.get(BenchmarkAnswersRepository).find(key)).not.toBeNull();
    let usedAt: unknown = null;
    for (let i = 0; i < 50 && usedAt === null; i++) {
      await new Promise((resolve) => setTimeout(resolve, 50));
      [{ used_at: usedAt }] = (await select<{ used_at: Date | null }>(
        'SELECT used_at FROM benchmark_answers WHERE answer_key = ?',
        [key],
      )) as [{ used_at: Date | null }];
    }
    expect(usedAt).not.toBeNull();
  });

  it('does not run while another process holds the lease, and removes nothing', async () => {
    await t.db.query(
      `UPDATE benchmark_upkeep SET lease_owner = 'another process',
         lease_expires_at = NOW(3) + INTERVAL 1 MINUTE WHERE job = ?`,
      { replacements: [PRUNING_JOB], type: QueryTypes.UPDATE },
    );
    await age('benchmark_answers', 'built_at', 60, '1 = 1', []);
    await t.db.query('UPDATE benchmark_answers SET used_at = NULL', { type: QueryTypes.UPDATE });
    const before = await allRows();
    expect(await t.app.get(BenchmarkPruning).run()).toBeNull();
    expect(await allRows()).toEqual(before);
    // Once the other's lease has expired, this process takes it.
    await t.db.query(
      'UPDATE benchmark_upkeep SET lease_expires_at = NOW(3) - INTERVAL 1 SECOND WHERE job = ?',
      { replacements: [PRUNING_JOB], type: QueryTypes.UPDATE },
    );
    expect(await t.app.get(BenchmarkPruning).run()).not.toBeNull();
  });
});
