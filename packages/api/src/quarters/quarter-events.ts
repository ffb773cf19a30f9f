/**
 * What other modules learn when an audit quarter opens, inside the transaction
 * that opens it: a listener's writes (the mail module queues the quarter's
 * opening message) commit with the quarter or not at all. Listeners register
 * themselves at start (onModuleInit); quarters knows nothing of them.
 */
import { Injectable } from '@nestjs/common';
import type { Transaction } from 'sequelize';
import type { Actor } from '../auth/actor.js';
import type { QuarterDto } from './dto/quarter.dto.js';

export type QuarterOpenedListener = (
  quarter: QuarterDto,
  actor: Actor,
  transaction: Transaction,
) => Promise<void>;

@Injectable()
export class QuarterEvents {
  private readonly openedListeners: QuarterOpenedListener[] = [];

  onOpened(listener: QuarterOpenedListener): void {
    this.openedListeners.push(listener);
  }

  /** Called by QuartersService.open inside its transaction; a listener's failure undoes the opening. */
  async opened(quarter: QuarterDto, actor: Actor, transaction: Transaction): Promise<void> {
    for (const listener of this.openedListeners) await listener(quarter, actor, transaction);
  }
}
