/**
 * Audit quarters: the periods practices submit extracts for. The review
 * window (docs/methods.md §1) is derived from the year and quarter and stored for
 * readers; the measure set is chosen when the quarter is opened.
 */
import type { Migration } from '../migrator.js';

export const up: Migration = async ({ context: { exec } }) => {
  await exec(`
    CREATE TABLE audit_quarters (
      id INT UNSIGNED NOT NULL AUTO_INCREMENT PRIMARY KEY,
      region_id INT UNSIGNED NOT NULL,
      year SMALLINT UNSIGNED NOT NULL,
      quarter TINYINT UNSIGNED NOT NULL,
      window_start CHAR(7) CHARACTER SET ascii NOT NULL,
      window_end CHAR(7) CHARACTER SET ascii NOT NULL,
      measure_set_id VARCHAR(64) NOT NULL,
      submission_deadline DATE NOT NULL,
      status ENUM('open', 'closed') NOT NULL DEFAULT 'open',
      opened_by_user_id INT UNSIGNED NULL,
      opened_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
      closed_at DATETIME(3) NULL,
      created_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
      updated_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3),
      UNIQUE KEY audit_quarters_region_period (region_id, year, quarter),
      KEY audit_quarters_region_status (region_id, status),
      CONSTRAINT audit_quarters_region FOREIGN KEY (region_id) REFERENCES regions (id),
      CONSTRAINT audit_quarters_quarter CHECK (quarter BETWEEN 1 AND 4)
    ) ENGINE=InnoDB`);
};

export const down: Migration = async ({ context: { exec } }) => {
  await exec('DROP TABLE audit_quarters');
};
