/**
 * The columns of `care_records`, in table order: one row per person of one
 * submission, keyed (submission_id, source_row). The names follow the
 * metrics engine's FlatCareRecord (@cairn/metrics, records/columns.ts) in
 * snake case; months are 'YYYY-MM'. diagnostic_test and diagnostic_value are
 * Cairn's own additions for the data-quality check (not in the care record).
 */
export const RECORD_COLUMNS = [
  'submission_id',
  'source_row',
  'record_ref',
  'pseudonym',
  'birth_year',
  'sex',
  'diabetes_type',
  'diagnosis_year',
  'deprivation_quintile',
  'hba1c_month',
  'hba1c_mmol_mol',
  'blood_pressure_month',
  'systolic',
  'diastolic',
  'cholesterol_month',
  'total_cholesterol_mmol_l',
  'serum_creatinine_month',
  'serum_creatinine_umol_l',
  'urine_albumin_month',
  'acr_mg_mmol',
  'foot_surveillance_month',
  'bmi_month',
  'bmi_kg_m2',
  'smoking_month',
  'smoking_status',
  'retinal_screening_month',
  'on_statin',
  'on_insulin',
  'insulin_start_year',
  'cvd_history',
  'diagnostic_test',
  'diagnostic_value',
] as const;

export type RecordColumn = (typeof RECORD_COLUMNS)[number];

/**
 * The columns of one person's care record, those the metrics read (FlatCareRecord's fields in
 * snake case, RECORD_COLUMNS from birth_year to cvd_history): every SELECT of records for the
 * metrics, the recall lists and the sums is made from this list.
 */
export const CARE_COLUMNS = RECORD_COLUMNS.slice(
  RECORD_COLUMNS.indexOf('birth_year'),
  RECORD_COLUMNS.indexOf('cvd_history') + 1,
) as readonly RecordColumn[];

export const COL = Object.fromEntries(RECORD_COLUMNS.map((name, i) => [name, i])) as {
  [K in RecordColumn]: number;
};

/** One record as the loader writes it: values in RECORD_COLUMNS order, null for "not recorded". */
export type RecordRow = (string | number | null)[];
