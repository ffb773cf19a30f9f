/**
 * Local SMTP capture for development and tests (smtp-server + mailparser):
 * every message Cairn sends is kept in <devFakes.dataDir>/mailbox as the raw
 * .eml plus a parsed .json, and shown by the mailbox page. Never in production.
 */
import { mkdirSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { simpleParser } from 'mailparser';
import { SMTPServer } from 'smtp-server';

export interface CapturedMessage {
  id: string;
  receivedAt: string;
  from: string;
  to: string[];
  subject: string;
  text: string;
  html: string | null;
  attachments: { filename: string; contentType: string; size: number; index: number }[];
}

export class Mailbox {
  constructor(readonly dir: string) {
    mkdirSync(dir, { recursive: true });
  }

  list(): CapturedMessage[] {
    return readdirSync(this.dir)
      .filter((f) => f.endsWith('.json'))
      .sort()
      .reverse()
      .map((f) => JSON.parse(readFileSync(join(this.dir, f), 'utf8')) as CapturedMessage);
  }

  get(id: string): CapturedMessage | null {
    if (!/^[0-9a-z-]+$/.test(id)) return null;
    try {
      return JSON.parse(readFileSync(join(this.dir, `${id}.json`), 'utf8')) as CapturedMessage;
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
  }

  async store(raw: Buffer): Promise<CapturedMessage> {
    const parsed = await simpleParser(raw);
    const id = `${Date.now().toString(36).padStart(9, '0')}-${Math.random().toString(36).slice(2, 8)}`;
    const addresses = (value: typeof parsed.to): string[] =>
      (Array.isArray(value) ? value : value ? [value] : []).flatMap((a) =>
        a.value.map((v) => v.address ?? ''),
      );
    const message: CapturedMessage = {
      id,
      receivedAt: new Date().toISOString(),
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

export function startSmtpCapture(
  mailbox: Mailbox,
  host: string,
  port: number,
): Promise<SMTPServer> {
  const server = new SMTPServer({
    authOptional: true,
    // smtp-server's built-in certificate has expired; the local capture speaks plain SMTP.
    disabledCommands: ['STARTTLS', 'AUTH'],
    banner: 'Cairn local mail capture (development only)',
    size: 30 * 1024 * 1024,
    logger: false,
    onData(stream, _session, callback) {
      const chunks: Buffer[] = [];
      stream.on('data', (chunk: Buffer) => chunks.push(chunk));
      stream.on('end', () => {
        mailbox.store(Buffer.concat(chunks)).then(
          () => callback(),
          (error: Error) => callback(error),
        );
      });
    },
  });
  return new Promise((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, host, () => resolve(server));
  });
}
