/**
 * The outbox against a real SMTP server on loopback (the local capture) when
 * things go wrong:
 *  - the server is down for the whole run, then comes up: every message is
 *    delivered, exactly once;
 *  - the server refuses some recipients: 550 marks those failed with the
 *    server's reply at once, a 4xx is tried again and gets through, the rest
 *    are sent;
 *  - the API process is killed (SIGKILL) in the middle of a run of 300
 *    messages and started again: every message is delivered, none missing, and
 *    no Message-ID is stored twice. A message the server had accepted just
 *    before the kill, whose "sent" the process never recorded, is sent again
 *    with the same Message-ID: the capture counts it as a repeat. The number of
 *    repeats is printed and written to .test-results/mail-sigkill.json.
 */
import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { QueryTypes } from 'sequelize';
import { findRepoRoot } from '../src/config/load-config.js';
import { defaultDeadline } from '../src/quarters/deadline.js';
import { startApiProcess } from './support/api-process.js';
import { seedDemoOrganisation, signInAs } from './support/auth.js';
import {
  type Capture,
  mailTestApp,
  outboxRows,
  startCapture,
  stateCounts,
  waitUntil,
} from './support/mail.js';
import type { TestApp } from './support/test-app.js';

/** `perPractice` extra addresses for each demo practice; the demo leads opt out of the opening message. */
async function arrangeRecipients(t: TestApp, perPractice: number): Promise<number> {
  await seedDemoOrganisation(t);
  const practices = await t.db.query<{ id: number; code: string }>(
    'SELECT id, code FROM practices WHERE active = 1 ORDER BY id',
    { type: QueryTypes.SELECT },
  );
  const values = practices.flatMap((p) =>
    Array.from({ length: perPractice }, (_, i) => [
      p.id,
      `contact${i + 1}@${p.code.toLowerCase()}.example`,
    ]),
  );
  await t.db.query(
    `INSERT INTO mail_extra_recipients (practice_id, address, added_by_label) VALUES ${values
      .map(() => "(?, ?, 'test')")
      .join(', ')}`,
    { replacements: values.flat(), type: QueryTypes.INSERT },
  );
  await t.db.query("UPDATE users SET mail_opt_outs = 'quarter_opened'", {
    type: QueryTypes.UPDATE,
  });
  return values.length;
}

async function openQuarter(t: TestApp): Promise<number> {
  const lead = await signInAs(t, 'regional_lead');
  const res = await lead
    .post('/api/quarters')
    .send({ year: 2027, quarter: 1, submissionDeadline: defaultDeadline(2027, 1, 45) })
    .expect(201);
  return res.body.id as number;
}

describe('outbox faults', () => {
  describe('the mail server down for the whole run, then up', () => {
    let capture: Capture;
    let t: TestApp;

    beforeAll(async () => {
      capture = await startCapture({ listen: false });
      t = await mailTestApp(capture.port);
    });
    afterAll(async () => {
      await t?.close();
      await capture?.stop();
    });

    it('keeps every message queued while the server is away, then delivers each exactly once', async () => {
      const expected = await arrangeRecipients(t, 1);
      await openQuarter(t);
      expect(await outboxRows(t)).toHaveLength(expected);
      // Every message tried at least once, some twice, none given up: all still queued. The
      // snapshot is taken between attempts (no message mid-attempt, `sending`, in it): an
      // attempt against an absent server lasts a moment, and retries come within a second.
      let waiting: Awaited<ReturnType<typeof outboxRows>> = [];
      await waitUntil(
        async () => {
          waiting = await outboxRows(t);
          return (
            waiting.every((r) => r.attempts >= 1 && r.state !== 'sending') &&
            waiting.some((r) => r.attempts >= 2)
          );
        },
        30_000,
        async () => JSON.stringify(await stateCounts(t)),
      );
      expect(new Set(waiting.map((r) => r.state))).toEqual(new Set(['queued']));
      for (const row of waiting) expect(row.last_error).toMatch(/ECONNREFUSED|connect/);
      expect(capture.messages()).toEqual([]);

      await capture.start();
      await waitUntil(
        async () => (await stateCounts(t)).sent === expected,
        30_000,
        async () => JSON.stringify(await stateCounts(t)),
      );
      const rows = await outboxRows(t);
      const arrived = capture.messages();
      expect(arrived).toHaveLength(expected);
      expect(new Set(arrived.map((m) => m.messageId))).toEqual(
        new Set(rows.map((r) => r.message_id)),
      );
      expect(capture.mailbox.stats()).toEqual({ messages: expected, repeats: 0 });
    });
  });

  describe('the mail server refusing some recipients', () => {
    let capture: Capture;
    let t: TestApp;
    const tried = new Map<string, number>();

    beforeAll(async () => {
      capture = await startCapture({
        refuseRecipient: (address) => {
          tried.set(address, (tried.get(address) ?? 0) + 1);
          if (address.startsWith('contact2@'))
            return { code: 550, message: `5.1.1 <${address}>: mailbox unavailable` };
          // OV104's first contact is busy the first time only: a transient refusal.
          if (address === 'contact1@ov104.example' && tried.get(address) === 1)
            return { code: 452, message: '4.2.2 mailbox full, try again later' };
          return null;
        },
      });
      t = await mailTestApp(capture.port);
    });
    afterAll(async () => {
      await t?.close();
      await capture?.stop();
    });

    it('marks the refused failed with the server’s reply, retries the busy one, sends the rest', async () => {
      const expected = await arrangeRecipients(t, 2);
      await openQuarter(t);
      await waitUntil(
        async () => {
          const c = await stateCounts(t);
          return (c.sent ?? 0) + (c.failed ?? 0) === expected;
        },
        30_000,
        async () => JSON.stringify(await stateCounts(t)),
      );
      const rows = await outboxRows(t);
      const failed = rows.filter((r) => r.state === 'failed');
      expect(failed.map((r) => r.recipient_address).sort()).toEqual(
        rows
          .filter((r) => r.recipient_address.startsWith('contact2@'))
          .map((r) => r.recipient_address)
          .sort(),
      );
      expect(failed).toHaveLength(expected / 2);
      for (const row of failed) {
        expect(row.attempts).toBe(1);
        expect(row.last_reply_code).toBe(550);
        expect(row.last_error).toBe(`550 5.1.1 <${row.recipient_address}>: mailbox unavailable`);
      }
      const busy = rows.find((r) => r.recipient_address === 'contact1@ov104.example')!;
      expect(busy).toMatchObject({ state: 'sent', attempts: 2, last_error: null });
      const sent = rows.filter((r) => r.state === 'sent');
      expect(sent).toHaveLength(expected / 2);
      expect(
        capture
          .messages()
          .map((m) => m.messageId)
          .sort(),
      ).toEqual(sent.map((r) => r.message_id).sort());
      expect(capture.mailbox.stats().repeats).toBe(0);
    });
  });

  describe('the API killed mid-run and started again', () => {
    let capture: Capture;
    let t: TestApp;
    const RUN = 300;

    beforeAll(async () => {
      // A server that answers each message after 15 ms: the run takes a second or so.
      capture = await startCapture({ delayMs: 15 });
      // This process queues only; the API processes started below send.
      t = await mailTestApp(capture.port, { concurrency: 0 });
    });
    afterAll(async () => {
      await t?.close();
      await capture?.stop();
    });

    it(`delivers all ${RUN} messages exactly once (distinct Message-IDs), repeats counted`, async () => {
      const expected = await arrangeRecipients(t, RUN / 30);
      expect(expected).toBe(RUN);
      await openQuarter(t);
      expect(await outboxRows(t)).toHaveLength(RUN);

      const env = {
        CAIRN_MAIL_PORT: String(capture.port),
        CAIRN_MAIL_OUTBOX_CONCURRENCY: '5',
        CAIRN_MAIL_OUTBOX_POLL_INTERVAL_MS: '100',
        CAIRN_MAIL_OUTBOX_LEASE_SECONDS: '2',
        CAIRN_MAIL_OUTBOX_BACKOFF_BASE_SECONDS: '0.2',
        CAIRN_MAIL_OUTBOX_BACKOFF_MAX_SECONDS: '1',
        CAIRN_MAIL_REMINDERS_CHECK_CRON: '0 0 0 1 1 *',
        CAIRN_MAIL_DIGESTS_CHECK_CRON: '0 0 0 1 1 *',
      };
      const first = await startApiProcess(t, env);
      await capture.waitFor(RUN / 3, 60_000);
      await first.kill();
      const atKill = await stateCounts(t);
      const heldAtKill = atKill.sending ?? 0;
      const arrivedAtKill = capture.mailbox.stats().messages;
      expect(atKill.sent ?? 0).toBeLessThan(RUN);

      const second = await startApiProcess(t, env);
      try {
        await waitUntil(
          async () => (await stateCounts(t)).sent === RUN,
          90_000,
          async () => JSON.stringify(await stateCounts(t)),
        );
      } finally {
        await second.stop();
      }
      const rows = await outboxRows(t);
      const arrived = capture.messages();
      const distinct = new Set(arrived.map((m) => m.messageId));
      const missing = rows.filter((r) => !distinct.has(r.message_id));
      const stats = capture.mailbox.stats();
      const resumed = rows.reduce((n, r) => n + r.resumed, 0);
      const figures = {
        messages: RUN,
        sentBeforeKill: atKill.sent ?? 0,
        sendingAtKill: heldAtKill,
        arrivedBeforeKill: arrivedAtKill,
        distinctMessageIds: distinct.size,
        missing: missing.length,
        repeats: stats.repeats,
        resumedRows: resumed,
        // Any message that arrived more often than its row was resumed, with its row and the
        // outbox's warnings of both processes: what to read when the counts below disagree.
        unexplained: arrived
          .map((m) => ({ m, row: rows.find((r) => r.message_id === m.messageId) }))
          .filter(({ m, row }) => m.repeats > (row?.resumed ?? 0))
          .map(({ m, row }) => ({
            messageId: m.messageId,
            repeats: m.repeats,
            receivedAt: m.receivedAt,
            repeatedAt: m.repeatedAt,
            attempts: row?.attempts ?? null,
            resumed: row?.resumed ?? null,
            lastError: row?.last_error ?? null,
          })),
        warnings: [first.output(), second.output()].map((out) =>
          out
            .split('\n')
            .filter((line) => /outbox|lease|resum/i.test(line))
            .slice(0, 40),
        ),
      };
      console.log(`SIGKILL mid-run: ${JSON.stringify(figures)}`);
      const dir = join(findRepoRoot(), '.test-results');
      mkdirSync(dir, { recursive: true });
      writeFileSync(join(dir, 'mail-sigkill.json'), `${JSON.stringify(figures, null, 2)}\n`);

      expect(arrived).toHaveLength(RUN);
      expect(distinct.size).toBe(RUN);
      expect(missing).toEqual([]);
      expect(rows.every((r) => r.state === 'sent')).toBe(true);
      // Only a message held mid-send at the kill can arrive twice, and only once more.
      expect(resumed).toBe(heldAtKill);
      expect(stats.repeats).toBeLessThanOrEqual(resumed);
      for (const message of arrived) expect(message.repeats).toBeLessThanOrEqual(1);
      // Two API processes start (each given 90 s to become healthy) and the run has its own
      // limits above: the test as a whole needs more than the default minute on a busy machine.
    }, 360_000);
  });
});
