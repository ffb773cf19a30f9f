/**
 * The care_records columns a submission's sums are computed from, and how
 * one row of them goes into @cairn/metrics' column builder. Rows arrive as
 * arrays straight from the mariadb connector (streamed, no type cast): the
 * submission id first, then SUMS_COLUMNS in this order, already in the
 * column builder's codes, so that no string is made per row (`SUMS_SELECT`):
 * months as the number YYYYMM (MariaDB drops the '-' of the stored 'YYYY-MM':
 * one REPLACE and one CAST a month, far cheaper for the server than cutting
 * out year and month; the appender turns it into the month index, year × 12 +
 * month − 1), the ENUMs as their 1-based index less one (sex
 * F, M, X, U → 0…3, as SEX_CODES) or as it is (diabetes type type1, type2,
 * other → 1…3 and smoking status current, ex, never → 1…3; NULL → 0, as
 * TYPE_UNKNOWN and "no status"), TINYINT(1) as 0 or 1.
 */
import type { CodedCareRecord, ColumnBuilder } from '@cairn/metrics';
import { CARE_COLUMNS } from '../../database/bulk-load/record-columns.js';

/** Every column the metrics read, per record (FlatCareRecord's fields in snake case). */
export const SUMS_COLUMNS = CARE_COLUMNS;

/** The SELECT expression of one sums column of table alias `r`, in the builder's codes. */
function coded(column: string): string {
  if (column.endsWith('_month')) return `CAST(REPLACE(r.${column}, '-', '') AS UNSIGNED)`;
  if (column === 'sex') return 'r.sex + 0 - 1';
  if (column === 'diabetes_type' || column === 'smoking_status') {
    return `COALESCE(r.${column} + 0, 0)`;
  }
  return `r.${column}`;
}

/** SUMS_COLUMNS of care_records `r` as the SELECT list of a sums read (see above). */
export const SUMS_SELECT = SUMS_COLUMNS.map(coded).join(', ');

const flag = (value: unknown): boolean | null => (value === null ? null : Number(value) !== 0);

/** A month as sent (YYYYMM, or null) as its month index, year × 12 + month − 1. */
export function monthOfSent(value: unknown): number | null {
  if (value === null) return null;
  const yyyymm = value as number;
  const year = Math.floor(yyyymm / 100);
  return year * 12 + (yyyymm - year * 100) - 1;
}

/**
 * A function that appends one streamed row ([submission id, ...SUMS_SELECT]) to the builder,
 * as the practice `practiceOf(submissionId)` names. One record object is reused for every row,
 * so no object is made per row.
 */
export function rowAppender(
  builder: ColumnBuilder,
  practiceOf: (submissionId: number) => string,
): (row: unknown[]) => void {
  const r: CodedCareRecord = {
    practiceCode: '',
    birthYear: 0,
    sex: 3,
    diabetesType: 0,
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
    smokingStatus: 0,
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
    r.sex = row[2] as number;
    r.diabetesType = row[3] as number;
    r.diagnosisYear = row[4] as number | null;
    r.deprivationQuintile = row[5] as number | null;
    // A measurement counts only with its month and its value (as toStoredRecord reads it).
    const hba1c = row[7] as number | null;
    r.hba1cMonth = hba1c === null ? null : monthOfSent(row[6]);
    r.hba1cMmolMol = hba1c;
    const systolic = row[9] as number | null;
    const diastolic = row[10] as number | null;
    r.bloodPressureMonth = systolic === null || diastolic === null ? null : monthOfSent(row[8]);
    r.systolic = systolic;
    r.diastolic = diastolic;
    const cholesterol = row[12] as number | null;
    r.cholesterolMonth = cholesterol === null ? null : monthOfSent(row[11]);
    r.totalCholesterolMmolL = cholesterol;
    const creatinine = row[14] as number | null;
    r.serumCreatinineMonth = creatinine === null ? null : monthOfSent(row[13]);
    r.serumCreatinineUmolL = creatinine;
    const acr = row[16] as number | null;
    r.urineAlbuminMonth = acr === null ? null : monthOfSent(row[15]);
    r.acrMgMmol = acr;
    r.footSurveillanceMonth = monthOfSent(row[17]);
    const bmi = row[19] as number | null;
    r.bmiMonth = bmi === null ? null : monthOfSent(row[18]);
    r.bmiKgM2 = bmi;
    const smoking = row[21] as number;
    r.smokingMonth = smoking === 0 ? null : monthOfSent(row[20]);
    r.smokingStatus = smoking;
    r.retinalScreeningMonth = monthOfSent(row[22]);
    r.onStatin = flag(row[23]);
    r.onInsulin = flag(row[24]);
    r.insulinStartYear = row[25] as number | null;
    r.cvdHistory = flag(row[26]);
    builder.appendCoded(r);
  };
}
