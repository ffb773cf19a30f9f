/**
 * Built benchmarks of an audit quarter (owned by the benchmarks module): the
 * encoded benchmark and region sums, built from one set of current
 * submissions' sums. `submissions_key` is the SHA-256 (hex) of the sorted ids
 * of the current submissions it was built from, so a reader that reads the
 * quarter's current pointers finds the result of exactly that set, or builds
 * it. Rows never change: two processes building the same key at once insert
 * identical bytes, and the second INSERT IGNORE keeps the first.
 * `format_version` is the encoding's version (part of the key: a new format
 * is a new row, never a reinterpretation of old bytes).
 */
import type { Migration } from '../migrator.js';

export const up: Migration = async ({ context: { exec } }) => {
  await exec(`
    CREATE TABLE benchmark_results (
      id INT UNSIGNED NOT NULL AUTO_INCREMENT PRIMARY KEY,
      quarter_id INT UNSIGNED NOT NULL,
      measure_set_id VARCHAR(64) CHARACTER SET ascii NOT NULL,
      format_version SMALLINT UNSIGNED NOT NULL,
      submissions_key CHAR(64) CHARACTER SET ascii NOT NULL,
      submission_count INT UNSIGNED NOT NULL,
      body LONGBLOB NOT NULL,
      built_at DATETIME(3) NOT NULL,
      build_ms INT UNSIGNED NOT NULL,
      UNIQUE KEY benchmark_results_built_from (quarter_id, measure_set_id, format_version, submissions_key),
      CONSTRAINT benchmark_results_quarter FOREIGN KEY (quarter_id) REFERENCES audit_quarters (id)
    ) ENGINE=InnoDB`);
};

export const down: Migration = async ({ context: { exec } }) => {
  await exec('DROP TABLE benchmark_results');
};
