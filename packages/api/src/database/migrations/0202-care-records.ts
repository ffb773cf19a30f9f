/**
 * Care records: one row per person of one submission, in canonical units
 * with months 'YYYY-MM' (the metrics engine's FlatCareRecord in snake case;
 * see src/database/bulk-load/record-columns.ts). Rows are written while an extract is
 * processed ("staged" under the new submission, invisible to readers, who go
 * through practice_quarters.current_submission_id) and never change after.
 * Refused, cancelled and failed submissions have theirs removed; superseded
 * ones keep them, so a published report can still read what it froze.
 *
 * The primary key clusters a submission's rows together: "every current
 * record of quarter Q" is one range scan per practice from
 * practice_quarters_quarter.
 *
 * record_ref is the practice's own reference, shown only to that practice;
 * pseudonym is its keyed hash (docs/methods.md §9) for everyone else.
 */
import type { Migration } from '../migrator.js';

export const up: Migration = async ({ context: { exec } }) => {
  await exec(`
    CREATE TABLE care_records (
      submission_id INT UNSIGNED NOT NULL,
      source_row INT UNSIGNED NOT NULL,
      record_ref VARCHAR(64) NOT NULL,
      pseudonym CHAR(12) CHARACTER SET ascii NOT NULL,
      birth_year SMALLINT UNSIGNED NOT NULL,
      sex ENUM('F', 'M', 'X', 'U') NOT NULL,
      diabetes_type ENUM('type1', 'type2', 'other') NULL,
      diagnosis_year SMALLINT UNSIGNED NULL,
      deprivation_quintile TINYINT UNSIGNED NULL,
      hba1c_month CHAR(7) CHARACTER SET ascii NULL,
      hba1c_mmol_mol DOUBLE NULL,
      blood_pressure_month CHAR(7) CHARACTER SET ascii NULL,
      systolic SMALLINT UNSIGNED NULL,
      diastolic SMALLINT UNSIGNED NULL,
      cholesterol_month CHAR(7) CHARACTER SET ascii NULL,
      total_cholesterol_mmol_l DOUBLE NULL,
      serum_creatinine_month CHAR(7) CHARACTER SET ascii NULL,
      serum_creatinine_umol_l DOUBLE NULL,
      urine_albumin_month CHAR(7) CHARACTER SET ascii NULL,
      acr_mg_mmol DOUBLE NULL,
      foot_surveillance_month CHAR(7) CHARACTER SET ascii NULL,
      bmi_month CHAR(7) CHARACTER SET ascii NULL,
      bmi_kg_m2 DOUBLE NULL,
      smoking_month CHAR(7) CHARACTER SET ascii NULL,
      smoking_status ENUM('current', 'ex', 'never') NULL,
      retinal_screening_month CHAR(7) CHARACTER SET ascii NULL,
      on_statin TINYINT(1) NULL,
      on_insulin TINYINT(1) NULL,
      insulin_start_year SMALLINT UNSIGNED NULL,
      cvd_history TINYINT(1) NULL,
      diagnostic_test ENUM('fasting_glucose', 'two_hour_glucose', 'random_glucose', 'hba1c') NULL,
      diagnostic_value DOUBLE NULL,
      PRIMARY KEY (submission_id, source_row),
      CONSTRAINT care_records_submission FOREIGN KEY (submission_id) REFERENCES submissions (id)
    ) ENGINE=InnoDB`);
};

export const down: Migration = async ({ context: { exec } }) => {
  await exec('DROP TABLE care_records');
};
