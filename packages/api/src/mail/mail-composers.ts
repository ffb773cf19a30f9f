/**
 * What each kind of message says. A module that sends mail registers a
 * composer for its kind at start (onModuleInit); the outbox worker asks it for
 * a message's content when the message is due, and the delivery page asks it
 * how to name a source ("2026 Q4 opening message"). Composing must give the
 * same message every time for the same row (a resend after an interruption
 * repeats it).
 */
import { Injectable } from '@nestjs/common';
import type { OutboxMessageRow } from './outbox.repository.js';

export interface ComposedMail {
  subject: string;
  html: string;
  text: string;
  attachments?: { filename: string; content: Buffer; contentType: string }[];
}

export interface MailComposer {
  /** How the delivery page names the source's messages */
  sourceLabel(sourceId: number, regionId: number): Promise<string>;
  compose(message: OutboxMessageRow): Promise<ComposedMail>;
}

/** The source's subject could not be found or the content could not be made: never worth a retry. */
export class CompositionError extends Error {
  override readonly name = 'CompositionError';
}

@Injectable()
export class MailComposers {
  private readonly composers = new Map<string, MailComposer>();

  register(kind: string, composer: MailComposer): void {
    if (this.composers.has(kind)) throw new Error(`a composer for ${kind} is registered already`);
    this.composers.set(kind, composer);
  }

  has(kind: string): boolean {
    return this.composers.has(kind);
  }

  get(kind: string): MailComposer {
    const composer = this.composers.get(kind);
    if (!composer) throw new CompositionError(`no composer for messages of kind ${kind}`);
    return composer;
  }
}
