/**
 * Peak RSS of one API process ingesting a 200,000-row extract. This driver
 * prepares a fresh test database (demo organisation, an open quarter) and
 * stores a 200,000-row XLSX as an upload while its own job runner is off
 * (CAIRN_EXTRACTS_WORKERS=0); then it starts the production API exactly as
 * `npm start` does (`node dist/main.js`, one extract worker) and lets that
 * process claim, check and stage the file (test/support/api-process.ts starts it). The figure is the API process's
 * own peak resident set size (VmHWM in /proc/<pid>/status), so the driver,
 * tsx and the file generator are not counted. Run by run.ts.
 */
import { existsSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Readable } from 'node:stream';
import { QueryTypes } from 'sequelize';
import { systemActor } from '../src/auth/actor.js';
import { writeXlsx } from '../src/submissions/template/extract-writer.js';
import { startApiProcess } from '../test/support/api-process.js';
import type { TestApp } from '../test/support/test-app.js';
import { benchApp } from './app.js';
import { BENCH_HEADINGS, benchRows } from './rows.js';

const quick = process.argv.includes('--quick');
const N = quick ? 50_000 : 200_000;
const file = join(tmpdir(), 'cairn-bench', `rss-${N}.xlsx`);
if (!existsSync(file)) {
  await writeXlsx(
    { headings: BENCH_HEADINGS, rows: benchRows(N, { sparse: true }) },
    { filename: file, sharedStrings: true },
  );
}
const bytes = readFileSync(file);

/** Peak resident set of a process (VmHWM), in MB. */
function peakRssMb(pid: number): number {
  const status = readFileSync(`/proc/${pid}/status`, 'utf8');
  return Math.round(Number(/^VmHWM:\s+(\d+) kB/m.exec(status)?.[1]) / 1024);
}

process.env.CAIRN_EXTRACTS_WORKERS = '0';
const t = await benchApp();
try {
  const [region] = await t.db.query<{ id: number }>('SELECT id FROM regions', {
    type: QueryTypes.SELECT,
  });
  const [practice] = await t.db.query<{ id: number }>(
    "SELECT id FROM practices WHERE code = 'OV105'",
    { type: QueryTypes.SELECT },
  );
  const system = systemActor('benchmark', region!.id);
  const quarters = await t.get('quarters/quarters.service.js', 'QuartersService');
  const quarter = (await quarters.open(system, { year: 2026, quarter: 3 })).id as number;
  const intake = await t.get('submissions/intake.service.js', 'IntakeService');
  const id = (await intake.store(system, practice!.id, quarter, null, {
    fileName: 'rss.xlsx',
    chunks: Readable.from([bytes]),
    truncated: () => false,
  })) as number;

  // The production API, as `npm start` runs it, with one extract worker to claim the upload.
  const api = await startApiProcess({ databaseName: t.databaseName } as TestApp, {
    CAIRN_EXTRACTS_WORKERS: '1',
  });
  try {
    const t0 = performance.now();
    let status = 'processing';
    let rowsAccepted = 0;
    while (status === 'processing') {
      if (performance.now() - t0 > 600_000) throw new Error('the API did not finish in 10 min');
      await new Promise((r) => setTimeout(r, 250));
      const [row] = await t.db.query<{ status: string; rows_accepted: number }>(
        'SELECT status, rows_accepted FROM submissions WHERE id = ?',
        { replacements: [id], type: QueryTypes.SELECT },
      );
      status = row!.status;
      rowsAccepted = row!.rows_accepted;
    }
    const seconds = (performance.now() - t0) / 1000;
    if (status !== 'awaiting_confirmation') throw new Error(`the ${N}-row file ended ${status}`);
    console.log(
      `peak RSS ${peakRssMb(api.pid)} MB ingesting ${rowsAccepted} rows (xlsx, ${(bytes.length / 1_048_576).toFixed(1)} MB) in ${seconds.toFixed(1)} s`,
    );
  } finally {
    await api.stop();
  }
} finally {
  await t.close();
}
