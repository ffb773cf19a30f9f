/**
 * The results routes under load over loopback: the region benchmark, a
 * practice's results and its detail (the tabs' figures, their own route) of
 * the demo region's open quarter (2026 Q3), 50
 * concurrent connections for 10 s each, by autocannon in a child process of
 * its own (never in the API's process), against the production build (dist/)
 * listening on the test profile's server port, signed in as the regional lead
 * through the local fake identity provider.
 *
 * The demo region (the invented organisation and its eight quarters of
 * extracts, loaded through the upload pipeline) lives in a database of its
 * own, cairn_test_bench_demo, loaded once and reused while it holds the demo's
 * accepted submissions. Target: p95 ≤ 50 ms and no errors; autocannon reports
 * p90 and p97.5, so the figure judged is p97.5 (above p95). Requests accept
 * gzip and brotli, as a browser does; a stored answer's brotli form is made
 * after its first serve, so the load starts once it is made. The reference, measured the same way in the same
 * run and not judged, is the quarter list: the smallest signed-in route, whose
 * time is the session's read (one SELECT with the person; no write within a
 * minute of the last renewal), the guards and one SELECT. Each judged route's
 * response, exactly as sent, is also served by a bare node:http server under the
 * same load (the floor: what sending those bytes costs here; not judged). Beside
 * the reference, the stack's floor (bench/stack-floor.ts, not judged): NestJS on
 * Express with express-session reading the session row, then one SELECT or
 * none, in a process of its own under the same load: what any signed-in read
 * that checks its session in the database costs here before Cairn does anything.
 */
import { spawn } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { request } from 'node:http';
import type { Server } from 'node:http';
import { loadavg, tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { QueryTypes } from 'sequelize';
import type { CairnConfig, CairnSecrets } from '../src/config/config.schema.js';
import { findRepoRoot, loadConfig, loadSecrets, resolvePath } from '../src/config/load-config.js';
import { connect, createDatabase } from '../src/database/connect.js';
import { migrateUp } from '../src/database/migrator.js';
import { API_NODE_FLAGS } from '../src/node-flags.js';
import { fromDist } from './app.js';
import { autocannon, type LoadFigures } from './autocannon.js';
import { httpSignIn } from './http-sign-in.js';

const DATABASE = 'cairn_test_bench_demo';
const REFERENCE_ROUTE = '/api/quarters';
const CONNECTIONS = 50;
const SECONDS = 10;

export interface RouteFigures extends LoadFigures {
  route: string;
  /** The reference route (not judged) */
  reference: boolean;
  /** Bytes of the JSON body (uncompressed) */
  bytes: number;
  /** The same response from a bare node:http server under the same load (routes that send bytes) */
  floor?: LoadFigures & { sentBytes: number };
  /** The stack's floors under the same load (bench/stack-floor.ts; with the reference) */
  stackFloor?: { read: LoadFigures; noRead: LoadFigures };
}

/** The demo region in its own database: loaded now unless an earlier run left it complete. */
async function demoDatabase(config: CairnConfig, secrets: CairnSecrets, log: (l: string) => void) {
  await createDatabase(config, secrets);
  const db = connect(config, secrets);
  await migrateUp(db);
  const { demoDataDir } = await import('../test/support/demo-region.js');
  const { dir, generator } = await demoDataDir();
  const manifest = JSON.parse(readFileSync(join(dir, 'extracts', 'manifest.json'), 'utf8')) as {
    extracts: unknown[];
  };
  const [row] = await db.query<{ n: number }>(
    "SELECT COUNT(*) AS n FROM submissions WHERE status = 'accepted'",
    { type: QueryTypes.SELECT },
  );
  if (Number(row!.n) !== manifest.extracts.length) {
    if (Number(row!.n) > 0) {
      throw new Error(
        `${DATABASE} holds a partial demo region: drop it (npm run db:stop -- --profile test keeps it)`,
      );
    }
    const t0 = performance.now();
    const { seedDemoOrganisation } = await fromDist('organisations/demo-seed.js');
    const { ingestDemoExtracts } = await fromDist('submissions/demo-ingest.js');
    await seedDemoOrganisation(db, generator.generateOrganisation());
    await ingestDemoExtracts(dir, config, secrets);
    log(`    demo region loaded in ${((performance.now() - t0) / 1000).toFixed(0)} s`);
  } else log('    demo region: reused (loaded by an earlier run)');
  return db;
}

export async function measureRoutes(
  base: CairnConfig,
  secrets: CairnSecrets,
  log: (line: string) => void,
): Promise<RouteFigures[]> {
  const config: CairnConfig = { ...base, database: { ...base.database, name: DATABASE } };
  const db = await demoDatabase(config, secrets, log);
  const { createApp } = await fromDist('app.factory.js');
  const { createRootLogger } = await fromDist('common/logger.js');
  const { createFakeIdp } = await fromDist('dev/idp/fake-idp.js');
  const { StoredAnswers } = await fromDist('benchmarks/answers/stored-answers.service.js');
  const app = await createApp({ config, secrets, logger: createRootLogger('silent') });
  await app.listen(config.server.port, '127.0.0.1');
  const idp = await createFakeIdp(config, resolvePath(findRepoRoot(), config.devFakes.dataDir));
  const idpServer: Server = idp.app.listen(config.devFakes.port, config.devFakes.host);
  try {
    const origin = `http://127.0.0.1:${config.server.port}`;
    const { cookie } = await httpSignIn(origin, 'regional_lead');
    const [ids] = await db.query<{ quarter: number; practice: number }>(
      `SELECT q.id AS quarter, (SELECT id FROM practices WHERE code = 'OV102') AS practice
         FROM audit_quarters q WHERE q.year = 2026 AND q.quarter = 3`,
      { type: QueryTypes.SELECT },
    );
    // The reference: the region's quarter list, the smallest signed-in route (the session's
    // read with its person, the guards, a SELECT), measured the same way in the same run.
    const routes = [
      REFERENCE_ROUTE,
      `/api/quarters/${ids!.quarter}/benchmark`,
      `/api/practices/${ids!.practice}/quarters/${ids!.quarter}/results`,
      `/api/practices/${ids!.practice}/quarters/${ids!.quarter}/results/detail`,
    ];
    const out: RouteFigures[] = [];
    const bytes = new Map<string, number>();
    for (const route of routes) {
      // Requests first until one is answered: the stored results exist (a first build of every
      // quarter may outlast the server's request timeout on a busy machine) and this process
      // has read them.
      for (let attempt = 1; ; attempt++) {
        try {
          const first = await fetch(origin + route, { headers: { cookie } });
          if (first.status !== 200) throw new Error(`${route} answered ${first.status}`);
          bytes.set(route, (await first.arrayBuffer()).byteLength);
          // The answer's brotli form is made after its first serve: made before the load.
          await app.get(StoredAnswers).brotliSettled();
          break;
        } catch (error) {
          if (attempt === 10) throw error;
          await new Promise((resolve) => setTimeout(resolve, 2000));
        }
      }
      const result = await loadFor(origin + route, cookie);
      // The floor of a route that sends bytes: the same response (status, headers and the
      // compressed body exactly as sent) from a bare node:http server in a process of its own,
      // under the same load. What the route costs beyond it is Cairn's; the floor itself is
      // what sending those bytes to autocannon costs on this machine.
      let floor: RouteFigures['floor'];
      if (route !== REFERENCE_ROUTE) floor = await bareFloor(origin + route, cookie);
      // Beside the reference: the same kind of read from the bare stack (bench/stack-floor.ts).
      const stack =
        route === REFERENCE_ROUTE
          ? { read: await stackFloor(cookie, false), noRead: await stackFloor(cookie, true) }
          : undefined;
      out.push({
        route,
        reference: route === REFERENCE_ROUTE,
        bytes: bytes.get(route) ?? 0,
        ...result,
        floor,
        stackFloor: stack,
      });
    }
    return out;
  } finally {
    idpServer.close();
    await app.close();
    await db.close();
  }
}

/** The load of every route: as a browser asks, gzip and brotli accepted (the stored answers are sent as stored). */
const loadFor = (url: string, cookie: string): Promise<LoadFigures> =>
  autocannon(url, {
    connections: CONNECTIONS,
    seconds: SECONDS,
    headers: { cookie, 'accept-encoding': 'gzip, deflate, br' },
  });

/** The bare server: sends the body it is given with the headers it is given, to every request. */
const BARE_SERVER = `
const { createServer } = require('node:http');
const { readFileSync } = require('node:fs');
const [file, headersJson] = process.argv.slice(1);
const body = readFileSync(file);
const headers = JSON.parse(headersJson);
const server = createServer((req, res) => { req.resume(); res.writeHead(200, headers); res.end(body); });
server.listen(0, '127.0.0.1', () => console.log(server.address().port));
`;

/** The route's response as sent (brotli or gzip as stored), served bare, under the same load. */
async function bareFloor(url: string, cookie: string): Promise<RouteFigures['floor']> {
  const sent = await new Promise<{ headers: Record<string, string>; body: Buffer }>(
    (resolve, reject) => {
      request(url, { headers: { cookie, 'accept-encoding': 'gzip, deflate, br' } }, (res) => {
        const chunks: Buffer[] = [];
        res.on('data', (c: Buffer) => chunks.push(c));
        res.on('end', () => {
          const headers: Record<string, string> = {};
          for (const name of ['content-type', 'content-encoding', 'etag', 'cache-control', 'vary'])
            if (typeof res.headers[name] === 'string') headers[name] = res.headers[name];
          const body = Buffer.concat(chunks);
          headers['content-length'] = String(body.length);
          resolve({ headers, body });
        });
        res.on('error', reject);
      })
        .on('error', reject)
        .end();
    },
  );
  const dir = mkdtempSync(join(tmpdir(), 'cairn-bare-'));
  const file = join(dir, 'body');
  writeFileSync(file, sent.body);
  const child = spawn(process.execPath, ['-e', BARE_SERVER, file, JSON.stringify(sent.headers)]);
  try {
    const port = await new Promise<number>((resolve, reject) => {
      child.stdout.once('data', (chunk: Buffer) => resolve(Number(chunk.toString().trim())));
      child.once('error', reject);
      child.once('exit', (code) => reject(new Error(`the bare server ended (${code})`)));
    });
    return { ...(await loadFor(`http://127.0.0.1:${port}/`, cookie)), sentBytes: sent.body.length };
  } finally {
    child.kill();
    rmSync(dir, { recursive: true, force: true });
  }
}

/**
 * The stack's floor (bench/stack-floor.ts) in a process of its own with the API's Node flags,
 * signed in with the same cookie, under the same load.
 */
async function stackFloor(cookie: string, noRead: boolean): Promise<LoadFigures> {
  const here = dirname(fileURLToPath(import.meta.url));
  const child = spawn(
    process.execPath,
    [
      ...API_NODE_FLAGS,
      '--import',
      'tsx/esm',
      join(here, 'stack-floor.ts'),
      DATABASE,
      ...(noRead ? ['--no-read'] : []),
    ],
    { cwd: join(here, '..'), env: process.env },
  );
  try {
    const port = await new Promise<number>((resolve, reject) => {
      child.stdout.once('data', (chunk: Buffer) => resolve(Number(chunk.toString().trim())));
      child.once('error', reject);
      child.once('exit', (code) => reject(new Error(`the stack's floor ended (${code})`)));
    });
    return await loadFor(`http://127.0.0.1:${port}${REFERENCE_ROUTE}`, cookie);
  } finally {
    child.kill();
  }
}

/** The section of `npm run bench`; returns false when a target is missed. */
export async function runHttpBench(
  config: CairnConfig,
  secrets: CairnSecrets,
  log: (line: string) => void = console.log,
): Promise<boolean> {
  let ok = true;
  log(
    `  load average before: ${loadavg()
      .map((x) => x.toFixed(2))
      .join(', ')}`,
  );
  for (const f of await measureRoutes(config, secrets, log)) {
    const met = f.errors === 0 && f.non2xx === 0 && f.latency.p97_5 <= 50;
    if (!met && !f.reference) ok = false;
    const verdict = f.reference ? 'ref.  ' : met ? 'met   ' : 'MISSED';
    log(
      `  ${verdict} GET ${f.route} (${Math.round(f.bytes / 1024)} kB JSON): ${CONNECTIONS} connections, ${f.requests} requests in ${SECONDS} s, ` +
        `p50 ${f.latency.p50} ms, p90 ${f.latency.p90} ms, p97.5 ${f.latency.p97_5} ms${f.reference ? '' : ' (target p95 ≤ 50 ms)'}, p99 ${f.latency.p99} ms, ` +
        `errors ${f.errors}, non-2xx ${f.non2xx}`,
    );
    if (f.stackFloor) {
      const line = (what: string, g: LoadFigures) =>
        log(
          `         ${what} (bench/stack-floor.ts; floor, not judged): ${g.requests} requests, p50 ${g.latency.p50} ms, ` +
            `p97.5 ${g.latency.p97_5} ms, p99 ${g.latency.p99} ms, errors ${g.errors}, non-2xx ${g.non2xx}`,
        );
      line(
        'the bare stack (NestJS on Express, express-session reading the session row, then one SELECT)',
        f.stackFloor.read,
      );
      line('the bare stack answering from memory after the session row', f.stackFloor.noRead);
    }
    if (f.floor)
      log(
        `         the same ${Math.round(f.floor.sentBytes / 1024)} kB response as sent from a bare node:http server (floor, not judged): ` +
          `${f.floor.requests} requests, p50 ${f.floor.latency.p50} ms, p97.5 ${f.floor.latency.p97_5} ms, p99 ${f.floor.latency.p99} ms`,
      );
  }
  log(
    `  load average after: ${loadavg()
      .map((x) => x.toFixed(2))
      .join(', ')}`,
  );
  return ok;
}

if (process.argv[1] === fileURLToPath(import.meta.url)) {
  // Run alone: the test profile, and the test secrets left by `npm run db:start -- --profile test`.
  process.env.CAIRN_PROFILE = 'test';
  const file = join(findRepoRoot(), '.data', 'secrets-test.json');
  if (!process.env.CAIRN_DATABASE_PASSWORD && existsSync(file)) {
    const stored = JSON.parse(readFileSync(file, 'utf8')) as Record<string, string>;
    for (const [name, value] of Object.entries(stored)) process.env[name] ??= value;
  }
  const ok = await runHttpBench(loadConfig({ profile: 'test' }), loadSecrets());
  process.exitCode = ok ? 0 : 1;
}
