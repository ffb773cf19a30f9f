/**
 * `npm start`: everything from a fresh clone to a running Cairn.
 *
 *  1. configuration and local secrets       5. build metrics, API and web when stale
 *  2. Debian's mariadb-server when missing   6. migrate, then seed the demo scenario (empty DB)
 *  3. ports free                             7. local fakes (SAML IdP, SMTP capture)
 *  4. private MariaDB on 127.0.0.1           8. the API, serving the web at /
 *
 * Ctrl-C (SIGINT) or SIGTERM stops the API and the fakes, then shuts MariaDB
 * down cleanly. The terminal shows short log lines (full JSON logs in
 * .data/log/); `npm start -- --verbose` also shows health-check requests.
 */
import { type ChildProcess, spawn } from 'node:child_process';
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { buildAll } from './lib/build.ts';
import { loadContext } from './lib/context.ts';
import { fail, log, runMain } from './lib/log.ts';
import {
  ensureDatabaseAndUser,
  ensureDataDir,
  ensureMariadbBinaries,
  startMariadb,
  stopMariadb,
} from './lib/mariadb.ts';
import { isPortOpen, runSync, waitFor } from './lib/proc.ts';
import { pipeLogs } from './lib/pretty-log.ts';
import { prepareDemoData } from './lib/seed.ts';
import { API_NODE_FLAGS } from '../packages/api/src/node-flags.ts';

async function main(): Promise<void> {
  const started = Date.now();
  const verbose = process.argv.includes('--verbose');
  const ctx = loadContext('development');
  const { config } = ctx;

  const portsToCheck: [number, string][] = [
    [config.server.port, 'server.port (CAIRN_SERVER_PORT)'],
  ];
  if (config.devFakes.enabled) {
    portsToCheck.push([config.devFakes.port, 'devFakes.port (CAIRN_DEV_FAKES_PORT)']);
    portsToCheck.push([config.devFakes.smtpPort, 'devFakes.smtpPort (CAIRN_DEV_FAKES_SMTP_PORT)']);
  }
  for (const [port, key] of portsToCheck) {
    if (await isPortOpen(port, '127.0.0.1')) {
      fail(
        `Port ${port} on 127.0.0.1 is already in use (is another \`npm start\` running?).\n` +
          `  Fix: stop that program (see: ss -ltnp 'sport = :${port}'), or set ${key} to a free port.`,
      );
    }
  }

  const children: ChildProcess[] = [];
  let mariadbStarted = false;
  let stopping = false;
  const bin = config.mariadb.manage ? await ensureMariadbBinaries() : null;

  const stopAll = async (code: number) => {
    if (stopping) return;
    stopping = true;
    log.step('stopping ...');
    for (const child of children) if (child.exitCode === null) child.kill('SIGTERM');
    await waitFor(() => children.every((c) => c.exitCode !== null || c.signalCode !== null), {
      timeoutMs: 10_000,
    });
    if (bin && mariadbStarted) {
      await stopMariadb(bin, ctx.mariadb);
      log.ok('MariaDB shut down cleanly; your data is kept in ' + config.mariadb.dataDir);
    }
    process.exit(code);
  };
  process.on('SIGINT', () => void stopAll(0));
  process.on('SIGTERM', () => void stopAll(0));
  process.on('SIGHUP', () => void stopAll(0));
  // A closed terminal or pipe must not leave MariaDB running: ignore EPIPE, shut down on anything unexpected.
  for (const stream of [process.stdout, process.stderr]) stream.on('error', () => undefined);
  process.on('uncaughtException', (error) => {
    log.error(`unexpected error: ${error.stack ?? error.message}`);
    void stopAll(1);
  });

  if (bin) {
    ensureDataDir(bin, ctx.mariadb);
    mariadbStarted = (await startMariadb(bin, ctx.mariadb)).started;
    ensureDatabaseAndUser(bin, ctx.mariadb, {
      database: config.database.name,
      user: config.database.user,
      password: ctx.secrets.CAIRN_DATABASE_PASSWORD,
    });
    log.ok(`MariaDB ready on 127.0.0.1:${config.database.port} (database ${config.database.name})`);
  }

  try {
    buildAll(ctx.root);
  } catch (error) {
    log.error((error as Error).message);
    return stopAll(1);
  }

  const apiDist = join(ctx.root, 'packages', 'api', 'dist');
  const cli = (args: string[]) => {
    const result = runSync(
      process.execPath,
      [...API_NODE_FLAGS, join(apiDist, 'cli.js'), ...args],
      {
        env: ctx.childEnv,
        cwd: ctx.root,
      },
    );
    if (result.status !== 0) {
      log.error(`${args[0]} failed:\n${result.stdout}${result.stderr}`);
      return false;
    }
    log.ok(result.stdout.trim().split('\n').pop() ?? `${args[0]} done`);
    return true;
  };
  if (!cli(['migrate'])) return stopAll(1);
  const demoDir = prepareDemoData(ctx.root);
  if (!cli(['seed-demo', demoDir])) return stopAll(1);

  const spawnChild = (name: string, script: string, logName: string) => {
    // No --enable-source-maps here (npm run dev has it): with it the API needs about 110 MB more
    // and a quarter longer to check a 200,000-row workbook (npm run bench); stack traces then
    // point into dist/, which tsc keeps close to the sources.
    const child = spawn(process.execPath, [...API_NODE_FLAGS, script], {
      cwd: ctx.root,
      env: ctx.childEnv,
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    const logFile = join(ctx.root, '.data', 'log', `${logName}.log`);
    pipeLogs(logName, child.stdout!, logFile, verbose);
    pipeLogs(logName, child.stderr!, logFile, verbose);
    child.on('exit', (code, signal) => {
      if (!stopping) {
        log.error(
          `${name} stopped unexpectedly (${signal ?? `exit code ${code}`}); shutting down.`,
        );
        void stopAll(1);
      }
    });
    children.push(child);
    return child;
  };

  const fakes = join(apiDist, 'dev', 'main.js');
  if (config.devFakes.enabled && existsSync(fakes)) spawnChild('the local fakes', fakes, 'fakes');
  spawnChild('the API', join(apiDist, 'main.js'), 'api');

  const healthUrl = `http://127.0.0.1:${config.server.port}/api/health`;
  const healthy = await waitFor(
    async () => {
      try {
        return (await fetch(healthUrl)).ok;
      } catch {
        return false;
      }
    },
    { timeoutMs: 60_000, intervalMs: 250 },
  );
  if (!healthy) {
    log.error(`the API did not become healthy at ${healthUrl} within 60 s`);
    return stopAll(1);
  }
  const seconds = ((Date.now() - started) / 1000).toFixed(1);
  console.log('');
  log.ok(`Cairn is running at ${config.server.publicUrl}/  (healthy in ${seconds} s)`);
  if (config.devFakes.enabled) {
    log.ok(
      `Sign in with the demo personas: choose "Sign in" and pick one on the local sign-in page ` +
        `(e.g. Imogen Varley, regional lead). Captured e-mail: http://${config.devFakes.host}:${config.devFakes.port}/mailbox`,
    );
  }
  log.ok(`API documentation: ${config.server.publicUrl}/api/docs   Press Ctrl-C to stop.`);
}

runMain(main);
