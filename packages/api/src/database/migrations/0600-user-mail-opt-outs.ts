/**
 * Each person's mail preferences (users module): the kinds of e-mail they
 * chose not to receive, as a comma-separated list of kind names (empty: they
 * receive every kind sent to their role).
 */
import type { Migration } from '../migrator.js';

export const up: Migration = async ({ context: { exec } }) => {
  await exec(`
    ALTER TABLE users
      ADD COLUMN mail_opt_outs VARCHAR(255) CHARACTER SET ascii NOT NULL DEFAULT '' AFTER last_sign_in_at`);
};

export const down: Migration = async ({ context: { exec } }) => {
  await exec('ALTER TABLE users DROP COLUMN mail_opt_outs');
};
