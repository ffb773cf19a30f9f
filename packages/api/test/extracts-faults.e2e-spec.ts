/**
 * The API process killed (SIGKILL) at the two moments that matter for
 * extracts: while a file is being read and staged, and inside the confirm
 * transaction. The API runs as real OS processes (the built dist/main.js)
 * against this file's database; the test itself only arranges data, signs
 * in and reads the database.
 *
 * Short lease through configuration (CAIRN_EXTRACTS_LEASE_SECONDS), so the
 * sweep of the restarted process notices the dead job within seconds. The
 * pause inside confirm is the test-only fault point CAIRN_TEST_PAUSE_CONFIRM_MS
 * (refused at start outside the test profile; see load-config.spec.ts).
 */
import { QueryTypes, Transaction } from 'sequelize';
import type TestAgent from 'supertest/lib/agent.js';
import { type ApiProcess, onProcess, openRequest, startApiProcess } from './support/api-process.js';
import { signInAs, type SignedInAgent } from './support/auth.js';
import { createTestApp, type TestApp } from './support/test-app.js';
import {
  arrange,
  currentState,
  upload,
  waitDone,
  type ExtractsWorld,
} from './extracts-fixtures/api.js';
import { csvOf, goodRows } from './extracts-fixtures/rows.js';

const FAST = {
  CAIRN_EXTRACTS_LEASE_SECONDS: '2',
  CAIRN_EXTRACTS_POLL_INTERVAL_MS: '100',
  CAIRN_EXTRACTS_WORKERS: '1',
};

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

async function until<T>(
  what: string,
  probe: () => Promise<T | null | undefined | false>,
  timeoutMs = 60_000,
): Promise<T> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const value = await probe();
    if (value) return value;
    if (Date.now() > deadline) throw new Error(`timed out waiting for ${what}`);
    await sleep(20);
  }
}

describe('extracts: the API process killed', () => {
  let t: TestApp;
  let w: ExtractsWorld;
  let regional: SignedInAgent;
  const started: ApiProcess[] = [];

  const start = async (env: Record<string, string> = {}) => {
    const api = await startApiProcess(t, { ...FAST, ...env });
    started.push(api);
    return api;
  };

  /** Rows of a submission as MariaDB holds them, including uncommitted ones (READ UNCOMMITTED). */
  const dirty = async <T extends object>(sql: string, replacements: unknown[]) =>
    t.db.transaction(
      { isolationLevel: Transaction.ISOLATION_LEVELS.READ_UNCOMMITTED },
      (transaction) => t.db.query<T>(sql, { replacements, type: QueryTypes.SELECT, transaction }),
    );

  const submission = async (id: number) => {
    const [row] = await t.db.query<{
      status: string;
      rows_done: number;
      attempts: number;
      records_purged_at: Date | null;
      lease_owner: string | null;
    }>(
      'SELECT status, rows_done, attempts, records_purged_at, lease_owner FROM submissions WHERE id = ?',
      {
        replacements: [id],
        type: QueryTypes.SELECT,
      },
    );
    return row!;
  };

  const uploadConfirmed = async (
    agent: TestAgent,
    practice: number,
    quarter: number,
    rows: number,
    from: number,
  ) => {
    const res = await upload(agent, practice, quarter, csvOf(goodRows(rows, from)), {
      name: 'earlier.csv',
    });
    expect(res.status).toBe(202);
    const done = await waitDone(agent, practice, res.body.id);
    expect(done).toMatchObject({ status: 'awaiting_confirmation', counts: { rowsAccepted: rows } });
    await agent.post(`/api/practices/${practice}/submissions/${done.id}/confirm`).expect(200);
    return done.id as number;
  };

  beforeAll(async () => {
    // The in-process app only arranges data and signs people in: it reads no extracts itself.
    t = await createTestApp({
      configure: (c) => ({ ...c, extracts: { ...c.extracts, workers: 0 } }),
    });
    w = await arrange(t);
    regional = await signInAs(t, 'regional_lead');
  });
  afterAll(async () => {
    for (const api of started) await api.kill();
    await t?.close();
  });

  it('killed while reading a 60,000-row file: the previous submission stays current, the job fails plainly, its staged rows go, retry reads it', async () => {
    const practice = w.practice('OV102');
    const quarter = w.quarter('2026 Q3');
    let api = await start();
    let agent = onProcess(regional, api);
    const previous = await uploadConfirmed(agent, practice, quarter, 25, 1);
    const before = await currentState(t, practice, quarter);
    expect(before).toMatchObject({ current: previous, records: 25 });

    const big = csvOf(goodRows(60_000, 100_000));
    const res = await upload(agent, practice, quarter, big, { name: 'year-end.csv' });
    expect(res.status).toBe(202);
    const id = res.body.id as number;
    // Kill once the job shows progress and MariaDB holds staged (uncommitted) rows of it.
    const staged = await until('rows staged for the big file', async () => {
      const s = await submission(id);
      if (s.status !== 'processing')
        throw new Error(`the job ended (${s.status}) before it could be killed`);
      if (s.rows_done <= 0) return null;
      const [n] = await dirty<{ n: number }>(
        'SELECT COUNT(*) AS n FROM care_records WHERE submission_id = ?',
        [id],
      );
      return Number(n!.n) > 0 ? { rowsDone: s.rows_done, staged: Number(n!.n) } : null;
    });
    await api.kill();
    expect(staged.rowsDone).toBeGreaterThan(0);
    expect(staged.rowsDone).toBeLessThan(60_000);
    expect((await submission(id)).status).toBe('processing');

    api = await start();
    agent = onProcess(regional, api);
    // The sweep of the new process notices the lease that ran out, fails the job and removes its rows.
    const failed = await until('the sweep to fail the killed job', async () => {
      const s = await submission(id);
      return s.status === 'failed' && s.records_purged_at !== null ? s : null;
    });
    expect(failed.lease_owner).toBeNull();
    const [left] = await dirty<{ n: number }>(
      'SELECT COUNT(*) AS n FROM care_records WHERE submission_id = ?',
      [id],
    );
    expect(Number(left!.n)).toBe(0);
    expect(await currentState(t, practice, quarter)).toEqual(before);

    const view = await agent.get(`/api/practices/${practice}/submissions/${id}`).expect(200);
    expect(view.body).toMatchObject({
      status: 'failed',
      isCurrent: false,
      actions: { retry: true, confirm: false },
      failure: { attempts: 1, canRetry: true },
    });
    expect(view.body.failure.message).toBe(
      'Cairn stopped while checking this file (the server processing it stopped). Nothing from it was kept. Retry to check it again.',
    );
    const [audit] = await t.db.query<{ n: number }>(
      "SELECT COUNT(*) AS n FROM audit_events WHERE action = 'submission.failed' AND subject_type = 'submission' AND subject_id = ?",
      { replacements: [String(id)], type: QueryTypes.SELECT },
    );
    expect(Number(audit!.n)).toBe(1);

    const retried = await agent
      .post(`/api/practices/${practice}/submissions/${id}/retry`)
      .expect(200);
    expect(retried.body.status).toBe('processing');
    const done = await waitDone(agent, practice, id, 120_000);
    expect(done).toMatchObject({
      status: 'awaiting_confirmation',
      counts: { rowsRead: 60_000, rowsAccepted: 60_000, rowsRejected: 0 },
    });
    expect((await submission(id)).attempts).toBe(2);
    const [records] = await t.db.query<{ n: number; refs: number }>(
      'SELECT COUNT(*) AS n, COUNT(DISTINCT record_ref) AS refs FROM care_records WHERE submission_id = ?',
      { replacements: [id], type: QueryTypes.SELECT },
    );
    expect({ n: Number(records!.n), refs: Number(records!.refs) }).toEqual({
      n: 60_000,
      refs: 60_000,
    });
    // Still not current until someone confirms it.
    expect(await currentState(t, practice, quarter)).toEqual(before);
    await api.stop();
  }, 240_000);

  it('killed inside the confirm transaction: MariaDB rolls the switch back, readers only ever see the old or the new set, and confirm then works', async () => {
    const practice = w.practice('OV103');
    const quarter = w.quarter('2026 Q3');
    let api = await start();
    let agent = onProcess(regional, api);
    const previous = await uploadConfirmed(agent, practice, quarter, 30, 1);
    const res = await upload(agent, practice, quarter, csvOf(goodRows(45, 5000)), {
      name: 'new.csv',
    });
    const next = (await waitDone(agent, practice, res.body.id)).id as number;
    await api.stop();

    // A reader polling what every report reads: the records of the current submission.
    const seen = new Map<number, number>();
    let reading = true;
    const reader = (async () => {
      while (reading) {
        const [row] = await t.db.query<{ n: number }>(
          `SELECT COUNT(*) AS n FROM practice_quarters pq JOIN care_records r ON r.submission_id = pq.current_submission_id
            WHERE pq.practice_id = ? AND pq.quarter_id = ?`,
          { replacements: [practice, quarter], type: QueryTypes.SELECT },
        );
        const n = Number(row!.n);
        seen.set(n, (seen.get(n) ?? 0) + 1);
      }
    })();

    try {
      api = await start({ CAIRN_TEST_PAUSE_CONFIRM_MS: '60000' });
      // On a connection of its own, fully written before the kill: the kill can only cut it.
      const confirming = openRequest(
        regional,
        api,
        'POST',
        `/api/practices/${practice}/submissions/${next}/confirm`,
      );
      await confirming.sent;
      // Inside the paused transaction every write of the switch is done, not committed.
      await until('the confirm transaction to have switched (uncommitted)', async () => {
        const [pq] = await dirty<{ current: number | null }>(
          'SELECT current_submission_id AS current FROM practice_quarters WHERE practice_id = ? AND quarter_id = ?',
          [practice, quarter],
        );
        return pq?.current === next;
      });
      expect((await currentState(t, practice, quarter)).current).toBe(previous);
      await api.kill();
      // No response at all: not a byte arrived before the connection was cut.
      expect(await confirming.outcome).toEqual({
        error: expect.stringMatching(/socket hang up|ECONNRESET/),
        code: 'ECONNRESET',
        responseBytes: 0,
      });

      // The server notices the dropped connection and rolls the transaction back.
      await until('MariaDB to roll the confirm back', async () => {
        const [pq] = await dirty<{ current: number | null }>(
          'SELECT current_submission_id AS current FROM practice_quarters WHERE practice_id = ? AND quarter_id = ?',
          [practice, quarter],
        );
        return pq?.current === previous;
      });
      expect(await currentState(t, practice, quarter)).toMatchObject({
        current: previous,
        records: 30,
      });

      api = await start();
      agent = onProcess(regional, api);
      const waiting = await agent.get(`/api/practices/${practice}/submissions/${next}`).expect(200);
      expect(waiting.body).toMatchObject({
        status: 'awaiting_confirmation',
        actions: { confirm: true },
      });
      const old = await agent.get(`/api/practices/${practice}/submissions/${previous}`).expect(200);
      expect(old.body).toMatchObject({ status: 'accepted', isCurrent: true });
      await sleep(300); // the reader keeps reading across the restart
      const confirmed = await agent
        .post(`/api/practices/${practice}/submissions/${next}/confirm`)
        .expect(200);
      expect(confirmed.body).toMatchObject({ status: 'accepted', isCurrent: true });
      await sleep(300);
    } finally {
      reading = false;
      await reader;
    }
    expect(await currentState(t, practice, quarter)).toMatchObject({ current: next, records: 45 });
    expect([...seen.keys()].sort((a, b) => a - b)).toEqual([30, 45]);
    expect(seen.get(30)!).toBeGreaterThan(10);
    const events = await t.db.query<{ action: string; subject_id: string }>(
      "SELECT action, subject_id FROM audit_events WHERE action = 'submission.confirmed' AND subject_id IN (?) ORDER BY id",
      { replacements: [[String(previous), String(next)]], type: QueryTypes.SELECT },
    );
    // The killed confirm left no audit event: it was part of the rolled-back transaction.
    expect(events.map((e) => e.subject_id)).toEqual([String(previous), String(next)]);
    const [prev] = await t.db.query<{ status: string; superseded_by_submission_id: number }>(
      'SELECT status, superseded_by_submission_id FROM submissions WHERE id = ?',
      { replacements: [previous], type: QueryTypes.SELECT },
    );
    expect(prev).toEqual({ status: 'superseded', superseded_by_submission_id: next });
    await api.stop();
  }, 180_000);
});
