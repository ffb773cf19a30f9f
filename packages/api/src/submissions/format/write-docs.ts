/**
 * Writes docs/extract-format.md from the column definitions:
 * `npm run docs:extract-format` (root). Limits are the defaults of
 * config/default.json.
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { findRepoRoot } from '../../config/load-config.js';
import { renderExtractFormatDoc } from './docs.js';

const repoRoot = findRepoRoot();
export const docPath = join(repoRoot, 'docs', 'extract-format.md');

export function defaultLimits() {
  const config = JSON.parse(readFileSync(join(repoRoot, 'config', 'default.json'), 'utf8')) as {
    extracts: { maxBytes: number; maxRows: number; maxUncompressedBytes: number };
  };
  return config.extracts;
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  writeFileSync(docPath, renderExtractFormatDoc(defaultLimits()));
  console.log(`wrote ${docPath}`);
}
