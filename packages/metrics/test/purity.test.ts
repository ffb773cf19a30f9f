import { readdirSync, readFileSync, statSync } from 'node:fs';
import { dirname, join, relative } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';

/**
 * The package's source (tests aside) reads no files, no network and no clock, and imports no
 * platform module, so that the same build serves the API and the browser.
 */
const src = join(dirname(fileURLToPath(import.meta.url)), '..', 'src');

function files(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const path = join(dir, name);
    if (statSync(path).isDirectory()) return files(path);
    return name.endsWith('.ts') && !name.endsWith('.test.ts') ? [path] : [];
  });
}

const FORBIDDEN: [RegExp, string][] = [
  [/from\s+['"]node:/, 'a node: module'],
  [
    /from\s+['"](fs|path|os|crypto|http|https|net|child_process|worker_threads)['"]/,
    'a platform module',
  ],
  [/\brequire\(/, 'require()'],
  [/\bfetch\(/, 'fetch()'],
  [/\bXMLHttpRequest\b/, 'XMLHttpRequest'],
  [/\bDate\.now\(|\bnew Date\(/, 'the clock'],
  [/\bperformance\.now\(/, 'the clock'],
  [/\bprocess\./, 'process'],
  [/\bMath\.random\(/, 'Math.random'],
  [/\bconsole\./, 'console output'],
];

describe('package purity', () => {
  const sources = files(src);
  it('has source files to check', () => {
    expect(sources.length).toBeGreaterThan(30);
  });
  it.each(sources.map((f) => [relative(src, f), f]))(
    '%s uses no I/O, clock or platform module',
    (_, file) => {
      const text = readFileSync(file, 'utf8');
      const found = FORBIDDEN.filter(([pattern]) => pattern.test(text)).map(([, what]) => what);
      expect(found).toEqual([]);
    },
  );
});
