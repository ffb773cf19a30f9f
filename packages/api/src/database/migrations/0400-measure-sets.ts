/**
 * Measure-set versions (owned by the measure-sets module). A version is a
 * draft while a regional lead edits it and published once for good: the
 * triggers refuse to change or delete a published row, so no code path can
 * rewrite what a quarter or a report was computed with. `region_id` is null
 * for the versions shipped with Cairn (seeded from config/measure-sets/,
 * read by every region); a region's own versions carry its id.
 * `definition` is the validated measure set as canonical JSON (keys sorted)
 * and `content_hash` its SHA-256 (hex). `revision` counts a draft's saves,
 * so that two editors cannot overwrite each other unseen.
 */
import type { Migration } from '../migrator.js';

export const up: Migration = async ({ context: { exec } }) => {
  await exec(`
    CREATE TABLE measure_sets (
      id VARCHAR(64) CHARACTER SET ascii NOT NULL PRIMARY KEY,
      region_id INT UNSIGNED NULL,
      label VARCHAR(200) NOT NULL,
      status ENUM('draft', 'published') NOT NULL,
      based_on VARCHAR(64) CHARACTER SET ascii NULL,
      definition LONGTEXT NOT NULL,
      content_hash CHAR(64) CHARACTER SET ascii NOT NULL,
      revision INT UNSIGNED NOT NULL DEFAULT 1,
      seed_file VARCHAR(255) NULL,
      created_by_user_id INT UNSIGNED NULL,
      created_by VARCHAR(200) NOT NULL,
      created_at DATETIME(3) NOT NULL,
      updated_at DATETIME(3) NOT NULL,
      published_by_user_id INT UNSIGNED NULL,
      published_by VARCHAR(200) NULL,
      published_at DATETIME(3) NULL,
      KEY measure_sets_region_status (region_id, status),
      CONSTRAINT measure_sets_region FOREIGN KEY (region_id) REFERENCES regions (id),
      CONSTRAINT measure_sets_based_on FOREIGN KEY (based_on) REFERENCES measure_sets (id),
      CONSTRAINT measure_sets_definition_json CHECK (JSON_VALID(definition)),
      CONSTRAINT measure_sets_published_when CHECK ((status = 'published') = (published_at IS NOT NULL))
    ) ENGINE=InnoDB`);
  await exec(`
    CREATE TRIGGER measure_sets_published_no_update BEFORE UPDATE ON measure_sets FOR EACH ROW
    IF OLD.status = 'published' THEN
      SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'a published measure set never changes';
    END IF`);
  await exec(`
    CREATE TRIGGER measure_sets_published_no_delete BEFORE DELETE ON measure_sets FOR EACH ROW
    IF OLD.status = 'published' THEN
      SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'a published measure set is never deleted';
    END IF`);
};

export const down: Migration = async ({ context: { exec } }) => {
  await exec('DROP TABLE measure_sets');
};
