/** Small process and network helpers for the orchestration scripts. */
import { spawn, spawnSync, type SpawnOptions } from 'node:child_process';
import { existsSync, readFileSync } from 'node:fs';
import { connect } from 'node:net';
import { delimiter, join } from 'node:path';

/** Finds an executable on PATH or in the sbin folders Debian puts servers in. */
export function findExecutable(name: string): string | null {
  const dirs = [
    ...(process.env.PATH ?? '').split(delimiter),
    '/usr/sbin',
    '/usr/bin',
    '/sbin',
    '/bin',
  ];
  for (const dir of dirs) {
    if (!dir) continue;
    const candidate = join(dir, name);
    if (existsSync(candidate)) return candidate;
  }
  return null;
}

export interface RunResult {
  status: number | null;
  stdout: string;
  stderr: string;
}

export function runSync(
  command: string,
  args: string[],
  options: SpawnOptions & { input?: string } = {},
): RunResult {
  const result = spawnSync(command, args, { encoding: 'utf8', ...options });
  return {
    status: result.status,
    stdout: String(result.stdout ?? ''),
    stderr: String(result.stderr ?? ''),
  };
}

/** Runs a command with inherited output; resolves with its exit code. */
export function runInherit(
  command: string,
  args: string[],
  options: SpawnOptions = {},
): Promise<number> {
  return new Promise((resolve, reject) => {
    const child = spawn(command, args, { stdio: 'inherit', ...options });
    child.on('error', reject);
    child.on('exit', (code, signal) => resolve(code ?? (signal ? 128 : 1)));
  });
}

/** Runs a command with its standard output captured (stderr inherited); resolves with both. */
export function runCapture(
  command: string,
  args: string[],
  options: SpawnOptions = {},
): Promise<{ code: number; stdout: string }> {
  return new Promise((resolve, reject) => {
    const child = spawn(command, args, { ...options, stdio: ['ignore', 'pipe', 'inherit'] });
    const chunks: Buffer[] = [];
    child.stdout?.on('data', (chunk: Buffer) => chunks.push(chunk));
    child.on('error', reject);
    child.on('close', (code, signal) =>
      resolve({
        code: code ?? (signal ? 128 : 1),
        stdout: Buffer.concat(chunks).toString('utf8'),
      }),
    );
  });
}

/** True when something accepts TCP connections on host:port. */
export function isPortOpen(port: number, host = '127.0.0.1', timeoutMs = 500): Promise<boolean> {
  return new Promise((resolve) => {
    const socket = connect({ port, host });
    const done = (open: boolean) => {
      socket.destroy();
      resolve(open);
    };
    socket.setTimeout(timeoutMs, () => done(false));
    socket.once('connect', () => done(true));
    socket.once('error', () => done(false));
  });
}

export function isProcessAlive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch (error) {
    return (error as NodeJS.ErrnoException).code === 'EPERM';
  }
}

/** The command line of a live process (Linux /proc), or '' when unknown. */
export function processCommandLine(pid: number): string {
  try {
    return readFileSync(`/proc/${pid}/cmdline`, 'utf8').split('\0').join(' ');
  } catch {
    return '';
  }
}

export const sleep = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

export async function waitFor(
  check: () => Promise<boolean> | boolean,
  { timeoutMs, intervalMs = 200 }: { timeoutMs: number; intervalMs?: number },
): Promise<boolean> {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    if (await check()) return true;
    await sleep(intervalMs);
  }
  return check();
}
