/**
 * A submission's sums (owned by the submissions module): per measure set
 * version, the bytes of @cairn/metrics' encoded per-practice sums of the
 * submission's care records. They are computed from the submission's own
 * records (immutable once staged) and inserted in the transaction that
 * confirms it, so a current submission has sums under its quarter's measure
 * set; a measure-set change adds rows beside the old ones instead of
 * overwriting them. `format_version` is the encoding's version: a reader
 * that meets another version recomputes from the records.
 */
import type { Migration } from '../migrator.js';

export const up: Migration = async ({ context: { exec } }) => {
  await exec(`
    CREATE TABLE submission_sums (
      submission_id INT UNSIGNED NOT NULL,
      measure_set_id VARCHAR(64) CHARACTER SET ascii NOT NULL,
      format_version SMALLINT UNSIGNED NOT NULL,
      records INT UNSIGNED NOT NULL,
      bytes MEDIUMBLOB NOT NULL,
      computed_at DATETIME(3) NOT NULL,
      PRIMARY KEY (submission_id, measure_set_id),
      CONSTRAINT submission_sums_submission FOREIGN KEY (submission_id) REFERENCES submissions (id) ON DELETE CASCADE
    ) ENGINE=InnoDB`);
};

export const down: Migration = async ({ context: { exec } }) => {
  await exec('DROP TABLE submission_sums');
};
