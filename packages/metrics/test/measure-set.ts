/** The shipped default measure set, read from config/ (tests may read files; src/ never does). */
import { readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { type MeasureSet, parseMeasureSet } from '../src/index.js';

const here = dirname(fileURLToPath(import.meta.url));
export const DEFAULT_MEASURE_SET_PATH = join(
  here,
  '..',
  '..',
  '..',
  'config',
  'measure-sets',
  'cairn-default-2026.1.json',
);

export function defaultMeasureSetJson(): Record<string, unknown> {
  return JSON.parse(readFileSync(DEFAULT_MEASURE_SET_PATH, 'utf8')) as Record<string, unknown>;
}

export function defaultMeasureSet(): MeasureSet {
  return parseMeasureSet(defaultMeasureSetJson());
}
