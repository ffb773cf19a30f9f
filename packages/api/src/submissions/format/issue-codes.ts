/**
 * Every problem Cairn can report about an extract, by code. Refusals stop
 * the whole file (nothing is stored); row errors refuse one row (the rest is
 * kept); warnings keep the row and say what Cairn did; flags are clinical
 * data-quality checks (docs/methods.md §7), shown to the practice and the auditor.
 *
 * The codes are stable: the API, the report download, the tests and
 * docs/extract-format.md use them.
 */

export const ISSUE_SEVERITIES = ['refusal', 'error', 'warning', 'flag'] as const;
export type IssueSeverity = (typeof ISSUE_SEVERITIES)[number];

export interface IssueCode {
  severity: IssueSeverity;
  /** Short title for the summary ("warnings by code") */
  title: string;
}

export const ISSUE_CODES = {
  // ── refusals: the file is not accepted ──
  file_too_large: { severity: 'refusal', title: 'File larger than the limit' },
  too_many_rows: { severity: 'refusal', title: 'More rows than the limit' },
  empty_file: { severity: 'refusal', title: 'Empty file' },
  header_only: { severity: 'refusal', title: 'Headings but no rows' },
  save_as_xlsx: { severity: 'refusal', title: 'Spreadsheet format Cairn does not read' },
  unsupported_file_type: { severity: 'refusal', title: 'Not a spreadsheet or CSV file' },
  unreadable_file: { severity: 'refusal', title: 'File damaged or unreadable' },
  encrypted_workbook: { severity: 'refusal', title: 'Workbook protected by a password' },
  uncompressed_too_large: { severity: 'refusal', title: 'Workbook expands beyond the safe size' },
  xml_entities: {
    severity: 'refusal',
    title: 'Workbook contains XML declarations Cairn does not accept',
  },
  not_utf8: { severity: 'refusal', title: 'Text file not saved as UTF-8' },
  csv_malformed: { severity: 'refusal', title: 'CSV quote marks do not match' },
  no_header_row: { severity: 'refusal', title: 'Heading row not found' },
  missing_columns: { severity: 'refusal', title: 'Required columns missing' },
  duplicate_column: { severity: 'refusal', title: 'Column appears twice' },
  unknown_unit_in_header: { severity: 'refusal', title: 'Unit in a heading not recognised' },
  identifier_column: { severity: 'refusal', title: 'Column that identifies people' },
  identifier_values: { severity: 'refusal', title: 'References that identify people' },
  full_birth_date: { severity: 'refusal', title: 'Full dates of birth' },
  no_valid_rows: { severity: 'refusal', title: 'No row could be accepted' },

  // ── row errors: the row is refused ──
  record_ref_missing: { severity: 'error', title: 'record_ref missing' },
  record_ref_too_long: { severity: 'error', title: 'record_ref too long' },
  record_ref_invalid: { severity: 'error', title: 'record_ref has hidden characters' },
  record_ref_formula: { severity: 'error', title: 'record_ref looks like a formula' },
  duplicate_record_ref: { severity: 'error', title: 'record_ref used twice' },
  birth_year_missing: { severity: 'error', title: 'birth_year missing' },
  invalid_year: { severity: 'error', title: 'Not a year' },
  two_digit_year: { severity: 'error', title: 'Two-digit year' },
  birth_year_out_of_range: { severity: 'error', title: 'Birth year not plausible' },
  diagnosis_year_out_of_range: { severity: 'error', title: 'Diagnosis year not plausible' },
  invalid_code: { severity: 'error', title: 'Value not in the allowed list' },
  invalid_yes_no: { severity: 'error', title: 'Not yes or no' },
  invalid_number: { severity: 'error', title: 'Not a number' },
  ambiguous_number: { severity: 'error', title: 'Number with an unclear separator' },
  invalid_unit: { severity: 'error', title: 'Unit not recognised' },
  unit_conflict: { severity: 'error', title: 'Two different units given' },
  out_of_range: { severity: 'error', title: 'Value outside the plausible range' },
  systolic_not_above_diastolic: { severity: 'error', title: 'Systolic not above diastolic' },
  invalid_date: { severity: 'error', title: 'Not a date' },
  ambiguous_date: { severity: 'error', title: 'Date reads two ways' },
  date_contradicts_convention: {
    severity: 'error',
    title: 'Date does not fit the chosen convention',
  },
  date_year_only: { severity: 'error', title: 'Year without a month' },
  date_after_window: { severity: 'error', title: 'Date after the review window' },
  date_in_future: { severity: 'error', title: 'Date in the future' },
  date_before_birth: { severity: 'error', title: 'Date before birth' },
  formula_without_result: { severity: 'error', title: 'Formula with no saved result' },
  cell_error: { severity: 'error', title: 'Spreadsheet error in a cell' },

  // ── warnings: the row is kept ──
  unit_converted: { severity: 'warning', title: 'Value converted to Cairn’s unit' },
  hba1c_percent_assumed: { severity: 'warning', title: 'HbA1c read as %' },
  unknown_column: { severity: 'warning', title: 'Column not in Cairn’s format (ignored)' },
  unnamed_column: { severity: 'warning', title: 'Column without a heading (ignored)' },
  rows_above_header: { severity: 'warning', title: 'Rows above the headings (ignored)' },
  blank_rows: { severity: 'warning', title: 'Blank rows (skipped)' },
  merged_cells: { severity: 'warning', title: 'Merged cells' },
  hidden_rows: { severity: 'warning', title: 'Hidden rows (read)' },
  hidden_columns: { severity: 'warning', title: 'Hidden columns (read)' },
  formulas_used: { severity: 'warning', title: 'Formula results used' },
  other_sheets: { severity: 'warning', title: 'Other sheets (not read)' },
  diabetes_type_missing: { severity: 'warning', title: 'Diabetes type not recorded' },
  value_without_date: { severity: 'warning', title: 'Result without a date (not counted)' },
  date_without_value: { severity: 'warning', title: 'Date without a result (not counted)' },
  year_taken_from_date: { severity: 'warning', title: 'Year taken from a full date' },
  insulin_year_dropped: { severity: 'warning', title: 'Insulin start year left out' },
  insulin_year_without_insulin: {
    severity: 'warning',
    title: 'Insulin start year but not on insulin',
  },
  diagnostic_value_dropped: { severity: 'warning', title: 'Diagnostic result left out' },
  duplicate_record_ref_kept: {
    severity: 'warning',
    title: 'First of a repeated record_ref (kept)',
  },
  extra_cells: { severity: 'warning', title: 'Values beyond the last heading (ignored)' },

  // ── clinical data-quality flags ──
  type1_not_on_insulin: { severity: 'flag', title: 'Type 1 diabetes but not on insulin' },
  diagnostic_below_threshold: {
    severity: 'flag',
    title: 'Diagnostic result below the WHO threshold',
  },
} as const satisfies Record<string, IssueCode>;

export type IssueCodeKey = keyof typeof ISSUE_CODES;

export function severityOf(code: IssueCodeKey): IssueSeverity {
  return ISSUE_CODES[code].severity;
}

/** One problem found in an extract. `row` is the spreadsheet row number (heading row included). */
export interface Issue {
  code: IssueCodeKey;
  severity: Exclude<IssueSeverity, 'refusal'>;
  row: number | null;
  /** The heading as written in the file (or the column letter when it has none) */
  column: string | null;
  /** The Cairn column it is about (e.g. 'record_ref'), when there is one */
  key: string | null;
  /** The value as given */
  value: string | null;
  message: string;
  fix: string;
}

/** One reason a file is refused, with what to do about it. */
export interface RefusalProblem {
  code: IssueCodeKey;
  message: string;
  fix: string;
  /** Details for the report (e.g. the missing columns) */
  detail?: Record<string, unknown>;
}

/**
 * A refusal: the file is not accepted, nothing of it is stored. `code` is the primary reason;
 * `problems`, when given, are every reason found at once (the heading row's), the primary first.
 */
export interface Refusal extends RefusalProblem {
  problems?: RefusalProblem[];
}

export function makeIssue(
  code: IssueCodeKey,
  row: number | null,
  column: string | null,
  value: string | null,
  message: string,
  fix: string,
): Issue {
  const severity = severityOf(code);
  if (severity === 'refusal') throw new Error(`${code} is a refusal, not an issue`);
  return {
    code,
    severity,
    row,
    column,
    key: null,
    value: value === null ? null : value.slice(0, 255),
    message,
    fix,
  };
}

export function refusal(
  code: IssueCodeKey,
  message: string,
  fix: string,
  detail?: Record<string, unknown>,
): Refusal {
  return { code, message, fix, ...(detail ? { detail } : {}) };
}
