/**
 * Published reports (owned by the reports module): a quarter's benchmark
 * frozen when the regional lead publishes it. `snapshot` holds the report's
 * canonical JSON (keys sorted, no white space) compressed with gzip;
 * `content_hash` is the SHA-256 (hex) of the uncompressed canonical bytes,
 * which include who published it, when and the release note. The triggers
 * refuse any change to what was published (snapshot, hash, identity) and any
 * DELETE: a report only moves from published to replaced (a later report of
 * the same quarter) or withdrawn, and a withdrawn report keeps its row as a
 * tombstone with the reason and who withdrew it.
 */
import type { Migration } from '../migrator.js';

export const up: Migration = async ({ context: { exec } }) => {
  await exec(`
    CREATE TABLE reports (
      id INT UNSIGNED NOT NULL AUTO_INCREMENT PRIMARY KEY,
      region_id INT UNSIGNED NOT NULL,
      quarter_id INT UNSIGNED NOT NULL,
      sequence SMALLINT UNSIGNED NOT NULL,
      measure_set_id VARCHAR(64) CHARACTER SET ascii NOT NULL,
      benchmark_result_id INT UNSIGNED NOT NULL,
      submissions_key CHAR(64) CHARACTER SET ascii NOT NULL,
      submission_count INT UNSIGNED NOT NULL,
      status ENUM('published', 'replaced', 'withdrawn') NOT NULL,
      published_at DATETIME(3) NOT NULL,
      published_by_user_id INT UNSIGNED NULL,
      published_by VARCHAR(200) NOT NULL,
      release_note TEXT NOT NULL,
      content_hash CHAR(64) CHARACTER SET ascii NOT NULL,
      snapshot_bytes INT UNSIGNED NOT NULL,
      snapshot LONGBLOB NOT NULL,
      replaced_by_id INT UNSIGNED NULL,
      replaced_at DATETIME(3) NULL,
      withdrawn_at DATETIME(3) NULL,
      withdrawn_by_user_id INT UNSIGNED NULL,
      withdrawn_by VARCHAR(200) NULL,
      withdrawn_reason TEXT NULL,
      UNIQUE KEY reports_quarter_sequence (quarter_id, sequence),
      KEY reports_region (region_id, published_at),
      CONSTRAINT reports_quarter FOREIGN KEY (quarter_id) REFERENCES audit_quarters (id),
      CONSTRAINT reports_region FOREIGN KEY (region_id) REFERENCES regions (id),
      CONSTRAINT reports_benchmark FOREIGN KEY (benchmark_result_id) REFERENCES benchmark_results (id)
    ) ENGINE=InnoDB`);
  await exec(`
    CREATE TRIGGER reports_frozen BEFORE UPDATE ON reports FOR EACH ROW
    BEGIN
      IF NOT (NEW.snapshot <=> OLD.snapshot) OR NOT (NEW.content_hash <=> OLD.content_hash)
         OR NOT (NEW.region_id <=> OLD.region_id) OR NOT (NEW.quarter_id <=> OLD.quarter_id)
         OR NOT (NEW.sequence <=> OLD.sequence) OR NOT (NEW.published_at <=> OLD.published_at)
         OR NOT (NEW.published_by <=> OLD.published_by)
         OR NOT (NEW.release_note <=> OLD.release_note) THEN
        SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'a published report cannot be changed';
      END IF;
      IF OLD.status = 'withdrawn' THEN
        SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'a withdrawn report cannot be changed';
      END IF;
    END`);
  await exec(`
    CREATE TRIGGER reports_no_delete BEFORE DELETE ON reports FOR EACH ROW
    SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'reports are kept: withdraw a report instead'`);
};

export const down: Migration = async ({ context: { exec } }) => {
  await exec('DROP TABLE reports');
};
