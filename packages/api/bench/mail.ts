/**
 * The mail outbox benchmark (`npm run bench:mail -w @cairn/api`, or the root
 * `npm run bench`): 500 messages, each with a ~50 kB attachment (standing in
 * for a practice's data pack), queued in one transaction and sent by the
 * outbox of one API process (the production build) to an SMTP server on
 * loopback that reads and discards each message. Timed from the commit of the
 * queue to the last message recorded as sent.
 *
 * Reference, in the same run: the same 500 messages, composed the same way,
 * handed to the same server by nodemailer's pooled transport with the same
 * settings, with no outbox (no database, no leases). The ratio is the cost of
 * the outbox's guarantees.
 *
 * Target: ≤ 30 s for the 500. Exit code 1 when missed, or when the server did
 * not receive 500 distinct Message-IDs.
 */
import { spawnSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { fileURLToPath } from 'node:url';
import nodemailer from 'nodemailer';
import { QueryTypes } from 'sequelize';
import { API_NODE_FLAGS } from '../src/node-flags.js';
import { benchApp, fromDist } from './app.js';
import { sendingTo, smtpSink } from './smtp-sink.js';

if (!API_NODE_FLAGS.every((flag) => process.execArgv.includes(flag))) {
  const again = spawnSync(
    process.execPath,
    [
      ...API_NODE_FLAGS,
      ...process.execArgv,
      fileURLToPath(import.meta.url),
      ...process.argv.slice(2),
    ],
    { stdio: 'inherit' },
  );
  process.exit(again.status ?? 1);
}

const MESSAGES = 500;
const ATTACHMENT_BYTES = 50 * 1024;
const TARGET_SECONDS = 30;
const KIND = 'bench_pack';

/** Deterministic bytes that do not compress (a data pack is already zipped). */
function attachment(): Buffer {
  const out = Buffer.alloc(ATTACHMENT_BYTES);
  let block = Buffer.from('cairn-bench');
  for (let at = 0; at < out.length; at += 32) {
    block = createHash('sha256').update(block).digest();
    block.copy(out, at);
  }
  return out;
}

async function main(): Promise<void> {
  const server = await smtpSink();
  const bench = await benchApp(sendingTo(server));
  let missed = false;
  try {
    const { MailComposers } = await fromDist('mail/mail-composers.js');
    const { OutboxService } = await fromDist('mail/outbox.service.js');
    const { renderMail } = await fromDist('mail/mail-layout.js');
    const { mailOptions } = await fromDist('mail/outbox-worker.service.js');
    const { transportOptions } = await fromDist('mail/mail-transport.js');
    const pack = attachment();
    const compose = (row: { recipient_address: string; practice_id: number }) => {
      const mail = renderMail({
        subject: `Benchmark message for practice ${row.practice_id}`,
        preheader: 'A benchmark message',
        regionName: 'Ostrevale',
        greeting: 'Hello,',
        blocks: [
          { type: 'paragraph', text: `A benchmark message to ${row.recipient_address}.` },
          { type: 'facts', rows: [{ label: 'Practice', value: String(row.practice_id) }] },
          { type: 'action', label: 'Open Cairn', url: 'https://cairn.example.org/' },
        ],
        footer: ['Sent by the outbox benchmark.'],
      });
      return {
        ...mail,
        attachments: [
          { filename: 'bench-pack.bin', content: pack, contentType: 'application/octet-stream' },
        ],
      };
    };
    bench.app.get(MailComposers).register(KIND, {
      sourceLabel: async () => 'benchmark',
      compose: async (row: { recipient_address: string; practice_id: number }) => compose(row),
    });
    const practices = await bench.db.query<{ id: number; region_id: number }>(
      'SELECT id, region_id FROM practices ORDER BY id',
      { type: QueryTypes.SELECT },
    );
    const perPractice = new Map<number, { address: string; name: null; userId: null }[]>();
    for (let i = 0; i < MESSAGES; i++) {
      const practice = practices[i % practices.length]!;
      perPractice.set(practice.id, [
        ...(perPractice.get(practice.id) ?? []),
        { address: `reader${i}@bench.example`, name: null, userId: null },
      ]);
    }

    // ── the outbox ──
    const outbox = bench.app.get(OutboxService);
    const sent = async () => {
      const [row] = await bench.db.query<{ n: number }>(
        "SELECT COUNT(*) AS n FROM outbox_messages WHERE state = 'sent'",
        { type: QueryTypes.SELECT },
      );
      return Number(row?.n ?? 0);
    };
    let t0 = 0;
    await outbox.transaction(async (transaction: unknown) => {
      for (const practice of practices)
        await outbox.queue(
          {
            kind: KIND,
            sourceId: 1,
            regionId: practice.region_id,
            practiceId: practice.id,
            recipients: perPractice.get(practice.id) ?? [],
          },
          transaction,
        );
      t0 = performance.now();
    });
    const deadline = Date.now() + 120_000;
    while ((await sent()) < MESSAGES) {
      if (Date.now() > deadline) throw new Error(`only ${await sent()} sent after 120 s`);
      await new Promise((r) => setTimeout(r, 25));
    }
    const outboxMs = performance.now() - t0;
    const outboxStats = server.stats();
    const distinct = server.ids.size;

    // ── the reference: the same messages straight through nodemailer's pool ──
    server.reset();
    const transport = nodemailer.createTransport(transportOptions(bench.config.mail, undefined));
    const rows = await bench.db.query<{
      id: number;
      recipient_address: string;
      practice_id: number;
      message_id: string;
      recipient_name: string | null;
    }>('SELECT * FROM outbox_messages ORDER BY id', { type: QueryTypes.SELECT });
    const settings = { from: bench.config.mail.from, publicUrl: bench.config.server.publicUrl };
    const r0 = performance.now();
    let next = 0;
    await Promise.all(
      Array.from({ length: bench.config.mail.connections }, async () => {
        while (next < rows.length) {
          const row = rows[next++]!;
          await transport.sendMail(mailOptions(row, compose(row), settings));
        }
      }),
    );
    const referenceMs = performance.now() - r0;
    transport.close();

    const mb = (outboxStats.bytes / 1024 / 1024).toFixed(1);
    console.log(
      `  outbox: ${MESSAGES} messages with a ${ATTACHMENT_BYTES / 1024} kB attachment each (${mb} MB) sent in ${(outboxMs / 1000).toFixed(2)} s ` +
        `(${Math.round(MESSAGES / (outboxMs / 1000))} messages/s; target ≤ ${TARGET_SECONDS} s)`,
    );
    console.log(
      `  reference: nodemailer's pool alone, the same messages: ${(referenceMs / 1000).toFixed(2)} s; outbox / reference ${(outboxMs / referenceMs).toFixed(2)}`,
    );
    console.log(`  the server received ${distinct} distinct Message-IDs of ${MESSAGES}`);
    if (outboxMs / 1000 > TARGET_SECONDS) {
      console.log(`  MISSED: ${(outboxMs / 1000).toFixed(2)} s > ${TARGET_SECONDS} s`);
      missed = true;
    }
    if (distinct !== MESSAGES || outboxStats.messages !== MESSAGES) {
      console.log(`  MISSED: ${outboxStats.messages} messages, ${distinct} distinct Message-IDs`);
      missed = true;
    }
  } finally {
    await bench.close();
    await server.close();
  }
  process.exitCode = missed ? 1 : 0;
}

main().catch((error: unknown) => {
  console.error(error);
  process.exit(1);
});
