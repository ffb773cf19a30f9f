import { monthFromIndex, monthIndex } from './month.js';
import {
  CARE_PROCESS_FIELDS,
  type CareProcessField,
  type CareRecord,
  type DiabetesType,
  type MeasurementField,
  type Month,
  type Sex,
  type SmokingStatus,
} from './record.js';

/**
 * The columnar form of care records: one typed array per field, one element per record, so that
 * millions of records take about 90 bytes each and no object per record.
 *
 * Encoding (the same for every producer; `MISSING` values mark "not recorded"):
 * - `practice`: Int32Array, index into `practiceCodes`.
 * - `birthYear`, `diagnosisYear`, `insulinStartYear`: Int16Array, calendar year; `MISSING_YEAR`.
 * - `sex`: Uint8Array, index into `SEX_CODES` (F 0, M 1, X 2, U 3).
 * - `diabetesType`: Uint8Array, `TYPE_UNKNOWN` 0, `TYPE_1` 1, `TYPE_2` 2, `TYPE_OTHER` 3.
 * - `deprivation`: Uint8Array, quintile 1…5, 0 when not recorded.
 * - `months[field]`: Int16Array per care process, month index (see month.ts); `MISSING_MONTH`.
 * - `values[field]`: Float64Array per measurement, canonical units (record.ts); NaN when not
 *   recorded. `systolic` and `diastolic` share `months.bloodPressure`.
 * - `smokingStatus`: Uint8Array, 0 not recorded, 1 current, 2 ex, 3 never.
 * - `onStatin`, `onInsulin`, `cvdHistory`: Uint8Array, `FLAG_UNKNOWN` 0, `FLAG_NO` 1, `FLAG_YES` 2.
 * - `recordKeys`: the record references, only when the builder was asked to keep them.
 */
export interface CareColumns {
  readonly length: number;
  /** Practice codes; `practice[i]` indexes this list. */
  readonly practiceCodes: readonly string[];
  readonly practice: Int32Array;
  readonly recordKeys: readonly string[] | null;
  readonly birthYear: Int16Array;
  readonly sex: Uint8Array;
  readonly diabetesType: Uint8Array;
  readonly diagnosisYear: Int16Array;
  readonly deprivation: Uint8Array;
  readonly months: Readonly<Record<CareProcessField, Int16Array>>;
  readonly values: Readonly<Record<MeasurementField, Float64Array>>;
  readonly smokingStatus: Uint8Array;
  readonly onStatin: Uint8Array;
  readonly onInsulin: Uint8Array;
  readonly insulinStartYear: Int16Array;
  readonly cvdHistory: Uint8Array;
}

export const MISSING_MONTH = -32768;
export const MISSING_YEAR = -32768;
/** The largest month index the Int16 month columns hold (December of year 2730). */
const MAX_MONTH_INDEX = 2730 * 12 + 11;
export const SEX_CODES: readonly Sex[] = ['F', 'M', 'X', 'U'];
export const TYPE_UNKNOWN = 0;
export const TYPE_1 = 1;
export const TYPE_2 = 2;
export const TYPE_OTHER = 3;
export const FLAG_UNKNOWN = 0;
export const FLAG_NO = 1;
export const FLAG_YES = 2;
export const SMOKING_CODES: readonly (SmokingStatus | null)[] = [null, 'current', 'ex', 'never'];

/** Every measurement column, in a fixed order. */
export const MEASUREMENT_FIELDS: readonly MeasurementField[] = [
  'hba1c',
  'systolic',
  'diastolic',
  'cholesterol',
  'serumCreatinine',
  'urineAlbumin',
  'bmi',
];

/**
 * A flat row of primitives, the shape of a database row of the records table: use it with
 * `ColumnBuilder.appendFlat` when streaming rows, so that no nested objects are built.
 * Months are 'YYYY-MM' strings or null.
 */
export interface FlatCareRecord {
  practiceCode: string;
  recordKey?: string | null;
  birthYear: number;
  sex: Sex;
  diabetesType: DiabetesType | null;
  diagnosisYear: number | null;
  deprivationQuintile: number | null;
  hba1cMonth: Month | null;
  hba1cMmolMol: number | null;
  bloodPressureMonth: Month | null;
  systolic: number | null;
  diastolic: number | null;
  cholesterolMonth: Month | null;
  totalCholesterolMmolL: number | null;
  serumCreatinineMonth: Month | null;
  serumCreatinineUmolL: number | null;
  urineAlbuminMonth: Month | null;
  acrMgMmol: number | null;
  footSurveillanceMonth: Month | null;
  bmiMonth: Month | null;
  bmiKgM2: number | null;
  smokingMonth: Month | null;
  smokingStatus: SmokingStatus | null;
  retinalScreeningMonth: Month | null;
  onStatin: boolean | null;
  onInsulin: boolean | null;
  insulinStartYear: number | null;
  cvdHistory: boolean | null;
}

/**
 * A flat row already in the columnar form's codes, as a database can send it without any
 * string: months as month indices (month.ts: year × 12 + month − 1) or null, sex as its index
 * in SEX_CODES (0…3), the diabetes type as TYPE_UNKNOWN, TYPE_1, TYPE_2 or TYPE_OTHER, the
 * smoking status as its index in SMOKING_CODES (0: none). Use it with
 * `ColumnBuilder.appendCoded`; it builds the same columns as the same row through appendFlat.
 */
export interface CodedCareRecord {
  practiceCode: string;
  recordKey?: string | null;
  birthYear: number;
  sex: number;
  diabetesType: number;
  diagnosisYear: number | null;
  deprivationQuintile: number | null;
  hba1cMonth: number | null;
  hba1cMmolMol: number | null;
  bloodPressureMonth: number | null;
  systolic: number | null;
  diastolic: number | null;
  cholesterolMonth: number | null;
  totalCholesterolMmolL: number | null;
  serumCreatinineMonth: number | null;
  serumCreatinineUmolL: number | null;
  urineAlbuminMonth: number | null;
  acrMgMmol: number | null;
  footSurveillanceMonth: number | null;
  bmiMonth: number | null;
  bmiKgM2: number | null;
  smokingMonth: number | null;
  smokingStatus: number;
  retinalScreeningMonth: number | null;
  onStatin: boolean | null;
  onInsulin: boolean | null;
  insulinStartYear: number | null;
  cvdHistory: boolean | null;
}

export interface ColumnBuilderOptions {
  /** Expected number of records (the arrays grow by doubling beyond it). Default 1024. */
  capacity?: number;
  /** Practice codes to index first, in this order (e.g. every practice of the region). */
  practiceCodes?: readonly string[];
  /** Keep record references (needed for recall lists; costs one string per record). */
  keepRecordKeys?: boolean;
}

/** An appender that builds `CareColumns` one record at a time, e.g. from a database stream. */
export interface ColumnBuilder {
  readonly length: number;
  /** Appends a record; throws a RangeError naming the field when a value cannot be encoded. */
  append(record: CareRecord): void;
  /** Appends a flat row (see `FlatCareRecord`). */
  appendFlat(row: FlatCareRecord): void;
  /** Appends a flat row already in codes (see `CodedCareRecord`). */
  appendCoded(row: CodedCareRecord): void;
  /**
   * The columns built so far, trimmed to length. The builder must not be used afterwards, but
   * for `reset`.
   */
  finish(): CareColumns;
  /**
   * Starts the builder again, empty, on the arrays it has (a stream evaluated a chunk at a time
   * allocates them once). The columns an earlier `finish` returned may share those arrays: call
   * it only once they are no longer read.
   */
  reset(): void;
}

const TYPE_CODE: Record<DiabetesType, number> = { type1: TYPE_1, type2: TYPE_2, other: TYPE_OTHER };
const SEX_CODE: Record<Sex, number> = { F: 0, M: 1, X: 2, U: 3 };
const SMOKING_CODE: Record<SmokingStatus, number> = { current: 1, ex: 2, never: 3 };

interface Arrays {
  practice: Int32Array;
  birthYear: Int16Array;
  sex: Uint8Array;
  diabetesType: Uint8Array;
  diagnosisYear: Int16Array;
  deprivation: Uint8Array;
  months: Record<CareProcessField, Int16Array>;
  values: Record<MeasurementField, Float64Array>;
  smokingStatus: Uint8Array;
  onStatin: Uint8Array;
  onInsulin: Uint8Array;
  insulinStartYear: Int16Array;
  cvdHistory: Uint8Array;
}

function allocate(capacity: number): Arrays {
  const months = {} as Record<CareProcessField, Int16Array>;
  for (const field of CARE_PROCESS_FIELDS) months[field] = new Int16Array(capacity);
  const values = {} as Record<MeasurementField, Float64Array>;
  for (const field of MEASUREMENT_FIELDS) values[field] = new Float64Array(capacity);
  return {
    practice: new Int32Array(capacity),
    birthYear: new Int16Array(capacity),
    sex: new Uint8Array(capacity),
    diabetesType: new Uint8Array(capacity),
    diagnosisYear: new Int16Array(capacity),
    deprivation: new Uint8Array(capacity),
    months,
    values,
    smokingStatus: new Uint8Array(capacity),
    onStatin: new Uint8Array(capacity),
    onInsulin: new Uint8Array(capacity),
    insulinStartYear: new Int16Array(capacity),
    cvdHistory: new Uint8Array(capacity),
  };
}

type AnyArray = Int32Array | Int16Array | Uint8Array | Float64Array;

function resize<T extends AnyArray>(array: T, length: number, copy: boolean): T {
  if (!copy) return array.subarray(0, length) as T;
  const next = new (array.constructor as new (n: number) => T)(length);
  next.set(array.subarray(0, Math.min(length, array.length)));
  return next;
}

function mapArrays(a: Arrays, f: <T extends AnyArray>(x: T) => T): Arrays {
  const months = {} as Record<CareProcessField, Int16Array>;
  for (const field of CARE_PROCESS_FIELDS) months[field] = f(a.months[field]);
  const values = {} as Record<MeasurementField, Float64Array>;
  for (const field of MEASUREMENT_FIELDS) values[field] = f(a.values[field]);
  return {
    practice: f(a.practice),
    birthYear: f(a.birthYear),
    sex: f(a.sex),
    diabetesType: f(a.diabetesType),
    diagnosisYear: f(a.diagnosisYear),
    deprivation: f(a.deprivation),
    months,
    values,
    smokingStatus: f(a.smokingStatus),
    onStatin: f(a.onStatin),
    onInsulin: f(a.onInsulin),
    insulinStartYear: f(a.insulinStartYear),
    cvdHistory: f(a.cvdHistory),
  };
}

function encodeYear(value: number | null, field: string, row: number, optional: boolean): number {
  if (value === null && optional) return MISSING_YEAR;
  if (typeof value !== 'number' || !Number.isInteger(value) || value < 1 || value > 32767) {
    throw new RangeError(`record ${row}: ${field} must be a year 1…32767 (got ${String(value)})`);
  }
  return value;
}

function encodeMonth(month: Month | null | undefined, field: string, row: number): number {
  if (month == null) return MISSING_MONTH;
  let index: number;
  try {
    index = monthIndex(month);
  } catch {
    throw new RangeError(
      `record ${row}: ${field} must be a month 'YYYY-MM' (got ${JSON.stringify(month)})`,
    );
  }
  if (index > 32767) throw new RangeError(`record ${row}: ${field} is after the year 2730`);
  return index;
}

function encodeValue(value: number | null | undefined, field: string, row: number): number {
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    throw new RangeError(`record ${row}: ${field} must be a finite number (got ${String(value)})`);
  }
  return value;
}

function encodeFlag(value: boolean | null | undefined, field: string, row: number): number {
  if (value == null) return FLAG_UNKNOWN;
  if (value === true) return FLAG_YES;
  if (value === false) return FLAG_NO;
  throw new RangeError(`record ${row}: ${field} must be true, false or null`);
}

/** Creates an appender for the columnar form. */
export function createColumnBuilder(options: ColumnBuilderOptions = {}): ColumnBuilder {
  let capacity = Math.max(16, Math.floor(options.capacity ?? 1024));
  let a = allocate(capacity);
  let length = 0;
  let finished = false;
  let practiceCodes: string[] = [];
  const practiceIndex = new Map<string, number>();
  const indexGiven = () => {
    for (const code of options.practiceCodes ?? []) {
      if (!practiceIndex.has(code)) {
        practiceIndex.set(code, practiceCodes.length);
        practiceCodes.push(code);
      }
    }
  };
  indexGiven();
  let recordKeys: string[] | null = options.keepRecordKeys ? [] : null;

  function slot(practiceCode: string, recordKey: string | null | undefined): number {
    if (finished) throw new Error('the column builder has finished');
    if (typeof practiceCode !== 'string' || practiceCode === '') {
      throw new RangeError(`record ${length}: practiceCode must be a non-empty string`);
    }
    if (length === capacity) {
      capacity *= 2;
      a = mapArrays(a, (x) => resize(x, capacity, true));
    }
    let p = practiceIndex.get(practiceCode);
    if (p === undefined) {
      p = practiceCodes.length;
      practiceIndex.set(practiceCode, p);
      practiceCodes.push(practiceCode);
    }
    a.practice[length] = p;
    if (recordKeys !== null) recordKeys.push(recordKey ?? '');
    return length;
  }

  function common(
    i: number,
    birthYear: number,
    sex: Sex,
    type: DiabetesType | null,
    diagnosisYear: number | null,
    deprivation: number | null,
  ): void {
    a.birthYear[i] = encodeYear(birthYear, 'birthYear', i, false);
    const s = SEX_CODE[sex];
    if (s === undefined) throw new RangeError(`record ${i}: sex must be F, M, X or U`);
    a.sex[i] = s;
    if (type === null) a.diabetesType[i] = TYPE_UNKNOWN;
    else {
      const t = TYPE_CODE[type];
      if (t === undefined) {
        throw new RangeError(`record ${i}: diabetesType must be type1, type2, other or null`);
      }
      a.diabetesType[i] = t;
    }
    a.diagnosisYear[i] = encodeYear(diagnosisYear, 'diagnosisYear', i, true);
    if (deprivation === null) a.deprivation[i] = 0;
    else if (deprivation === 1 || deprivation === 2 || deprivation === 3 || deprivation === 4) {
      a.deprivation[i] = deprivation;
    } else if (deprivation === 5) a.deprivation[i] = 5;
    else throw new RangeError(`record ${i}: deprivationQuintile must be 1…5 or null`);
  }

  function smoking(i: number, status: SmokingStatus | null | undefined): void {
    if (status == null) {
      a.smokingStatus[i] = 0;
      return;
    }
    const code = SMOKING_CODE[status];
    if (code === undefined) throw new RangeError(`record ${i}: smoking status is not valid`);
    a.smokingStatus[i] = code;
  }

  function flags(
    i: number,
    onStatin: boolean | null,
    onInsulin: boolean | null,
    insulinStartYear: number | null,
    cvdHistory: boolean | null,
  ): void {
    a.onStatin[i] = encodeFlag(onStatin, 'onStatin', i);
    a.onInsulin[i] = encodeFlag(onInsulin, 'onInsulin', i);
    a.insulinStartYear[i] = encodeYear(insulinStartYear, 'insulinStartYear', i, true);
    a.cvdHistory[i] = encodeFlag(cvdHistory, 'cvdHistory', i);
  }

  /** Writes one care process's month (its column passed directly: no lookup by name). */
  function putMonth(
    months: Int16Array,
    field: CareProcessField,
    month: Month | null | undefined,
    i: number,
  ): number {
    const m = encodeMonth(month, field, i);
    months[i] = m;
    return m;
  }

  /** Writes one care process's month index (checked: a month of years 1…2730, or null). */
  function putIndex(
    months: Int16Array,
    field: CareProcessField,
    month: number | null,
    i: number,
  ): number {
    if (month === null) {
      months[i] = MISSING_MONTH;
      return MISSING_MONTH;
    }
    if (!Number.isInteger(month) || month < 12 || month > MAX_MONTH_INDEX) {
      throw new RangeError(`record ${i}: ${field} must be a month index (got ${String(month)})`);
    }
    months[i] = month;
    return month;
  }

  /** Writes one measurement of a care process whose month is m (NaN when not recorded). */
  function putValue(
    values: Float64Array,
    field: MeasurementField,
    m: number,
    value: number | null | undefined,
    i: number,
  ): void {
    values[i] = m === MISSING_MONTH ? NaN : encodeValue(value, field, i);
  }

  /** Writes one row's care processes (the month strings and values of a flat row or a record). */
  function putProcesses(
    i: number,
    hba1c: Month | null | undefined,
    hba1cValue: number | null | undefined,
    bloodPressure: Month | null | undefined,
    systolic: number | null | undefined,
    diastolic: number | null | undefined,
    cholesterol: Month | null | undefined,
    cholesterolValue: number | null | undefined,
    creatinine: Month | null | undefined,
    creatinineValue: number | null | undefined,
    albumin: Month | null | undefined,
    albuminValue: number | null | undefined,
    foot: Month | null | undefined,
    bmi: Month | null | undefined,
    bmiValue: number | null | undefined,
    smokingMonth: Month | null | undefined,
  ): void {
    const { months, values } = a;
    let m = putMonth(months.hba1c, 'hba1c', hba1c, i);
    putValue(values.hba1c, 'hba1c', m, hba1cValue, i);
    m = putMonth(months.bloodPressure, 'bloodPressure', bloodPressure, i);
    putValue(values.systolic, 'systolic', m, systolic, i);
    putValue(values.diastolic, 'diastolic', m, diastolic, i);
    m = putMonth(months.cholesterol, 'cholesterol', cholesterol, i);
    putValue(values.cholesterol, 'cholesterol', m, cholesterolValue, i);
    m = putMonth(months.serumCreatinine, 'serumCreatinine', creatinine, i);
    putValue(values.serumCreatinine, 'serumCreatinine', m, creatinineValue, i);
    m = putMonth(months.urineAlbumin, 'urineAlbumin', albumin, i);
    putValue(values.urineAlbumin, 'urineAlbumin', m, albuminValue, i);
    putMonth(months.footSurveillance, 'footSurveillance', foot, i);
    m = putMonth(months.bmi, 'bmi', bmi, i);
    putValue(values.bmi, 'bmi', m, bmiValue, i);
    putMonth(months.smoking, 'smoking', smokingMonth, i);
  }

  return {
    get length() {
      return length;
    },
    append(r: CareRecord): void {
      const i = slot(r.practiceCode, r.recordKey);
      try {
        common(i, r.birthYear, r.sex, r.diabetesType, r.diagnosisYear, r.deprivationQuintile);
        putProcesses(
          i,
          r.hba1c?.month,
          r.hba1c?.mmolMol,
          r.bloodPressure?.month,
          r.bloodPressure?.systolic,
          r.bloodPressure?.diastolic,
          r.cholesterol?.month,
          r.cholesterol?.totalMmolL,
          r.serumCreatinine?.month,
          r.serumCreatinine?.umolL,
          r.urineAlbumin?.month,
          r.urineAlbumin?.acrMgMmol,
          r.footSurveillance?.month,
          r.bmi?.month,
          r.bmi?.kgM2,
          r.smoking?.month,
        );
        smoking(i, r.smoking === null ? null : r.smoking.status);
        putMonth(a.months.retinalScreening, 'retinalScreening', r.retinalScreening?.month, i);
        flags(i, r.onStatin, r.onInsulin, r.insulinStartYear, r.cvdHistory);
      } catch (error) {
        if (recordKeys !== null) recordKeys.pop();
        throw error;
      }
      length++;
    },
    appendFlat(r: FlatCareRecord): void {
      const i = slot(r.practiceCode, r.recordKey);
      try {
        common(i, r.birthYear, r.sex, r.diabetesType, r.diagnosisYear, r.deprivationQuintile);
        putProcesses(
          i,
          r.hba1cMonth,
          r.hba1cMmolMol,
          r.bloodPressureMonth,
          r.systolic,
          r.diastolic,
          r.cholesterolMonth,
          r.totalCholesterolMmolL,
          r.serumCreatinineMonth,
          r.serumCreatinineUmolL,
          r.urineAlbuminMonth,
          r.acrMgMmol,
          r.footSurveillanceMonth,
          r.bmiMonth,
          r.bmiKgM2,
          r.smokingMonth,
        );
        smoking(i, r.smokingMonth == null ? null : r.smokingStatus);
        if (r.smokingMonth != null && r.smokingStatus == null) {
          throw new RangeError(`record ${i}: smokingStatus is required with smokingMonth`);
        }
        putMonth(a.months.retinalScreening, 'retinalScreening', r.retinalScreeningMonth, i);
        flags(i, r.onStatin, r.onInsulin, r.insulinStartYear, r.cvdHistory);
      } catch (error) {
        if (recordKeys !== null) recordKeys.pop();
        throw error;
      }
      length++;
    },
    appendCoded(r: CodedCareRecord): void {
      const i = slot(r.practiceCode, r.recordKey);
      try {
        const sex = r.sex;
        if (sex !== 0 && sex !== 1 && sex !== 2 && sex !== 3) {
          throw new RangeError(`record ${i}: sex must be a code 0…3 (got ${String(sex)})`);
        }
        const type = r.diabetesType;
        if (type !== TYPE_UNKNOWN && type !== TYPE_1 && type !== TYPE_2 && type !== TYPE_OTHER) {
          throw new RangeError(
            `record ${i}: diabetesType must be a code 0…3 (got ${String(type)})`,
          );
        }
        common(i, r.birthYear, SEX_CODES[sex]!, null, r.diagnosisYear, r.deprivationQuintile);
        a.diabetesType[i] = type;
        const { months, values } = a;
        let m = putIndex(months.hba1c, 'hba1c', r.hba1cMonth, i);
        putValue(values.hba1c, 'hba1c', m, r.hba1cMmolMol, i);
        m = putIndex(months.bloodPressure, 'bloodPressure', r.bloodPressureMonth, i);
        putValue(values.systolic, 'systolic', m, r.systolic, i);
        putValue(values.diastolic, 'diastolic', m, r.diastolic, i);
        m = putIndex(months.cholesterol, 'cholesterol', r.cholesterolMonth, i);
        putValue(values.cholesterol, 'cholesterol', m, r.totalCholesterolMmolL, i);
        m = putIndex(months.serumCreatinine, 'serumCreatinine', r.serumCreatinineMonth, i);
        putValue(values.serumCreatinine, 'serumCreatinine', m, r.serumCreatinineUmolL, i);
        m = putIndex(months.urineAlbumin, 'urineAlbumin', r.urineAlbuminMonth, i);
        putValue(values.urineAlbumin, 'urineAlbumin', m, r.acrMgMmol, i);
        putIndex(months.footSurveillance, 'footSurveillance', r.footSurveillanceMonth, i);
        m = putIndex(months.bmi, 'bmi', r.bmiMonth, i);
        putValue(values.bmi, 'bmi', m, r.bmiKgM2, i);
        m = putIndex(months.smoking, 'smoking', r.smokingMonth, i);
        const smokingCode = r.smokingStatus;
        if (smokingCode !== 0 && smokingCode !== 1 && smokingCode !== 2 && smokingCode !== 3) {
          throw new RangeError(`record ${i}: smokingStatus must be a code 0…3`);
        }
        if (m !== MISSING_MONTH && smokingCode === 0) {
          throw new RangeError(`record ${i}: smokingStatus is required with smokingMonth`);
        }
        a.smokingStatus[i] = m === MISSING_MONTH ? 0 : smokingCode;
        putIndex(months.retinalScreening, 'retinalScreening', r.retinalScreeningMonth, i);
        flags(i, r.onStatin, r.onInsulin, r.insulinStartYear, r.cvdHistory);
      } catch (error) {
        if (recordKeys !== null) recordKeys.pop();
        throw error;
      }
      length++;
    },
    reset(): void {
      // Every append writes every column of its row, so the arrays need no clearing.
      length = 0;
      finished = false;
      practiceCodes = [];
      practiceIndex.clear();
      indexGiven();
      recordKeys = options.keepRecordKeys ? [] : null;
    },
    finish(): CareColumns {
      finished = true;
      // Copy when more than an eighth of the capacity is unused, so the spare memory is freed.
      const copy = capacity - length > capacity / 8;
      const t = mapArrays(a, (x) => resize(x, length, copy));
      return { length, practiceCodes, recordKeys, ...t };
    },
  };
}

/** Builds the columnar form of an array of records (practice indices in order of appearance). */
export function toColumns(
  records: readonly CareRecord[],
  options: Omit<ColumnBuilderOptions, 'capacity'> = {},
): CareColumns {
  const builder = createColumnBuilder({ ...options, capacity: records.length });
  for (const record of records) builder.append(record);
  return builder.finish();
}

function year(value: number): number | null {
  return value === MISSING_YEAR ? null : value;
}

function flag(value: number | undefined): boolean | null {
  return value === FLAG_YES ? true : value === FLAG_NO ? false : null;
}

/** Record `i` of the columns as a `CareRecord` (recordKey '' unless keys were kept). */
export function recordAt(columns: CareColumns, i: number): CareRecord {
  if (!Number.isInteger(i) || i < 0 || i >= columns.length) {
    throw new RangeError(`i must be a record index 0…${columns.length - 1} (got ${i})`);
  }
  const m = (field: CareProcessField): Month | null => {
    const index = columns.months[field][i] as number;
    return index === MISSING_MONTH ? null : monthFromIndex(index);
  };
  const v = (field: MeasurementField): number => columns.values[field][i] as number;
  const type = columns.diabetesType[i];
  const deprivation = columns.deprivation[i] as number;
  const hba1c = m('hba1c');
  const bp = m('bloodPressure');
  const chol = m('cholesterol');
  const creat = m('serumCreatinine');
  const acr = m('urineAlbumin');
  const foot = m('footSurveillance');
  const bmi = m('bmi');
  const smokingMonth = m('smoking');
  const retinal = m('retinalScreening');
  const status = SMOKING_CODES[columns.smokingStatus[i] as number] ?? null;
  return {
    practiceCode: columns.practiceCodes[columns.practice[i] as number] as string,
    recordKey: columns.recordKeys?.[i] ?? '',
    birthYear: columns.birthYear[i] as number,
    sex: SEX_CODES[columns.sex[i] as number] as Sex,
    diabetesType:
      type === TYPE_1 ? 'type1' : type === TYPE_2 ? 'type2' : type === TYPE_OTHER ? 'other' : null,
    diagnosisYear: year(columns.diagnosisYear[i] as number),
    deprivationQuintile: deprivation === 0 ? null : (deprivation as 1 | 2 | 3 | 4 | 5),
    hba1c: hba1c === null ? null : { month: hba1c, mmolMol: v('hba1c') },
    bloodPressure:
      bp === null ? null : { month: bp, systolic: v('systolic'), diastolic: v('diastolic') },
    cholesterol: chol === null ? null : { month: chol, totalMmolL: v('cholesterol') },
    serumCreatinine: creat === null ? null : { month: creat, umolL: v('serumCreatinine') },
    urineAlbumin: acr === null ? null : { month: acr, acrMgMmol: v('urineAlbumin') },
    footSurveillance: foot === null ? null : { month: foot },
    bmi: bmi === null ? null : { month: bmi, kgM2: v('bmi') },
    smoking:
      smokingMonth === null || status === null ? null : { month: smokingMonth, status: status },
    retinalScreening: retinal === null ? null : { month: retinal },
    onStatin: flag(columns.onStatin[i]),
    onInsulin: flag(columns.onInsulin[i]),
    insulinStartYear: year(columns.insulinStartYear[i] as number),
    cvdHistory: flag(columns.cvdHistory[i]),
  };
}
