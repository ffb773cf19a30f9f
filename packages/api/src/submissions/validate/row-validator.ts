/**
 * Validates and normalises one data row of an extract (methods.md §7):
 * row errors refuse the row, warnings keep it and say what Cairn did, flags
 * are clinical data-quality checks. Accepted rows come out as a RecordRow in
 * canonical units with dates coarsened to the month.
 *
 * The validator keeps the state that spans rows: record references seen (a
 * repeated reference refuses the later rows and warns on the first) and the
 * counts that decide the file-level identifier checks.
 */
import { COL, RECORD_COLUMNS, type RecordRow } from '../../records/record-columns.js';
import {
  CARE_PROCESSES,
  COLUMN_BY_KEY,
  COLUMNS,
  type ColumnDef,
  DIAGNOSTIC_THRESHOLDS,
  findUnit,
  UNITS,
  type UnitDef,
} from '../format/columns.js';
import type { HeaderMapping, MappedColumn } from '../format/header.js';
import { looksLikeEmail, passesModulus11 } from '../format/identifiers.js';
import {
  type Issue,
  type IssueCodeKey,
  makeIssue,
  type Refusal,
  refusal,
} from '../format/issue-codes.js';
import {
  type Cell,
  CellProblem,
  cellText,
  type DateConvention,
  isBlank,
  monthString,
  normaliseCode,
  readDate,
  readNumber,
  readYear,
  readYesNo,
} from '../format/values.js';

export interface ValidationContext {
  practiceCode: string;
  /** Review window of the quarter, as month indices (year × 12 + month − 1) */
  windowStartIndex: number;
  windowEndIndex: number;
  windowEnd: string;
  /** Calendar year of the window's last month */
  endYear: number;
  /** The current month (server clock), as an index */
  currentMonthIndex: number;
  dateConvention: DateConvention;
  date1904: boolean;
}

export type RowOutcome =
  | { kind: 'accepted'; record: RecordRow; issues: Issue[] | null }
  | { kind: 'rejected'; issues: Issue[] }
  | { kind: 'refused'; refusal: Refusal };

const FORMULA_START = /^[=+\-@\u2212\t\r]/;
// eslint-disable-next-line no-control-regex
const CONTROL = /[\u0000-\u001f\u007f]/;
const MAX_REF = 64;
const REF_SAMPLE = 200;

/** The care-record columns (month, values) each care process fills. */
const PROCESS_TARGET: Record<string, { month: number; values: number[] }> = {
  hba1c: { month: COL.hba1c_month, values: [COL.hba1c_mmol_mol] },
  blood_pressure: { month: COL.blood_pressure_month, values: [COL.systolic, COL.diastolic] },
  cholesterol: { month: COL.cholesterol_month, values: [COL.total_cholesterol_mmol_l] },
  serum_creatinine: { month: COL.serum_creatinine_month, values: [COL.serum_creatinine_umol_l] },
  urine_albumin: { month: COL.urine_albumin_month, values: [COL.acr_mg_mmol] },
  foot_surveillance: { month: COL.foot_surveillance_month, values: [] },
  bmi: { month: COL.bmi_month, values: [COL.bmi_kg_m2] },
  smoking: { month: COL.smoking_month, values: [COL.smoking_status] },
  retinal_screening: { month: COL.retinal_screening_month, values: [] },
};

const PLAIN_NUMBER = /^\d{1,6}(\.\d{1,6})?$/;
const digit = (text: string, i: number) => {
  const d = text.charCodeAt(i) - 48;
  return d >= 0 && d <= 9 ? d : -1000;
};
const digits4 = (text: string) => {
  const n = digit(text, 0) * 1000 + digit(text, 1) * 100 + digit(text, 2) * 10 + digit(text, 3);
  return n >= 0 ? n : -1;
};
const exactCodeCache = new Map<ColumnDef, Map<string, string>>();
/** Codes as written in the template (the common case), looked up without normalising. */
function exactCodes(def: ColumnDef): Map<string, string> {
  let map = exactCodeCache.get(def);
  if (!map) {
    map = new Map((def.codes ?? []).map((c) => [c.value, c.value]));
    exactCodeCache.set(def, map);
  }
  return map;
}
const fmt = (value: number) => String(Math.round(value * 100) / 100);
const quote = (text: string) => `“${text.length > 60 ? `${text.slice(0, 57)}…` : text}”`;

export class RowValidator {
  /** record_ref → first row it appeared on */
  private readonly refs = new Map<string, number>();
  /** Rows whose record_ref was repeated later: first row → later rows */
  readonly repeatedRefs = new Map<number, number[]>();
  private refsSeen = 0;
  private refsLikeNationalNumbers = 0;
  private firstNationalLike: { row: number; value: string } | null = null;
  formulaCells = 0;
  /** Position of each Cairn column in the row, −1 when the file does not have it */
  private readonly index: Record<string, number> = {};
  private readonly processes: {
    def: (typeof CARE_PROCESSES)[number];
    dateIndex: number;
    valueIndices: number[];
    target: { month: number; values: number[] };
    /** Scratch arrays, reused row after row (nothing of them outlives one care process) */
    valueCells: Cell[];
    values: (number | string)[];
  }[];
  /** 'YYYY-MM' of month indices already seen (the same few months recur on every row) */
  private readonly monthText = new Map<number, string>();
  // The row being validated
  private row = 0;
  private issues: Issue[] = [];
  private errorCount = 0;

  constructor(
    private readonly mapping: HeaderMapping,
    private readonly context: ValidationContext,
    private readonly submissionId: number,
  ) {
    for (const def of COLUMNS) this.index[def.key] = mapping.byKey.get(def.key)?.index ?? -1;
    this.processes = CARE_PROCESSES.map((def) => ({
      def,
      dateIndex: this.index[def.dateColumn]!,
      valueIndices: def.valueColumns.map((k) => this.index[k]!),
      target: PROCESS_TARGET[def.key]!,
      valueCells: def.valueColumns.map(() => null),
      values: def.valueColumns.map(() => 0),
    }));
  }

  private readonly add = (
    code: IssueCodeKey,
    key: string | null,
    cell: Cell | string | null,
    message: string,
    fix: string,
  ): void => {
    const heading = key === null ? null : (this.col(key)?.heading ?? key);
    const value = cell === null ? null : typeof cell === 'string' ? cell : cellText(cell);
    const issue = makeIssue(code, this.row, heading, value, message, fix);
    issue.key = key;
    if (issue.severity === 'error') this.errorCount++;
    this.issues.push(issue);
  };

  private col(key: string): MappedColumn | undefined {
    return this.mapping.byKey.get(key);
  }

  private cell(cells: readonly Cell[], key: string): Cell {
    const i = this.index[key]!;
    if (i < 0) return null;
    const value = cells[i];
    return value === undefined ? null : value;
  }

  validate(row: number, cells: readonly Cell[]): RowOutcome {
    this.row = row;
    this.issues = [];
    this.errorCount = 0;
    const issues = this.issues;
    const add = this.add;
    const record: RecordRow = new Array<string | number | null>(RECORD_COLUMNS.length).fill(null);
    record[COL.submission_id] = this.submissionId;
    record[COL.source_row] = row;

    // Cells that hold no value at all: spreadsheet errors, formulas never calculated.
    for (const mapped of this.mapping.columns) {
      const value = cells[mapped.index];
      if (value instanceof CellProblem) {
        if (value.kind === 'error') {
          add(
            'cell_error',
            mapped.def.key,
            value,
            `The cell shows the spreadsheet error ${value.text} instead of a value.`,
            'Correct the formula or type the value, or leave the cell blank if nothing was recorded.',
          );
        } else {
          add(
            'formula_without_result',
            mapped.def.key,
            value,
            'The cell holds a formula that was never calculated, so the file has no value for it.',
            'Open the file in your spreadsheet program, let it calculate, and save it again (or paste the values in place of the formulas).',
          );
        }
      }
    }
    if (this.errorCount > 0) return { kind: 'rejected', issues };

    // ── record_ref ──
    const refCell = this.cell(cells, 'record_ref');
    const ref =
      typeof refCell === 'number'
        ? String(refCell)
        : typeof refCell === 'string'
          ? refCell.trim()
          : cellText(refCell).trim();
    if (ref === '') {
      add(
        'record_ref_missing',
        'record_ref',
        refCell,
        'This row has no record_ref.',
        "Fill in the practice's own reference for the person, so that the practice can find them again.",
      );
    } else if (FORMULA_START.test(ref)) {
      add(
        'record_ref_formula',
        'record_ref',
        ref,
        `record_ref ${quote(ref)} starts with “${ref[0] === '\t' ? 'a tab' : ref[0] === '\r' ? 'a line break' : ref[0]}”, which spreadsheet programs treat as the start of a formula.`,
        'Use a plain reference made of letters, digits and - or / (not starting with = + - or @).',
      );
    } else if (CONTROL.test(ref)) {
      add(
        'record_ref_invalid',
        'record_ref',
        ref,
        'record_ref contains hidden control characters (such as a line break or tab).',
        'Retype the reference without line breaks or tabs.',
      );
    } else if (ref.length > MAX_REF) {
      add(
        'record_ref_too_long',
        'record_ref',
        ref,
        `record_ref is ${ref.length} characters long; Cairn accepts up to ${MAX_REF}.`,
        "Use the practice's short internal reference for the person.",
      );
    } else {
      if (looksLikeEmail(ref)) {
        return {
          kind: 'refused',
          refusal: refusal(
            'identifier_values',
            `record_ref on row ${row} is an e-mail address. Cairn accepts only de-identified data, so the file was not accepted and nothing from it was kept.`,
            "Put the practice's own internal reference for each person in record_ref (never an e-mail address, name or national health number), then upload again.",
            { row },
          ),
        };
      }
      this.refsSeen++;
      if (passesModulus11(ref)) {
        this.refsLikeNationalNumbers++;
        this.firstNationalLike ??= { row, value: ref };
      }
      const first = this.refs.get(ref);
      if (first !== undefined) {
        add(
          'duplicate_record_ref',
          'record_ref',
          ref,
          `The same record_ref is already used on row ${first}; each person must appear once. Cairn kept row ${first} and refused this row.`,
          'Keep one row per person (the most recent review), or correct the reference if these are two people.',
        );
        const later = this.repeatedRefs.get(first);
        if (later) later.push(row);
        else this.repeatedRefs.set(first, [row]);
      }
      record[COL.record_ref] = ref;
    }

    // ── birth_year ──
    const birthCell = this.cell(cells, 'birth_year');
    let birthYear: number | null = null;
    if (isBlank(birthCell)) {
      add(
        'birth_year_missing',
        'birth_year',
        birthCell,
        'This row has no birth_year.',
        'Fill in the year of birth (four digits, e.g. 1958).',
      );
    } else {
      const read = readYear(birthCell);
      if (!read.ok && read.reason === 'full_date') {
        return {
          kind: 'refused',
          refusal: refusal(
            'full_birth_date',
            `birth_year on row ${row} holds a full date (${cellText(birthCell)}). A date of birth identifies a person, so the file was not accepted and nothing from it was kept.`,
            'Keep only the year of birth in birth_year (e.g. 1958): in a spreadsheet, =YEAR(cell) and then paste the values; then upload again.',
            { row },
          ),
        };
      }
      if (!read.ok) {
        if (read.reason === 'two_digit_year') {
          add(
            'two_digit_year',
            'birth_year',
            birthCell,
            `birth_year ${quote(cellText(birthCell))} has only two digits.`,
            'Write the year in full, e.g. 1958.',
          );
        } else {
          add(
            'invalid_year',
            'birth_year',
            birthCell,
            `birth_year ${quote(cellText(birthCell))} is not a year.`,
            'Write the year of birth as four digits, e.g. 1958.',
          );
        }
      } else if (read.year < 1900 || read.year > this.context.endYear) {
        add(
          'birth_year_out_of_range',
          'birth_year',
          birthCell,
          read.year < 1900
            ? `birth_year ${read.year} is before 1900.`
            : `birth_year ${read.year} is after the end of the review window (${this.context.windowEnd}).`,
          'Check the year of birth in the clinical system and correct it.',
        );
      } else {
        birthYear = read.year;
        record[COL.birth_year] = birthYear;
      }
    }

    // ── coded person fields ──
    record[COL.sex] = this.code(cells, 'sex') ?? 'U';
    const diabetesType = this.code(cells, 'diabetes_type');
    record[COL.diabetes_type] = diabetesType;
    if (diabetesType === null && isBlank(this.cell(cells, 'diabetes_type'))) {
      add(
        'diabetes_type_missing',
        'diabetes_type',
        null,
        'diabetes_type is blank: the person is kept but not counted in any measure.',
        'Record the type of diabetes (type1, type2 or other) if it is known.',
      );
    }
    if (this.col('deprivation_quintile')) {
      const q = this.code(cells, 'deprivation_quintile');
      record[COL.deprivation_quintile] = q === null ? null : Number(q);
    }

    // ── diagnosis_year ──
    const diagnosisYear = this.year(cells, 'diagnosis_year');
    if (diagnosisYear !== null) {
      if (birthYear !== null && diagnosisYear < birthYear) {
        add(
          'diagnosis_year_out_of_range',
          'diagnosis_year',
          String(diagnosisYear),
          `diagnosis_year ${diagnosisYear} is before birth_year ${birthYear}.`,
          'Check both years in the clinical system and correct the wrong one.',
        );
      } else if (diagnosisYear > this.context.endYear) {
        add(
          'diagnosis_year_out_of_range',
          'diagnosis_year',
          String(diagnosisYear),
          `diagnosis_year ${diagnosisYear} is after the end of the review window (${this.context.windowEnd}).`,
          'Check the year of diagnosis and correct it.',
        );
      } else {
        record[COL.diagnosis_year] = diagnosisYear;
      }
    }

    // ── care processes ──
    for (const care of this.processes) {
      const { def: process, dateIndex, valueIndices, target } = care;
      const dateCell = dateIndex < 0 ? null : (cells[dateIndex] ?? null);
      let anyValue = false;
      // Scratch arrays of fixed length, overwritten in full (or not read) on every row.
      const valueCells = care.valueCells;
      for (let i = 0; i < valueIndices.length; i++) {
        const vi = valueIndices[i]!;
        const c = vi < 0 ? null : (cells[vi] ?? null);
        valueCells[i] = c;
        if (!isBlank(c)) anyValue = true;
      }
      if (isBlank(dateCell) && !anyValue) continue;
      if (isBlank(dateCell)) {
        if (anyValue) {
          add(
            'value_without_date',
            process.valueColumns[valueCells.findIndex((c) => !isBlank(c))]!,
            valueCells.find((c) => !isBlank(c)) ?? null,
            `${process.label} has a result but no date in ${process.dateColumn}, so it cannot be placed in the review window and is not counted.`,
            `Fill in ${process.dateColumn} with the date of the result.`,
          );
        }
        continue;
      }
      const month = this.month(dateCell, process.dateColumn, birthYear);
      const values = care.values;
      let valuesOk = true;
      for (let i = 0; i < process.valueColumns.length; i++) {
        const key = process.valueColumns[i]!;
        const valueCell = valueCells[i]!;
        if (isBlank(valueCell)) {
          valuesOk = false;
          continue;
        }
        const value =
          key === 'smoking_status' ? this.code(cells, key) : this.measurement(cells, key);
        if (value === null) valuesOk = false;
        else values[i] = value;
      }
      if (month === null) continue;
      if (process.valueColumns.length > 0 && !anyValue) {
        add(
          'date_without_value',
          process.valueColumns[0]!,
          null,
          `${process.label} has a date but no result, so it is not counted as done.`,
          `Fill in ${process.valueColumns.join(' and ')}, or clear ${process.dateColumn} if nothing was recorded.`,
        );
        continue;
      }
      if (!valuesOk) {
        const missing = process.valueColumns.filter((_, i) => isBlank(valueCells[i]!));
        if (missing.length > 0 && this.errorCount === 0) {
          add(
            'date_without_value',
            missing[0]!,
            null,
            `${process.label} is missing ${missing.join(' and ')}, so it is not counted as done.`,
            `Fill in ${missing.join(' and ')} for this reading.`,
          );
        }
        continue;
      }
      if (process.key === 'blood_pressure') {
        const [systolic, diastolic] = values as number[];
        if (systolic! <= diastolic!) {
          add(
            'systolic_not_above_diastolic',
            'bp_systolic',
            `${systolic}/${diastolic}`,
            `Blood pressure ${systolic}/${diastolic}: the systolic value must be higher than the diastolic one.`,
            'Check whether the two values were swapped, and correct them.',
          );
          continue;
        }
      }
      record[target.month] = month;
      for (let i = 0; i < target.values.length; i++) record[target.values[i]!] = values[i]!;
    }

    // ── treatment and history ──
    record[COL.on_statin] = this.yesNo(cells, 'on_statin');
    const onInsulin = this.yesNo(cells, 'on_insulin');
    record[COL.on_insulin] = onInsulin;
    record[COL.cvd_history] = this.yesNo(cells, 'cvd_history');
    const insulinYear = this.year(cells, 'insulin_start_year');
    if (insulinYear !== null) {
      const floor = diagnosisYear ?? birthYear;
      if (floor !== null && insulinYear < floor) {
        add(
          'insulin_year_dropped',
          'insulin_start_year',
          String(insulinYear),
          `insulin_start_year ${insulinYear} is before the ${diagnosisYear !== null ? `diagnosis year (${diagnosisYear})` : `birth year (${birthYear})`}; Cairn kept the row but left the insulin start year out.`,
          'Check the year insulin was started and correct it.',
        );
      } else if (insulinYear > this.context.endYear) {
        add(
          'insulin_year_dropped',
          'insulin_start_year',
          String(insulinYear),
          `insulin_start_year ${insulinYear} is after the end of the review window (${this.context.windowEnd}); Cairn kept the row but left the insulin start year out.`,
          'Check the year insulin was started and correct it.',
        );
      } else {
        record[COL.insulin_start_year] = insulinYear;
        if (onInsulin === 0) {
          add(
            'insulin_year_without_insulin',
            'insulin_start_year',
            String(insulinYear),
            `insulin_start_year is ${insulinYear} but on_insulin is “no”; Cairn kept both as given.`,
            'If insulin was stopped this is fine; otherwise correct on_insulin.',
          );
        }
      }
    }

    // ── optional diagnostic test ──
    if (this.col('diagnostic_test') || this.col('diagnostic_value')) this.diagnostic(cells, record);

    // ── clinical data-quality flags (methods.md §7) ──
    if (diabetesType === 'type1' && onInsulin === 0) {
      add(
        'type1_not_on_insulin',
        'on_insulin',
        'no',
        'Type 1 diabetes is recorded but on_insulin is “no”. Type 1 diabetes ends in complete insulin dependence, so one of the two is probably wrong.',
        'Check the diabetes type and the insulin record for this person in the clinical system.',
      );
    }

    if (this.errorCount > 0) return { kind: 'rejected', issues };
    const acceptedRef = record[COL.record_ref] as string;
    this.refs.set(acceptedRef, row);
    return { kind: 'accepted', record, issues: issues.length > 0 ? issues : null };
  }

  /** The national-number check, once enough references were seen (or at the end of the file). */
  nationalNumberRefusal(final: boolean): Refusal | null {
    if (!final && this.refsSeen < REF_SAMPLE) return null;
    if (this.refsSeen < 5 || this.firstNationalLike === null) return null;
    if (this.refsLikeNationalNumbers / this.refsSeen < 0.9) return null;
    return refusal(
      'identifier_values',
      `The record_ref values look like national health numbers (${this.refsLikeNationalNumbers} of ${this.refsSeen} are 10-digit numbers with a valid check digit, e.g. row ${this.firstNationalLike.row}). Cairn accepts only de-identified data, so the file was not accepted and nothing from it was kept.`,
      "Put the practice's own internal reference for each person in record_ref instead of the national number, then upload again.",
      { row: this.firstNationalLike.row },
    );
  }

  // ───────────────────────────── helpers ─────────────────────────────

  private code(cells: readonly Cell[], key: string): string | null {
    const i = this.index[key]!;
    if (i < 0) return null;
    const cell = cells[i] ?? null;
    if (cell === null) return null;
    const def = COLUMN_BY_KEY.get(key)!;
    if (typeof cell === 'string') {
      const exact = exactCodes(def).get(cell);
      if (exact !== undefined) return exact;
    }
    if (isBlank(cell)) return null;
    const text = typeof cell === 'number' ? String(cell) : cellText(cell);
    const wanted = normaliseCode(text);
    for (const code of def.codes ?? []) {
      if (normaliseCode(code.value) === wanted || code.aliases.includes(wanted)) return code.value;
    }
    this.add(
      'invalid_code',
      key,
      cell,
      `${key} ${quote(text)} is not one of the allowed values.`,
      `Use one of: ${(def.codes ?? []).map((c) => c.value).join(', ')} (or leave it blank if not recorded).`,
    );
    return null;
  }

  private yesNo(cells: readonly Cell[], key: string): number | null {
    const cell = this.cell(cells, key);
    const read = readYesNo(cell);
    if (!read.ok) {
      this.add(
        'invalid_yes_no',
        key,
        cell,
        `${key} ${quote(cellText(cell))} is not yes or no.`,
        'Write yes or no, or leave it blank if not recorded.',
      );
      return null;
    }
    return read.value === null ? null : read.value ? 1 : 0;
  }

  private year(cells: readonly Cell[], key: string): number | null {
    const cell = this.cell(cells, key);
    if (isBlank(cell)) return null;
    const read = readYear(cell);
    if (read.ok) {
      if (read.year < 1900) {
        this.add(
          key === 'diagnosis_year' ? 'diagnosis_year_out_of_range' : 'invalid_year',
          key,
          cell,
          `${key} ${read.year} is before 1900.`,
          'Check the year and correct it.',
        );
        return null;
      }
      return read.year;
    }
    if (read.reason === 'full_date') {
      const date = readDate(cell, this.context.dateConvention, this.context.date1904);
      if (date.ok) {
        this.add(
          'year_taken_from_date',
          key,
          cell,
          `${key} holds a full date; Cairn kept only its year (${date.year}).`,
          `Write just the year in ${key} next time.`,
        );
        return date.year;
      }
    }
    if (read.reason === 'two_digit_year') {
      this.add(
        'two_digit_year',
        key,
        cell,
        `${key} ${quote(cellText(cell))} has only two digits.`,
        'Write the year in full, e.g. 2014.',
      );
    } else {
      this.add(
        'invalid_year',
        key,
        cell,
        `${key} ${quote(cellText(cell))} is not a year.`,
        'Write the year as four digits, e.g. 2014, or leave it blank if not known.',
      );
    }
    return null;
  }

  private month(cell: Cell, key: string, birthYear: number | null): string | null {
    // Fast path: an ISO date 'YYYY-MM-DD' inside the window (nearly every date of a clean file).
    if (
      typeof cell === 'string' &&
      cell.length === 10 &&
      cell.charCodeAt(4) === 45 &&
      cell.charCodeAt(7) === 45
    ) {
      const year = digits4(cell);
      const m = digit(cell, 5) * 10 + digit(cell, 6);
      const d = digit(cell, 8) * 10 + digit(cell, 9);
      if (year > 0 && m >= 1 && m <= 12 && d >= 1 && d <= 28) {
        const index = year * 12 + m - 1;
        if (
          index <= this.context.windowEndIndex &&
          index <= this.context.currentMonthIndex &&
          (birthYear === null || year >= birthYear) &&
          year >= 1900
        ) {
          let text = this.monthText.get(index);
          if (text === undefined) {
            text = cell.slice(0, 7);
            this.monthText.set(index, text);
          }
          return text;
        }
      }
    }
    const read = readDate(cell, this.context.dateConvention, this.context.date1904);
    const text = cellText(cell);
    if (!read.ok) {
      switch (read.reason) {
        case 'ambiguous':
          this.add(
            'ambiguous_date',
            key,
            cell,
            `${quote(text)} can be read as ${read.readings![0]} (day first) or ${read.readings![1]} (month first).`,
            'When you upload, say whether the file writes dates day first (DD/MM/YYYY) or month first (MM/DD/YYYY); or write dates as YYYY-MM-DD.',
          );
          break;
        case 'contradicts_convention':
          this.add(
            'date_contradicts_convention',
            key,
            cell,
            `${quote(text)} cannot be read ${this.context.dateConvention === 'day_first' ? 'day first' : 'month first'}, as this upload says dates are written.`,
            'Check the date, or upload again choosing the other date order.',
          );
          break;
        case 'two_digit_year':
          this.add(
            'two_digit_year',
            key,
            cell,
            `The date ${quote(text)} has a two-digit year.`,
            'Write the year in full, e.g. 14/05/2026 or 2026-05-14.',
          );
          break;
        case 'year_only':
          this.add(
            'date_year_only',
            key,
            cell,
            `${quote(text)} is a year without a month; Cairn needs at least the month.`,
            'Write the date, e.g. 2026-05-14 or 2026-05.',
          );
          break;
        default:
          this.add(
            'invalid_date',
            key,
            cell,
            `${quote(text)} is not a date Cairn can read.`,
            'Write the date as YYYY-MM-DD (e.g. 2026-05-14), DD/MM/YYYY, or use a date cell.',
          );
      }
      return null;
    }
    const index = read.year * 12 + read.month - 1;
    const month = monthString(read.year, read.month);
    if (index > this.context.currentMonthIndex) {
      this.add(
        'date_in_future',
        key,
        cell,
        `The date ${quote(text)} (${month}) is in the future.`,
        'Check the date and correct it.',
      );
      return null;
    }
    if (index > this.context.windowEndIndex) {
      this.add(
        'date_after_window',
        key,
        cell,
        `The date ${quote(text)} (${month}) is after the end of this quarter's review window (${this.context.windowEnd}).`,
        'Check that you are uploading to the right quarter, or correct the date.',
      );
      return null;
    }
    if (read.year < 1900 || (birthYear !== null && read.year < birthYear)) {
      this.add(
        'date_before_birth',
        key,
        cell,
        `The date ${quote(text)} (${month}) is before the person was born.`,
        'Check the date and the birth year, and correct the wrong one.',
      );
      return null;
    }
    return month;
  }

  /** A measurement in the column's canonical unit, converting (with a warning) where a unit says so. */
  private measurement(cells: readonly Cell[], key: string): number | null {
    const mapped = this.col(key)!;
    const def = mapped.def;
    const cell = cells[mapped.index] ?? null;
    // Fast path: a plain number in the canonical unit, no unit given anywhere, within range.
    if (
      mapped.headingUnit === null &&
      (def.unitColumn === undefined || isBlank(this.cell(cells, def.unitColumn)))
    ) {
      const value =
        typeof cell === 'number'
          ? cell
          : typeof cell === 'string' && PLAIN_NUMBER.test(cell)
            ? +cell
            : NaN;
      if (
        value === value &&
        def.range &&
        value >= def.range.min &&
        value <= def.range.max &&
        !(def.key === 'hba1c_value' && value <= 20)
      ) {
        return value;
      }
    }
    const read = readNumber(cell);
    if (!read.ok) {
      if (read.reason === 'ambiguous_separator') {
        this.add(
          'ambiguous_number',
          key,
          cell,
          `${quote(cellText(cell))} could be a decimal comma or a thousands separator.`,
          'Write the number without thousands separators, with a full stop for decimals (e.g. 1200 or 1.2).',
        );
      } else {
        this.add(
          'invalid_number',
          key,
          cell,
          `${key} ${quote(cellText(cell))} is not a number.`,
          'Write the result as a number (e.g. 58), or leave it blank if nothing was recorded.',
        );
      }
      return null;
    }
    const resolved = this.unitFor(cells, def, mapped, read.unitText, read.value);
    if (resolved === null) return null;
    const { unit, assumed } = resolved;
    const canonical = def.units![0]!;
    const value = unit === canonical ? read.value : unit.toCanonical(read.value);
    if (def.range && (value < def.range.min || value > def.range.max)) {
      const shown =
        unit === canonical
          ? `${fmt(read.value)} ${canonical.code}`
          : `${fmt(read.value)} ${unit.code} (${fmt(value)} ${canonical.code})`;
      this.add(
        'out_of_range',
        key,
        cell,
        `${key} ${shown} is outside the plausible range ${def.range.min}–${def.range.max} ${canonical.code}.`,
        def.unitColumn
          ? `Check the result and its unit; if it is in another unit, say so in ${def.unitColumn} (${def.units!.map((u) => u.code).join(' or ')}).`
          : 'Check the result in the clinical system and correct it.',
      );
      return null;
    }
    if (assumed) {
      this.add(
        'hba1c_percent_assumed',
        key,
        cell,
        `HbA1c ${fmt(read.value)} has no unit and is too low for mmol/mol, so Cairn read it as % and converted it to ${fmt(value)} mmol/mol.`,
        'Say the unit in hba1c_unit (mmol/mol or %) so that Cairn does not have to guess.',
      );
    } else if (unit !== canonical) {
      this.add(
        'unit_converted',
        key,
        cell,
        `${fmt(read.value)} ${unit.code} was converted to ${fmt(value)} ${canonical.code}.`,
        'Nothing to fix; Cairn keeps results in ' + canonical.code + '.',
      );
    }
    return value;
  }

  private unitFor(
    cells: readonly Cell[],
    def: ColumnDef,
    mapped: MappedColumn,
    inlineText: string | null,
    value: number,
  ): { unit: UnitDef; assumed: boolean } | null {
    let fromColumn: UnitDef | null = null;
    if (def.unitColumn && this.col(def.unitColumn)) {
      const unitCell = this.cell(cells, def.unitColumn);
      if (!isBlank(unitCell)) {
        fromColumn = findUnit(def, cellText(unitCell));
        if (!fromColumn) {
          this.add(
            'invalid_unit',
            def.unitColumn,
            unitCell,
            `${def.unitColumn} ${quote(cellText(unitCell))} is not a unit Cairn knows for ${def.key}.`,
            `Use ${def.units!.map((u) => u.code).join(' or ')}.`,
          );
          return null;
        }
      }
    }
    let inline: UnitDef | null = null;
    if (inlineText !== null) {
      inline = findUnit(def, inlineText);
      if (!inline) {
        this.add(
          'invalid_unit',
          def.key,
          inlineText,
          `The unit “${inlineText}” after the number is not one Cairn knows for ${def.key}.`,
          `Write just the number, with its unit ${def.units!.map((u) => u.code).join(' or ')}${def.unitColumn ? ` in ${def.unitColumn}` : ''}.`,
        );
        return null;
      }
    }
    if (fromColumn && inline && fromColumn !== inline) {
      this.add(
        'unit_conflict',
        def.key,
        `${value} ${inline.code}`,
        `The value says ${inline.code} but ${def.unitColumn} says ${fromColumn.code}.`,
        'Keep one unit: write the number alone and its unit in the unit column.',
      );
      return null;
    }
    const explicit = fromColumn ?? inline ?? mapped.headingUnit;
    if (explicit) return { unit: explicit, assumed: false };
    if (def.key === 'hba1c_value' && value >= 3 && value <= 20)
      return { unit: UNITS.hba1cPercent, assumed: true };
    return { unit: def.units![0]!, assumed: false };
  }

  private diagnostic(cells: readonly Cell[], record: RecordRow): void {
    const test = this.code(cells, 'diagnostic_test');
    const valueCell = this.cell(cells, 'diagnostic_value');
    if (test === null) {
      if (!isBlank(valueCell)) {
        this.add(
          'diagnostic_value_dropped',
          'diagnostic_value',
          valueCell,
          'diagnostic_value is filled in but diagnostic_test is blank, so Cairn left the result out.',
          'Say which test it was in diagnostic_test (fasting_glucose, two_hour_glucose, random_glucose or hba1c).',
        );
      }
      return;
    }
    record[COL.diagnostic_test] = test;
    if (isBlank(valueCell)) return;
    const read = readNumber(valueCell);
    if (!read.ok) {
      this.add(
        'invalid_number',
        'diagnostic_value',
        valueCell,
        `diagnostic_value ${quote(cellText(valueCell))} is not a number.`,
        'Write the result as a number, or leave it blank.',
      );
      return;
    }
    const glucose = test !== 'hba1c';
    const allowed = glucose
      ? [UNITS.mmolL, UNITS.glucoseMgDl]
      : [UNITS.hba1cMmolMol, UNITS.hba1cPercent];
    const unitCell = this.cell(cells, 'diagnostic_unit');
    const unitText = !isBlank(unitCell) ? cellText(unitCell) : read.unitText;
    let unit: UnitDef = allowed[0]!;
    if (unitText) {
      const found = allowed.find((u) =>
        u.aliases.some(
          (a) => a.replace(/\s/g, '').toLowerCase() === unitText.replace(/\s/g, '').toLowerCase(),
        ),
      );
      if (!found) {
        this.add(
          'invalid_unit',
          'diagnostic_unit',
          unitText,
          `“${unitText}” is not a unit for a ${glucose ? 'glucose' : 'HbA1c'} result.`,
          `Use ${allowed.map((u) => u.code).join(' or ')}.`,
        );
        return;
      }
      unit = found;
    } else if (!glucose && read.value >= 3 && read.value <= 20) {
      unit = UNITS.hba1cPercent;
    }
    const value = unit.toCanonical(read.value);
    record[COL.diagnostic_value] = value;
    const threshold = DIAGNOSTIC_THRESHOLDS[test]!;
    if (value < threshold.min) {
      this.add(
        'diagnostic_below_threshold',
        'diagnostic_value',
        valueCell,
        `The diagnostic ${test.replace(/_/g, ' ')} of ${fmt(value)} ${threshold.unit} is below the diagnostic threshold of ${threshold.min} ${threshold.unit} (${threshold.source}).`,
        'Check the diagnosis and the test result recorded for this person.',
      );
    }
  }
}
