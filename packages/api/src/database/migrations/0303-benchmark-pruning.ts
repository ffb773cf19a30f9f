/**
 * Pruning of the benchmarks module's stored results and answers (both grow with every confirm
 * and every new answer key).
 *
 * `benchmark_answers.used_at`: when the stored answer was last read from the table (NULL: never
 * read since it was built; `built_at` then counts). Set at most once an hour per answer
 * (BenchmarkAnswersRepository.find), so a busy route does not write on every read.
 *
 * `benchmark_upkeep` (owned by the benchmarks module): one row per upkeep job, holding the
 * lease of the process that runs it now, so that of several API processes one at a time runs
 * it; a process that dies holding it loses it when the lease expires.
 */
import type { Migration } from '../migrator.js';

export const up: Migration = async ({ context: { exec } }) => {
  await exec('ALTER TABLE benchmark_answers ADD COLUMN used_at DATETIME(3) NULL AFTER built_at');
  await exec(`
    CREATE TABLE benchmark_upkeep (
      job VARCHAR(64) CHARACTER SET ascii NOT NULL PRIMARY KEY,
      lease_owner VARCHAR(64) NULL,
      lease_expires_at DATETIME(3) NULL,
      last_started_at DATETIME(3) NULL,
      last_finished_at DATETIME(3) NULL,
      last_outcome VARCHAR(500) NULL
    ) ENGINE=InnoDB`);
};

export const down: Migration = async ({ context: { exec } }) => {
  await exec('DROP TABLE benchmark_upkeep');
  await exec('ALTER TABLE benchmark_answers DROP COLUMN used_at');
};
