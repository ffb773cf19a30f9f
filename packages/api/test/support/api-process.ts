/**
 * The built API (packages/api/dist/main.js) as a real OS process against a
 * test file's database, on a free port, so that a test can SIGKILL it and
 * start another. Started as `npm start` starts it (scripts/start.ts);
 * configuration through CAIRN_* environment variables, as a deployment
 * would set it.
 *
 *   const api = await startApiProcess(t, { CAIRN_EXTRACTS_LEASE_SECONDS: '2' });
 *   const lead = onProcess(await signInAs(t, 'regional_lead'), api);  // same session
 *   await api.kill();                                                 // SIGKILL
 */
import { type ChildProcess, spawn } from 'node:child_process';
import { request as httpRequest } from 'node:http';
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import request from 'supertest';
import type TestAgent from 'supertest/lib/agent.js';
import { findRepoRoot } from '../../src/config/load-config.js';
import { API_NODE_FLAGS } from '../../src/node-flags.js';
import type { SignedInAgent } from './auth.js';
import { freePort } from './ports.js';
import type { TestApp } from './test-app.js';

export interface ApiProcess {
  baseUrl: string;
  pid: number;
  /** Everything the process printed so far */
  output(): string;
  /** SIGKILL: no shutdown hooks, no goodbye to MariaDB; resolves once the process is gone */
  kill(): Promise<void>;
  /** SIGTERM and wait (the normal shutdown) */
  stop(): Promise<void>;
}

const root = findRepoRoot();
const mainJs = join(root, 'packages', 'api', 'dist', 'main.js');

function exited(child: ChildProcess): Promise<void> {
  return new Promise((resolve) => {
    if (child.exitCode !== null || child.signalCode !== null) return resolve();
    child.once('exit', () => resolve());
  });
}

export async function startApiProcess(
  t: TestApp,
  env: Record<string, string> = {},
): Promise<ApiProcess> {
  if (!existsSync(mainJs))
    throw new Error(`${mainJs} is missing: run \`npm run build -w @cairn/api\` first`);
  // Another jest worker may take the same free port between our probe and the child's listen:
  // that start fails with EADDRINUSE and is tried again on a new port.
  for (let attempt = 1; ; attempt++) {
    try {
      return await launch(t, await freePort(), env);
    } catch (error) {
      if (!(error instanceof PortTakenError) || attempt === 3) throw error;
    }
  }
}

const START_TIMEOUT_MS = 90_000;

class PortTakenError extends Error {}

async function launch(t: TestApp, port: number, env: Record<string, string>): Promise<ApiProcess> {
  const childEnv: NodeJS.ProcessEnv = {
    ...process.env,
    CAIRN_PROFILE: 'test',
    NODE_ENV: 'test',
    CAIRN_ROOT: root,
    CAIRN_DATABASE_NAME: t.databaseName,
    CAIRN_SERVER_PORT: String(port),
    CAIRN_SERVER_SERVE_WEB: 'false',
    CAIRN_LOGGING_LEVEL: 'warn',
    CAIRN_LOGGING_REQUESTS: 'false',
    ...env,
  };
  // jest's own flags are not for the API process.
  delete childEnv.NODE_OPTIONS;
  const child = spawn(process.execPath, [...API_NODE_FLAGS, mainJs], {
    env: childEnv,
    cwd: root,
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let output = '';
  child.stdout!.on('data', (d: Buffer) => (output += d.toString()));
  child.stderr!.on('data', (d: Buffer) => (output += d.toString()));
  const baseUrl = `http://127.0.0.1:${port}`;
  // Start-up takes a few seconds; on a machine busy with other work it has taken over 30.
  const deadline = Date.now() + START_TIMEOUT_MS;
  for (;;) {
    if (child.exitCode !== null) {
      const message = `the API process exited (${child.exitCode}) before it was healthy:\n${output}`;
      throw /EADDRINUSE/.test(output) ? new PortTakenError(message) : new Error(message);
    }
    try {
      const res = await fetch(`${baseUrl}/api/health`);
      // Healthy, and this child's own answer (not another process that holds the port).
      const body = (await res.json()) as { process?: { pid?: number } };
      if (res.ok && body.process?.pid === child.pid) break;
    } catch {
      // not listening yet
    }
    if (Date.now() > deadline) {
      child.kill('SIGKILL');
      throw new Error(
        `the API process was not healthy within ${START_TIMEOUT_MS / 1000} s:\n${output}`,
      );
    }
    await new Promise((r) => setTimeout(r, 100));
  }
  return {
    baseUrl,
    pid: child.pid!,
    output: () => output,
    kill: async () => {
      child.kill('SIGKILL');
      await exited(child);
    },
    stop: async () => {
      child.kill('SIGTERM');
      const timer = setTimeout(() => child.kill('SIGKILL'), 15_000);
      await exited(child);
      clearTimeout(timer);
    },
  };
}

/** An agent for `api` carrying the session of `signedIn` (sessions live in MariaDB). */
export function onProcess(signedIn: SignedInAgent, api: ApiProcess): TestAgent {
  const agent = request.agent(api.baseUrl);
  (agent as unknown as { jar: unknown }).jar = (signedIn as unknown as { jar: unknown }).jar;
  agent.set('X-CSRF-Token', signedIn.csrfToken);
  return agent;
}

export type OpenRequestOutcome =
  { status: number } | { error: string; code: string | undefined; responseBytes: number };

/**
 * A request of `signedIn`'s session to `api` on a connection of its own (no
 * pooled keep-alive socket), for a test that cuts the process mid-request:
 * `sent` resolves once the request is connected and fully written, so a kill
 * after it can only break an open connection; `outcome` is the response
 * status, or the error with the number of response bytes that had arrived.
 */
export function openRequest(
  signedIn: SignedInAgent,
  api: ApiProcess,
  method: string,
  path: string,
): { sent: Promise<void>; outcome: Promise<OpenRequestOutcome> } {
  let markSent!: () => void;
  let failSent!: (error: Error) => void;
  const sent = new Promise<void>((resolve, reject) => {
    markSent = resolve;
    failSent = reject;
  });
  const outcome = new Promise<OpenRequestOutcome>((resolve) => {
    let responseBytes = 0;
    const req = httpRequest(`${api.baseUrl}${path}`, {
      method,
      agent: false,
      headers: {
        cookie: signedIn.cookie,
        'x-csrf-token': signedIn.csrfToken,
        'content-length': '0',
      },
    });
    req.on('socket', (socket) => {
      socket.on('data', (d: Buffer) => (responseBytes += d.length));
    });
    req.on('response', (res) => {
      res.resume();
      resolve({ status: res.statusCode ?? 0 });
    });
    req.on('error', (error: NodeJS.ErrnoException) => {
      failSent(error);
      resolve({ error: error.message, code: error.code, responseBytes });
    });
    req.end(() => markSent());
  });
  return { sent, outcome };
}
