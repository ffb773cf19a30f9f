/**
 * Validates and normalises one data row of an extract (docs/methods.md §7):
 * row errors refuse the row, warnings keep it and say what Cairn did, flags
 * are clinical data-quality checks. Accepted rows come out as a RecordRow in
 * canonical units with dates coarsened to the month.
 *
 * `validate` runs the checks in order, each a method below: cells that hold
 * no value, the person (record_ref, birth_year, coded fields,
 * diagnosis_year), each care process (its month, results and units),
 * treatment and history, the optional diagnostic test, the clinical flags,
 * and the outcome. The cells are read by a RowReader (row-reader.ts), which
 * also collects the row's issues.
 *
 * The validator keeps the state that spans rows: record references seen (a
 * repeated reference refuses the later rows and warns on the first) and the
 * counts that decide the file-level identifier checks.
 */
import { COL, RECORD_COLUMNS, type RecordRow } from '../../database/bulk-load/record-columns.js';
import {
  CARE_PROCESSES,
  DIAGNOSTIC_THRESHOLDS,
  type ProcessDef,
  UNITS,
  type UnitDef,
} from '../format/columns.js';
import type { HeaderMapping } from '../format/header.js';
import { looksLikeEmail, passesModulus11 } from '../format/identifiers.js';
import { type Issue, type Refusal, refusal } from '../format/issue-codes.js';
import {
  type Cell,
  CellProblem,
  cellText,
  isBlank,
  readNumber,
  readYear,
} from '../format/values.js';
import { fmt, quote, RowReader, type ValidationContext } from './row-reader.js';

export type { ValidationContext } from './row-reader.js';

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

/** A care process as this file holds it: where its cells are, where its values go. */
interface CareProcessSlot {
  def: ProcessDef;
  dateIndex: number;
  valueIndices: number[];
  target: { month: number; values: number[] };
  /** Scratch arrays, reused row after row (nothing of them outlives one care process) */
  valueCells: Cell[];
  values: (number | string)[];
}

export class RowValidator {
  /** record_ref → first row it appeared on */
  private readonly refs = new Map<string, number>();
  /** Rows whose record_ref was repeated later: first row → later rows */
  readonly repeatedRefs = new Map<number, number[]>();
  private refsSeen = 0;
  private refsLikeNationalNumbers = 0;
  private firstNationalLike: { row: number; value: string } | null = null;
  formulaCells = 0;
  /** Reads the cells of the row being validated, and collects its issues */
  private readonly reader: RowReader;
  private readonly processes: CareProcessSlot[];
  /** The file has the optional diagnostic columns (or one of them) */
  private readonly hasDiagnostic: boolean;

  constructor(
    private readonly mapping: HeaderMapping,
    private readonly context: ValidationContext,
    private readonly submissionId: number,
  ) {
    const reader = new RowReader(mapping, context);
    this.reader = reader;
    this.processes = CARE_PROCESSES.map((def) => ({
      def,
      dateIndex: reader.indexOf(def.dateColumn),
      valueIndices: def.valueColumns.map((k) => reader.indexOf(k)),
      target: PROCESS_TARGET[def.key]!,
      valueCells: def.valueColumns.map(() => null),
      values: def.valueColumns.map(() => 0),
    }));
    this.hasDiagnostic = Boolean(reader.col('diagnostic_test') || reader.col('diagnostic_value'));
  }

  validate(row: number, cells: readonly Cell[]): RowOutcome {
    const reader = this.reader;
    reader.begin(row);
    const record: RecordRow = new Array<string | number | null>(RECORD_COLUMNS.length).fill(null);
    record[COL.submission_id] = this.submissionId;
    record[COL.source_row] = row;

    this.checkCellsHoldValues(cells);
    if (reader.errorCount > 0) return { kind: 'rejected', issues: reader.issues };

    // The person. A reference or a birth date that identifies someone refuses the whole file.
    const refused =
      this.checkRecordRef(row, cells, record) ?? this.checkBirthYear(row, cells, record);
    if (refused) return { kind: 'refused', refusal: refused };
    // The birth year when plausible (null otherwise): later dates and years are checked against it.
    const birthYear = record[COL.birth_year] as number | null;
    this.readPersonCodes(cells, record);
    const diagnosisYear = this.checkDiagnosisYear(cells, record, birthYear);

    for (const care of this.processes) this.checkCareProcess(care, cells, record, birthYear);

    this.readTreatment(cells, record);
    this.checkInsulinStartYear(cells, record, diagnosisYear, birthYear);
    if (this.hasDiagnostic) this.checkDiagnosticTest(cells, record);
    this.flagType1NotOnInsulin(record);

    return this.outcome(row, record);
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

  // ───────────────────────────── the steps, in order ─────────────────────────────

  /** Cells that hold no value at all: spreadsheet errors, formulas never calculated. */
  private checkCellsHoldValues(cells: readonly Cell[]): void {
    for (const mapped of this.mapping.columns) {
      const value = cells[mapped.index];
      if (value instanceof CellProblem) {
        if (value.kind === 'error') {
          this.reader.add(
            'cell_error',
            mapped.def.key,
            value,
            `The cell shows the spreadsheet error ${value.text} instead of a value.`,
            'Correct the formula or type the value, or leave the cell blank if nothing was recorded.',
          );
        } else {
          this.reader.add(
            'formula_without_result',
            mapped.def.key,
            value,
            'The cell holds a formula that was never calculated, so the file has no value for it.',
            'Open the file in your spreadsheet program, let it calculate, and save it again (or paste the values in place of the formulas).',
          );
        }
      }
    }
  }

  /**
   * record_ref: present, plain, short, and used once in the file. An e-mail address refuses the
   * file; references are counted for the national-number check.
   */
  private checkRecordRef(row: number, cells: readonly Cell[], record: RecordRow): Refusal | null {
    const reader = this.reader;
    const refCell = reader.cell(cells, 'record_ref');
    const ref =
      typeof refCell === 'number'
        ? String(refCell)
        : typeof refCell === 'string'
          ? refCell.trim()
          : cellText(refCell).trim();
    if (ref === '') {
      reader.add(
        'record_ref_missing',
        'record_ref',
        refCell,
        'This row has no record_ref.',
        "Fill in the practice's own reference for the person, so that the practice can find them again.",
      );
    } else if (FORMULA_START.test(ref)) {
      reader.add(
        'record_ref_formula',
        'record_ref',
        ref,
        `record_ref ${quote(ref)} starts with “${ref[0] === '\t' ? 'a tab' : ref[0] === '\r' ? 'a line break' : ref[0]}”, which spreadsheet programs treat as the start of a formula.`,
        'Use a plain reference made of letters, digits and - or / (not starting with = + - or @).',
      );
    } else if (CONTROL.test(ref)) {
      reader.add(
        'record_ref_invalid',
        'record_ref',
        ref,
        'record_ref contains hidden control characters (such as a line break or tab).',
        'Retype the reference without line breaks or tabs.',
      );
    } else if (ref.length > MAX_REF) {
      reader.add(
        'record_ref_too_long',
        'record_ref',
        ref,
        `record_ref is ${ref.length} characters long; Cairn accepts up to ${MAX_REF}.`,
        "Use the practice's short internal reference for the person.",
      );
    } else {
      if (looksLikeEmail(ref)) {
        return refusal(
          'identifier_values',
          `record_ref on row ${row} is an e-mail address. Cairn accepts only de-identified data, so the file was not accepted and nothing from it was kept.`,
          "Put the practice's own internal reference for each person in record_ref (never an e-mail address, name or national health number), then upload again.",
          { row },
        );
      }
      this.refsSeen++;
      if (passesModulus11(ref)) {
        this.refsLikeNationalNumbers++;
        this.firstNationalLike ??= { row, value: ref };
      }
      const first = this.refs.get(ref);
      if (first !== undefined) {
        reader.add(
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
    return null;
  }

  /**
   * birth_year: present, four digits, from 1900 to the window's last year; kept in the record
   * only when plausible. A full date of birth refuses the file.
   */
  private checkBirthYear(row: number, cells: readonly Cell[], record: RecordRow): Refusal | null {
    const reader = this.reader;
    const birthCell = reader.cell(cells, 'birth_year');
    if (isBlank(birthCell)) {
      reader.add(
        'birth_year_missing',
        'birth_year',
        birthCell,
        'This row has no birth_year.',
        'Fill in the year of birth (four digits, e.g. 1958).',
      );
      return null;
    }
    const read = readYear(birthCell);
    if (!read.ok && read.reason === 'full_date') {
      return refusal(
        'full_birth_date',
        `birth_year on row ${row} holds a full date (${cellText(birthCell)}). A date of birth identifies a person, so the file was not accepted and nothing from it was kept.`,
        'Keep only the year of birth in birth_year (e.g. 1958): in a spreadsheet, =YEAR(cell) and then paste the values; then upload again.',
        { row },
      );
    }
    if (!read.ok) {
      if (read.reason === 'two_digit_year') {
        reader.add(
          'two_digit_year',
          'birth_year',
          birthCell,
          `birth_year ${quote(cellText(birthCell))} has only two digits.`,
          'Write the year in full, e.g. 1958.',
        );
      } else {
        reader.add(
          'invalid_year',
          'birth_year',
          birthCell,
          `birth_year ${quote(cellText(birthCell))} is not a year.`,
          'Write the year of birth as four digits, e.g. 1958.',
        );
      }
    } else if (read.year < 1900 || read.year > this.context.endYear) {
      reader.add(
        'birth_year_out_of_range',
        'birth_year',
        birthCell,
        read.year < 1900
          ? `birth_year ${read.year} is before 1900.`
          : `birth_year ${read.year} is after the end of the review window (${this.context.windowEnd}).`,
        'Check the year of birth in the clinical system and correct it.',
      );
    } else {
      record[COL.birth_year] = read.year;
    }
    return null;
  }

  /** sex (blank is U), diabetes_type (blank is a warning), and the optional deprivation quintile. */
  private readPersonCodes(cells: readonly Cell[], record: RecordRow): void {
    const reader = this.reader;
    record[COL.sex] = reader.code(cells, 'sex') ?? 'U';
    const diabetesType = reader.code(cells, 'diabetes_type');
    record[COL.diabetes_type] = diabetesType;
    if (diabetesType === null && isBlank(reader.cell(cells, 'diabetes_type'))) {
      reader.add(
        'diabetes_type_missing',
        'diabetes_type',
        null,
        'diabetes_type is blank: the person is kept but not counted in any measure.',
        'Record the type of diabetes (type1, type2 or other) if it is known.',
      );
    }
    if (reader.col('deprivation_quintile')) {
      const q = reader.code(cells, 'deprivation_quintile');
      record[COL.deprivation_quintile] = q === null ? null : Number(q);
    }
  }

  /**
   * diagnosis_year: not before the birth year, not after the window; kept only then. Returns the
   * year as read (null when blank or unreadable), which the insulin start year is checked against.
   */
  private checkDiagnosisYear(
    cells: readonly Cell[],
    record: RecordRow,
    birthYear: number | null,
  ): number | null {
    const reader = this.reader;
    const diagnosisYear = reader.year(cells, 'diagnosis_year');
    if (diagnosisYear === null) return null;
    if (birthYear !== null && diagnosisYear < birthYear) {
      reader.add(
        'diagnosis_year_out_of_range',
        'diagnosis_year',
        String(diagnosisYear),
        `diagnosis_year ${diagnosisYear} is before birth_year ${birthYear}.`,
        'Check both years in the clinical system and correct the wrong one.',
      );
    } else if (diagnosisYear > this.context.endYear) {
      reader.add(
        'diagnosis_year_out_of_range',
        'diagnosis_year',
        String(diagnosisYear),
        `diagnosis_year ${diagnosisYear} is after the end of the review window (${this.context.windowEnd}).`,
        'Check the year of diagnosis and correct it.',
      );
    } else {
      record[COL.diagnosis_year] = diagnosisYear;
    }
    return diagnosisYear;
  }

  /**
   * One care process: its date as a month, its results in canonical units, and whether they make
   * a whole reading. Only a whole reading is kept (month and every result); otherwise none of it.
   */
  private checkCareProcess(
    care: CareProcessSlot,
    cells: readonly Cell[],
    record: RecordRow,
    birthYear: number | null,
  ): void {
    const process = care.def;
    const dateCell = care.dateIndex < 0 ? null : (cells[care.dateIndex] ?? null);
    const anyValue = this.gatherResultCells(care, cells);
    if (isBlank(dateCell)) {
      if (anyValue) this.noteResultWithoutDate(care);
      return;
    }
    const month = this.reader.month(dateCell, process.dateColumn, birthYear);
    const resultsRead = this.readResults(care, cells);
    if (month === null) return;
    if (!this.isWholeReading(care, anyValue, resultsRead)) return;
    if (process.key === 'blood_pressure' && !this.checkSystolicAboveDiastolic(care)) return;
    const { target, values } = care;
    record[target.month] = month;
    for (let i = 0; i < target.values.length; i++) record[target.values[i]!] = values[i]!;
  }

  /** Puts the process's result cells into its scratch array; true when any is filled in. */
  private gatherResultCells(care: CareProcessSlot, cells: readonly Cell[]): boolean {
    let anyValue = false;
    // Scratch array of fixed length, overwritten in full on every row.
    const { valueIndices, valueCells } = care;
    for (let i = 0; i < valueIndices.length; i++) {
      const vi = valueIndices[i]!;
      const c = vi < 0 ? null : (cells[vi] ?? null);
      valueCells[i] = c;
      if (!isBlank(c)) anyValue = true;
    }
    return anyValue;
  }

  private noteResultWithoutDate(care: CareProcessSlot): void {
    const { def: process, valueCells } = care;
    this.reader.add(
      'value_without_date',
      process.valueColumns[valueCells.findIndex((c) => !isBlank(c))]!,
      valueCells.find((c) => !isBlank(c)) ?? null,
      `${process.label} has a result but no date in ${process.dateColumn}, so it cannot be placed in the review window and is not counted.`,
      `Fill in ${process.dateColumn} with the date of the result.`,
    );
  }

  /**
   * Reads each filled-in result of the process (a code for smoking status, a measurement
   * otherwise) into its scratch array; true when every result is filled in and readable.
   */
  private readResults(care: CareProcessSlot, cells: readonly Cell[]): boolean {
    const reader = this.reader;
    const { def: process, valueCells, values } = care;
    let resultsRead = true;
    for (let i = 0; i < process.valueColumns.length; i++) {
      const key = process.valueColumns[i]!;
      const valueCell = valueCells[i]!;
      if (isBlank(valueCell)) {
        resultsRead = false;
        continue;
      }
      const value =
        key === 'smoking_status' ? reader.code(cells, key) : reader.measurement(cells, key);
      if (value === null) resultsRead = false;
      else values[i] = value;
    }
    return resultsRead;
  }

  /**
   * A dated process is counted only with all its results: a date without any is a warning, a
   * missing one of several too (unless the row already has an error, which says more).
   */
  private isWholeReading(care: CareProcessSlot, anyValue: boolean, resultsRead: boolean): boolean {
    const reader = this.reader;
    const { def: process, valueCells } = care;
    if (process.valueColumns.length > 0 && !anyValue) {
      reader.add(
        'date_without_value',
        process.valueColumns[0]!,
        null,
        `${process.label} has a date but no result, so it is not counted as done.`,
        `Fill in ${process.valueColumns.join(' and ')}, or clear ${process.dateColumn} if nothing was recorded.`,
      );
      return false;
    }
    if (!resultsRead) {
      const missing = process.valueColumns.filter((_, i) => isBlank(valueCells[i]!));
      if (missing.length > 0 && reader.errorCount === 0) {
        reader.add(
          'date_without_value',
          missing[0]!,
          null,
          `${process.label} is missing ${missing.join(' and ')}, so it is not counted as done.`,
          `Fill in ${missing.join(' and ')} for this reading.`,
        );
      }
      return false;
    }
    return true;
  }

  private checkSystolicAboveDiastolic(care: CareProcessSlot): boolean {
    const [systolic, diastolic] = care.values as number[];
    if (systolic! > diastolic!) return true;
    this.reader.add(
      'systolic_not_above_diastolic',
      'bp_systolic',
      `${systolic}/${diastolic}`,
      `Blood pressure ${systolic}/${diastolic}: the systolic value must be higher than the diastolic one.`,
      'Check whether the two values were swapped, and correct them.',
    );
    return false;
  }

  /** on_statin, on_insulin and cvd_history: yes or no. */
  private readTreatment(cells: readonly Cell[], record: RecordRow): void {
    const reader = this.reader;
    record[COL.on_statin] = reader.yesNo(cells, 'on_statin');
    record[COL.on_insulin] = reader.yesNo(cells, 'on_insulin');
    record[COL.cvd_history] = reader.yesNo(cells, 'cvd_history');
  }

  /**
   * insulin_start_year: not before the diagnosis year (or the birth year when there is none), not
   * after the window. Out of range, it is left out with a warning rather than refusing the row.
   */
  private checkInsulinStartYear(
    cells: readonly Cell[],
    record: RecordRow,
    diagnosisYear: number | null,
    birthYear: number | null,
  ): void {
    const reader = this.reader;
    const insulinYear = reader.year(cells, 'insulin_start_year');
    if (insulinYear === null) return;
    const floor = diagnosisYear ?? birthYear;
    if (floor !== null && insulinYear < floor) {
      reader.add(
        'insulin_year_dropped',
        'insulin_start_year',
        String(insulinYear),
        `insulin_start_year ${insulinYear} is before the ${diagnosisYear !== null ? `diagnosis year (${diagnosisYear})` : `birth year (${birthYear})`}; Cairn kept the row but left the insulin start year out.`,
        'Check the year insulin was started and correct it.',
      );
    } else if (insulinYear > this.context.endYear) {
      reader.add(
        'insulin_year_dropped',
        'insulin_start_year',
        String(insulinYear),
        `insulin_start_year ${insulinYear} is after the end of the review window (${this.context.windowEnd}); Cairn kept the row but left the insulin start year out.`,
        'Check the year insulin was started and correct it.',
      );
    } else {
      record[COL.insulin_start_year] = insulinYear;
      if (record[COL.on_insulin] === 0) {
        reader.add(
          'insulin_year_without_insulin',
          'insulin_start_year',
          String(insulinYear),
          `insulin_start_year is ${insulinYear} but on_insulin is “no”; Cairn kept both as given.`,
          'If insulin was stopped this is fine; otherwise correct on_insulin.',
        );
      }
    }
  }

  /**
   * The optional diagnostic test and its result, in canonical units, flagged when below the WHO
   * diagnostic threshold (columns.ts, DIAGNOSTIC_THRESHOLDS).
   */
  private checkDiagnosticTest(cells: readonly Cell[], record: RecordRow): void {
    const reader = this.reader;
    const test = reader.code(cells, 'diagnostic_test');
    const valueCell = reader.cell(cells, 'diagnostic_value');
    if (test === null) {
      if (!isBlank(valueCell)) {
        reader.add(
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
    const value = this.readDiagnosticValue(test, valueCell, cells);
    if (value === null) return;
    record[COL.diagnostic_value] = value;
    const threshold = DIAGNOSTIC_THRESHOLDS[test]!;
    if (value < threshold.min) {
      reader.add(
        'diagnostic_below_threshold',
        'diagnostic_value',
        valueCell,
        `The diagnostic ${test.replace(/_/g, ' ')} of ${fmt(value)} ${threshold.unit} is below the diagnostic threshold of ${threshold.min} ${threshold.unit} (${threshold.source}).`,
        'Check the diagnosis and the test result recorded for this person.',
      );
    }
  }

  /**
   * The diagnostic result in the test's canonical unit: glucose in mmol/L (or mg/dL), HbA1c in
   * mmol/mol (or %, said so or from 3 to 20 with no unit); null, with an issue, when unreadable.
   */
  private readDiagnosticValue(
    test: string,
    valueCell: Cell,
    cells: readonly Cell[],
  ): number | null {
    const reader = this.reader;
    const read = readNumber(valueCell);
    if (!read.ok) {
      reader.add(
        'invalid_number',
        'diagnostic_value',
        valueCell,
        `diagnostic_value ${quote(cellText(valueCell))} is not a number.`,
        'Write the result as a number, or leave it blank.',
      );
      return null;
    }
    const glucose = test !== 'hba1c';
    const allowed = glucose
      ? [UNITS.mmolL, UNITS.glucoseMgDl]
      : [UNITS.hba1cMmolMol, UNITS.hba1cPercent];
    const unitCell = reader.cell(cells, 'diagnostic_unit');
    const unitText = !isBlank(unitCell) ? cellText(unitCell) : read.unitText;
    let unit: UnitDef = allowed[0]!;
    if (unitText) {
      const found = allowed.find((u) =>
        u.aliases.some(
          (a) => a.replace(/\s/g, '').toLowerCase() === unitText.replace(/\s/g, '').toLowerCase(),
        ),
      );
      if (!found) {
        reader.add(
          'invalid_unit',
          'diagnostic_unit',
          unitText,
          `“${unitText}” is not a unit for a ${glucose ? 'glucose' : 'HbA1c'} result.`,
          `Use ${allowed.map((u) => u.code).join(' or ')}.`,
        );
        return null;
      }
      unit = found;
    } else if (!glucose && read.value >= 3 && read.value <= 20) {
      unit = UNITS.hba1cPercent;
    }
    return unit.toCanonical(read.value);
  }

  /** Clinical data-quality flag (docs/methods.md §7): type 1 diabetes recorded as not on insulin. */
  private flagType1NotOnInsulin(record: RecordRow): void {
    if (record[COL.diabetes_type] === 'type1' && record[COL.on_insulin] === 0) {
      this.reader.add(
        'type1_not_on_insulin',
        'on_insulin',
        'no',
        'Type 1 diabetes is recorded but on_insulin is “no”. Type 1 diabetes ends in complete insulin dependence, so one of the two is probably wrong.',
        'Check the diabetes type and the insulin record for this person in the clinical system.',
      );
    }
  }

  /** Refused with its errors, or kept (its reference now taken) with its warnings and flags. */
  private outcome(row: number, record: RecordRow): RowOutcome {
    const issues = this.reader.issues;
    if (this.reader.errorCount > 0) return { kind: 'rejected', issues };
    this.refs.set(record[COL.record_ref] as string, row);
    return { kind: 'accepted', record, issues: issues.length > 0 ? issues : null };
  }
}
