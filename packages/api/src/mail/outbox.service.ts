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
import { OutboxRepository, type QueueRequest } from './outbox.repository.js';
import { OutboxWorker } from './outbox-worker.service.js';

export type { QueueRequest, Recipient } from './outbox.repository.js';

@Injectable()
export class OutboxService {
  constructor(
    @Inject(OutboxRepository) private readonly outbox: OutboxRepository,
    @Inject(MailComposers) private readonly composers: MailComposers,
    @Inject(OutboxWorker) private readonly worker: OutboxWorker,
  ) {}

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
