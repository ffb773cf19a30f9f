/**
 * Review cases (src/review-cases): an auditor's follow-up of one practice on
 * one measure in one audit quarter, with the practice.
 *  - review_cases: the case, its state (open, awaiting_practice, responded,
 *    closed), a version that every state change increments (optimistic
 *    concurrency: an UPDATE names the version it read), the frozen figures
 *    that prompted it (JSON, never changed) and the finding once closed;
 *  - review_case_entries: the timeline, append-only (triggers refuse UPDATE
 *    and DELETE): questions, answers, notes and state changes, each visible
 *    to the practice or internal;
 *  - review_case_files: attachments of an entry, their bytes in chunks of at
 *    most 1 MB (as extracts are kept), append-only too.
 */
import type { Migration } from '../migrator.js';

export const up: Migration = async ({ context: { exec } }) => {
  await exec(`
    CREATE TABLE review_cases (
      id INT UNSIGNED NOT NULL AUTO_INCREMENT PRIMARY KEY,
      region_id INT UNSIGNED NOT NULL,
      practice_id INT UNSIGNED NOT NULL,
      quarter_id INT UNSIGNED NOT NULL,
      measure_key VARCHAR(64) CHARACTER SET ascii NOT NULL,
      split ENUM('all', 'type1', 'type2_other') NOT NULL,
      status ENUM('open', 'awaiting_practice', 'responded', 'closed') NOT NULL DEFAULT 'open',
      version INT UNSIGNED NOT NULL DEFAULT 1,
      title VARCHAR(200) NOT NULL,
      evidence JSON NOT NULL,
      finding ENUM('data_quality_issue', 'explained_by_case_mix', 'genuine_variation_improving', 'genuine_variation_action_agreed', 'no_concern') NULL,
      opened_by_user_id INT UNSIGNED NULL,
      opened_by_label VARCHAR(254) NOT NULL,
      opened_at DATETIME(3) NOT NULL,
      updated_at DATETIME(3) NOT NULL,
      closed_at DATETIME(3) NULL,
      KEY review_cases_region (region_id, status, updated_at),
      KEY review_cases_subject (quarter_id, practice_id, measure_key, status),
      KEY review_cases_practice (practice_id, updated_at),
      CONSTRAINT review_cases_region FOREIGN KEY (region_id) REFERENCES regions (id),
      CONSTRAINT review_cases_practice FOREIGN KEY (practice_id) REFERENCES practices (id),
      CONSTRAINT review_cases_quarter FOREIGN KEY (quarter_id) REFERENCES audit_quarters (id)
    ) ENGINE=InnoDB`);
  await exec(`
    CREATE TABLE review_case_entries (
      id INT UNSIGNED NOT NULL AUTO_INCREMENT PRIMARY KEY,
      case_id INT UNSIGNED NOT NULL,
      kind ENUM('opened', 'question', 'answer', 'note', 'state') NOT NULL,
      visibility ENUM('practice', 'internal') NOT NULL,
      body TEXT NOT NULL,
      from_status VARCHAR(32) CHARACTER SET ascii NULL,
      to_status VARCHAR(32) CHARACTER SET ascii NULL,
      finding VARCHAR(64) CHARACTER SET ascii NULL,
      author_user_id INT UNSIGNED NULL,
      author_label VARCHAR(254) NOT NULL,
      author_name VARCHAR(200) NOT NULL,
      author_role VARCHAR(32) CHARACTER SET ascii NOT NULL,
      created_at DATETIME(3) NOT NULL,
      KEY review_case_entries_case (case_id, id),
      CONSTRAINT review_case_entries_case FOREIGN KEY (case_id) REFERENCES review_cases (id)
    ) ENGINE=InnoDB`);
  await exec(`
    CREATE TABLE review_case_files (
      id INT UNSIGNED NOT NULL AUTO_INCREMENT PRIMARY KEY,
      case_id INT UNSIGNED NOT NULL,
      entry_id INT UNSIGNED NOT NULL,
      file_name VARCHAR(255) NOT NULL,
      media_type VARCHAR(100) CHARACTER SET ascii NOT NULL,
      size_bytes INT UNSIGNED NOT NULL,
      sha256 CHAR(64) CHARACTER SET ascii NOT NULL,
      created_at DATETIME(3) NOT NULL,
      KEY review_case_files_entry (entry_id),
      CONSTRAINT review_case_files_case FOREIGN KEY (case_id) REFERENCES review_cases (id),
      CONSTRAINT review_case_files_entry FOREIGN KEY (entry_id) REFERENCES review_case_entries (id)
    ) ENGINE=InnoDB`);
  await exec(`
    CREATE TABLE review_case_file_chunks (
      file_id INT UNSIGNED NOT NULL,
      seq SMALLINT UNSIGNED NOT NULL,
      data MEDIUMBLOB NOT NULL,
      PRIMARY KEY (file_id, seq),
      CONSTRAINT review_case_file_chunks_file FOREIGN KEY (file_id) REFERENCES review_case_files (id)
    ) ENGINE=InnoDB`);
  for (const table of ['review_case_entries', 'review_case_files', 'review_case_file_chunks']) {
    await exec(`
      CREATE TRIGGER ${table}_no_update BEFORE UPDATE ON ${table} FOR EACH ROW
      SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = '${table} is append-only: rows cannot be changed'`);
    await exec(`
      CREATE TRIGGER ${table}_no_delete BEFORE DELETE ON ${table} FOR EACH ROW
      SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = '${table} is append-only: rows cannot be deleted'`);
  }
};

export const down: Migration = async ({ context: { exec } }) => {
  await exec('DROP TABLE review_case_file_chunks');
  await exec('DROP TABLE review_case_files');
  await exec('DROP TABLE review_case_entries');
  await exec('DROP TABLE review_cases');
};
