/**
 * `benchmark_answers.body_br`: the stored answer's JSON compressed with brotli at its highest
 * quality, for readers that accept it (about a third smaller than the gzip `body`). Made after
 * the answer is first served, off the request's path, by whichever process serves it without one;
 * NULL until then. Like `body`, it never changes once set: the same JSON gives the same bytes.
 */
import type { Migration } from '../migrator.js';

export const up: Migration = async ({ context: { exec } }) => {
  await exec('ALTER TABLE benchmark_answers ADD COLUMN body_br LONGBLOB NULL AFTER body');
};

export const down: Migration = async ({ context: { exec } }) => {
  await exec('ALTER TABLE benchmark_answers DROP COLUMN body_br');
};
