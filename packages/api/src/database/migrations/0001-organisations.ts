/** Regions, localities and practices. */
import type { Migration } from '../migrator.js';

export const up: Migration = async ({ context: { exec } }) => {
  await exec(`
    CREATE TABLE regions (
      id INT UNSIGNED NOT NULL AUTO_INCREMENT PRIMARY KEY,
      code VARCHAR(32) NOT NULL,
      name VARCHAR(200) NOT NULL,
      created_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
      updated_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3),
      UNIQUE KEY regions_code (code)
    ) ENGINE=InnoDB`);
  await exec(`
    CREATE TABLE localities (
      id INT UNSIGNED NOT NULL AUTO_INCREMENT PRIMARY KEY,
      region_id INT UNSIGNED NOT NULL,
      code VARCHAR(32) NOT NULL,
      name VARCHAR(200) NOT NULL,
      created_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
      updated_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3),
      UNIQUE KEY localities_region_code (region_id, code),
      CONSTRAINT localities_region FOREIGN KEY (region_id) REFERENCES regions (id)
    ) ENGINE=InnoDB`);
  await exec(`
    CREATE TABLE practices (
      id INT UNSIGNED NOT NULL AUTO_INCREMENT PRIMARY KEY,
      region_id INT UNSIGNED NOT NULL,
      locality_id INT UNSIGNED NULL,
      code VARCHAR(32) NOT NULL,
      name VARCHAR(200) NOT NULL,
      list_size INT UNSIGNED NULL,
      active TINYINT(1) NOT NULL DEFAULT 1,
      created_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3),
      updated_at DATETIME(3) NOT NULL DEFAULT CURRENT_TIMESTAMP(3) ON UPDATE CURRENT_TIMESTAMP(3),
      UNIQUE KEY practices_region_code (region_id, code),
      KEY practices_locality (locality_id),
      CONSTRAINT practices_region FOREIGN KEY (region_id) REFERENCES regions (id),
      CONSTRAINT practices_locality FOREIGN KEY (locality_id) REFERENCES localities (id)
    ) ENGINE=InnoDB`);
};

export const down: Migration = async ({ context: { exec } }) => {
  await exec('DROP TABLE practices');
  await exec('DROP TABLE localities');
  await exec('DROP TABLE regions');
};
