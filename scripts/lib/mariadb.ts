/**
 * Cairn's private MariaDB: Debian's mariadbd with its own data directory,
 * socket and pid file inside the checkout, bound to 127.0.0.1.
 *
 * - The data directory is initialised into a sibling temporary folder and
 *   renamed into place only once complete, with a marker file, so that an
 *   interrupted first start never leaves a half-made data directory behind.
 * - A data directory holding data is never deleted by these scripts.
 * - The application connects as its own user with a password; root is used
 *   only here, over the private socket, to create the database and that user.
 */
import { spawn } from 'node:child_process';
import {
  closeSync,
  existsSync,
  mkdirSync,
  openSync,
  readFileSync,
  readdirSync,
  renameSync,
  rmSync,
  unlinkSync,
  writeFileSync,
} from 'node:fs';
import { basename, dirname, relative } from 'node:path';
import { ensureDebianPackage } from './debian.ts';
import { fail, log } from './log.ts';
import {
  findExecutable,
  isPortOpen,
  isProcessAlive,
  processCommandLine,
  runSync,
  sleep,
  waitFor,
} from './proc.ts';

export const MARKER = '.cairn-initialised';

export interface MariadbPaths {
  root: string;
  dataDir: string;
  socket: string;
  pidFile: string;
  logFile: string;
  port: number;
  /** The config key prefix to name in messages, e.g. "mariadb" */
  configHint: string;
}

export interface MariadbBinaries {
  mariadbd: string;
  installDb: string;
  admin: string;
  client: string;
}

export async function ensureMariadbBinaries(): Promise<MariadbBinaries> {
  const mariadbd = await ensureDebianPackage(
    'mariadbd',
    'mariadb-server',
    'Cairn keeps its data in a private MariaDB',
  );
  const need = (name: string) =>
    findExecutable(name) ??
    fail(
      `${name} is missing although mariadbd is installed: reinstall Debian's mariadb-server and mariadb-client.`,
    );
  return {
    mariadbd,
    installDb: need('mariadb-install-db'),
    admin: need('mariadb-admin'),
    client: need('mariadb'),
  };
}

const show = (p: MariadbPaths, path: string) => relative(p.root, path) || path;

/** True when mariadbd answers on the private socket. */
export function ping(bin: MariadbBinaries, p: MariadbPaths): boolean {
  if (!existsSync(p.socket)) return false;
  return (
    runSync(bin.admin, [
      '--no-defaults',
      `--socket=${p.socket}`,
      '-uroot',
      '--connect-timeout=2',
      'ping',
    ]).status === 0
  );
}

function readPid(p: MariadbPaths): number | null {
  if (!existsSync(p.pidFile)) return null;
  const pid = Number.parseInt(readFileSync(p.pidFile, 'utf8').trim(), 10);
  return Number.isInteger(pid) && pid > 0 ? pid : null;
}

function isOurMariadb(pid: number, p: MariadbPaths): boolean {
  const cmd = processCommandLine(pid);
  return cmd.includes('mariadbd') && cmd.includes(p.dataDir);
}

export type InstanceState =
  | { kind: 'stopped' }
  | { kind: 'running'; pid: number }
  | { kind: 'stale-pid'; pid: number | null };

export function instanceState(bin: MariadbBinaries, p: MariadbPaths): InstanceState {
  const pid = readPid(p);
  if (pid === null) {
    return existsSync(p.pidFile) ? { kind: 'stale-pid', pid: null } : { kind: 'stopped' };
  }
  if (isProcessAlive(pid) && isOurMariadb(pid, p)) return { kind: 'running', pid };
  return ping(bin, p) ? { kind: 'running', pid } : { kind: 'stale-pid', pid };
}

/** Creates the data directory when it does not exist; refuses one that is not complete. */
export function ensureDataDir(bin: MariadbBinaries, p: MariadbPaths): 'created' | 'existing' {
  const parent = dirname(p.dataDir);
  mkdirSync(parent, { recursive: true });
  const temporary = `${p.dataDir}.initialising`;
  if (existsSync(temporary)) {
    // Only ever written by the step below and renamed when complete, so it
    // never holds data: safe to remove.
    log.warn(
      `removing ${show(p, temporary)}, left by an interrupted first start (it never held data)`,
    );
    rmSync(temporary, { recursive: true, force: true });
  }
  if (existsSync(p.dataDir)) {
    const entries = readdirSync(p.dataDir);
    if (entries.length === 0) {
      rmSync(p.dataDir, { recursive: true, force: true });
    } else if (!entries.includes(MARKER) || !entries.includes('mysql')) {
      const another = `${show(p, p.dataDir)}-2`;
      const fromEnv = process.env.CAIRN_MARIADB_DATA_DIR;
      fail(
        `The MariaDB data directory ${show(p, p.dataDir)} exists but is not a complete Cairn data directory ` +
          `(no ${MARKER} marker or no mysql/ system tables: it was probably left half-initialised by a start that was killed, ` +
          `or made by hand). Cairn never deletes a data directory itself.\n` +
          `  If it holds nothing you need: rm -rf ${show(p, p.dataDir)} and run the command again.\n` +
          (fromEnv
            ? `  To keep it and use another: CAIRN_MARIADB_DATA_DIR (${fromEnv}) names this one; point it at a new folder, e.g. CAIRN_MARIADB_DATA_DIR=${another}.`
            : `  To keep it and use another: set ${p.configHint}.dataDir, e.g. CAIRN_MARIADB_DATA_DIR=${another}.`),
      );
    } else {
      return 'existing';
    }
  }
  log.step(`initialising a private MariaDB data directory in ${show(p, p.dataDir)} ...`);
  mkdirSync(temporary, { recursive: true });
  const args = [
    '--no-defaults',
    `--datadir=${temporary}`,
    '--auth-root-authentication-method=normal',
    '--skip-test-db',
    '--skip-name-resolve',
  ];
  if (process.getuid?.() === 0) args.push('--user=root');
  const result = runSync(bin.installDb, args);
  if (result.status !== 0) {
    rmSync(temporary, { recursive: true, force: true });
    fail(`mariadb-install-db failed (exit ${result.status}):\n${result.stdout}\n${result.stderr}`);
  }
  writeFileSync(`${temporary}/${MARKER}`, `initialised by Cairn on ${new Date().toISOString()}\n`);
  renameSync(temporary, p.dataDir);
  return 'created';
}

function tailOfLog(p: MariadbPaths, lines = 15): string {
  if (!existsSync(p.logFile)) return '(no error log was written)';
  return readFileSync(p.logFile, 'utf8').trimEnd().split('\n').slice(-lines).join('\n');
}

export interface StartOptions {
  /** Remove a stale pid file instead of stopping with a message (the disposable test instance). */
  removeStalePid?: boolean;
}

/**
 * Starts mariadbd unless this checkout's instance already runs.
 * Returns whether this call started it (and so should stop it).
 */
export async function startMariadb(
  bin: MariadbBinaries,
  p: MariadbPaths,
  options: StartOptions = {},
): Promise<{ started: boolean }> {
  const state = instanceState(bin, p);
  if (state.kind === 'running') {
    if (await waitFor(() => ping(bin, p), { timeoutMs: 20_000 })) {
      log.ok(`MariaDB for this checkout is already running (pid ${state.pid}); reusing it`);
      return { started: false };
    }
    fail(
      `MariaDB (pid ${state.pid}) for ${show(p, p.dataDir)} is running but does not answer on ${show(p, p.socket)}. ` +
        `Stop it (kill ${state.pid}) and run the command again; the error log is ${show(p, p.logFile)}.`,
    );
  }
  if (state.kind === 'stale-pid') {
    const detail =
      state.pid === null
        ? 'holds no process id'
        : `names process ${state.pid}, which is not running`;
    if (options.removeStalePid) {
      log.warn(`removing the stale pid file ${show(p, p.pidFile)} (it ${detail})`);
      unlinkSync(p.pidFile);
    } else {
      fail(
        `The MariaDB pid file ${show(p, p.pidFile)} is stale: it ${detail}, so MariaDB probably crashed or the machine ` +
          `stopped without a clean shutdown. Your data is not touched by this check.\n` +
          `  Fix: rm ${show(p, p.pidFile)} and run the command again (MariaDB recovers its data on start).`,
      );
    }
  }
  if (await isPortOpen(p.port)) {
    fail(
      `Port ${p.port} on 127.0.0.1 is already in use by another program, so Cairn's private MariaDB cannot listen there.\n` +
        `  Fix: stop that program (see: ss -ltnp 'sport = :${p.port}'), or choose another port for this checkout, ` +
        `e.g. CAIRN_DATABASE_PORT=${p.port + 10} (config key database.port).`,
    );
  }
  mkdirSync(dirname(p.socket), { recursive: true });
  if (p.socket.length > 100) {
    fail(
      `The MariaDB socket path ${p.socket} is ${p.socket.length} characters long; Unix sockets allow about 107. ` +
        `Set ${p.configHint}.socket to a shorter path (e.g. CAIRN_MARIADB_SOCKET=/tmp/cairn-${basename(p.dataDir)}.sock), or move the checkout to a shorter path.`,
    );
  }
  const args = [
    '--no-defaults',
    `--datadir=${p.dataDir}`,
    `--port=${p.port}`,
    '--bind-address=127.0.0.1',
    `--socket=${p.socket}`,
    `--pid-file=${p.pidFile}`,
    `--log-error=${p.logFile}`,
    '--skip-name-resolve',
    '--character-set-server=utf8mb4',
    '--collation-server=utf8mb4_unicode_ci',
    '--local-infile=1',
    '--max-allowed-packet=256M',
    '--innodb-buffer-pool-size=512M',
    '--max-connections=300',
  ];
  if (process.getuid?.() === 0) args.push('--user=root');
  const out = openSync(p.logFile, 'a');
  const child = spawn(bin.mariadbd, args, { detached: true, stdio: ['ignore', out, out] });
  closeSync(out);
  let exited: number | null = null;
  child.on('exit', (code) => {
    exited = code ?? 1;
  });
  child.unref();
  const ready = await waitFor(() => exited !== null || ping(bin, p), {
    timeoutMs: 60_000,
    intervalMs: 150,
  });
  if (exited !== null || !ready) {
    fail(
      `MariaDB did not start (${exited !== null ? `exit code ${exited}` : 'no answer in 60 s'}). ` +
        `Last lines of ${show(p, p.logFile)}:\n${tailOfLog(p)}`,
    );
  }
  return { started: true };
}

/** Runs SQL as root over the private socket. */
export function rootSql(bin: MariadbBinaries, p: MariadbPaths, sql: string): string {
  const result = runSync(
    bin.client,
    ['--no-defaults', `--socket=${p.socket}`, '-uroot', '--batch', '--skip-column-names'],
    { input: sql },
  );
  if (result.status !== 0) fail(`MariaDB refused a set-up statement: ${result.stderr.trim()}`);
  return result.stdout;
}

const quote = (value: string) => `'${value.replace(/\\/g, '\\\\').replace(/'/g, "\\'")}'`;

/**
 * Creates the database (or, for tests, the right to create databases
 * named <name>_*) and the application user, and sets its password.
 */
export function ensureDatabaseAndUser(
  bin: MariadbBinaries,
  p: MariadbPaths,
  {
    database,
    user,
    password,
    allowPrefix,
  }: { database: string; user: string; password: string; allowPrefix?: boolean },
): void {
  const grants = [`GRANT ALL PRIVILEGES ON \`${database}\`.* TO %USER%;`];
  if (allowPrefix)
    grants.push(`GRANT ALL PRIVILEGES ON \`${database.replace(/_/g, '\\_')}\\_%\`.* TO %USER%;`);
  const statements = [
    `CREATE DATABASE IF NOT EXISTS \`${database}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci;`,
  ];
  for (const host of ['127.0.0.1', 'localhost']) {
    const who = `${quote(user)}@${quote(host)}`;
    statements.push(`CREATE USER IF NOT EXISTS ${who} IDENTIFIED BY ${quote(password)};`);
    statements.push(`ALTER USER ${who} IDENTIFIED BY ${quote(password)};`);
    for (const grant of grants) statements.push(grant.replace('%USER%', who));
  }
  statements.push('FLUSH PRIVILEGES;');
  rootSql(bin, p, statements.join('\n'));
}

export async function stopMariadb(bin: MariadbBinaries, p: MariadbPaths): Promise<void> {
  const pid = readPid(p);
  const result = runSync(bin.admin, [
    '--no-defaults',
    `--socket=${p.socket}`,
    '-uroot',
    'shutdown',
  ]);
  if (result.status !== 0 && pid !== null && isProcessAlive(pid)) process.kill(pid, 'SIGTERM');
  if (pid !== null) {
    const stopped = await waitFor(() => !isProcessAlive(pid), {
      timeoutMs: 60_000,
      intervalMs: 100,
    });
    if (!stopped) log.warn(`MariaDB (pid ${pid}) has not stopped after 60 s`);
  } else {
    await sleep(300);
  }
}
