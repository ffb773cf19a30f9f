/**
 * The care_records columns a submission's sums are computed from, and how
 * one row of them goes into @cairn/metrics' column builder. Rows arrive as
 * arrays straight from the mariadb connector (streamed, no type cast): the
 * submission id first, then SUMS_COLUMNS in this order. Numbers arrive as
 * numbers, ENUMs and months ('YYYY-MM') as strings, TINYINT(1) as 0 or 1.
 */
import type {
  ColumnBuilder,
  DiabetesType,
  FlatCareRecord,
  Month,
  Sex,
  SmokingStatus,
} from '@cairn/metrics';

/** Every column the metrics read, per record (FlatCareRecord's fields in snake case). */
export const SUMS_COLUMNS = [
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
] as const;

const flag = (value: unknown): boolean | null => (value === null ? null : Number(value) !== 0);

/**
 * A function that appends one streamed row ([submission id, ...SUMS_COLUMNS]) to the builder,
 * as the practice `practiceOf(submissionId)` names. One record object is reused for every row,
 * so no object is made per row.
 */
export function rowAppender(
  builder: ColumnBuilder,
  practiceOf: (submissionId: number) => string,
): (row: unknown[]) => void {
  const r: FlatCareRecord = {
    practiceCode: '',
    birthYear: 0,
    sex: 'U',
    diabetesType: null,
    diagnosisYear: null,
    deprivationQuintile: null,
    hba1cMonth: null,
    hba1cMmolMol: null,
    bloodPressureMonth: null,
    systolic: null,
    diastolic: null,
    cholesterolMonth: null,
    totalCholesterolMmolL: null,
    serumCreatinineMonth: null,
    serumCreatinineUmolL: null,
    urineAlbuminMonth: null,
    acrMgMmol: null,
    footSurveillanceMonth: null,
    bmiMonth: null,
    bmiKgM2: null,
    smokingMonth: null,
    smokingStatus: null,
    retinalScreeningMonth: null,
    onStatin: null,
    onInsulin: null,
    insulinStartYear: null,
    cvdHistory: null,
  };
  let lastSubmission = -1;
  return (row: unknown[]) => {
    const submission = row[0] as number;
    if (submission !== lastSubmission) {
      r.practiceCode = practiceOf(submission);
      lastSubmission = submission;
    }
    r.birthYear = row[1] as number;
    r.sex = row[2] as Sex;
    r.diabetesType = row[3] as DiabetesType | null;
    r.diagnosisYear = row[4] as number | null;
    r.deprivationQuintile = row[5] as number | null;
    // A measurement counts only with its month and its value (as toStoredRecord reads it).
    const hba1c = row[7] as number | null;
    r.hba1cMonth = hba1c === null ? null : (row[6] as Month | null);
    r.hba1cMmolMol = hba1c;
    const systolic = row[9] as number | null;
    const diastolic = row[10] as number | null;
    r.bloodPressureMonth =
      systolic === null || diastolic === null ? null : (row[8] as Month | null);
    r.systolic = systolic;
    r.diastolic = diastolic;
    const cholesterol = row[12] as number | null;
    r.cholesterolMonth = cholesterol === null ? null : (row[11] as Month | null);
    r.totalCholesterolMmolL = cholesterol;
    const creatinine = row[14] as number | null;
    r.serumCreatinineMonth = creatinine === null ? null : (row[13] as Month | null);
    r.serumCreatinineUmolL = creatinine;
    const acr = row[16] as number | null;
    r.urineAlbuminMonth = acr === null ? null : (row[15] as Month | null);
    r.acrMgMmol = acr;
    r.footSurveillanceMonth = row[17] as Month | null;
    const bmi = row[19] as number | null;
    r.bmiMonth = bmi === null ? null : (row[18] as Month | null);
    r.bmiKgM2 = bmi;
    const smoking = row[21] as SmokingStatus | null;
    r.smokingMonth = smoking === null ? null : (row[20] as Month | null);
    r.smokingStatus = smoking;
    r.retinalScreeningMonth = row[22] as Month | null;
    r.onStatin = flag(row[23]);
    r.onInsulin = flag(row[24]);
    r.insulinStartYear = row[25] as number | null;
    r.cvdHistory = flag(row[26]);
    builder.appendFlat(r);
  };
}
