/**
 * The mail module's tables (src/mail):
 *  - outbox_batches: one row per (kind, source, practice) once that practice's
 *    messages for the source were queued: "once per practice" holds across
 *    processes and restarts, and a practice that had nobody to write to is
 *    still seen on the delivery page;
 *  - outbox_messages: one row per (kind, source, practice, recipient) with its
 *    state (queued, sending, sent, failed), attempts, next attempt, lease,
 *    Message-ID and the server's last reply; the unique key makes queueing
 *    idempotent;
 *  - mail_extra_recipients: addresses the regional lead adds to a practice;
 *  - mail_schedule: which process runs a scheduled mail job now (a lease), so
 *    that several API processes do not run it together.
 */
import type { Migration } from '../migrator.js';

export const up: Migration = async ({ context: { exec } }) => {
  await exec(`
    CREATE TABLE outbox_batches (
      id BIGINT UNSIGNED NOT NULL AUTO_INCREMENT PRIMARY KEY,
      kind VARCHAR(32) CHARACTER SET ascii NOT NULL,
      source_id INT UNSIGNED NOT NULL,
      practice_id INT UNSIGNED NOT NULL,
      region_id INT UNSIGNED NOT NULL,
      recipients SMALLINT UNSIGNED NOT NULL,
      created_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
      UNIQUE KEY outbox_batches_once (kind, source_id, practice_id),
      KEY outbox_batches_region (region_id, kind, source_id),
      CONSTRAINT outbox_batches_practice FOREIGN KEY (practice_id) REFERENCES practices (id)
    ) ENGINE=InnoDB`);
  await exec(`
    CREATE TABLE outbox_messages (
      id BIGINT UNSIGNED NOT NULL AUTO_INCREMENT PRIMARY KEY,
      batch_id BIGINT UNSIGNED NOT NULL,
      kind VARCHAR(32) CHARACTER SET ascii NOT NULL,
      source_id INT UNSIGNED NOT NULL,
      practice_id INT UNSIGNED NOT NULL,
      region_id INT UNSIGNED NOT NULL,
      recipient_address VARCHAR(254) NOT NULL,
      recipient_name VARCHAR(200) NULL,
      recipient_user_id INT UNSIGNED NULL,
      state ENUM('queued', 'sending', 'sent', 'failed') NOT NULL DEFAULT 'queued',
      attempts SMALLINT UNSIGNED NOT NULL DEFAULT 0,
      resumed SMALLINT UNSIGNED NOT NULL DEFAULT 0,
      resends SMALLINT UNSIGNED NOT NULL DEFAULT 0,
      next_attempt_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
      lease_owner VARCHAR(64) NULL,
      lease_expires_at DATETIME(3) NULL,
      message_id VARCHAR(200) CHARACTER SET ascii NULL,
      last_error VARCHAR(1000) NULL,
      last_reply_code SMALLINT UNSIGNED NULL,
      server_reply VARCHAR(500) NULL,
      queued_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
      last_attempt_at DATETIME(3) NULL,
      sent_at DATETIME(3) NULL,
      failed_at DATETIME(3) NULL,
      UNIQUE KEY outbox_messages_once (kind, source_id, practice_id, recipient_address),
      UNIQUE KEY outbox_messages_message_id (message_id),
      KEY outbox_messages_due (state, next_attempt_at),
      KEY outbox_messages_lease (state, lease_expires_at),
      KEY outbox_messages_source (region_id, kind, source_id, state),
      CONSTRAINT outbox_messages_batch FOREIGN KEY (batch_id) REFERENCES outbox_batches (id)
    ) ENGINE=InnoDB`);
  await exec(`
    CREATE TABLE mail_extra_recipients (
      id INT UNSIGNED NOT NULL AUTO_INCREMENT PRIMARY KEY,
      practice_id INT UNSIGNED NOT NULL,
      address VARCHAR(254) NOT NULL,
      note VARCHAR(100) NULL,
      added_by_user_id INT UNSIGNED NULL,
      added_by_label VARCHAR(254) NOT NULL,
      created_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
      UNIQUE KEY mail_extra_recipients_once (practice_id, address),
      CONSTRAINT mail_extra_recipients_practice FOREIGN KEY (practice_id) REFERENCES practices (id)
    ) ENGINE=InnoDB`);
  await exec(`
    CREATE TABLE mail_schedule (
      job VARCHAR(64) CHARACTER SET ascii NOT NULL PRIMARY KEY,
      lease_owner VARCHAR(64) NULL,
      lease_expires_at DATETIME(3) NULL,
      last_started_at DATETIME(3) NULL,
      last_finished_at DATETIME(3) NULL,
      last_outcome VARCHAR(500) NULL
    ) ENGINE=InnoDB`);
};

export const down: Migration = async ({ context: { exec } }) => {
  await exec('DROP TABLE mail_schedule');
  await exec('DROP TABLE mail_extra_recipients');
  await exec('DROP TABLE outbox_messages');
  await exec('DROP TABLE outbox_batches');
};
