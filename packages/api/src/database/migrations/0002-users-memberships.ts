/** Users (one role each) and their practice memberships. */
import type { Migration } from '../migrator.js';

export const up: Migration = async ({ context: { exec } }) => {
  await exec(`
    CREATE TABLE users (
      id INT UNSIGNED NOT NULL AUTO_INCREMENT PRIMARY KEY,
      region_id INT UNSIGNED NOT NULL,
      email VARCHAR(254) NOT NULL,
      display_name VARCHAR(200) NOT NULL,
      role ENUM('regional_lead', 'practice_lead', 'auditor') NOT NULL,
      status ENUM('active', 'deactivated') NOT NULL DEFAULT 'active',
      external_id VARCHAR(255) NULL,
      last_sign_in_at DATETIME(3) NULL,
      created_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
      updated_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3),
      UNIQUE KEY users_email (email),
      KEY users_region_role (region_id, role),
      CONSTRAINT users_region FOREIGN KEY (region_id) REFERENCES regions (id)
    ) ENGINE=InnoDB`);
  await exec(`
    CREATE TABLE memberships (
      id INT UNSIGNED NOT NULL AUTO_INCREMENT PRIMARY KEY,
      user_id INT UNSIGNED NOT NULL,
      practice_id INT UNSIGNED NOT NULL,
      role ENUM('regional_lead', 'practice_lead', 'auditor') NOT NULL DEFAULT 'practice_lead',
      created_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
      updated_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3),
      UNIQUE KEY memberships_user_practice (user_id, practice_id),
      KEY memberships_practice (practice_id),
      CONSTRAINT memberships_user FOREIGN KEY (user_id) REFERENCES users (id) ON DELETE CASCADE,
      CONSTRAINT memberships_practice FOREIGN KEY (practice_id) REFERENCES practices (id)
    ) ENGINE=InnoDB`);
};

export const down: Migration = async ({ context: { exec } }) => {
  await exec('DROP TABLE memberships');
  await exec('DROP TABLE users');
};
