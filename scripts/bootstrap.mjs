#!/usr/bin/env node
// Entry point of `npm start`, `npm test`, `npm run bench` and `npm run db:*`.
//
// Plain JavaScript on purpose: it runs before npm dependencies exist. It makes
// sure node_modules matches package-lock.json (running `npm ci` when it is
// missing or older than the lockfile), then hands over to the TypeScript
// orchestration in scripts/ through tsx.
import { spawnSync, spawn } from 'node:child_process';
import { existsSync, statSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const [command = 'start', ...rest] = process.argv.slice(2);
const targets = {
  start: 'start.ts',
  test: 'test.ts',
  bench: 'bench.ts',
  dev: 'dev.ts',
  db: 'db.ts',
};
if (!(command in targets)) {
  console.error(
    `cairn: unknown command "${command}". Expected one of: ${Object.keys(targets).join(', ')}.`,
  );
  process.exit(2);
}

const [major, minor] = process.versions.node.split('.').map(Number);
if (major < 20 || (major === 20 && minor < 19)) {
  console.error(
    `cairn: Node.js ${process.versions.node} is too old; Cairn needs Node.js 20.19 or newer.`,
  );
  process.exit(1);
}

function dependenciesStale() {
  const lock = join(root, 'package-lock.json');
  const installed = join(root, 'node_modules', '.package-lock.json');
  if (!existsSync(installed)) return 'node_modules is missing';
  if (existsSync(lock) && statSync(lock).mtimeMs > statSync(installed).mtimeMs) {
    return 'package-lock.json is newer than node_modules';
  }
  if (!existsSync(join(root, 'node_modules', '.bin', 'tsx'))) return 'node_modules is incomplete';
  return null;
}

const stale = dependenciesStale();
if (stale) {
  console.log(`cairn: installing npm dependencies (${stale}): npm ci`);
  const started = Date.now();
  const result = spawnSync('npm', ['ci', '--no-audit', '--no-fund'], {
    cwd: root,
    stdio: 'inherit',
  });
  if (result.status !== 0) {
    console.error(
      'cairn: `npm ci` failed (see above). Check the network to the npm registry and run the command again.',
    );
    process.exit(result.status ?? 1);
  }
  console.log(
    `cairn: npm dependencies installed in ${((Date.now() - started) / 1000).toFixed(0)} s`,
  );
}

const tsx = join(root, 'node_modules', '.bin', 'tsx');
const child = spawn(tsx, [join(root, 'scripts', targets[command]), ...rest], {
  cwd: root,
  stdio: 'inherit',
});
// The TypeScript side handles SIGINT/SIGTERM itself (clean MariaDB shutdown);
// the terminal delivers SIGINT to the whole process group, so only forward
// SIGTERM, which is sent to this process alone.
process.on('SIGINT', () => {});
process.on('SIGTERM', () => child.kill('SIGTERM'));
child.on('exit', (code, signal) => process.exit(code ?? (signal ? 1 : 0)));
