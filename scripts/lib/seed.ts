/** Writes the demo scenario (seed-data/generate.ts) when its output is missing or older than its sources. */
import { existsSync, readdirSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { generate } from '../../seed-data/generate.ts';
import { log } from './log.ts';

export function prepareDemoData(root: string): string {
  const out = join(root, 'seed-data', 'out');
  const stamp = join(out, 'organisation.json');
  const sources = readdirSync(join(root, 'seed-data'))
    .filter((f) => f.endsWith('.ts'))
    .map((f) => statSync(join(root, 'seed-data', f)).mtimeMs);
  if (!existsSync(stamp) || statSync(stamp).mtimeMs < Math.max(...sources)) {
    log.step('generating the demo scenario ...');
    generate(out);
  }
  return out;
}
