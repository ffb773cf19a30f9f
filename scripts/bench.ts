/**
 * `npm run bench [-- --quick]`: the performance benchmarks, each printing
 * ratios against a reference measured in the same run.
 *   - @cairn/metrics: evaluation vs DuckDB at 100k / 1M / 3.5M records, funnel limits
 *   - @cairn/api: extract ingest vs LOAD DATA LOCAL INFILE and a bare exceljs read
 *   - @cairn/api: 500 mails with attachments through the outbox vs nodemailer's pool alone
 *   - @cairn/api: publishing the demo quarter with its region pack, a practice's PDF, and the
 *     region pack of 7,000 synthetic practices vs a bare exceljs write of the same cells
 *   - @cairn/api: composing a practice's digest, and 500 digests with their workbooks through the outbox
 *   - @cairn/api: the outlier list of 7,000 practices, and one drill-down under 20 connections
 *   - @cairn/web: region benchmark page, funnel points visible after navigation; initial JS
 * The ingest benchmark uses the disposable test MariaDB (never the demo data).
 * Exit code 1 when any benchmark misses a target.
 */
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { buildIfStale, buildTargets } from './lib/build.ts';
import { loadContext } from './lib/context.ts';
import { log, runMain } from './lib/log.ts';
import { runInherit } from './lib/proc.ts';
import { prepareDemoData } from './lib/seed.ts';
import { acquireTestDatabase } from './lib/test-db.ts';

function hasBenchScript(root: string, workspace: string): boolean {
  const file = join(root, 'packages', workspace, 'package.json');
  if (!existsSync(file)) return false;
  const pkg = JSON.parse(readFileSync(file, 'utf8')) as { scripts?: Record<string, string> };
  return Boolean(pkg.scripts?.bench);
}

async function main(): Promise<void> {
  const args = process.argv.slice(2);
  const ctx = loadContext('test');
  buildIfStale(ctx.root, buildTargets[0]!);
  const outcomes: [string, number][] = [];

  log.step('── @cairn/metrics benchmark ──');
  outcomes.push([
    'metrics',
    await runInherit('npm', ['run', 'bench', '-w', '@cairn/metrics', '--', ...args], {
      cwd: ctx.root,
      env: ctx.childEnv,
    }),
  ]);

  if (hasBenchScript(ctx.root, 'api')) {
    buildIfStale(ctx.root, buildTargets[1]!);
    const database = await acquireTestDatabase(ctx);
    try {
      log.step('── @cairn/api ingest benchmark ──');
      outcomes.push([
        'api',
        await runInherit('npm', ['run', 'bench', '-w', '@cairn/api', '--', ...args], {
          cwd: ctx.root,
          env: ctx.childEnv,
        }),
      ]);
      log.step('── @cairn/api mail outbox benchmark ──');
      outcomes.push([
        'mail',
        await runInherit('npm', ['run', 'bench:mail', '-w', '@cairn/api'], {
          cwd: ctx.root,
          env: ctx.childEnv,
        }),
      ]);
      log.step('── @cairn/api reports benchmark ──');
      prepareDemoData(ctx.root);
      outcomes.push([
        'reports',
        await runInherit('npm', ['run', 'bench:reports', '-w', '@cairn/api'], {
          cwd: ctx.root,
          env: ctx.childEnv,
        }),
      ]);
      log.step('── @cairn/api digest benchmark ──');
      outcomes.push([
        'digests',
        await runInherit('npm', ['run', 'bench:digests', '-w', '@cairn/api'], {
          cwd: ctx.root,
          env: ctx.childEnv,
        }),
      ]);
      log.step('── @cairn/api outlier review benchmark ──');
      outcomes.push([
        'outliers',
        await runInherit('npm', ['run', 'bench:outliers', '-w', '@cairn/api'], {
          cwd: ctx.root,
          env: ctx.childEnv,
        }),
      ]);
      buildIfStale(ctx.root, buildTargets[2]!);
      log.step('── @cairn/web region benchmark page ──');
      outcomes.push([
        'web',
        await runInherit('npx', ['tsx', 'tests/bench/web.ts'], {
          cwd: ctx.root,
          env: ctx.childEnv,
        }),
      ]);
    } finally {
      await database.release();
    }
  }

  console.log('');
  for (const [name, code] of outcomes) {
    console.log(
      `  ${code === 0 ? 'met   ' : 'MISSED'} ${name}${code === 0 ? '' : ` (exit ${code})`}`,
    );
  }
  process.exitCode = outcomes.every(([, code]) => code === 0) ? 0 : 1;
}

runMain(main);
