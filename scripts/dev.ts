/**
 * `npm run dev`: work on Cairn with live reload.
 *   - the private MariaDB (development data, as `npm start`)
 *   - @cairn/metrics built once (rebuild with `npm run build -w @cairn/metrics`)
 *   - the API compiled by `tsc --watch` and restarted by `node --watch`
 *   - the local fakes, and Vite's dev server on http://127.0.0.1:5173 (proxying /api)
 * Ctrl-C stops everything and shuts MariaDB down cleanly.
 */
import { type ChildProcess, spawn } from 'node:child_process';
import { join } from 'node:path';
import { buildIfStale, buildTargets } from './lib/build.ts';
import { loadContext } from './lib/context.ts';
import { log, runMain } from './lib/log.ts';
import {
  ensureDatabaseAndUser,
  ensureDataDir,
  ensureMariadbBinaries,
  startMariadb,
  stopMariadb,
} from './lib/mariadb.ts';
import { runSync, waitFor } from './lib/proc.ts';
import { prepareDemoData } from './lib/seed.ts';
import { API_NODE_FLAGS } from '../packages/api/src/node-flags.ts';

async function main(): Promise<void> {
  const ctx = loadContext('development');
  const bin = await ensureMariadbBinaries();
  ensureDataDir(bin, ctx.mariadb);
  const { started } = await startMariadb(bin, ctx.mariadb);
  ensureDatabaseAndUser(bin, ctx.mariadb, {
    database: ctx.config.database.name,
    user: ctx.config.database.user,
    password: ctx.secrets.CAIRN_DATABASE_PASSWORD,
  });
  for (const target of buildTargets.slice(0, 2)) buildIfStale(ctx.root, target);
  const apiDist = join(ctx.root, 'packages', 'api', 'dist');
  for (const args of [['migrate'], ['seed-demo', prepareDemoData(ctx.root)]]) {
    const result = runSync(
      process.execPath,
      [...API_NODE_FLAGS, join(apiDist, 'cli.js'), ...args],
      {
        env: ctx.childEnv,
        cwd: ctx.root,
      },
    );
    process.stdout.write(result.stdout + result.stderr);
  }

  const children: ChildProcess[] = [];
  const run = (command: string, args: string[], cwd = ctx.root) => {
    const child = spawn(command, args, { cwd, env: ctx.childEnv, stdio: 'inherit' });
    children.push(child);
    return child;
  };
  const bin_ = (name: string) => join(ctx.root, 'node_modules', '.bin', name);
  run(bin_('tsc'), ['-p', 'packages/api/tsconfig.build.json', '--watch', '--preserveWatchOutput']);
  run(process.execPath, ['--enable-source-maps', '--watch', join(apiDist, 'dev', 'main.js')]);
  run(process.execPath, [
    ...API_NODE_FLAGS,
    '--enable-source-maps',
    '--watch',
    join(apiDist, 'main.js'),
  ]);
  run(bin_('vite'), [], join(ctx.root, 'packages', 'web'));

  let stopping = false;
  const stop = async () => {
    if (stopping) return;
    stopping = true;
    for (const child of children) child.kill('SIGTERM');
    await waitFor(() => children.every((c) => c.exitCode !== null || c.signalCode !== null), {
      timeoutMs: 10_000,
    });
    if (started) await stopMariadb(bin, ctx.mariadb);
    process.exit(0);
  };
  process.on('SIGINT', () => void stop());
  process.on('SIGTERM', () => void stop());
  log.ok('dev servers starting: web http://127.0.0.1:5173/ (API on :3000). Ctrl-C stops all.');
}

runMain(main);
