/**
 * Extracts under concurrency, with two API processes (the built dist/main.js)
 * sharing this file's database as a deployment would: confirms racing for
 * one practice-quarter, the same submission confirmed twice at once, and ten
 * practices uploading and confirming at the same moment while the two
 * processes share the job queue.
 *
 * "At the same moment" is made dependable with the test-only fault point
 * CAIRN_TEST_PAUSE_CONFIRM_MS: each confirm transaction stays open 250 ms
 * after its writes, so a second confirm fired alongside it always reads the
 * practice-quarter before the first commits (without it, one request now and
 * then arrives after the other has finished, which is then simply a later
 * confirm).
 */
import { QueryTypes } from 'sequelize';
import type TestAgent from 'supertest/lib/agent.js';
import { type ApiProcess, onProcess, startApiProcess } from './support/api-process.js';
import { type PersonaKey, signInAs } from './support/auth.js';
import { createTestApp, type TestApp } from './support/test-app.js';
import {
  arrange,
  currentState,
  upload,
  waitDone,
  type ExtractsWorld,
} from './extracts-fixtures/api.js';
import { csvOf, goodRows } from './extracts-fixtures/rows.js';

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

describe('extracts: concurrency across two API processes', () => {
  let t: TestApp;
  let w: ExtractsWorld;
  let apis: [ApiProcess, ApiProcess];
  /** A regional lead's session on each process */
  let regional: [TestAgent, TestAgent];

  const QUARTER = '2026 Q3';

  const uploadDone = async (agent: TestAgent, practice: number, rows: number, from: number) => {
    const res = await upload(agent, practice, w.quarter(QUARTER), csvOf(goodRows(rows, from)), {
      name: `extract-${from}.csv`,
    });
    if (res.status !== 202) throw new Error(`upload answered ${res.status}: ${res.text}`);
    const done = await waitDone(agent, practice, res.body.id);
    expect(done).toMatchObject({ status: 'awaiting_confirmation', counts: { rowsAccepted: rows } });
    return done.id as number;
  };

  const statuses = async (practice: number) => {
    const rows = await t.db.query<{ id: number; status: string }>(
      'SELECT id, status FROM submissions WHERE practice_id = ? AND quarter_id = ? ORDER BY id',
      { replacements: [practice, w.quarter(QUARTER)], type: QueryTypes.SELECT },
    );
    return new Map(rows.map((r) => [r.id, r.status]));
  };

  const auditCount = async (action: string, id: number) => {
    const [row] = await t.db.query<{ n: number }>(
      "SELECT COUNT(*) AS n FROM audit_events WHERE action = ? AND subject_type = 'submission' AND subject_id = ?",
      { replacements: [action, String(id)], type: QueryTypes.SELECT },
    );
    return Number(row!.n);
  };

  beforeAll(async () => {
    t = await createTestApp({
      configure: (c) => ({ ...c, extracts: { ...c.extracts, workers: 0 } }),
    });
    w = await arrange(t);
    const env = {
      CAIRN_EXTRACTS_WORKERS: '2',
      CAIRN_EXTRACTS_POLL_INTERVAL_MS: '100',
      CAIRN_TEST_PAUSE_CONFIRM_MS: '250',
    };
    apis = [await startApiProcess(t, env), await startApiProcess(t, env)];
    const lead = await signInAs(t, 'regional_lead');
    regional = [onProcess(lead, apis[0]), onProcess(lead, apis[1])];
  }, 120_000);
  afterAll(async () => {
    for (const api of apis ?? []) await api.stop();
    await t?.close();
  });

  it('two different submissions confirmed at the same moment: exactly one becomes current, the other is refused with 409', async () => {
    const practice = w.practice('OV104');
    const ROUNDS = 12;
    const pairs: [number, number][] = [];
    for (let r = 0; r < ROUNDS; r++) {
      // Distinct sizes: the current record count tells which submission readers see.
      const a = await uploadDone(regional[r % 2]!, practice, 10 + 2 * r, 10_000 * (r + 1));
      const b = await uploadDone(
        regional[(r + 1) % 2]!,
        practice,
        11 + 2 * r,
        10_000 * (r + 1) + 500,
      );
      pairs.push([a, b]);
    }
    const sizes = new Map(
      pairs.flatMap(([a, b], r) => [[a, 10 + 2 * r] as const, [b, 11 + 2 * r] as const]),
    );
    const winners: number[] = [];
    for (const [r, [a, b]] of pairs.entries()) {
      const [ra, rb] = await Promise.all([
        regional[0].post(`/api/practices/${practice}/submissions/${a}/confirm`),
        regional[1].post(`/api/practices/${practice}/submissions/${b}/confirm`),
      ]);
      const answers = [ra.status, rb.status].sort();
      expect({ round: r, answers }).toEqual({ round: r, answers: [200, 409] });
      const [won, lost, loser] = ra.status === 200 ? [a, rb, b] : [b, ra, a];
      expect(lost.headers['content-type']).toMatch(/application\/problem\+json/);
      expect(lost.body).toMatchObject({
        status: 409,
        type: '/api/problems/current-submission-changed',
        title: 'Another submission was just made current',
        currentSubmissionId: won,
      });
      expect(lost.body.detail).toBe(
        `While this confirm was being handled, submission ${won} was made current for 2026 Q3, so submission ${loser} was not confirmed. Look at the practice's submissions again, then confirm this one if it should replace it.`,
      );
      winners.push(won);
      expect(await currentState(t, practice, w.quarter(QUARTER))).toMatchObject({
        current: won,
        records: sizes.get(won),
      });
      const now = await statuses(practice);
      expect([...now.values()].filter((s) => s === 'accepted')).toHaveLength(1);
      expect(now.get(won)).toBe('accepted');
      expect(now.get(loser)).toBe('awaiting_confirmation');
      expect(await auditCount('submission.confirmed', loser)).toBe(0);
    }
    // Each winner replaced the one before it, and only that one.
    const final = await statuses(practice);
    for (const [i, id] of winners.entries()) {
      expect(final.get(id)).toBe(i === winners.length - 1 ? 'accepted' : 'superseded');
    }
    const superseded = await t.db.query<{ id: number; by: number }>(
      "SELECT id, superseded_by_submission_id AS `by` FROM submissions WHERE practice_id = ? AND status = 'superseded' ORDER BY id",
      { replacements: [practice], type: QueryTypes.SELECT },
    );
    expect(superseded).toEqual(winners.slice(0, -1).map((id, i) => ({ id, by: winners[i + 1] })));
  }, 240_000);

  it('the same submission confirmed twice at once: one 200, one 409 “Already confirmed”, one audit event', async () => {
    const practice = w.practice('OV105');
    for (let r = 0; r < 6; r++) {
      const id = await uploadDone(regional[r % 2]!, practice, 7 + r, 50_000 + 100 * r);
      const answers = await Promise.all(
        regional.map((agent) => agent.post(`/api/practices/${practice}/submissions/${id}/confirm`)),
      );
      expect(answers.map((a) => a.status).sort()).toEqual([200, 409]);
      const refused = answers.find((a) => a.status === 409)!;
      expect(refused.body).toMatchObject({
        type: '/api/problems/submission-not-awaiting-confirmation',
        title: 'Already confirmed',
        detail: `Submission ${id} is already confirmed and current.`,
        submissionStatus: 'accepted',
      });
      expect(answers.find((a) => a.status === 200)!.body).toMatchObject({
        id,
        status: 'accepted',
        isCurrent: true,
      });
      expect(await auditCount('submission.confirmed', id)).toBe(1);
      expect(await currentState(t, practice, w.quarter(QUARTER))).toMatchObject({
        current: id,
        records: 7 + r,
      });
    }
  }, 120_000);

  it('the same file uploaded twice at once, to both processes: one is taken, the other is refused as identical', async () => {
    const practice = w.practice('OV106');
    for (let r = 0; r < 6; r++) {
      const file = csvOf(goodRows(300 + r, 70_000 + 1000 * r));
      const answers = await Promise.all(
        regional.map((agent, i) =>
          upload(agent, practice, w.quarter(QUARTER), file, { name: `twice-${r}-${i}.csv` }),
        ),
      );
      expect(answers.map((a) => a.status).sort()).toEqual([202, 409]);
      const taken = answers.find((a) => a.status === 202)!;
      const refused = answers.find((a) => a.status === 409)!;
      expect(refused.body).toMatchObject({
        type: '/api/problems/identical-extract',
        code: 'identical_extract',
        submissionId: taken.body.id,
      });
      // Only the taken upload remains; it is checked once.
      const sha = refused.body.sha256 as string;
      const [row] = await t.db.query<{ n: number }>(
        'SELECT COUNT(*) AS n FROM submissions WHERE practice_id = ? AND quarter_id = ? AND file_sha256 = ?',
        { replacements: [practice, w.quarter(QUARTER), sha], type: QueryTypes.SELECT },
      );
      expect(Number(row!.n)).toBe(1);
      const done = await waitDone(regional[0], practice, taken.body.id);
      expect(done).toMatchObject({
        status: 'awaiting_confirmation',
        counts: { rowsAccepted: 300 + r },
      });
    }
  }, 120_000);

  it('ten practices upload and confirm at once: right counts everywhere, jobs spread over both processes, none read twice', async () => {
    const sessions: { practice: string; who: PersonaKey }[] = [
      { practice: 'OV102', who: 'practice_lead_one' },
      { practice: 'OV103', who: 'practice_lead_two' },
      { practice: 'OV101', who: 'practice_lead_two' },
      { practice: 'OV201', who: 'practice_lead_three' },
    ];
    const [others] = [
      await t.db.query<{ code: string }>(
        "SELECT code FROM practices WHERE active = 1 AND code NOT IN ('OV101', 'OV102', 'OV103', 'OV104', 'OV105', 'OV201') ORDER BY code LIMIT 6",
        { type: QueryTypes.SELECT },
      ),
    ];
    for (const { code } of others) sessions.push({ practice: code, who: 'regional_lead' });
    expect(sessions).toHaveLength(10);
    // Ten separate sign-ins (ten sessions), alternating between the two processes.
    const people = await Promise.all(
      sessions.map(async (s, i) => ({
        ...s,
        id: w.practice(s.practice),
        rows: 2000 + 111 * i,
        agent: onProcess(await signInAs(t, s.who), apis[i % 2]!),
      })),
    );

    // Which process holds each job, sampled while they run.
    const owners = new Map<number, Set<string>>();
    let sampling = true;
    const sampler = (async () => {
      while (sampling) {
        const rows = await t.db.query<{ id: number; lease_owner: string }>(
          "SELECT id, lease_owner FROM submissions WHERE status = 'processing' AND lease_owner IS NOT NULL AND lease_owner NOT LIKE 'upload:%'",
          { type: QueryTypes.SELECT },
        );
        for (const r of rows) owners.set(r.id, (owners.get(r.id) ?? new Set()).add(r.lease_owner));
        await sleep(5);
      }
    })();
    let ids: number[];
    try {
      const uploads = await Promise.all(
        people.map((p) =>
          upload(p.agent, p.id, w.quarter(QUARTER), csvOf(goodRows(p.rows, 1)), {
            name: `${p.practice}.csv`,
          }),
        ),
      );
      expect(uploads.map((u) => u.status)).toEqual(Array(10).fill(202));
      ids = uploads.map((u) => u.body.id as number);
      const done = await Promise.all(
        people.map((p, i) => waitDone(p.agent, p.id, ids[i]!, 120_000)),
      );
      // A job that failed says why (its audit event's error), so that the log shows the cause.
      if (done.some((d) => d.status === 'failed')) {
        const why = await t.db.query<{ subject_id: number; detail: unknown }>(
          "SELECT subject_id, detail FROM audit_events WHERE action = 'submission.failed'",
          { type: QueryTypes.SELECT },
        );
        expect({ failedJobs: why }).toEqual({ failedJobs: [] });
      }
      for (const [i, d] of done.entries()) {
        expect(d).toMatchObject({
          status: 'awaiting_confirmation',
          counts: { rowsAccepted: people[i]!.rows },
        });
      }
    } finally {
      sampling = false;
      await sampler;
    }
    const confirmed = await Promise.all(
      people.map((p, i) => p.agent.post(`/api/practices/${p.id}/submissions/${ids[i]}/confirm`)),
    );
    expect(confirmed.map((c) => c.status)).toEqual(Array(10).fill(200));

    for (const [i, p] of people.entries()) {
      expect(await currentState(t, p.id, w.quarter(QUARTER))).toMatchObject({
        current: ids[i],
        records: p.rows,
      });
      expect(await auditCount('submission.validated', ids[i]!)).toBe(1);
      expect(await auditCount('submission.confirmed', ids[i]!)).toBe(1);
    }
    const attempts = await t.db.query<{ id: number; attempts: number }>(
      'SELECT id, attempts FROM submissions WHERE id IN (?) ORDER BY id',
      { replacements: [ids], type: QueryTypes.SELECT },
    );
    expect(attempts.map((a) => Number(a.attempts))).toEqual(Array(10).fill(1));
    // Every job seen running was held by one process only, and both processes took jobs.
    expect(owners.size).toBeGreaterThanOrEqual(8);
    for (const set of owners.values()) expect(set.size).toBe(1);
    const pids = new Set([...owners.values()].map((s) => Number([...s][0]!.split(':')[1])));
    expect([...pids].sort()).toEqual([apis[0].pid, apis[1].pid].sort());
  }, 240_000);
});
