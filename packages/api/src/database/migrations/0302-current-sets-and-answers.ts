/**
 * Two tables that let a reader serve a quarter's results without reading
 * every practice's pointer or building anything again.
 *
 * `quarter_current_sets` (owned by the submissions module, written only by
 * SubmissionRepository): one row per audit quarter naming its set of current
 * submissions — `submissions_key`, the SHA-256 (hex) of their ids sorted and
 * comma-separated (as benchmark_results.submissions_key), how many, and a
 * version that grows with every change. It is changed in the transaction that
 * switches a practice's pointer (a confirm), so it always agrees with
 * `practice_quarters`; a quarter without a row (data loaded before this
 * table, or never read) gets one the first time it is read.
 *
 * `benchmark_answers` (owned by the benchmarks module): finished responses of
 * the results routes, gzip of the JSON body, keyed by the SHA-256 of exactly
 * what the response was built from (the stored results of the quarter and of
 * the earlier quarters its trends use, the quarter as sent, the practices and
 * localities as they are, the split, locality, practice, what the reader may
 * see, and the answer's format). Rows never change: a change of any input is a
 * new key, and two processes building the same key make the same bytes
 * (INSERT IGNORE keeps the first).
 */
import type { Migration } from '../migrator.js';

export const up: Migration = async ({ context: { exec } }) => {
  await exec(`
    CREATE TABLE quarter_current_sets (
      quarter_id INT UNSIGNED NOT NULL PRIMARY KEY,
      submissions_key CHAR(64) CHARACTER SET ascii NOT NULL,
      submission_count INT UNSIGNED NOT NULL,
      version INT UNSIGNED NOT NULL,
      changed_at DATETIME(3) NOT NULL,
      CONSTRAINT quarter_current_sets_quarter FOREIGN KEY (quarter_id) REFERENCES audit_quarters (id)
    ) ENGINE=InnoDB`);
  await exec(`
    CREATE TABLE benchmark_answers (
      answer_key CHAR(64) CHARACTER SET ascii NOT NULL PRIMARY KEY,
      kind VARCHAR(32) CHARACTER SET ascii NOT NULL,
      quarter_id INT UNSIGNED NOT NULL,
      plain_bytes INT UNSIGNED NOT NULL,
      body LONGBLOB NOT NULL,
      built_at DATETIME(3) NOT NULL,
      KEY benchmark_answers_quarter (quarter_id),
      CONSTRAINT benchmark_answers_quarter FOREIGN KEY (quarter_id) REFERENCES audit_quarters (id)
    ) ENGINE=InnoDB`);
};

export const down: Migration = async ({ context: { exec } }) => {
  await exec('DROP TABLE benchmark_answers');
  await exec('DROP TABLE quarter_current_sets');
};
