/**
 * Submissions (processed extracts) and the job state that lets any API
 * process pick them up: a submission in status 'processing' with no lease is
 * queued; a process claims it (SELECT … FOR UPDATE SKIP LOCKED), holds a
 * lease it renews while reading, and a lease that runs out marks the
 * submission 'failed' (retry possible while the file is kept).
 *
 * practice_quarters holds the one pointer readers follow: which submission is
 * current for a practice and quarter. Confirming switches it in one short
 * transaction, so no reader ever sees a mix of two submissions.
 *
 * The uploaded file is kept only while it is needed (extract_file_chunks,
 * deleted when processing ends); issues and refused rows feed the report.
 */
import type { Migration } from '../migrator.js';

export const up: Migration = async ({ context: { exec } }) => {
  await exec(`
    CREATE TABLE submissions (
      id INT UNSIGNED NOT NULL AUTO_INCREMENT PRIMARY KEY,
      practice_id INT UNSIGNED NOT NULL,
      quarter_id INT UNSIGNED NOT NULL,
      status ENUM('processing', 'rejected', 'awaiting_confirmation', 'accepted', 'superseded', 'cancelled', 'failed') NOT NULL,
      file_name VARCHAR(255) NOT NULL,
      file_size_bytes BIGINT UNSIGNED NOT NULL,
      file_sha256 CHAR(64) CHARACTER SET ascii NULL,
      file_kind VARCHAR(8) CHARACTER SET ascii NULL,
      sheet_name VARCHAR(128) NULL,
      date_convention ENUM('day_first', 'month_first') NULL,
      uploaded_by_user_id INT UNSIGNED NULL,
      uploaded_by_label VARCHAR(254) NOT NULL,
      uploaded_at DATETIME(3) NOT NULL,
      processing_started_at DATETIME(3) NULL,
      processed_at DATETIME(3) NULL,
      confirmed_at DATETIME(3) NULL,
      confirmed_by_user_id INT UNSIGNED NULL,
      confirmed_by_label VARCHAR(254) NULL,
      cancelled_at DATETIME(3) NULL,
      cancelled_by_label VARCHAR(254) NULL,
      superseded_at DATETIME(3) NULL,
      superseded_by_submission_id INT UNSIGNED NULL,
      failed_at DATETIME(3) NULL,
      failure_message VARCHAR(1000) NULL,
      attempts SMALLINT UNSIGNED NOT NULL DEFAULT 0,
      lease_owner VARCHAR(64) CHARACTER SET ascii NULL,
      lease_expires_at DATETIME(3) NULL,
      rows_total INT UNSIGNED NULL,
      rows_done INT UNSIGNED NOT NULL DEFAULT 0,
      rows_read INT UNSIGNED NULL,
      rows_accepted INT UNSIGNED NULL,
      rows_rejected INT UNSIGNED NULL,
      rows_blank INT UNSIGNED NULL,
      error_count INT UNSIGNED NULL,
      warning_count INT UNSIGNED NULL,
      flag_count INT UNSIGNED NULL,
      refusal_code VARCHAR(48) CHARACTER SET ascii NULL,
      refusal_message VARCHAR(2000) NULL,
      refusal_fix VARCHAR(1000) NULL,
      summary JSON NULL,
      file_deleted_at DATETIME(3) NULL,
      records_purged_at DATETIME(3) NULL,
      created_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
      updated_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3),
      KEY submissions_practice_quarter (practice_id, quarter_id, id),
      KEY submissions_queue (status, lease_owner, id),
      KEY submissions_lease (status, lease_expires_at),
      KEY submissions_quarter_status (quarter_id, status),
      KEY submissions_hash (practice_id, quarter_id, file_sha256),
      CONSTRAINT submissions_practice FOREIGN KEY (practice_id) REFERENCES practices (id),
      CONSTRAINT submissions_quarter FOREIGN KEY (quarter_id) REFERENCES audit_quarters (id)
    ) ENGINE=InnoDB`);
  await exec(`
    CREATE TABLE practice_quarters (
      practice_id INT UNSIGNED NOT NULL,
      quarter_id INT UNSIGNED NOT NULL,
      current_submission_id INT UNSIGNED NULL,
      switched_at DATETIME(3) NULL,
      PRIMARY KEY (practice_id, quarter_id),
      UNIQUE KEY practice_quarters_current (current_submission_id),
      KEY practice_quarters_quarter (quarter_id, current_submission_id),
      CONSTRAINT practice_quarters_practice FOREIGN KEY (practice_id) REFERENCES practices (id),
      CONSTRAINT practice_quarters_quarter FOREIGN KEY (quarter_id) REFERENCES audit_quarters (id),
      CONSTRAINT practice_quarters_submission FOREIGN KEY (current_submission_id) REFERENCES submissions (id)
    ) ENGINE=InnoDB`);
  await exec(`
    CREATE TABLE extract_file_chunks (
      submission_id INT UNSIGNED NOT NULL,
      seq SMALLINT UNSIGNED NOT NULL,
      data MEDIUMBLOB NOT NULL,
      PRIMARY KEY (submission_id, seq),
      CONSTRAINT extract_file_chunks_submission FOREIGN KEY (submission_id) REFERENCES submissions (id) ON DELETE CASCADE
    ) ENGINE=InnoDB`);
  await exec(`
    CREATE TABLE submission_issues (
      submission_id INT UNSIGNED NOT NULL,
      seq INT UNSIGNED NOT NULL,
      severity ENUM('error', 'warning', 'flag') NOT NULL,
      code VARCHAR(48) CHARACTER SET ascii NOT NULL,
      source_row INT UNSIGNED NULL,
      column_key VARCHAR(48) CHARACTER SET ascii NULL,
      column_name VARCHAR(128) NULL,
      value_given VARCHAR(255) NULL,
      message VARCHAR(1000) NOT NULL,
      fix VARCHAR(1000) NOT NULL,
      PRIMARY KEY (submission_id, seq),
      KEY submission_issues_code (submission_id, code),
      KEY submission_issues_row (submission_id, source_row),
      CONSTRAINT submission_issues_submission FOREIGN KEY (submission_id) REFERENCES submissions (id) ON DELETE CASCADE
    ) ENGINE=InnoDB`);
  await exec(`
    CREATE TABLE submission_rejected_rows (
      submission_id INT UNSIGNED NOT NULL,
      source_row INT UNSIGNED NOT NULL,
      cells JSON NOT NULL,
      PRIMARY KEY (submission_id, source_row),
      CONSTRAINT submission_rejected_rows_submission FOREIGN KEY (submission_id) REFERENCES submissions (id) ON DELETE CASCADE
    ) ENGINE=InnoDB`);
};

export const down: Migration = async ({ context: { exec } }) => {
  await exec('DROP TABLE submission_rejected_rows');
  await exec('DROP TABLE submission_issues');
  await exec('DROP TABLE extract_file_chunks');
  await exec('DROP TABLE practice_quarters');
  await exec('DROP TABLE submissions');
};
