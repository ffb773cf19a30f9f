/**
 * Web figures measured the same way by the browser test and `npm run bench`: the JavaScript
 * a first visit loads before any route (the entry script and its module preloads, gzip), and
 * the time from navigating to the region benchmark until every practice's funnel point shows.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { gzipSync } from 'node:zlib';
import type { Page } from 'playwright-core';
import { repoRoot } from './paths.ts';

export interface InitialJs {
  files: { file: string; bytes: number; gzip: number }[];
  gzip: number;
}

/** The scripts index.html loads at once (entry and modulepreloads), gzip level 9. */
export function initialJs(dist = join(repoRoot, 'packages', 'web', 'dist')): InitialJs {
  const html = readFileSync(join(dist, 'index.html'), 'utf8');
  const sources = [
    ...html.matchAll(/<script[^>]+src="([^"]+\.js)"/g),
    ...html.matchAll(/<link[^>]+rel="modulepreload"[^>]+href="([^"]+\.js)"/g),
  ].map((m) => m[1]!);
  const files = [...new Set(sources)].map((src) => {
    const body = readFileSync(join(dist, src.replace(/^\//, '')));
    return { file: src, bytes: body.length, gzip: gzipSync(body, { level: 9 }).length };
  });
  return { files, gzip: files.reduce((sum, f) => sum + f.gzip, 0) };
}

/**
 * Milliseconds from `page.goto(url)` (a full navigation, nothing cached in memory) until
 * `points` funnel points are visible. The browser keeps its HTTP cache, as a returning reader's
 * does; the API serves the stored benchmark.
 */
export async function funnelVisibleMs(page: Page, url: string, points: number): Promise<number> {
  const start = Date.now();
  await page.goto(url, { waitUntil: 'commit' });
  await page.waitForFunction(
    (count) => {
      const shown = [...document.querySelectorAll('.cairn-funnel-point')].filter((el) => {
        const box = (el as SVGGElement).getBoundingClientRect();
        return box.width > 0 && box.height > 0;
      });
      return shown.length >= count;
    },
    points,
    { timeout: 30_000, polling: 'raf' },
  );
  return Date.now() - start;
}
