/**
 * The one owner of `outbox_batches` and `outbox_messages`: queueing, every
 * state and lease change, and the delivery page's reads. Each state-changing
 * UPDATE checks the state it leaves (and, for a message being sent, the
 * lease) in its WHERE clause, so that two processes cannot both win; callers
 * learn from the count of changed rows.
 *
 *   queued ──claim──▶ sending ──250──▶ sent
 *     ▲                 │  ├──5xx, or attempts used up──▶ failed ──resend──▶ queued
 *     └──4xx, no answer─┘  └──lease ran out (process died)──▶ claimed again, same Message-ID
 */
import { Inject, Injectable } from '@nestjs/common';
import { QueryTypes, type Transaction } from 'sequelize';
import { Sequelize } from 'sequelize-typescript';

import type { OutboxState } from './outbox-policy.js';

export type { OutboxState };

export interface OutboxMessageRow {
  id: number;
  batch_id: number;
  kind: string;
  source_id: number;
  practice_id: number;
  region_id: number;
  recipient_address: string;
  recipient_name: string | null;
  recipient_user_id: number | null;
  state: OutboxState;
  attempts: number;
  resumed: number;
  resends: number;
  next_attempt_at: Date;
  lease_owner: string | null;
  lease_expires_at: Date | null;
  message_id: string | null;
  last_error: string | null;
  last_reply_code: number | null;
  server_reply: string | null;
  queued_at: Date;
  last_attempt_at: Date | null;
  sent_at: Date | null;
  failed_at: Date | null;
}

export interface Recipient {
  address: string;
  name: string | null;
  userId: number | null;
}

export interface QueueRequest {
  kind: string;
  sourceId: number;
  regionId: number;
  practiceId: number;
  recipients: readonly Recipient[];
}

export interface SourceCounts {
  kind: string;
  source_id: number;
  queued: number;
  sending: number;
  sent: number;
  failed: number;
  first_queued_at: Date;
  last_activity_at: Date;
}

export interface BatchSummary {
  kind: string;
  source_id: number;
  practices: number;
  practices_without_recipients: number;
}

@Injectable()
export class OutboxRepository {
  constructor(@Inject(Sequelize) private readonly sequelize: Sequelize) {}

  transaction<T>(work: (transaction: Transaction) => Promise<T>): Promise<T> {
    return this.sequelize.transaction(work);
  }

  private async execute(sql: string, replacements: unknown[], transaction?: Transaction) {
    const [, affected] = (await this.sequelize.query(sql, {
      replacements,
      type: QueryTypes.UPDATE,
      transaction,
    })) as unknown as [unknown, number];
    return Number(affected ?? 0);
  }

  private select<T extends object>(
    sql: string,
    replacements: unknown[],
    transaction?: Transaction,
  ) {
    return this.sequelize.query<T>(sql, { replacements, type: QueryTypes.SELECT, transaction });
  }

  // ── queueing ──

  /**
   * Queues one practice's messages for a source, once: the batch row's unique key (kind,
   * source, practice) lets only the first caller in, whichever process it runs in; a later
   * call (a second process, a rerun after a restart) queues nothing and returns null. Each
   * message's own unique key (kind, source, practice, recipient) holds as well. Runs in the
   * caller's transaction, so the messages commit with the change that caused them.
   */
  async queue(request: QueueRequest, transaction: Transaction): Promise<number | null> {
    const recipients = dedupe(request.recipients);
    const [, inserted] = (await this.sequelize.query(
      `INSERT IGNORE INTO outbox_batches (kind, source_id, practice_id, region_id, recipients)
       VALUES (?, ?, ?, ?, ?)`,
      {
        replacements: [
          request.kind,
          request.sourceId,
          request.practiceId,
          request.regionId,
          recipients.length,
        ],
        type: QueryTypes.INSERT,
        transaction,
      },
    )) as unknown as [number, number];
    if (Number(inserted) === 0) return null;
    const [batch] = await this.select<{ id: number }>(
      'SELECT id FROM outbox_batches WHERE kind = ? AND source_id = ? AND practice_id = ?',
      [request.kind, request.sourceId, request.practiceId],
      transaction,
    );
    if (recipients.length === 0) return 0;
    const values = recipients.map(() => '(?, ?, ?, ?, ?, ?, ?, ?, NOW(3), NOW(3))').join(', ');
    const [, queued] = (await this.sequelize.query(
      `INSERT IGNORE INTO outbox_messages (batch_id, kind, source_id, practice_id, region_id,
         recipient_address, recipient_name, recipient_user_id, next_attempt_at, queued_at)
       VALUES ${values}`,
      {
        replacements: recipients.flatMap((r) => [
          batch!.id,
          request.kind,
          request.sourceId,
          request.practiceId,
          request.regionId,
          r.address,
          r.name,
          r.userId,
        ]),
        type: QueryTypes.INSERT,
        transaction,
      },
    )) as unknown as [number, number];
    return Number(queued);
  }

  // ── sending ──

  /**
   * Claims up to `limit` messages for `owner`: first those whose sender died mid-send (state
   * sending, lease run out: they are resent with the Message-ID they already carry), then
   * those due. Each is marked sending, with its Message-ID, before anything is handed to the
   * mail server. SKIP LOCKED: processes claiming at once take different rows.
   */
  claim(
    owner: string,
    limit: number,
    leaseSeconds: number,
    messageIdHost: string,
  ): Promise<OutboxMessageRow[]> {
    return this.transaction(async (transaction) => {
      const stale = await this.select<{ id: number }>(
        `SELECT id FROM outbox_messages WHERE state = 'sending' AND lease_expires_at < NOW(3)
          ORDER BY lease_expires_at LIMIT ? FOR UPDATE SKIP LOCKED`,
        [limit],
        transaction,
      );
      const due =
        stale.length < limit
          ? await this.select<{ id: number }>(
              `SELECT id FROM outbox_messages WHERE state = 'queued' AND next_attempt_at <= NOW(3)
                ORDER BY next_attempt_at, id LIMIT ? FOR UPDATE SKIP LOCKED`,
              [limit - stale.length],
              transaction,
            )
          : [];
      const ids = [...stale, ...due].map((r) => r.id);
      if (ids.length === 0) return [];
      // MariaDB assigns left to right: `resumed` reads the state before it changes.
      await this.execute(
        `UPDATE outbox_messages
            SET resumed = resumed + IF(state = 'sending', 1, 0),
                state = 'sending', lease_owner = ?, lease_expires_at = NOW(3) + INTERVAL ? SECOND,
                attempts = attempts + 1, last_attempt_at = NOW(3),
                message_id = COALESCE(message_id, CONCAT('<outbox-', id, '.region-', region_id, '@', ?, '>'))
          WHERE id IN (?)`,
        [owner, leaseSeconds, messageIdHost, ids],
        transaction,
      );
      return this.select<OutboxMessageRow>(
        'SELECT * FROM outbox_messages WHERE id IN (?) ORDER BY id',
        [ids],
        transaction,
      );
    });
  }

  /**
   * Extends the leases `owner` holds on these messages (a send still under way). Through the
   * primary key, as every other update of one message goes: left to itself MariaDB reads these
   * rows through the (state, next_attempt_at) index and locks in the opposite order to a
   * concurrent markSent, and one of the two dies in a deadlock.
   */
  renew(owner: string, ids: readonly number[], leaseSeconds: number): Promise<number> {
    if (ids.length === 0) return Promise.resolve(0);
    return this.execute(
      `UPDATE outbox_messages FORCE INDEX (PRIMARY) SET lease_expires_at = NOW(3) + INTERVAL ? SECOND
        WHERE id IN (?) AND state = 'sending' AND lease_owner = ?`,
      [leaseSeconds, [...ids], owner],
    );
  }

  /** The server accepted the message (250): sent. False when the lease was lost meanwhile. */
  async markSent(id: number, owner: string, reply: string): Promise<boolean> {
    return (
      (await this.execute(
        `UPDATE outbox_messages SET state = 'sent', sent_at = NOW(3), server_reply = ?, last_error = NULL,
           last_reply_code = NULL, lease_owner = NULL, lease_expires_at = NULL
         WHERE id = ? AND state = 'sending' AND lease_owner = ?`,
        [reply.slice(0, 500), id, owner],
      )) > 0
    );
  }

  /** A transient failure: back to the queue, due again after `delayMs`. */
  async markRetry(
    id: number,
    owner: string,
    failure: { error: string; replyCode: number | null },
    delayMs: number,
  ): Promise<boolean> {
    return (
      (await this.execute(
        `UPDATE outbox_messages SET state = 'queued', next_attempt_at = NOW(3) + INTERVAL ? MICROSECOND,
           last_error = ?, last_reply_code = ?, lease_owner = NULL, lease_expires_at = NULL
         WHERE id = ? AND state = 'sending' AND lease_owner = ?`,
        [Math.round(delayMs * 1000), failure.error, failure.replyCode, id, owner],
      )) > 0
    );
  }

  /** Refused for good, or out of attempts: failed, with the server's reply. */
  async markFailed(
    id: number,
    owner: string,
    failure: { error: string; replyCode: number | null },
  ): Promise<boolean> {
    return (
      (await this.execute(
        `UPDATE outbox_messages SET state = 'failed', failed_at = NOW(3), last_error = ?, last_reply_code = ?,
           lease_owner = NULL, lease_expires_at = NULL
         WHERE id = ? AND state = 'sending' AND lease_owner = ?`,
        [failure.error, failure.replyCode, id, owner],
      )) > 0
    );
  }

  /** Failed messages of a source (or one failed message) queued again, attempts from zero. */
  resendFailed(
    where: { regionId: number; kind: string; sourceId: number } | { regionId: number; id: number },
    transaction: Transaction,
  ): Promise<number> {
    const [clause, params] =
      'id' in where
        ? ['region_id = ? AND id = ?', [where.regionId, where.id]]
        : [
            'region_id = ? AND kind = ? AND source_id = ?',
            [where.regionId, where.kind, where.sourceId],
          ];
    return this.execute(
      `UPDATE outbox_messages SET state = 'queued', attempts = 0, resends = resends + 1,
         next_attempt_at = NOW(3), failed_at = NULL
       WHERE ${clause} AND state = 'failed'`,
      params,
      transaction,
    );
  }

  // ── reading ──

  async find(id: number, transaction?: Transaction): Promise<OutboxMessageRow | null> {
    if (!Number.isSafeInteger(id)) return null;
    const [row] = await this.select<OutboxMessageRow>(
      'SELECT * FROM outbox_messages WHERE id = ?',
      [id],
      transaction,
    );
    return row ?? null;
  }

  /** Counts by state for each source of a region, latest first. */
  async sourceCounts(
    regionId: number,
    only?: { kind: string; sourceId: number },
  ): Promise<SourceCounts[]> {
    const rows = await this.select<SourceCounts>(
      `SELECT kind, source_id,
              SUM(state = 'queued') AS queued, SUM(state = 'sending') AS sending,
              SUM(state = 'sent') AS sent, SUM(state = 'failed') AS failed,
              MIN(queued_at) AS first_queued_at,
              GREATEST(MAX(queued_at), COALESCE(MAX(last_attempt_at), MAX(queued_at))) AS last_activity_at
         FROM outbox_messages
        WHERE region_id = ? ${only ? 'AND kind = ? AND source_id = ?' : ''}
        GROUP BY kind, source_id
        ORDER BY first_queued_at DESC, kind`,
      only ? [regionId, only.kind, only.sourceId] : [regionId],
    );
    return rows.map((r) => ({
      ...r,
      queued: Number(r.queued),
      sending: Number(r.sending),
      sent: Number(r.sent),
      failed: Number(r.failed),
    }));
  }

  /** Practices reached per source, and how many of them had nobody to write to. */
  async batchSummaries(
    regionId: number,
    only?: { kind: string; sourceId: number },
  ): Promise<(BatchSummary & { first_at: Date })[]> {
    const rows = await this.select<BatchSummary & { first_at: Date }>(
      `SELECT kind, source_id, COUNT(*) AS practices, SUM(recipients = 0) AS practices_without_recipients,
              MIN(created_at) AS first_at
         FROM outbox_batches
        WHERE region_id = ? ${only ? 'AND kind = ? AND source_id = ?' : ''}
        GROUP BY kind, source_id`,
      only ? [regionId, only.kind, only.sourceId] : [regionId],
    );
    return rows.map((r) => ({
      ...r,
      practices: Number(r.practices),
      practices_without_recipients: Number(r.practices_without_recipients),
    }));
  }

  /** A source's practices that had nobody to write to. */
  async practicesWithoutRecipients(
    regionId: number,
    kind: string,
    sourceId: number,
  ): Promise<number[]> {
    const rows = await this.select<{ practice_id: number }>(
      `SELECT practice_id FROM outbox_batches
        WHERE region_id = ? AND kind = ? AND source_id = ? AND recipients = 0 ORDER BY practice_id`,
      [regionId, kind, sourceId],
    );
    return rows.map((r) => r.practice_id);
  }

  /** Every message of a source: failed first, then by practice and recipient. */
  messagesOf(regionId: number, kind: string, sourceId: number): Promise<OutboxMessageRow[]> {
    return this.select<OutboxMessageRow>(
      `SELECT * FROM outbox_messages WHERE region_id = ? AND kind = ? AND source_id = ?
        ORDER BY FIELD(state, 'failed', 'sending', 'queued', 'sent'), practice_id, recipient_address`,
      [regionId, kind, sourceId],
    );
  }
}

/** One message per address (lower-cased); the first mention wins (a named lead before an extra). */
function dedupe(recipients: readonly Recipient[]): Recipient[] {
  const seen = new Set<string>();
  const out: Recipient[] = [];
  for (const r of recipients) {
    const address = r.address.trim().toLowerCase();
    if (!address || seen.has(address)) continue;
    seen.add(address);
    out.push({ ...r, address });
  }
  return out;
}
