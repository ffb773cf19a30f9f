/**
 * Reading the cells of one extract row into Cairn's values (docs/methods.md §7): each reader finds a
 * Cairn column in the row and turns its cell into a code, yes or no, a year, a month or a
 * measurement in the column's canonical unit; a cell it cannot read becomes an issue of the row
 * (with the message and fix the practice reads) and the reader returns null. The issues of the
 * row being read are collected here; the row validator (row-validator.ts) runs the checks in
 * order and decides what becomes of the row.
 *
 * One reader serves every row of a file (`begin` starts the next), so the lookups it keeps (the
 * position of each column, the month texts already met) are made once per file, not per row.
 */
import {
  COLUMN_BY_KEY,
  COLUMNS,
  type ColumnDef,
  findUnit,
  UNITS,
  type UnitDef,
} from '../format/columns.js';
import type { HeaderMapping, MappedColumn } from '../format/header.js';
import { type Issue, type IssueCodeKey, makeIssue } from '../format/issue-codes.js';
import {
  type Cell,
  cellText,
  type DateConvention,
  type DateRead,
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
/** A number as the messages show it: at most two decimals. */
export const fmt = (value: number) => String(Math.round(value * 100) / 100);
/** A value as the messages quote it, cut to 60 characters. */
export const quote = (text: string) => `“${text.length > 60 ? `${text.slice(0, 57)}…` : text}”`;

export class RowReader {
  /** The spreadsheet row being read */
  row = 0;
  /** Its issues so far, in the order they were found */
  issues: Issue[] = [];
  /** How many of them are row errors */
  errorCount = 0;
  /** Position of each Cairn column in the row, −1 when the file does not have it */
  private readonly index: Record<string, number> = {};
  /** 'YYYY-MM' of month indices already seen (the same few months recur on every row) */
  private readonly monthText = new Map<number, string>();

  constructor(
    private readonly mapping: HeaderMapping,
    private readonly context: ValidationContext,
  ) {
    for (const def of COLUMNS) this.index[def.key] = mapping.byKey.get(def.key)?.index ?? -1;
  }

  /** Starts the next row: no issues yet. */
  begin(row: number): void {
    this.row = row;
    this.issues = [];
    this.errorCount = 0;
  }

  /** Position of a Cairn column in the row, −1 when the file does not have it. */
  indexOf(key: string): number {
    return this.index[key]!;
  }

  /** Notes an issue of the row about a Cairn column (null: about the row as a whole). */
  add(
    code: IssueCodeKey,
    key: string | null,
    cell: Cell | string | null,
    message: string,
    fix: string,
  ): void {
    const heading = key === null ? null : (this.col(key)?.heading ?? key);
    const value = cell === null ? null : typeof cell === 'string' ? cell : cellText(cell);
    const issue = makeIssue(code, this.row, heading, value, message, fix);
    issue.key = key;
    if (issue.severity === 'error') this.errorCount++;
    this.issues.push(issue);
  }

  /** The file's column for a Cairn column, if it has one. */
  col(key: string): MappedColumn | undefined {
    return this.mapping.byKey.get(key);
  }

  /** The cell of a Cairn column: null when blank, or when the file does not have the column. */
  cell(cells: readonly Cell[], key: string): Cell {
    const i = this.index[key]!;
    if (i < 0) return null;
    const value = cells[i];
    return value === undefined ? null : value;
  }

  /** A coded value as its code; blank is null. */
  code(cells: readonly Cell[], key: string): string | null {
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

  /** Yes or no as 1 or 0; blank or "not recorded" is null. */
  yesNo(cells: readonly Cell[], key: string): number | null {
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

  /** A year (the year of a full date, with a warning); blank is null. */
  year(cells: readonly Cell[], key: string): number | null {
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

  /** A date as its month, 'YYYY-MM', checked against the window, today and the birth year. */
  month(cell: Cell, key: string, birthYear: number | null): string | null {
    const plain = this.plainIsoMonth(cell, birthYear);
    if (plain !== null) return plain;
    const read = readDate(cell, this.context.dateConvention, this.context.date1904);
    if (!read.ok) {
      this.noteUnreadableDate(read, key, cell);
      return null;
    }
    return this.placeMonth(read.year, read.month, key, cell, birthYear);
  }

  /**
   * The fast path: an ISO date 'YYYY-MM-DD' that needs no check (nearly every date of a clean
   * file), as its month; null for any other cell, which takes the general path.
   */
  private plainIsoMonth(cell: Cell, birthYear: number | null): string | null {
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
    return null;
  }

  private noteUnreadableDate(read: DateRead & { ok: false }, key: string, cell: Cell): void {
    const text = cellText(cell);
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
  }

  /** A month read from a date: not in the future, not after the window, not before birth. */
  private placeMonth(
    year: number,
    monthOfYear: number,
    key: string,
    cell: Cell,
    birthYear: number | null,
  ): string | null {
    const text = cellText(cell);
    const index = year * 12 + monthOfYear - 1;
    const month = monthString(year, monthOfYear);
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
    if (year < 1900 || (birthYear !== null && year < birthYear)) {
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
  measurement(cells: readonly Cell[], key: string): number | null {
    const mapped = this.col(key)!;
    const def = mapped.def;
    const cell = cells[mapped.index] ?? null;
    const plain = this.plainCanonicalValue(cells, mapped, cell);
    if (plain !== null) return plain;
    const read = readNumber(cell);
    if (!read.ok) {
      this.noteUnreadableNumber(read.reason, key, cell);
      return null;
    }
    const resolved = this.unitFor(cells, def, mapped, read.unitText, read.value);
    if (resolved === null) return null;
    const { unit, assumed } = resolved;
    const canonical = def.units![0]!;
    const value = unit === canonical ? read.value : unit.toCanonical(read.value);
    if (def.range && (value < def.range.min || value > def.range.max)) {
      this.noteOutOfRange(def, cell, read.value, unit, value);
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

  /**
   * The fast path: a plain number in the canonical unit, no unit given anywhere, within range
   * (nearly every result of a clean file); null for any other cell, which takes the general path.
   */
  private plainCanonicalValue(
    cells: readonly Cell[],
    mapped: MappedColumn,
    cell: Cell,
  ): number | null {
    const def = mapped.def;
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
    return null;
  }

  private noteUnreadableNumber(
    reason: 'not_a_number' | 'ambiguous_separator',
    key: string,
    cell: Cell,
  ): void {
    if (reason === 'ambiguous_separator') {
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
  }

  /** A result outside the column's plausible range (columns.ts), once in the canonical unit. */
  private noteOutOfRange(
    def: ColumnDef,
    cell: Cell,
    given: number,
    unit: UnitDef,
    value: number,
  ): void {
    const key = def.key;
    const range = def.range!;
    const canonical = def.units![0]!;
    const shown =
      unit === canonical
        ? `${fmt(given)} ${canonical.code}`
        : `${fmt(given)} ${unit.code} (${fmt(value)} ${canonical.code})`;
    this.add(
      'out_of_range',
      key,
      cell,
      `${key} ${shown} is outside the plausible range ${range.min}–${range.max} ${canonical.code}.`,
      def.unitColumn
        ? `Check the result and its unit; if it is in another unit, say so in ${def.unitColumn} (${def.units!.map((u) => u.code).join(' or ')}).`
        : 'Check the result in the clinical system and correct it.',
    );
  }

  /**
   * The unit of a result: from the unit column, after the number, or in the heading (they must
   * agree); with none, the canonical unit, except an HbA1c from 3 to 20, read as % (`assumed`).
   */
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
}
