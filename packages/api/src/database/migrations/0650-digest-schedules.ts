/**
 * The digests module's table (src/digests): digest_schedules, when a report's
 * digests are to be sent (one row per report; the regional lead may move or
 * cancel it until it has run). The scheduled check sends what is due and marks
 * the row sent with the counts.
 */
import type { Migration } from '../migrator.js';

export const up: Migration = async ({ context: { exec } }) => {
  await exec(`
    CREATE TABLE digest_schedules (
      source_id INT UNSIGNED NOT NULL PRIMARY KEY,
      region_id INT UNSIGNED NOT NULL,
      send_at DATETIME(3) NOT NULL,
      state ENUM('scheduled', 'sent', 'cancelled') CHARACTER SET ascii NOT NULL DEFAULT 'scheduled',
      scheduled_by_user_id INT UNSIGNED NULL,
      scheduled_by_label VARCHAR(255) NOT NULL,
      scheduled_at DATETIME(3) NOT NULL DEFAULT NOW(3),
      ran_at DATETIME(3) NULL,
      outcome VARCHAR(500) NULL,
      KEY digest_schedules_due (state, send_at)
    ) ENGINE=InnoDB DEFAULT CHARSET=utf8mb4 COLLATE=utf8mb4_unicode_ci`);
};

export const down: Migration = async ({ context: { exec } }) => {
  await exec('DROP TABLE digest_schedules');
};
