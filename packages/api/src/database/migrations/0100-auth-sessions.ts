/**
 * Sign-in state, all in the database so that several API processes share it:
 *  - sessions: express-session's rows (Cairn's own store, auth/session-store.ts),
 *    with the signed-in user's id so that deactivating a person ends their sessions;
 *  - saml_requests: the AuthnRequest/LogoutRequest ids Cairn issued, so an
 *    answer is accepted once, only for a request Cairn made, within its TTL;
 *  - auth_throttle: @nestjs/throttler counters for the sign-in routes.
 */
import type { Migration } from '../migrator.js';

export const up: Migration = async ({ context: { exec } }) => {
  await exec(`
    CREATE TABLE sessions (
      sid VARCHAR(64) NOT NULL PRIMARY KEY,
      user_id INT UNSIGNED NULL,
      expires DATETIME(3) NULL,
      data MEDIUMTEXT NOT NULL,
      created_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
      updated_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3),
      KEY sessions_expires (expires),
      KEY sessions_user (user_id)
    ) ENGINE=InnoDB`);
  await exec(`
    CREATE TABLE saml_requests (
      id VARCHAR(128) NOT NULL PRIMARY KEY,
      created_at DATETIME(3) NOT NULL,
      used_at DATETIME(3) NULL,
      claimed_at DATETIME(3) NULL,
      KEY saml_requests_created (created_at)
    ) ENGINE=InnoDB`);
  await exec(`
    CREATE TABLE auth_throttle (
      bucket VARCHAR(190) NOT NULL PRIMARY KEY,
      hits INT UNSIGNED NOT NULL,
      window_ends_at DATETIME(3) NOT NULL,
      blocked_until DATETIME(3) NULL,
      KEY auth_throttle_window (window_ends_at)
    ) ENGINE=InnoDB`);
};

export const down: Migration = async ({ context: { exec } }) => {
  await exec('DROP TABLE auth_throttle');
  await exec('DROP TABLE saml_requests');
  await exec('DROP TABLE sessions');
};
