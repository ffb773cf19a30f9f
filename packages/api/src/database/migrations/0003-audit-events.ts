/**
 * The audit trail: append-only. Triggers refuse UPDATE and DELETE, so no
 * code path (nor a mistaken query) can rewrite history.
 */
import type { Migration } from '../migrator.js';

export const up: Migration = async ({ context: { exec } }) => {
  await exec(`
    CREATE TABLE audit_events (
      id BIGINT UNSIGNED NOT NULL AUTO_INCREMENT PRIMARY KEY,
      occurred_at DATETIME(3) NOT NULL,
      action VARCHAR(64) NOT NULL,
      outcome ENUM('success', 'refused', 'failed') NOT NULL DEFAULT 'success',
      actor_user_id INT UNSIGNED NULL,
      actor_label VARCHAR(254) NOT NULL,
      region_id INT UNSIGNED NULL,
      practice_id INT UNSIGNED NULL,
      subject_type VARCHAR(32) NULL,
      subject_id VARCHAR(64) NULL,
      summary VARCHAR(500) NOT NULL,
      detail JSON NULL,
      request_id VARCHAR(64) NULL,
      ip_address VARCHAR(64) NULL,
      KEY audit_events_occurred (occurred_at),
      KEY audit_events_action (action, occurred_at),
      KEY audit_events_actor (actor_user_id, occurred_at),
      KEY audit_events_practice (practice_id, occurred_at),
      KEY audit_events_subject (subject_type, subject_id)
    ) ENGINE=InnoDB`);
  await exec(`
    CREATE TRIGGER audit_events_no_update BEFORE UPDATE ON audit_events FOR EACH ROW
    SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'audit_events is append-only: rows cannot be changed'`);
  await exec(`
    CREATE TRIGGER audit_events_no_delete BEFORE DELETE ON audit_events FOR EACH ROW
    SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'audit_events is append-only: rows cannot be deleted'`);
};

export const down: Migration = async ({ context: { exec } }) => {
  await exec('DROP TABLE audit_events');
};
