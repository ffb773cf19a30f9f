/**
 * Runs the built Cairn (API serving the web, plus the local fakes) as real
 * processes against a fresh test database, on free ports: what a user of
 * `npm start` gets, without touching the demo data.
 */
import { type ChildProcess, spawn, spawnSync } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { existsSync, mkdtempSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { API_NODE_FLAGS } from '../../packages/api/src/node-flags.ts';
import { repoRoot } from './paths.ts';

const handedOut = new Set<number>();

/**
 * A port free on 127.0.0.1 now, never one this process handed out before (the kernel may
 * offer a just-released port again, and two servers of one test would then collide).
 */
export async function freePort(): Promise<number> {
  for (;;) {
    const port = await new Promise<number>((resolve, reject) => {
      const server = createServer();
      server.unref();
      server.on('error', reject);
      server.listen(0, '127.0.0.1', () => {
        const address = server.address();
        server.close(() => resolve(typeof address === 'object' && address ? address.port : 0));
      });
    });
    if (!handedOut.has(port)) {
      handedOut.add(port);
      return port;
    }
  }
}

export interface CairnServer {
  baseUrl: string;
  fakesUrl: string;
  databaseName: string;
  env: NodeJS.ProcessEnv;
  /** Everything the API process printed */
  output: () => string;
  stop(): Promise<void>;
}

export interface StartOptions {
  /** Load the demo organisation (default true) */
  seed?: boolean;
  env?: NodeJS.ProcessEnv;
}

const apiDist = join(repoRoot, 'packages', 'api', 'dist');

function cli(args: string[], env: NodeJS.ProcessEnv): void {
  const result = spawnSync(
    process.execPath,
    [...API_NODE_FLAGS, join(apiDist, 'cli.js'), ...args],
    {
      env,
      cwd: repoRoot,
      encoding: 'utf8',
    },
  );
  if (result.status !== 0)
    throw new Error(`cli ${args.join(' ')} failed:\n${result.stdout}\n${result.stderr}`);
}

async function waitHealthy(url: string, child: ChildProcess, timeoutMs: number): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    if (child.exitCode !== null)
      throw new Error(`the API exited with code ${child.exitCode} before becoming healthy`);
    try {
      if ((await fetch(url)).ok) return;
    } catch {
      // not listening yet
    }
    await new Promise((r) => setTimeout(r, 200));
  }
  throw new Error(`${url} was not healthy within ${timeoutMs} ms`);
}

export async function startCairn(options: StartOptions = {}): Promise<CairnServer> {
  if (!existsSync(join(apiDist, 'main.js')))
    throw new Error('packages/api/dist is missing: run `npm test` (it builds) or `npm run build`');
  // A port taken between choosing it and binding it makes a process exit at once: try again on
  // new ports (twice at most); any other failure is reported with everything the processes said.
  for (let attempt = 1; ; attempt++) {
    try {
      return await startOnce(options);
    } catch (error) {
      if (!(error instanceof PortTakenError) || attempt >= 3) throw error;
    }
  }
}

class PortTakenError extends Error {}

async function startOnce(options: StartOptions): Promise<CairnServer> {
  const [port, fakesPort, smtpPort] = [await freePort(), await freePort(), await freePort()];
  const databaseName = `cairn_test_${randomBytes(5).toString('hex')}`;
  const env: NodeJS.ProcessEnv = {
    ...process.env,
    CAIRN_PROFILE: 'test',
    NODE_ENV: 'test',
    CAIRN_ROOT: repoRoot,
    CAIRN_DATABASE_NAME: databaseName,
    CAIRN_SERVER_PORT: String(port),
    CAIRN_SERVER_PUBLIC_URL: `http://127.0.0.1:${port}`,
    CAIRN_DEV_FAKES_PORT: String(fakesPort),
    CAIRN_DEV_FAKES_SMTP_PORT: String(smtpPort),
    CAIRN_DEV_FAKES_DATA_DIR: mkdtempSync(join(tmpdir(), 'cairn-fakes-')),
    CAIRN_MAIL_PORT: String(smtpPort),
    CAIRN_LOGGING_LEVEL: 'warn',
    ...options.env,
  };
  cli(['migrate', '--create'], env);
  if (options.seed !== false) cli(['seed-demo', join(repoRoot, 'seed-data', 'out')], env);

  const children: ChildProcess[] = [];
  let output = '';
  const run = (script: string, flags: readonly string[] = []) => {
    const child = spawn(process.execPath, [...flags, script], {
      env,
      cwd: repoRoot,
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    child.stdout?.on('data', (d: Buffer) => (output += d.toString()));
    child.stderr?.on('data', (d: Buffer) => (output += d.toString()));
    children.push(child);
    return child;
  };
  const fakes = join(apiDist, 'dev', 'main.js');
  if (existsSync(fakes)) run(fakes);
  const api = run(join(apiDist, 'main.js'), API_NODE_FLAGS);
  const baseUrl = `http://127.0.0.1:${port}`;
  try {
    await waitHealthy(`${baseUrl}/api/health`, api, 120_000);
  } catch (error) {
    for (const child of children) child.kill('SIGKILL');
    cli(['drop-test-database'], env);
    const message = `${(error as Error).message} (API on port ${port}, fakes on ${fakesPort} and ${smtpPort})\n${output}`;
    if (/EADDRINUSE/.test(output)) throw new PortTakenError(message, { cause: error });
    throw new Error(message, { cause: error });
  }

  return {
    baseUrl,
    fakesUrl: `http://127.0.0.1:${fakesPort}`,
    databaseName,
    env,
    output: () => output,
    stop: async () => {
      await Promise.all(
        children.map(
          (child) =>
            new Promise<void>((resolve) => {
              if (child.exitCode !== null) return resolve();
              child.once('exit', () => resolve());
              child.kill('SIGTERM');
              setTimeout(() => child.kill('SIGKILL'), 10_000).unref();
            }),
        ),
      );
      cli(['drop-test-database'], env);
    },
  };
}
