/**
 * What Cairn says about an extract as a whole, rather than about one row: the refusals decided by
 * the file's shape (no values, too many rows, no heading row, headings Cairn cannot use, no rows
 * under the headings, no row accepted), and the notes of an accepted file (columns ignored, rows
 * above the headings, merged cells, hidden rows and columns, other sheets, repeated references,
 * blank rows, values beyond the last heading, formulas). Pure functions: the extract pipeline
 * (read-rows.ts) decides when each applies.
 */
import type { SourceNotes } from '../files/row-source.js';
import type { CellRange } from '../files/xlsx-prescan.js';
import { columnLetter, type HeaderMapping, type HeaderProblem } from '../format/header.js';
import {
  type Issue,
  ISSUE_CODES,
  makeIssue,
  type Refusal,
  type RefusalProblem,
  refusal,
} from '../format/issue-codes.js';

/** How many rows with values are searched for the heading row */
export const HEADER_SEARCH_ROWS = 20;

/** Sheets of Cairn's own template beside the data sheet: not worth a note */
const TEMPLATE_SHEETS = new Set([
  'dictionary',
  'data dictionary',
  'instructions',
  'read me',
  'readme',
]);

const listRows = (rows: number[], max = 12) =>
  rows.length <= max
    ? joinList(rows.map(String))
    : `${rows.slice(0, max).join(', ')} and ${rows.length - max} more`;

function joinList(items: string[]): string {
  if (items.length <= 1) return items.join('');
  return `${items.slice(0, -1).join(', ')} and ${items[items.length - 1]}`;
}

// ───────────────────────────── refusals ─────────────────────────────

/**
 * The refusal of a heading row: every problem found in it, each with its words and its fix. With
 * one problem the refusal is that problem; with several, the first is the primary code and the
 * message names them all, so that one corrected file answers every one of them.
 */
export function headerRefusal(problems: readonly HeaderProblem[]): Refusal {
  const each = problems.map(headerProblem);
  const [first] = each;
  if (!first) throw new Error('headerRefusal needs at least one problem');
  if (each.length === 1) return { ...first, problems: each };
  const titles = each.map((p) => lowerFirst(ISSUE_CODES[p.code].title));
  return {
    code: first.code,
    message: `The heading row has ${each.length} problems (${titles.join('; ')}), so the file was not accepted and nothing from it was kept.`,
    fix: 'Fix each of them as its own note says, then upload the file again; or start from Cairn’s template.',
    detail: { problems: each.map((p) => p.code) },
    problems: each,
  };
}

const lowerFirst = (text: string) => text.charAt(0).toLowerCase() + text.slice(1);

function headerProblem(problem: HeaderProblem): RefusalProblem {
  switch (problem.code) {
    case 'identifier_column': {
      const list = problem.headings.map(
        (h) => `“${h.heading}” (column ${h.column}, looks like ${h.what})`,
      );
      return refusal(
        'identifier_column',
        `The file has ${list.length === 1 ? 'a column' : 'columns'} that could identify people: ${joinList(list)}. Cairn accepts only de-identified data, so the file was not accepted and nothing from it was kept.`,
        `Delete ${list.length === 1 ? 'that column' : 'those columns'} from the file (Cairn needs only the columns of its template) and upload again.`,
        { headings: problem.headings },
      );
    }
    case 'missing_columns':
      return refusal(
        'missing_columns',
        `The file has no ${problem.missing.length === 1 ? 'column' : 'columns'} ${joinList(problem.missing)}, which Cairn needs.`,
        `Add ${problem.missing.length === 1 ? 'the column' : 'the columns'} with ${problem.missing.length === 1 ? 'that heading' : 'those headings'} (leave cells blank where nothing was recorded), or start from Cairn’s template.`,
        { missing: problem.missing },
      );
    case 'duplicate_column':
      return refusal(
        'duplicate_column',
        `The column ${problem.key} appears more than once (columns ${joinList(problem.columns)}: ${joinList(problem.headings.map((h) => `“${h}”`))}), so Cairn cannot tell which to use.`,
        'Keep one of them and delete the others, then upload again.',
        { key: problem.key, columns: problem.columns },
      );
    case 'unknown_unit_in_header':
      return refusal(
        'unknown_unit_in_header',
        `The heading “${problem.heading}” names the unit “${problem.unitText}”, which Cairn does not know for ${problem.key}.`,
        `Use ${joinList(problem.allowed)} in the heading, or write the heading without a unit.`,
        { heading: problem.heading },
      );
  }
}

/** The sheet (or the file) has no values at all. */
export function emptyFile(kind: 'xlsx' | 'csv', sheetName: string | null): Refusal {
  return refusal(
    'empty_file',
    kind === 'xlsx'
      ? `The sheet “${sheetName}” has no values in it.`
      : 'The file has no rows with values in it.',
    kind === 'xlsx'
      ? 'Put the extract on a sheet named “data” (or the first sheet), or check that you chose the right file.'
      : 'Check that you chose the right file; export the extract again if needed.',
  );
}

/** More data rows than the limit: `count` when known before reading, null when found while reading. */
export function tooManyRows(count: number | null, max: number): Refusal {
  const n = new Intl.NumberFormat('en-GB');
  return refusal(
    'too_many_rows',
    count === null
      ? `The file has more than ${n.format(max)} rows of data, the most Cairn accepts in one extract.`
      : `The file has ${n.format(count)} rows of data; Cairn accepts at most ${n.format(max)} in one extract.`,
    'Check that the file holds one practice’s people with diabetes, one row each; if the practice really has more, ask the regional lead to raise the limit.',
    { max },
  );
}

export function noHeader(): Refusal {
  return refusal(
    'no_header_row',
    `Cairn could not find the heading row: none of the first ${HEADER_SEARCH_ROWS} rows with values names at least three of Cairn’s columns (record_ref, birth_year, sex, diabetes_type, …).`,
    'Put Cairn’s headings in the first row, exactly as in the template, or start from Cairn’s template.',
  );
}

export function headerOnly(headerRow: number | null): Refusal {
  return refusal(
    'header_only',
    `The file has the headings (row ${headerRow}) but no rows of data below them.`,
    'Check that you chose the right file; export the extract again with the people included.',
  );
}

export function noValidRows(rowsRead: number): Refusal {
  return refusal(
    'no_valid_rows',
    `None of the ${rowsRead} rows could be accepted: every row has at least one error (listed in the report).`,
    'Fix the errors listed in the report (the first rows usually show what is wrong with all of them) and upload the file again.',
  );
}

// ───────────────────────────── notes, once the headings are found ─────────────────────────────

/** Columns Cairn ignores: headings not in its format, and columns without a heading. */
export function headingNotes(mapping: HeaderMapping): Issue[] {
  return mapping.warnings.map((w) =>
    w.code === 'unknown_column'
      ? makeIssue(
          'unknown_column',
          null,
          w.heading,
          null,
          `The column “${w.heading}” (column ${w.column}) is not part of Cairn’s extract format; Cairn ignored it.`,
          'Nothing to fix if the column is not needed; check the spelling if it should be one of Cairn’s columns.',
        )
      : makeIssue(
          'unnamed_column',
          null,
          w.column,
          null,
          `Column ${w.column} has no heading; Cairn ignored it.`,
          'Give the column one of Cairn’s headings if it holds data Cairn needs; otherwise delete it.',
        ),
  );
}

/** Rows with values above the heading row (titles, notes), which Cairn ignored. */
export function rowsAboveHeaderNote(headerRow: number, rows: number[]): Issue | null {
  if (rows.length === 0) return null;
  return makeIssue(
    'rows_above_header',
    null,
    null,
    null,
    `Cairn found the headings on row ${headerRow} and ignored the ${rows.length === 1 ? 'row' : `${rows.length} rows`} above them (row${rows.length === 1 ? '' : 's'} ${listRows(rows)}).`,
    'Nothing to fix if those rows are titles or notes; if they hold people, move the headings to the top.',
  );
}

/** What the workbook's layout may hide: merged cells, hidden rows and columns, other sheets. */
export function workbookNotes(notes: SourceNotes, headerRow: number): Issue[] {
  const issues = mergedCellNotes(notes.merges, headerRow);
  const hiddenRows = hiddenRowsNote(notes.hiddenRows.filter((r) => r > headerRow));
  if (hiddenRows) issues.push(hiddenRows);
  const hiddenColumns = hiddenColumnsNote(notes.hiddenColumns);
  if (hiddenColumns) issues.push(hiddenColumns);
  const otherSheets = otherSheetsNote(notes.sheetName, notes.otherSheets);
  if (otherSheets) issues.push(otherSheets);
  return issues;
}

/** Merged heading cells, and merged cells below them (their value read into every cell). */
function mergedCellNotes(merges: readonly CellRange[], headerRow: number): Issue[] {
  const issues: Issue[] = [];
  for (const m of merges) {
    if (m.bottom < headerRow) continue;
    if (m.top <= headerRow) {
      issues.push(
        makeIssue(
          'merged_cells',
          headerRow,
          null,
          m.ref,
          `Heading cells ${m.ref} are merged, so only the first of those columns has a heading.`,
          'Unmerge the heading cells and give every column its own heading.',
        ),
      );
    } else {
      issues.push(
        makeIssue(
          'merged_cells',
          m.top,
          columnLetter(m.left - 1),
          m.ref,
          `Cells ${m.ref} are merged; Cairn used the value shown in them for every cell of the range${m.bottom > m.top ? ` (rows ${m.top} to ${m.bottom})` : ''}.`,
          'Unmerge the cells and fill in each row, to be sure every person has the right value.',
        ),
      );
    }
  }
  return issues;
}

/** Hidden rows below the headings, which Cairn read like the others. */
function hiddenRowsNote(rows: number[]): Issue | null {
  if (rows.length === 0) return null;
  return makeIssue(
    'hidden_rows',
    null,
    null,
    null,
    `${rows.length === 1 ? 'Row' : 'Rows'} ${listRows(rows)} ${rows.length === 1 ? 'is' : 'are'} hidden in the spreadsheet; Cairn read ${rows.length === 1 ? 'it' : 'them'} like any other row.`,
    'Unhide the rows to check them, and delete any you did not mean to send.',
  );
}

/** Hidden columns (1-based positions), which Cairn read like the others. */
function hiddenColumnsNote(columns: number[]): Issue | null {
  if (columns.length === 0) return null;
  const letters = columns.map((c) => columnLetter(c - 1));
  return makeIssue(
    'hidden_columns',
    null,
    null,
    null,
    `${letters.length === 1 ? 'Column' : 'Columns'} ${joinList(letters.slice(0, 12))}${letters.length > 12 ? ` and ${letters.length - 12} more` : ''} ${letters.length === 1 ? 'is' : 'are'} hidden in the spreadsheet; Cairn read ${letters.length === 1 ? 'it' : 'them'} like the others.`,
    'Unhide the columns to check what they hold.',
  );
}

/** Sheets other than the one read (the template's own sheets aside). */
function otherSheetsNote(sheetName: string | null, otherSheets: string[]): Issue | null {
  const others = otherSheets.filter((s) => !TEMPLATE_SHEETS.has(s.trim().toLowerCase()));
  if (others.length === 0) return null;
  const named = (sheetName ?? '').trim().toLowerCase() === 'data';
  return makeIssue(
    'other_sheets',
    null,
    null,
    null,
    named
      ? `The workbook has other sheets (${joinList(others.map((s) => `“${s}”`))}); Cairn read only the sheet “${sheetName}”.`
      : `The workbook has no sheet named “data”, so Cairn read the first sheet, “${sheetName}”, and not ${joinList(others.map((s) => `“${s}”`))}.`,
    named
      ? 'Nothing to fix if the extract is on the sheet “data”.'
      : 'Name the sheet that holds the extract “data” so that Cairn reads the right one.',
  );
}

// ───────────────────────────── notes that need the whole file ─────────────────────────────

/** On the first row of each repeated record_ref: kept, and where it appears again. */
export function repeatedRefNotes(
  repeatedRefs: ReadonlyMap<number, number[]>,
  heading: string,
): Issue[] {
  const issues: Issue[] = [];
  for (const [first, later] of repeatedRefs) {
    const issue = makeIssue(
      'duplicate_record_ref_kept',
      first,
      heading,
      null,
      `The record_ref of this row appears again on row${later.length === 1 ? '' : 's'} ${listRows(later)}, which Cairn refused; this row was kept.`,
      'Check which row is right for this person; keep only that one next time.',
    );
    issue.key = 'record_ref';
    issues.push(issue);
  }
  return issues;
}

export function blankRowsNote(rows: number[]): Issue | null {
  if (rows.length === 0) return null;
  return makeIssue(
    'blank_rows',
    null,
    null,
    null,
    `${rows.length === 1 ? 'One blank row was' : `${rows.length} blank rows were`} skipped (row${rows.length === 1 ? '' : 's'} ${listRows(rows)}).`,
    'Nothing to fix; delete blank rows if you want the row numbers to match.',
  );
}

/** Rows with values to the right of the last heading, from `firstColumn` (a letter) on. */
export function extraCellsNote(rowCount: number, firstColumn: string): Issue | null {
  if (rowCount <= 0) return null;
  return makeIssue(
    'extra_cells',
    null,
    firstColumn,
    null,
    `${rowCount === 1 ? 'One row has' : `${rowCount} rows have`} values to the right of the last heading (from column ${firstColumn}); Cairn ignored them.`,
    'Give those columns a heading if they belong to the extract, or delete them.',
  );
}

/** Formula cells whose saved results Cairn used. */
export function formulasNote(cells: number): Issue | null {
  if (cells <= 0) return null;
  return makeIssue(
    'formulas_used',
    null,
    null,
    null,
    `${cells === 1 ? 'One cell holds a formula' : `${cells} cells hold formulas`}; Cairn used the result${cells === 1 ? '' : 's'} saved in the file.`,
    'Nothing to fix if the results are right; to be sure, paste the values in place of the formulas before uploading.',
  );
}
