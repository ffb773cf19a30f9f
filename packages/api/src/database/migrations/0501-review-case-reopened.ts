/**
 * A reopened review case keeps what it was closed with: the finding and when it was closed
 * before the reopen, and when and by whom it was reopened (review_cases.finding and closed_at
 * describe only the current close). Filled for cases reopened before from their timelines.
 */
import type { Migration } from '../migrator.js';

export const up: Migration = async ({ context: { exec } }) => {
  await exec(`
    ALTER TABLE review_cases
      ADD COLUMN previous_finding ENUM('data_quality_issue', 'explained_by_case_mix', 'genuine_variation_improving', 'genuine_variation_action_agreed', 'no_concern') NULL AFTER closed_at,
      ADD COLUMN previous_closed_at DATETIME(3) NULL AFTER previous_finding,
      ADD COLUMN reopened_at DATETIME(3) NULL AFTER previous_closed_at,
      ADD COLUMN reopened_by_name VARCHAR(200) NULL AFTER reopened_at`);
  await exec(`
    UPDATE review_cases c
      JOIN review_case_entries r ON r.id = (
        SELECT MAX(x.id) FROM review_case_entries x
         WHERE x.case_id = c.id AND x.kind = 'state' AND x.from_status = 'closed' AND x.to_status = 'open')
      LEFT JOIN review_case_entries k ON k.id = (
        SELECT MAX(y.id) FROM review_case_entries y
         WHERE y.case_id = c.id AND y.kind = 'state' AND y.to_status = 'closed' AND y.id < r.id)
       SET c.reopened_at = r.created_at, c.reopened_by_name = r.author_name,
           c.previous_finding = k.finding, c.previous_closed_at = k.created_at`);
};

export const down: Migration = async ({ context: { exec } }) => {
  await exec(`
    ALTER TABLE review_cases
      DROP COLUMN previous_finding, DROP COLUMN previous_closed_at,
      DROP COLUMN reopened_at, DROP COLUMN reopened_by_name`);
};
