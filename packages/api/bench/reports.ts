/**
 * The reports benchmark (`npm run bench:reports -w @cairn/api`, or the root
 * `npm run bench`), on the production build (dist/) and a fresh test
 * database loaded with the demo region's extracts through the upload
 * pipeline:
 *
 *   1. publishing the demo region's open quarter (the snapshot of every
 *      practice's results) and writing the region's data pack: ≤ 3 s
 *      (median of RUNS publishes, after one untimed);
 *   2. one practice's PDF of that report: ≤ 2 s (median of RUNS);
 *   3. the region's data pack of a synthetic report of 7,000 practices,
 *      against a bare exceljs streaming write of the same cells (same sheets,
 *      same values, no styles, no neutralising, no filters) in the same run:
 *      ≤ 1.5 × (median of each run's ratio).
 *
 * Exit code 1 when a target is missed.
 */
import { spawnSync } from 'node:child_process';
import { loadavg } from 'node:os';
import { join } from 'node:path';
import { Writable } from 'node:stream';
import { fileURLToPath } from 'node:url';
import ExcelJS from 'exceljs';
import { QueryTypes } from 'sequelize';
import { API_NODE_FLAGS } from '../src/node-flags.js';
import { benchApp, fromDist } from './app.js';

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

const RUNS = 3;
const SYNTHETIC_PRACTICES = 7000;
const TARGET_PUBLISH_S = 3;
const TARGET_PDF_S = 2;
const TARGET_PACK_RATIO = 1.5;

/** A stream that counts and drops what it is given. */
function sink(): Writable & { bytes: number } {
  const out = new Writable({
    write(chunk: Buffer, _enc, done) {
      out.bytes += chunk.length;
      done();
    },
  }) as Writable & { bytes: number };
  out.bytes = 0;
  return out;
}

const loadAverage = () =>
  loadavg()
    .map((x) => x.toFixed(2))
    .join(', ');
const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;
const seconds = (ms: number) => (ms / 1000).toFixed(2);

async function main(): Promise<number> {
  const root = join(fileURLToPath(import.meta.url), '..', '..', '..', '..');
  // BENCH_KEEP_DATABASE=<name> keeps the loaded demo region between runs (for profiling).
  const bench = await benchApp(undefined, process.env.BENCH_KEEP_DATABASE || undefined);
  let app = bench.app;
  let missed = 0;
  console.log(`load average before: ${loadAverage()}`);
  try {
    if (bench.fresh || !process.env.BENCH_KEEP_DATABASE) {
      const { ingestDemoExtracts } = await fromDist('submissions/demo-ingest.js');
      const t0 = performance.now();
      const loaded = await ingestDemoExtracts(
        join(root, 'seed-data', 'out'),
        bench.config,
        bench.secrets,
      );
      if (!loaded)
        throw new Error(
          'no demo extracts in seed-data/out (run npm start once, or seed-data/generate.ts)',
        );
      console.log(
        `demo region loaded: ${loaded.extracts} extracts, ${loaded.records} records (${seconds(performance.now() - t0)} s)`,
      );
    }
    // The loading closed the connection the models were bound to: a fresh API process's app.
    await app.close();
    const { createApp } = await fromDist('app.factory.js');
    const { createRootLogger } = await fromDist('common/logger.js');
    app = await createApp({
      config: bench.config,
      secrets: bench.secrets,
      logger: createRootLogger('silent'),
    });
    await app.init();
    const [quarter] = await bench.db.query<{ id: number; region_id: number }>(
      "SELECT id, region_id FROM audit_quarters WHERE status = 'open' ORDER BY year DESC, quarter DESC LIMIT 1",
      { type: QueryTypes.SELECT },
    );
    const actor = {
      id: null,
      label: 'benchmark',
      displayName: 'Benchmark',
      role: 'regional_lead',
      regionId: Number(quarter!.region_id),
      practiceIds: [],
      requestId: null,
      ipAddress: null,
    };
    const reports = app.get((await fromDist('reports/reports.service.js')).ReportsService);

    // 1. publish + region pack
    const publishOnce = async () => {
      const start = performance.now();
      const report = await reports.publish(actor, Number(quarter!.id), 'benchmark');
      const download = await reports.pack(actor, report.id, { kind: 'region' });
      const out = sink();
      await download.write(out);
      return { ms: performance.now() - start, report, bytes: out.bytes };
    };
    await publishOnce();
    const publishes = [];
    for (let i = 0; i < RUNS; i++) publishes.push(await publishOnce());
    const publishMs = median(publishes.map((p) => p.ms));
    const last = publishes[publishes.length - 1]!;
    const met1 = publishMs / 1000 <= TARGET_PUBLISH_S;
    if (!met1) missed++;
    console.log(
      `publish the demo quarter (${last.report.practices.length} practices) + region pack (${(last.bytes / 1024).toFixed(0)} kB): ${seconds(publishMs)} s median of ${RUNS} (runs ${publishes.map((p) => seconds(p.ms)).join(', ')}), × ${(publishMs / 1000 / TARGET_PUBLISH_S).toFixed(2)} of the target ≤ ${TARGET_PUBLISH_S} s: ${met1 ? 'met' : 'MISSED'}`,
    );

    const [size] = await bench.db.query<{ canonical: number; stored: number }>(
      'SELECT snapshot_bytes AS canonical, LENGTH(snapshot) AS stored FROM reports WHERE id = ?',
      { type: QueryTypes.SELECT, replacements: [last.report.id] },
    );
    console.log(
      `  snapshot: ${(Number(size!.canonical) / 1e6).toFixed(1)} MB canonical, ${(Number(size!.stored) / 1e6).toFixed(2)} MB stored`,
    );

    // 2. one practice's PDF
    const practiceId = last.report.practices[0]!.id;
    const pdfs = [];
    for (let i = 0; i < RUNS + 1; i++) {
      const start = performance.now();
      const download = await reports.pdf(actor, last.report.id, { kind: 'practice', practiceId });
      const out = sink();
      await download.write(out);
      pdfs.push({ ms: performance.now() - start, bytes: out.bytes });
    }
    const pdfMs = median(pdfs.slice(1).map((p) => p.ms));
    const met2 = pdfMs / 1000 <= TARGET_PDF_S;
    if (!met2) missed++;
    console.log(
      `one practice's PDF (${(pdfs[0]!.bytes / 1024).toFixed(0)} kB): ${seconds(pdfMs)} s median of ${RUNS}, × ${(pdfMs / 1000 / TARGET_PDF_S).toFixed(2)} of the target ≤ ${TARGET_PDF_S} s: ${met2 ? 'met' : 'MISSED'}`,
    );

    // 3. the region pack of 7,000 synthetic practices vs a bare exceljs write of the same cells
    const { syntheticReport } = await fromDist('reports/synthetic-report.js');
    const { packSheets } = await fromDist('reports/pack.js');
    const { writePack } = await fromDist('reports/pack-writer.js');
    const { row, snapshot } = syntheticReport(SYNTHETIC_PRACTICES);
    const sheets = packSheets(row, snapshot, { kind: 'region' });
    const cells = sheets.map(
      (s: { name: string; columns: { header: string }[]; rows: Iterable<unknown[]> }) => ({
        name: s.name,
        header: s.columns.map((c) => c.header),
        rows: [...s.rows],
      }),
    );
    const bare = async () => {
      const start = performance.now();
      const wb = new ExcelJS.stream.xlsx.WorkbookWriter({
        stream: sink(),
        useStyles: false,
        useSharedStrings: false,
      });
      for (const s of cells) {
        const ws = wb.addWorksheet(s.name);
        ws.addRow(s.header).commit();
        for (const r of s.rows) ws.addRow(r).commit();
        ws.commit();
      }
      await wb.commit();
      return performance.now() - start;
    };
    const ours = async () => {
      const start = performance.now();
      await writePack(
        packSheets(row, snapshot, { kind: 'region' }),
        { title: 'bench', subject: 'bench', created: new Date(0) },
        sink(),
      );
      return performance.now() - start;
    };
    await bare();
    await ours();
    const ratios = [];
    const times = [];
    for (let i = 0; i < RUNS; i++) {
      const b = await bare();
      const o = await ours();
      ratios.push(o / b);
      times.push([o, b]);
    }
    const ratio = median(ratios);
    const rows = cells.reduce((n: number, s: { rows: unknown[] }) => n + s.rows.length, 0);
    const met3 = ratio <= TARGET_PACK_RATIO;
    if (!met3) missed++;
    console.log(
      `region pack of ${SYNTHETIC_PRACTICES} synthetic practices (${rows} rows): ${seconds(median(times.map((t) => t[0]!)))} s vs bare exceljs ${seconds(median(times.map((t) => t[1]!)))} s, ratio ${ratio.toFixed(2)} median of ${RUNS} (runs ${ratios.map((r) => r.toFixed(2)).join(', ')}; target ≤ ${TARGET_PACK_RATIO}): ${met3 ? 'met' : 'MISSED'}`,
    );
  } finally {
    await app.close();
    await bench.db.close();
    if (!process.env.BENCH_KEEP_DATABASE) {
      const { dropTestDatabase } = await fromDist('database/connect.js');
      await dropTestDatabase(bench.config, bench.secrets);
    }
  }
  console.log(`load average after: ${loadAverage()}`);
  return missed;
}

main().then(
  (missed) => process.exit(missed === 0 ? 0 : 1),
  (error: unknown) => {
    console.error(error);
    process.exit(1);
  },
);
