/**
 * The care_records columns a submission's sums are computed from, and how
 * one row of them goes into @cairn/metrics' column builder. Rows arrive as
 * arrays straight from the mariadb connector (streamed, no type cast) with two
 * fields: the submission id, then one text that MariaDB makes of SUMS_COLUMNS
 * in this order, separated by commas (`SUMS_SELECT`), which the appender reads
 * itself. The connector then decodes two fields a row, not 27 (and makes no
 * string per DOUBLE), and the server only joins what it stores:
 *
 * - numbers as MariaDB writes them for the text protocol (the same conversion
 *   of the stored value), '' for NULL;
 * - months as stored, 'YYYY-MM', '' for NULL (read as month indices, year ×
 *   12 + month − 1);
 * - the ENUMs as their 1-based index (sex F, M, X, U → 1…4, read less one as
 *   SEX_CODES; diabetes type type1, type2, other → 1…3 and smoking status
 *   current, ex, never → 1…3; NULL → 0, as TYPE_UNKNOWN and "no status");
 * - TINYINT(1) as 0 or 1.
 *
 * The separator and the empty fields are ascii literals (`_ascii`), like the
 * month columns: the text is then made in ascii, so MariaDB converts nothing
 * while it joins. With the connection's utf8mb4 literals it converted every
 * field to utf8mb4 first, and the national read cost it about 1 s more CPU
 * (6.8–7.0 s against 5.8–6.0 s; docs/performance.md). The connection still
 * receives the text in its own character set; for ascii the bytes are the same.
 */
import type { CodedCareRecord, ColumnBuilder } from '@cairn/metrics';
import { CARE_COLUMNS } from '../../database/bulk-load/record-columns.js';

/** Every column the metrics read, per record (FlatCareRecord's fields in snake case). */
export const SUMS_COLUMNS = CARE_COLUMNS;

/** One sums column of table alias `r` as a CONCAT_WS argument (see above). */
function asText(column: string): string {
  if (column === 'sex') return 'r.sex + 0';
  if (column === 'diabetes_type' || column === 'smoking_status') {
    return `IFNULL(r.${column} + 0, 0)`;
  }
  // CONCAT_WS skips NULLs: an empty field keeps the place of each.
  return `IFNULL(r.${column}, _ascii'')`;
}

/** SUMS_COLUMNS of care_records `r` as the one text field of a sums read (see above). */
export const SUMS_SELECT = `CONCAT_WS(_ascii',', ${SUMS_COLUMNS.map(asText).join(', ')})`;

/** Exact powers of ten, 10⁰ … 10²² (every one a double exactly). */
const POW10 = Array.from({ length: 23 }, (_, k) => Number(`1e${k}`));

/**
 * Reads the comma-separated fields of one row's text in turn. A number of at most 15
 * significant digits and no exponent is read as its digits divided by a power of ten: both
 * are doubles exactly, so the quotient (IEEE 754 division, correctly rounded) is the double
 * nearest to the decimal, as `Number` gives it (W. D. Clinger, "How to Read Floating Point
 * Numbers Accurately", PLDI 1990: the exact fast path). Anything else goes through `Number`.
 */
export class RowText {
  private text = '';
  private pos = 0;

  start(text: string): void {
    this.text = text;
    this.pos = 0;
  }

  /** The next field as a number; null when it is empty. */
  number(): number | null {
    const text = this.text;
    const length = text.length;
    const from = this.pos;
    let pos = from;
    let c = pos < length ? text.charCodeAt(pos) : 44;
    if (c === 44) {
      this.pos = pos + 1;
      return null;
    }
    const negative = c === 45;
    if (negative) pos++;
    let digits = 0;
    let scale = 0;
    let point = false;
    let mantissa = 0;
    for (; pos < length; pos++) {
      c = text.charCodeAt(pos);
      if (c >= 48 && c <= 57) {
        mantissa = mantissa * 10 + (c - 48);
        digits++;
        if (point) scale++;
      } else if (c === 46 && !point) point = true;
      else break;
    }
    if ((pos < length && c !== 44) || digits === 0 || digits > 15) {
      // An exponent, more digits than a double holds exactly, or no digits: as Number reads it.
      let end = text.indexOf(',', pos);
      if (end < 0) end = length;
      this.pos = end + 1;
      return Number(text.slice(from, end));
    }
    this.pos = pos + 1;
    const value = scale === 0 ? mantissa : mantissa / (POW10[scale] as number);
    return negative ? -value : value;
  }

  /** The next field, a month 'YYYY-MM', as its month index; null when it is empty. */
  month(): number | null {
    const text = this.text;
    const length = text.length;
    let pos = this.pos;
    let c = pos < length ? text.charCodeAt(pos) : 44;
    if (c === 44) {
      this.pos = pos + 1;
      return null;
    }
    if (pos + 7 <= length && text.charCodeAt(pos + 4) === 45) {
      // As stored: four digits, '-', two digits.
      const y0 = text.charCodeAt(pos) - 48;
      const y1 = text.charCodeAt(pos + 1) - 48;
      const y2 = text.charCodeAt(pos + 2) - 48;
      const y3 = text.charCodeAt(pos + 3) - 48;
      const m0 = text.charCodeAt(pos + 5) - 48;
      const m1 = text.charCodeAt(pos + 6) - 48;
      if (
        y0 >>> 0 < 10 &&
        y1 >>> 0 < 10 &&
        y2 >>> 0 < 10 &&
        y3 >>> 0 < 10 &&
        m0 >>> 0 < 10 &&
        m1 >>> 0 < 10 &&
        (pos + 7 === length || text.charCodeAt(pos + 7) === 44)
      ) {
        this.pos = pos + 8;
        return (y0 * 1000 + y1 * 100 + y2 * 10 + y3) * 12 + m0 * 10 + m1 - 1;
      }
    }
    let year = 0;
    let month = 0;
    let part = 0;
    let bad = false;
    for (; pos < length; pos++) {
      c = text.charCodeAt(pos);
      if (c === 44) break;
      if (c >= 48 && c <= 57) {
        if (part === 0) year = year * 10 + (c - 48);
        else month = month * 10 + (c - 48);
      } else if (c === 45 && part === 0) part = 1;
      else bad = true;
    }
    this.pos = pos + 1;
    // Not a month: NaN, which the column builder refuses with the field's name.
    return bad || part === 0 ? NaN : year * 12 + month - 1;
  }
}

const flag = (value: number | null): boolean | null => (value === null ? null : value !== 0);

/**
 * A function that appends one streamed row ([submission id, SUMS_SELECT's text]) to the
 * builder, as the practice `practiceOf(submissionId)` names. One record object is reused for
 * every row, so no object is made per row.
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
  const f = new RowText();
  let lastSubmission = -1;
  return (row: unknown[]) => {
    const submission = row[0] as number;
    if (submission !== lastSubmission) {
      r.practiceCode = practiceOf(submission);
      lastSubmission = submission;
    }
    f.start(row[1] as string);
    r.birthYear = f.number() as number;
    const sex = f.number();
    r.sex = sex === null ? NaN : sex - 1;
    r.diabetesType = f.number() as number;
    r.diagnosisYear = f.number();
    r.deprivationQuintile = f.number();
    // A measurement counts only with its month and its value (as toStoredRecord reads it).
    const hba1cMonth = f.month();
    const hba1c = f.number();
    r.hba1cMonth = hba1c === null ? null : hba1cMonth;
    r.hba1cMmolMol = hba1c;
    const bloodPressureMonth = f.month();
    const systolic = f.number();
    const diastolic = f.number();
    r.bloodPressureMonth = systolic === null || diastolic === null ? null : bloodPressureMonth;
    r.systolic = systolic;
    r.diastolic = diastolic;
    const cholesterolMonth = f.month();
    const cholesterol = f.number();
    r.cholesterolMonth = cholesterol === null ? null : cholesterolMonth;
    r.totalCholesterolMmolL = cholesterol;
    const creatinineMonth = f.month();
    const creatinine = f.number();
    r.serumCreatinineMonth = creatinine === null ? null : creatinineMonth;
    r.serumCreatinineUmolL = creatinine;
    const acrMonth = f.month();
    const acr = f.number();
    r.urineAlbuminMonth = acr === null ? null : acrMonth;
    r.acrMgMmol = acr;
    r.footSurveillanceMonth = f.month();
    const bmiMonth = f.month();
    const bmi = f.number();
    r.bmiMonth = bmi === null ? null : bmiMonth;
    r.bmiKgM2 = bmi;
    const smokingMonth = f.month();
    const smoking = f.number() as number;
    r.smokingMonth = smoking === 0 ? null : smokingMonth;
    r.smokingStatus = smoking;
    r.retinalScreeningMonth = f.month();
    r.onStatin = flag(f.number());
    r.onInsulin = flag(f.number());
    r.insulinStartYear = f.number();
    r.cvdHistory = flag(f.number());
    builder.appendCoded(r);
  };
}
