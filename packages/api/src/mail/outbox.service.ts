/**
 * How any module puts messages into the outbox: `queue` in the caller's own
 * transaction (the messages commit with the change that causes them, or not
 * at all), once per (kind, source, practice). This process's worker looks for
 * them as soon as the transaction commits; every other process's at its next
 * poll. A kind must have its composer registered (MailComposers) first.
 */
import { Inject, Injectable } from '@nestjs/common';
import type { Transaction } from 'sequelize';
import { MailComposers } from './mail-composers.js';
import { MailTablesRepository } from './mail-tables.repository.js';
import { OutboxRepository, type QueueRequest } from './outbox.repository.js';
import { OutboxWorker } from './outbox-worker.service.js';

export type { OutboxMessageRow, QueueRequest, Recipient } from './outbox.repository.js';

@Injectable()
export class OutboxService {
  constructor(
    @Inject(OutboxRepository) private readonly outbox: OutboxRepository,
    @Inject(MailComposers) private readonly composers: MailComposers,
    @Inject(OutboxWorker) private readonly worker: OutboxWorker,
    @Inject(MailTablesRepository) private readonly tables: MailTablesRepository,
  ) {}

  /**
   * Runs a scheduled mail job unless another process is running it (the mail_schedule lease,
   * `leaseSeconds` long); null when it did not run. `describe` words the outcome it records.
   */
  async exclusive<T>(
    job: string,
    owner: string,
    leaseSeconds: number,
    work: () => Promise<T>,
    describe: (result: T) => string,
  ): Promise<T | null> {
    if (!(await this.tables.claimJob(job, owner, leaseSeconds))) return null;
    let outcome = 'failed';
    try {
      const result = await work();
      outcome = describe(result);
      return result;
    } catch (error) {
      outcome = `failed: ${(error as Error).message}`;
      throw error;
    } finally {
      await this.tables.releaseJob(job, owner, outcome).catch(() => undefined);
    }
  }

  /**
   * Queues one practice's messages of a kind for a source; the number queued, or null when
   * this practice's messages for the source were queued before (nothing is queued twice).
   */
  async queue(request: QueueRequest, transaction: Transaction): Promise<number | null> {
    if (!this.composers.has(request.kind))
      throw new Error(`no composer registered for mail of kind ${request.kind}`);
    const queued = await this.outbox.queue(request, transaction);
    if (queued) transaction.afterCommit(() => this.worker.kick());
    return queued;
  }

  /** Runs `work` in one transaction (for a caller with nothing else to write). */
  transaction<T>(work: (transaction: Transaction) => Promise<T>): Promise<T> {
    return this.outbox.transaction(work);
  }
}
