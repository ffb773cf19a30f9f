/**
 * Local SMTP capture for development and tests (smtp-server + mailparser):
 * every message Cairn sends is kept in <devFakes.dataDir>/mailbox as the raw
 * .eml plus a parsed .json, and shown by the mailbox page. Never in production.
 *
 * A message whose Message-ID the mailbox already holds is a repeat of that
 * message (an outbox row sent again after its sender stopped mid-send): it is
 * counted on the first message (`repeats`), never stored as a second message.
 *
 * The capture refuses recipients at refused.example (550, as a real server
 * refuses an unknown mailbox), so that a failed delivery can be seen locally;
 * tests pass a refusal rule of their own.
 */
import { mkdirSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { simpleParser } from 'mailparser';
import { SMTPServer } from 'smtp-server';

export interface CapturedMessage {
  id: string;
  receivedAt: string;
  /** The Message-ID header, or null when the message had none */
  messageId: string | null;
  /** Times the same Message-ID arrived again after this message */
  repeats: number;
  /** When each repeat arrived */
  repeatedAt: string[];
  from: string;
  to: string[];
  subject: string;
  text: string;
  html: string | null;
  attachments: { filename: string; contentType: string; size: number; index: number }[];
}

export interface MailboxStats {
  /** Distinct messages (distinct Message-IDs, plus any message without one) */
  messages: number;
  /** Arrivals of a Message-ID already held */
  repeats: number;
}

export class Mailbox {
  /** Message-ID → stored message id */
  private readonly byMessageId = new Map<string, string>();

  constructor(readonly dir: string) {
    mkdirSync(dir, { recursive: true });
    for (const message of this.list())
      if (message.messageId) this.byMessageId.set(message.messageId, message.id);
  }

  list(): CapturedMessage[] {
    return readdirSync(this.dir)
      .filter((f) => f.endsWith('.json'))
      .sort()
      .reverse()
      .map((f) => normalise(JSON.parse(readFileSync(join(this.dir, f), 'utf8'))));
  }

  get(id: string): CapturedMessage | null {
    if (!/^[0-9a-z-]+$/.test(id)) return null;
    try {
      return normalise(JSON.parse(readFileSync(join(this.dir, `${id}.json`), 'utf8')));
    } catch {
      return null;
    }
  }

  raw(id: string): Buffer | null {
    if (!/^[0-9a-z-]+$/.test(id)) return null;
    try {
      return readFileSync(join(this.dir, `${id}.eml`));
    } catch {
      return null;
    }
  }

  clear(): void {
    for (const f of readdirSync(this.dir)) rmSync(join(this.dir, f), { force: true });
    this.byMessageId.clear();
  }

  stats(): MailboxStats {
    const messages = this.list();
    return { messages: messages.length, repeats: messages.reduce((n, m) => n + m.repeats, 0) };
  }

  /** Stores a message, or counts it as a repeat of the message with its Message-ID. */
  async store(raw: Buffer): Promise<CapturedMessage> {
    const parsed = await simpleParser(raw);
    const messageId = parsed.messageId?.trim() || null;
    // From here on nothing awaits: two arrivals of one Message-ID cannot both be "first".
    const known = messageId ? this.byMessageId.get(messageId) : undefined;
    const original = known ? this.get(known) : null;
    if (original) {
      original.repeats += 1;
      original.repeatedAt.push(new Date().toISOString());
      writeFileSync(join(this.dir, `${original.id}.json`), JSON.stringify(original, null, 2));
      return original;
    }
    const id = `${Date.now().toString(36).padStart(9, '0')}-${Math.random().toString(36).slice(2, 8)}`;
    const addresses = (value: typeof parsed.to): string[] =>
      (Array.isArray(value) ? value : value ? [value] : []).flatMap((a) =>
        a.value.map((v) => v.address ?? ''),
      );
    const message: CapturedMessage = {
      id,
      receivedAt: new Date().toISOString(),
      messageId,
      repeats: 0,
      repeatedAt: [],
      from: parsed.from?.text ?? '',
      to: addresses(parsed.to),
      subject: parsed.subject ?? '',
      text: parsed.text ?? '',
      html: typeof parsed.html === 'string' ? parsed.html : null,
      attachments: parsed.attachments.map((a, index) => ({
        filename: a.filename ?? `attachment-${index + 1}`,
        contentType: a.contentType,
        size: a.size,
        index,
      })),
    };
    if (messageId) this.byMessageId.set(messageId, id);
    writeFileSync(join(this.dir, `${id}.eml`), raw);
    writeFileSync(join(this.dir, `${id}.json`), JSON.stringify(message, null, 2));
    return message;
  }

  async attachment(id: string, index: number) {
    const raw = this.raw(id);
    if (!raw) return null;
    const parsed = await simpleParser(raw);
    return parsed.attachments[index] ?? null;
  }
}

/** Messages stored before repeats were counted read as never repeated. */
function normalise(message: CapturedMessage): CapturedMessage {
  return {
    ...message,
    messageId: message.messageId ?? null,
    repeats: message.repeats ?? 0,
    repeatedAt: message.repeatedAt ?? [],
  };
}

export interface CaptureOptions {
  /**
   * The refusal of a recipient, as the server's reply text after the code (e.g. "5.1.1 no such
   * mailbox"), or null to accept it. Default: every address at refused.example is refused.
   */
  refuseRecipient?: (address: string) => { code: number; message: string } | null;
  /** Milliseconds to wait before answering the end of each message (a slow server) */
  delayMs?: number;
}

export const REFUSED_DOMAIN = 'refused.example';

export function refuseAtRefusedDomain(address: string) {
  return address.toLowerCase().endsWith(`@${REFUSED_DOMAIN}`)
    ? {
        code: 550,
        message: `5.1.1 <${address}>: no such mailbox (the local capture refuses every address at ${REFUSED_DOMAIN})`,
      }
    : null;
}

export function startSmtpCapture(
  mailbox: Mailbox,
  host: string,
  port: number,
  options: CaptureOptions = {},
): Promise<SMTPServer> {
  const refuse = options.refuseRecipient ?? refuseAtRefusedDomain;
  const server = new SMTPServer({
    authOptional: true,
    // smtp-server's built-in certificate has expired; the local capture speaks plain SMTP.
    disabledCommands: ['STARTTLS', 'AUTH'],
    banner: 'Cairn local mail capture (development only)',
    size: 30 * 1024 * 1024,
    logger: false,
    onRcptTo(address, _session, callback) {
      const refusal = refuse(address.address);
      if (!refusal) return callback();
      const error = new Error(refusal.message) as Error & { responseCode: number };
      error.responseCode = refusal.code;
      callback(error);
    },
    onData(stream, _session, callback) {
      const chunks: Buffer[] = [];
      stream.on('data', (chunk: Buffer) => chunks.push(chunk));
      stream.on('end', () => {
        const stored = mailbox.store(Buffer.concat(chunks));
        const delayed = options.delayMs
          ? stored.then(() => new Promise((r) => setTimeout(r, options.delayMs)))
          : stored;
        delayed.then(
          () => callback(),
          (error: Error) => callback(error),
        );
      });
    },
  });
  return new Promise((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, host, () => {
      server.off('error', reject);
      // Once listening, a client that vanishes mid-conversation (ECONNRESET when a sending
      // process is killed) ends only its own connection; the capture keeps serving the others.
      server.on('error', () => undefined);
      resolve(server);
    });
  });
}
