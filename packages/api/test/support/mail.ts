/**
 * Mail in API tests: a real SMTP server on loopback (the local capture,
 * smtp-server + mailparser) and a test app whose outbox sends to it quickly
 * (short poll, lease and back-off; the scheduled reminder check left to the
 * test).
 *
 *   const capture = await startCapture();
 *   const t = await mailTestApp(capture.port);
 *   await capture.waitFor(3);                      // three distinct messages arrived
 *   const raw = capture.raw(capture.messages()[0]!); // the .eml as received
 */
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { QueryTypes } from 'sequelize';
import type { SMTPServer } from 'smtp-server';
import type { CairnConfig } from '../../src/config/config.schema.js';
import {
  type CaptureOptions,
  type CapturedMessage,
  Mailbox,
  startSmtpCapture,
} from '../../src/dev/smtp-capture.js';
import { freePort } from './ports.js';
import { createTestApp, type TestApp, type TestAppOptions } from './test-app.js';

export interface Capture {
  port: number;
  mailbox: Mailbox;
  messages(): CapturedMessage[];
  raw(message: CapturedMessage): string;
  /** Waits until `n` distinct messages have arrived */
  waitFor(n: number, timeoutMs?: number): Promise<CapturedMessage[]>;
  /** Starts listening (again) on the same port */
  start(): Promise<void>;
  stop(): Promise<void>;
}

export async function startCapture(
  options: CaptureOptions & { port?: number; listen?: boolean } = {},
): Promise<Capture> {
  const port = options.port ?? (await freePort());
  const mailbox = new Mailbox(mkdtempSync(join(tmpdir(), 'cairn-mail-test-')));
  let server: SMTPServer | null = null;
  const capture: Capture = {
    port,
    mailbox,
    messages: () => mailbox.list(),
    raw: (message) => mailbox.raw(message.id)!.toString('utf8'),
    waitFor: async (n, timeoutMs = 30_000) => {
      await waitUntil(
        () => mailbox.list().length >= n,
        timeoutMs,
        () => {
          return `${mailbox.list().length} of ${n} messages arrived`;
        },
      );
      return mailbox.list();
    },
    start: async () => {
      server = await startSmtpCapture(mailbox, '127.0.0.1', port, options);
    },
    stop: async () => {
      const s = server;
      server = null;
      if (s) await new Promise<void>((resolve) => s.close(() => resolve()));
    },
  };
  if (options.listen !== false) await capture.start();
  return capture;
}

/** Mail settings for a test: send to `port`, quickly. */
export function withMail(port: number, outbox: Partial<CairnConfig['mail']['outbox']> = {}) {
  return (config: CairnConfig): CairnConfig => ({
    ...config,
    mail: {
      ...config.mail,
      port,
      timeoutSeconds: 5,
      outbox: {
        ...config.mail.outbox,
        concurrency: 5,
        pollIntervalMs: 100,
        leaseSeconds: 3,
        maxAttempts: 10,
        backoffBaseSeconds: 0.2,
        backoffMaxSeconds: 1,
        ...outbox,
      },
      // Reminders run when a test asks (QuarterMailService.runReminderCheck), not on the clock.
      reminders: { ...config.mail.reminders, checkCron: '0 0 0 1 1 *' },
      digests: { ...config.mail.digests, checkCron: '0 0 0 1 1 *' },
    },
  });
}

export function mailTestApp(
  port: number,
  outbox: Partial<CairnConfig['mail']['outbox']> = {},
  options: TestAppOptions = {},
): Promise<TestApp> {
  return createTestApp({ ...options, configure: withMail(port, outbox) });
}

export async function waitUntil(
  done: () => boolean | Promise<boolean>,
  timeoutMs: number,
  describe: () => string | Promise<string> = () => 'condition',
): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  while (!(await done())) {
    if (Date.now() > deadline) throw new Error(`timed out: ${await describe()}`);
    await new Promise((r) => setTimeout(r, 50));
  }
}

export interface OutboxRowView {
  id: number;
  kind: string;
  source_id: number;
  practice_id: number;
  recipient_address: string;
  state: string;
  attempts: number;
  resumed: number;
  message_id: string | null;
  last_error: string | null;
  last_reply_code: number | null;
}

export function outboxRows(t: TestApp, where = '1 = 1', params: unknown[] = []) {
  return t.db.query<OutboxRowView>(
    `SELECT id, kind, source_id, practice_id, recipient_address, state, attempts, resumed, message_id,
            last_error, last_reply_code
       FROM outbox_messages WHERE ${where} ORDER BY id`,
    { replacements: params, type: QueryTypes.SELECT },
  );
}

export async function stateCounts(t: TestApp): Promise<Record<string, number>> {
  const rows = await t.db.query<{ state: string; n: number }>(
    'SELECT state, COUNT(*) AS n FROM outbox_messages GROUP BY state',
    { type: QueryTypes.SELECT },
  );
  return Object.fromEntries(rows.map((r) => [r.state, Number(r.n)]));
}

/** A date `days` from today (UTC), YYYY-MM-DD. */
export function daysFromToday(days: number): string {
  return new Date(Date.now() + days * 86_400_000).toISOString().slice(0, 10);
}

/** One header of a raw message (unfolded), or null. */
export function header(raw: string, name: string): string | null {
  const head = raw.split(/\r?\n\r?\n/)[0]!.replace(/\r?\n[ \t]+/g, ' ');
  const match = new RegExp(`^${name}:\\s*(.*)$`, 'im').exec(head);
  return match ? match[1]!.trim() : null;
}
