/**
 * Peak RSS of one API process ingesting a 200,000-row extract. This driver
 * prepares a fresh test database (demo organisation, an open quarter) and
 * stores a 200,000-row XLSX as an upload while its own job runner is off
 * (CAIRN_EXTRACTS_WORKERS=0); then it starts the production API exactly as
 * `npm start` does (`node dist/main.js`, one extract worker) and lets that
 * process claim, check and stage the file. The figure is the API process's
 * own peak resident set size (VmHWM in /proc/<pid>/status), so the driver,
 * tsx and the file generator are not counted. Run by run.ts.
 */
import { spawn } from 'node:child_process';
import { existsSync, readFileSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { Readable } from 'node:stream';
import { fileURLToPath } from 'node:url';
import { QueryTypes } from 'sequelize';
import { writeXlsx } from '../src/submissions/template/extract-writer.js';
import { benchApp } from './app.js';
import { BENCH_HEADINGS, benchRows } from './rows.js';

const quick = process.argv.includes('--quick');
const N = quick ? 50_000 : 200_000;
const here = dirname(fileURLToPath(import.meta.url));
const file = join(tmpdir(), 'cairn-bench', `rss-${N}.xlsx`);
if (!existsSync(file)) {
  await writeXlsx(
    { headings: BENCH_HEADINGS, rows: benchRows(N, { sparse: true }) },
    { filename: file, sharedStrings: true },
  );
}
const bytes = readFileSync(file);

const freePort = () =>
  new Promise<number>((resolve, reject) => {
    const server = createServer();
    server.on('error', reject);
    server.listen(0, '127.0.0.1', () => {
      const address = server.address();
      server.close(() => resolve(typeof address === 'object' && address ? address.port : 0));
    });
  });

/** VmHWM (peak resident set) and VmRSS of a process, in MB. */
function memoryOf(pid: number): { peak: number; now: number } {
  const status = readFileSync(`/proc/${pid}/status`, 'utf8');
  const kb = (name: string) => Number(new RegExp(`^${name}:\\s+(\\d+) kB`, 'm').exec(status)?.[1]);
  return { peak: Math.round(kb('VmHWM') / 1024), now: Math.round(kb('VmRSS') / 1024) };
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
  const system = { id: null, label: 'benchmark', role: 'system' as const, regionId: region!.id };
  const quarters = await t.get('quarters/quarters.service.js', 'QuartersService');
  const quarter = (await quarters.open(system, { year: 2026, quarter: 3 })).id as number;
  const intake = await t.get('submissions/intake.service.js', 'IntakeService');
  const id = (await intake.store(system, practice!.id, quarter, null, {
    fileName: 'rss.xlsx',
    chunks: Readable.from([bytes]),
    truncated: () => false,
  })) as number;

  const port = await freePort();
  const api = spawn(
    process.execPath,
    [
      ...(process.env.BENCH_API_FLAGS ? process.env.BENCH_API_FLAGS.split(' ') : []),
      join(here, '..', 'dist', 'main.js'),
    ],
    {
      env: {
        ...process.env,
        CAIRN_PROFILE: 'test',
        NODE_ENV: 'test',
        CAIRN_DATABASE_NAME: t.databaseName,
        CAIRN_SERVER_PORT: String(port),
        CAIRN_SERVER_PUBLIC_URL: `http://127.0.0.1:${port}`,
        CAIRN_EXTRACTS_WORKERS: '1',
        CAIRN_LOGGING_LEVEL: 'warn',
      },
      stdio: ['ignore', process.env.BENCH_API_LOG ? 'inherit' : 'ignore', 'inherit'],
    },
  );
  const exited = new Promise<number | null>((resolve) => api.once('exit', resolve));
  try {
    const t0 = performance.now();
    let status = 'processing';
    let rowsAccepted = 0;
    while (status === 'processing') {
      if (api.exitCode !== null) throw new Error(`the API exited with code ${api.exitCode}`);
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
    const memory = memoryOf(api.pid!);
    console.log(
      `peak RSS ${memory.peak} MB ingesting ${rowsAccepted} rows (xlsx, ${(bytes.length / 1_048_576).toFixed(1)} MB) in ${seconds.toFixed(1)} s`,
    );
  } finally {
    api.kill('SIGTERM');
    await exited;
  }
} finally {
  await t.close();
}
