/**
 * The mail benchmarks' SMTP server on loopback (bench/mail.ts, bench/digests.ts):
 * it reads every message to its end and discards it, keeping its Message-ID, the
 * count of messages and bytes, and the names of its attachments; and the test
 * profile's configuration pointed at it, with one outbox of 5 and the scheduled
 * mail checks moved out of the run's way.
 */
import { SMTPServer } from 'smtp-server';
import type { CairnConfig } from '../src/config/config.schema.js';

/** Attachment file names of a raw message (the Content-Disposition filename parameters). */
const FILENAME =
  /^Content-Disposition:[^\r\n]*(?:\r?\n[ \t][^\r\n]*)*?filename="?([^";\r\n]+)"?/gim;

export interface SmtpSink {
  port: number;
  /** Distinct Message-IDs received */
  ids: Set<string>;
  /** Messages and bytes received, and how many messages had at least one attachment */
  stats(): { messages: number; bytes: number; withAttachment: number };
  /** Attachment file names received, with how many messages carried each */
  attachments(): Map<string, number>;
  reset(): void;
  close(): Promise<void>;
}

export async function smtpSink(): Promise<SmtpSink> {
  const ids = new Set<string>();
  const names = new Map<string, number>();
  let messages = 0;
  let bytes = 0;
  let withAttachment = 0;
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ['STARTTLS', 'AUTH'],
    logger: false,
    size: 10 * 1024 * 1024,
    onData(stream, _session, callback) {
      // An attachment's headers may lie anywhere in the message: it is read whole.
      const chunks: Buffer[] = [];
      stream.on('data', (chunk: Buffer) => {
        bytes += chunk.length;
        chunks.push(chunk);
      });
      stream.on('end', () => {
        messages++;
        const text = Buffer.concat(chunks).toString('latin1');
        const id = /^Message-ID:\s*(\S+)/im.exec(text)?.[1];
        if (id) ids.add(id);
        let any = false;
        for (const match of text.matchAll(FILENAME)) {
          any = true;
          names.set(match[1]!, (names.get(match[1]!) ?? 0) + 1);
        }
        if (any) withAttachment++;
        callback();
      });
    },
  });
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  return {
    port: (server.server.address() as { port: number }).port,
    ids,
    stats: () => ({ messages, bytes, withAttachment }),
    attachments: () => new Map(names),
    reset: () => {
      ids.clear();
      names.clear();
      messages = 0;
      bytes = 0;
      withAttachment = 0;
    },
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}

/** The configuration sending through `sink`: one outbox of 5, no scheduled mail during the run. */
export const sendingTo =
  (sink: Pick<SmtpSink, 'port'>) =>
  (config: CairnConfig): CairnConfig => ({
    ...config,
    mail: {
      ...config.mail,
      port: sink.port,
      outbox: { ...config.mail.outbox, concurrency: 5 },
      reminders: { ...config.mail.reminders, checkCron: '0 0 0 1 1 *' },
      digests: { ...config.mail.digests, checkCron: '0 0 0 1 1 *' },
    },
  });
