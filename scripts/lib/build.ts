/**
 * Builds a workspace package when its output is missing or older than its
 * sources (newest modification time of the inputs vs the output's stamp).
 */
import { existsSync, readdirSync, statSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { fail, log } from './log.ts';
import { runSync } from './proc.ts';

function newestMtime(path: string): number {
  if (!existsSync(path)) return 0;
  const stat = statSync(path);
  if (!stat.isDirectory()) return stat.mtimeMs;
  let newest = 0;
  for (const entry of readdirSync(path)) {
    if (entry === 'node_modules' || entry === 'dist' || entry.startsWith('.')) continue;
    newest = Math.max(newest, newestMtime(join(path, entry)));
  }
  return newest;
}

export interface BuildTarget {
  name: string;
  workspace: string;
  /** Files and folders whose changes require a rebuild */
  inputs: string[];
  /** Stamp file written after a successful build */
  stamp: string;
}

export function buildIfStale(root: string, target: BuildTarget, force = false): boolean {
  const stamp = join(root, target.stamp);
  const newestInput = Math.max(...target.inputs.map((input) => newestMtime(join(root, input))));
  if (!force && existsSync(stamp) && statSync(stamp).mtimeMs >= newestInput) return false;
  log.step(`building ${target.name} ...`);
  const started = Date.now();
  const result = runSync('npm', ['run', 'build', '-w', target.workspace], {
    cwd: root,
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  if (result.status !== 0) {
    fail(`building ${target.name} failed:\n${result.stdout}\n${result.stderr}`);
  }
  writeFileSync(stamp, new Date().toISOString() + '\n');
  log.ok(`built ${target.name} in ${((Date.now() - started) / 1000).toFixed(1)} s`);
  return true;
}

export const buildTargets: BuildTarget[] = [
  {
    name: '@cairn/metrics',
    workspace: '@cairn/metrics',
    inputs: [
      'packages/metrics/src',
      'packages/metrics/package.json',
      'packages/metrics/tsconfig.build.json',
      'tsconfig.base.json',
    ],
    stamp: 'packages/metrics/dist/.built',
  },
  {
    name: '@cairn/api',
    workspace: '@cairn/api',
    inputs: [
      'packages/api/src',
      'packages/api/package.json',
      'packages/api/tsconfig.build.json',
      'packages/metrics/src',
      'tsconfig.base.json',
    ],
    stamp: 'packages/api/dist/.built',
  },
  {
    name: '@cairn/web',
    workspace: '@cairn/web',
    inputs: [
      'packages/web/src',
      'packages/web/index.html',
      'packages/web/public',
      'packages/web/package.json',
      'packages/web/vite.config.ts',
      'packages/metrics/src',
    ],
    stamp: 'packages/web/dist/.built',
  },
];

export function buildAll(root: string): void {
  for (const target of buildTargets) buildIfStale(root, target);
}
