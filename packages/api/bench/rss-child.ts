/**
 * Peak RSS of one API process ingesting a 200,000-row extract: this process
 * boots the production API (dist/) on a fresh test database, stores a
 * 200,000-row XLSX as an upload, lets its job runner check and stage it, and
 * prints its own peak resident set size (getrusage maxrss). Run by run.ts.
 */
import { existsSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Readable } from 'node:stream';
import { QueryTypes } from 'sequelize';
import { writeXlsx } from '../src/submissions/template/extract-writer.js';
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
  const runner = await t.get('submissions/job-runner.service.js', 'JobRunner');
  const t0 = performance.now();
  const id = await intake.store(system, practice!.id, quarter, null, {
    fileName: 'rss.xlsx',
    chunks: Readable.from([bytes]),
    truncated: () => false,
  });
  await runner.waitFor([id], 600_000);
  const [row] = await t.db.query<{ status: string; rows_accepted: number }>(
    'SELECT status, rows_accepted FROM submissions WHERE id = ?',
    {
      replacements: [id],
      type: QueryTypes.SELECT,
    },
  );
  if (row?.status !== 'awaiting_confirmation')
    throw new Error(`the ${N}-row file ended ${row?.status}`);
  const peakMb = Math.round(process.resourceUsage().maxRSS / 1024);
  console.log(
    `peak RSS ${peakMb} MB ingesting ${row.rows_accepted} rows (xlsx, ${(bytes.length / 1_048_576).toFixed(1)} MB) in ${((performance.now() - t0) / 1000).toFixed(1)} s`,
  );
} finally {
  await t.close();
}
