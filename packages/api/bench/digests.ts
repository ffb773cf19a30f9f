/**
 * The digest benchmark (`npm run bench:digests -w @cairn/api`, or the root
 * `npm run bench`), on the production build (dist/) with the demo region's
 * last two audit quarters loaded through the upload → check → confirm
 * pipeline:
 *
 *  - composing: each practice's digest of the latest quarter's report (published
 *    here) composed through
 *    the registered composer, as the outbox worker does (its results read, the
 *    content, both parts and its data pack of the report): the median of the first
 *    composition per practice (nothing cached) and of a further one for another
 *    recipient of the same practice. Target: ≤ 50 ms median.
 *  - sending: 500 digests (the practices' digests for many recipients each),
 *    queued in one transaction and sent by the outbox of one API process to an
 *    SMTP server on loopback that reads and discards each message, timed from
 *    the commit of the queue to the last message recorded as sent. Target:
 *    ≤ 30 s.
 *
 * Exit code 1 when a target is missed or the server did not receive 500
 * distinct Message-IDs each with its practice's data pack attached.
 */
import { spawnSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, readFileSync, rmSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { PassThrough } from 'node:stream';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
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
const SEND_TARGET_SECONDS = 30;
const COMPOSE_TARGET_MS = 50;
const QUARTERS = 2;

const median = (values: number[]) => {
  const sorted = [...values].sort((a, b) => a - b);
  const mid = sorted.length >> 1;
  return sorted.length % 2 ? sorted[mid]! : (sorted[mid - 1]! + sorted[mid]!) / 2;
};

/** The demo scenario's last QUARTERS quarters only (a folder of links to its extracts). */
function demoSubset(): string {
  const root = join(dirname(fileURLToPath(import.meta.url)), '..', '..', '..', 'seed-data', 'out');
  const manifest = JSON.parse(readFileSync(join(root, 'extracts', 'manifest.json'), 'utf8')) as {
    quarters: string[];
    extracts: { quarter: string; file: string }[];
  };
  const quarters = manifest.quarters.slice(-QUARTERS);
  const dir = mkdtempSync(join(tmpdir(), 'cairn-bench-digests-'));
  mkdirSync(join(dir, 'extracts'));
  const extracts = manifest.extracts.filter((e) => quarters.includes(e.quarter));
  for (const folder of new Set(extracts.map((e) => dirname(e.file))))
    symlinkSync(join(root, folder), join(dir, folder));
  writeFileSync(join(dir, 'extracts', 'manifest.json'), JSON.stringify({ quarters, extracts }));
  return dir;
}

async function main(): Promise<void> {
  const server = await smtpSink();
  const bench = await benchApp(sendingTo(server));
  const subset = demoSubset();
  const opened: { close(): Promise<void> }[] = [];
  let missed = false;
  try {
    const { ingestDemoExtracts } = await fromDist('submissions/demo-ingest.js');
    const loaded = await ingestDemoExtracts(subset, bench.config, bench.secrets);
    console.log(
      `  loaded ${loaded.extracts} demo extracts of ${loaded.quarters} quarters (${loaded.records} records) in ${loaded.seconds.toFixed(0)} s`,
    );
    // The loading closed the connection the models were bound to: a fresh API process's app
    // (this process's first one is closed, so that one outbox sends).
    await bench.app.close();
    const { createApp } = await fromDist('app.factory.js');
    const { createRootLogger } = await fromDist('common/logger.js');
    const app = await createApp({
      config: bench.config,
      secrets: bench.secrets,
      logger: createRootLogger('silent'),
    });
    await app.init();
    opened.push(app);
    const { MailComposers } = await fromDist('mail/mail-composers.js');
    const { OutboxService } = await fromDist('mail/outbox.service.js');
    const composer = app.get(MailComposers).get('digest');
    const [quarter] = await bench.db.query<{ id: number; region_id: number }>(
      'SELECT id, region_id FROM audit_quarters ORDER BY year DESC, quarter DESC LIMIT 1',
      { type: QueryTypes.SELECT },
    );
    // The latest quarter published as a report: digests are made from it.
    const { ReportsService } = await fromDist('reports/reports.service.js');
    const { systemActor } = await fromDist('auth/actor.js');
    const report = await app
      .get(ReportsService)
      .publish(systemActor('benchmark', quarter!.region_id), quarter!.id, 'Benchmark report.');
    const practices = await bench.db.query<{ id: number }>(
      'SELECT id FROM practices WHERE active = 1 ORDER BY id',
      { type: QueryTypes.SELECT },
    );

    // ── composing ──
    const row = (practiceId: number, i: number) => ({
      kind: 'digest',
      source_id: report.id,
      practice_id: practiceId,
      region_id: quarter!.region_id,
      recipient_address: `reader${i}@bench.example`,
      recipient_name: `Reader ${i}`,
      recipient_user_id: null,
    });
    const first: number[] = [];
    const further: number[] = [];
    let attachmentBytes = 0;
    const withFigures: { id: number }[] = [];
    for (const [i, practice] of practices.entries()) {
      let t = performance.now();
      const mail = await composer.compose(row(practice.id, i));
      first.push(performance.now() - t);
      // A practice without figures in the report (no submission) gets no data pack.
      if (mail.attachments.length > 0) {
        attachmentBytes += mail.attachments[0].content.length;
        withFigures.push(practice);
      }
      t = performance.now();
      await composer.compose(row(practice.id, i + 1000));
      further.push(performance.now() - t);
    }
    // Reference, in the same run: each practice's data pack made alone, as its download route
    // makes it (ReportsService.pack written to a stream).
    const reference: number[] = [];
    const reader = systemActor('benchmark', quarter!.region_id);
    for (const practice of withFigures) {
      const t = performance.now();
      const pack = await app
        .get(ReportsService)
        .pack(reader, report.id, { kind: 'practice', practiceId: practice.id });
      const sink = new PassThrough();
      sink.resume();
      const ended = new Promise((resolve) => sink.on('end', resolve));
      await pack.write(sink);
      if (!sink.writableEnded) sink.end();
      await ended;
      reference.push(performance.now() - t);
    }
    const firstMedian = median(first);
    const furtherMedian = median(further);
    const packMedian = median(reference);
    console.log(
      `  composing one digest (${practices.length} practices): first per practice median ${firstMedian.toFixed(1)} ms ` +
        `(max ${Math.max(...first).toFixed(1)} ms), another recipient median ${furtherMedian.toFixed(2)} ms; ` +
        `data pack ${Math.round(attachmentBytes / withFigures.length / 1024)} kB on average (${withFigures.length} practices with figures) (target ≤ ${COMPOSE_TARGET_MS} ms median)`,
    );
    console.log(
      `  reference: a practice's data pack made alone as its download is, median ${packMedian.toFixed(1)} ms; ` +
        `first digest / data pack ${(firstMedian / packMedian).toFixed(2)}`,
    );
    if (firstMedian > COMPOSE_TARGET_MS) {
      console.log(`  MISSED: composing ${firstMedian.toFixed(1)} ms > ${COMPOSE_TARGET_MS} ms`);
      missed = true;
    }

    // ── sending 500 through the outbox ──
    const perPractice = new Map<number, { address: string; name: string; userId: null }[]>();
    for (let i = 0; i < MESSAGES; i++) {
      const practice = withFigures[i % withFigures.length]!;
      perPractice.set(practice.id, [
        ...(perPractice.get(practice.id) ?? []),
        { address: `reader${i}@bench.example`, name: `Reader ${i}`, userId: null },
      ]);
    }
    const outbox = app.get(OutboxService);
    const sent = async () => {
      const [r] = await bench.db.query<{ n: number }>(
        "SELECT COUNT(*) AS n FROM outbox_messages WHERE kind = 'digest' AND state = 'sent'",
        { type: QueryTypes.SELECT },
      );
      return Number(r?.n ?? 0);
    };
    let t0 = 0;
    await outbox.transaction(async (transaction: unknown) => {
      for (const practice of withFigures)
        await outbox.queue(
          {
            kind: 'digest',
            sourceId: report.id,
            regionId: quarter!.region_id,
            practiceId: practice.id,
            recipients: perPractice.get(practice.id) ?? [],
          },
          transaction,
        );
      t0 = performance.now();
    });
    const deadline = Date.now() + 180_000;
    while ((await sent()) < MESSAGES) {
      if (Date.now() > deadline) throw new Error(`only ${await sent()} sent after 180 s`);
      await new Promise((r) => setTimeout(r, 25));
    }
    const sendMs = performance.now() - t0;
    const stats = server.stats();
    // The practice's data pack as its leads download it: cairn-report-<id>-<quarter>-<code>.xlsx
    const packName = new RegExp(`^cairn-report-${report.id}-[^"/]+-[A-Z]{2}\\d+\\.xlsx$`);
    let withPack = 0;
    for (const [name, count] of server.attachments()) if (packName.test(name)) withPack += count;
    console.log(
      `  outbox: ${MESSAGES} digests with their data packs (${(stats.bytes / 1024 / 1024).toFixed(1)} MB) composed and sent in ${(sendMs / 1000).toFixed(2)} s ` +
        `(${Math.round(MESSAGES / (sendMs / 1000))} messages/s; target ≤ ${SEND_TARGET_SECONDS} s)`,
    );
    console.log(
      `  the server received ${server.ids.size} distinct Message-IDs of ${MESSAGES}, ${withPack} with the practice's data pack`,
    );
    if (sendMs / 1000 > SEND_TARGET_SECONDS) {
      console.log(`  MISSED: ${(sendMs / 1000).toFixed(2)} s > ${SEND_TARGET_SECONDS} s`);
      missed = true;
    }
    if (server.ids.size !== MESSAGES || stats.messages !== MESSAGES || withPack !== MESSAGES) {
      console.log(
        `  MISSED: ${stats.messages} messages, ${server.ids.size} distinct Message-IDs, ${withPack} with a data pack`,
      );
      missed = true;
    }
  } finally {
    rmSync(subset, { recursive: true, force: true });
    for (const app of opened) await app.close();
    await bench.close();
    await server.close();
  }
  process.exitCode = missed ? 1 : 0;
}

main().catch((error: unknown) => {
  console.error(error);
  process.exit(1);
});
