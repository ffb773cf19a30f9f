/**
 * Sends the outbox's messages from this API process. Messages live in
 * MariaDB, so any number of API processes send together:
 *
 * - claim: SELECT … FOR UPDATE SKIP LOCKED the messages due, and mark them
 *   sending, each with its Message-ID, under a lease this process renews
 *   while it sends (OutboxRepository.claim);
 * - send: compose, hand to the SMTP server through the pooled transport, and
 *   mark sent right after the server's 250; a refusal (5xx) marks the message
 *   failed with the server's reply; anything else (4xx, no answer) queues it
 *   again after an exponential back-off, until the attempts are used up;
 * - a process that dies mid-send leaves its messages sending: once their lease
 *   runs out another process (or this one, restarted) claims them again and
 *   sends them with the same Message-ID. The server may then have the message
 *   twice (if the first 250 came but the process died before recording it);
 *   the Message-ID lets the receiver see it is the same message.
 * - while the server cannot be reached at all, this process waits (the same
 *   back-off) before claiming more, rather than failing every message in turn.
 */
import { randomBytes } from 'node:crypto';
import { hostname } from 'node:os';
import {
  Inject,
  Injectable,
  Logger,
  type OnApplicationBootstrap,
  type OnApplicationShutdown,
} from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import type { SendMailOptions } from 'nodemailer';
import type { CairnConfig } from '../config/config.schema.js';
import { type ComposedMail, CompositionError, MailComposers } from './mail-composers.js';
import { MailTransport, type SentReply } from './mail-transport.js';
import { backoffMs, classifyFailure, clip, messageIdHost } from './outbox-policy.js';
import { OutboxRepository, type OutboxMessageRow } from './outbox.repository.js';

/** The headers and parts of one outbox message as handed to nodemailer. */
export function mailOptions(
  row: Pick<OutboxMessageRow, 'recipient_address' | 'recipient_name' | 'message_id'>,
  composed: ComposedMail,
  settings: { from: string; publicUrl: string },
  now = new Date(),
): SendMailOptions {
  const profile = new URL('/profile', settings.publicUrl).href;
  return {
    from: settings.from,
    to: row.recipient_name
      ? { name: row.recipient_name, address: row.recipient_address }
      : row.recipient_address,
    subject: composed.subject,
    text: composed.text,
    html: composed.html,
    attachments: composed.attachments?.map((a) => ({ ...a })),
    messageId: row.message_id ?? undefined,
    date: now,
    headers: {
      // RFC 2369: where the reader stops these messages (their mail preferences).
      'List-Unsubscribe': `<${profile}>`,
      // RFC 3834: sent by Cairn, not by a person; no automatic replies, please.
      'Auto-Submitted': 'auto-generated',
    },
  };
}

/** Tries to record a message the server accepted (50, 100, 200 … ms apart). */
const RECORD_ATTEMPTS = 6;

@Injectable()
export class OutboxWorker implements OnApplicationBootstrap, OnApplicationShutdown {
  private readonly logger = new Logger('Outbox');
  readonly owner = `${hostname().slice(0, 30)}:${process.pid}:${randomBytes(3).toString('hex')}`;
  private readonly inFlight = new Map<number, Promise<void>>();
  private timer: NodeJS.Timeout | null = null;
  private renewTimer: NodeJS.Timeout | null = null;
  private ticking = false;
  private again = false;
  private stopping = false;
  /** While the server cannot be reached: no claims before this time */
  private pausedUntil = 0;
  private unreachableInARow = 0;

  constructor(
    @Inject(OutboxRepository) private readonly outbox: OutboxRepository,
    @Inject(MailTransport) private readonly transport: MailTransport,
    @Inject(MailComposers) private readonly composers: MailComposers,
    @Inject(ConfigService) private readonly config: ConfigService<CairnConfig, true>,
  ) {}

  private get settings() {
    return this.config.get('mail', { infer: true });
  }

  private get host(): string {
    return messageIdHost(this.config.get('server', { infer: true }).publicUrl);
  }

  onApplicationBootstrap(): void {
    const { outbox } = this.settings;
    if (outbox.concurrency === 0) return;
    this.timer = setInterval(() => void this.tick(), outbox.pollIntervalMs);
    this.timer.unref();
    this.renewTimer = setInterval(() => void this.renew(), (outbox.leaseSeconds * 1000) / 3);
    this.renewTimer.unref();
    this.kick();
  }

  async onApplicationShutdown(): Promise<void> {
    this.stopping = true;
    if (this.timer) clearInterval(this.timer);
    if (this.renewTimer) clearInterval(this.renewTimer);
    const inFlight = [...this.inFlight.values()];
    if (inFlight.length === 0) return;
    let timer: NodeJS.Timeout | undefined;
    await Promise.race([
      Promise.allSettled(inFlight),
      new Promise((resolve) => {
        timer = setTimeout(resolve, 10_000);
        timer.unref();
      }),
    ]);
    clearTimeout(timer);
  }

  /** Look for messages now (after queueing some in this process). */
  kick(): void {
    if (this.settings.outbox.concurrency === 0 || this.stopping) return;
    setImmediate(() => void this.tick());
  }

  /** Messages this process is sending now. */
  get busy(): number {
    return this.inFlight.size;
  }

  async tick(): Promise<void> {
    if (this.stopping) return;
    if (this.ticking) {
      this.again = true;
      return;
    }
    this.ticking = true;
    const { concurrency, leaseSeconds } = this.settings.outbox;
    try {
      do {
        this.again = false;
        while (
          !this.stopping &&
          Date.now() >= this.pausedUntil &&
          this.inFlight.size < concurrency
        ) {
          const rows = await this.outbox.claim(
            this.owner,
            concurrency - this.inFlight.size,
            leaseSeconds,
            this.host,
          );
          if (rows.length === 0) break;
          for (const row of rows) this.start(row);
        }
      } while (this.again && !this.stopping);
    } catch (error) {
      if (!this.stopping) this.logger.warn({ err: error }, 'outbox check failed; will try again');
    } finally {
      this.ticking = false;
    }
  }

  private start(row: OutboxMessageRow): void {
    if (row.resumed > 0 && row.state === 'sending')
      this.logger.warn(
        { outboxId: row.id, messageId: row.message_id, attempts: row.attempts },
        'resuming a message whose sender stopped mid-send (same Message-ID)',
      );
    const job = this.deliver(row)
      .catch((error: unknown) =>
        this.logger.error({ err: error, outboxId: row.id }, 'outbox message crashed'),
      )
      .finally(() => {
        this.inFlight.delete(row.id);
        this.kick();
      });
    this.inFlight.set(row.id, job);
  }

  private async deliver(row: OutboxMessageRow): Promise<void> {
    const mail = this.settings;
    let composed: ComposedMail;
    try {
      composed = await this.composers.get(row.kind).compose(row);
    } catch (error) {
      const permanent = error instanceof CompositionError;
      const message = clip(
        `Cairn could not compose this message: ${(error as Error).message}`,
        1000,
      );
      if (permanent || row.attempts >= mail.outbox.maxAttempts)
        await this.outbox.markFailed(row.id, this.owner, { error: message, replyCode: null });
      else
        await this.outbox.markRetry(
          row.id,
          this.owner,
          { error: message, replyCode: null },
          backoffMs(row.attempts, mail.outbox),
        );
      return;
    }
    const options = mailOptions(row, composed, {
      from: mail.from,
      publicUrl: this.config.get('server', { infer: true }).publicUrl,
    });
    let reply: SentReply;
    try {
      reply = await this.transport.send(options);
    } catch (error) {
      const failure = classifyFailure(error);
      if (failure.replyCode === null && Date.now() >= this.pausedUntil) {
        // No answer from the server: it is the server that is away, not this message's fault.
        // The pause grows with each round of sends that found it away (not with each message).
        this.unreachableInARow++;
        this.pausedUntil = Date.now() + backoffMs(this.unreachableInARow, mail.outbox);
      }
      if (failure.kind === 'permanent') {
        await this.outbox.markFailed(row.id, this.owner, failure);
      } else if (row.attempts >= mail.outbox.maxAttempts) {
        await this.outbox.markFailed(row.id, this.owner, {
          ...failure,
          error: clip(`${failure.error} (gave up after ${row.attempts} attempts)`, 1000),
        });
      } else {
        await this.outbox.markRetry(
          row.id,
          this.owner,
          failure,
          backoffMs(row.attempts, mail.outbox),
        );
      }
      return;
    }
    // The server has the message. Whatever happens from here on, it is not sent again as if the
    // server had not taken it: a failure to record the 250 (a deadlock, a lost connection to
    // MariaDB) is retried as a failure to record, never as a failure to send.
    this.unreachableInARow = 0;
    await this.recordSent(row, reply.response);
  }

  /**
   * Marks a message the server accepted as sent, trying again while MariaDB refuses the update.
   * Its lease is renewed meanwhile (it stays in flight). If it cannot be recorded at all, the row
   * stays `sending`: after its lease it is sent again with the same Message-ID, counted as resumed.
   */
  private async recordSent(row: OutboxMessageRow, response: string): Promise<void> {
    for (let attempt = 1; ; attempt++) {
      try {
        if (!(await this.outbox.markSent(row.id, this.owner, response)))
          this.logger.warn(
            { outboxId: row.id, messageId: row.message_id },
            'sent, but the lease had passed to another process meanwhile',
          );
        return;
      } catch (error) {
        if (attempt >= RECORD_ATTEMPTS) {
          this.logger.error(
            { err: error, outboxId: row.id, messageId: row.message_id },
            'the server took the message but Cairn could not record it; it is sent again after its lease, with the same Message-ID',
          );
          return;
        }
        this.logger.warn(
          { err: error, outboxId: row.id, attempt },
          'could not record a sent message yet; trying again',
        );
        await new Promise((resolve) => setTimeout(resolve, 50 * 2 ** attempt));
      }
    }
  }

  private async renew(): Promise<void> {
    if (this.inFlight.size === 0) return;
    try {
      await this.outbox.renew(
        this.owner,
        [...this.inFlight.keys()],
        this.settings.outbox.leaseSeconds,
      );
    } catch (error) {
      this.logger.warn({ err: error }, 'could not renew outbox leases');
    }
  }
}
