/**
 * The extract pipeline, from bytes to validated records: sniff the file,
 * prescan a workbook, find and match the heading row, then stream every row
 * through the validator into the sinks (records for the loader, issues and
 * refused rows for the report). No database here: the caller supplies sinks,
 * so the same code runs in the API's job runner, the demo seeding and the
 * benchmark.
 */
import type { RecordRow } from '../../records/record-columns.js';
import {
  columnLetter,
  knownHeadingCount,
  type HeaderMapping,
  mapHeader,
  type HeaderProblem,
} from '../format/header.js';
import {
  type Issue,
  type IssueCodeKey,
  makeIssue,
  type Refusal,
  refusal,
} from '../format/issue-codes.js';
import { type Cell, cellText, isBlank } from '../format/values.js';
import { openCsv } from '../files/csv-source.js';
import type { RowSource } from '../files/row-source.js';
import { sniff, unreadable } from '../files/sniff.js';
import { ZipError } from '../files/zip.js';
import { scanSheetFacts } from '../files/sheet-scan-thread.js';
import { planXlsx, PrescanRefusal } from '../files/xlsx-prescan.js';
import { SheetNotReadError, XlsxRowSource } from '../files/xlsx-source.js';
import { RowValidator, type ValidationContext } from '../validate/row-validator.js';

export interface ExtractLimits {
  maxRows: number;
  maxUncompressedBytes: number;
  maxZipEntries: number;
}

export interface RejectedRow {
  row: number;
  cells: string[];
}

export interface ExtractSinks {
  records(rows: RecordRow[]): Promise<void> | void;
  issues(issues: Issue[]): Promise<void> | void;
  rejectedRows(rows: RejectedRow[]): Promise<void> | void;
  /** Called with rows read so far and the expected total (data rows) */
  progress(rowsDone: number, rowsTotal: number | null): Promise<void> | void;
  /** Throws to stop processing (cancelled, lease lost) */
  checkpoint?(): Promise<void> | void;
}

export interface ExtractCounts {
  rowsRead: number;
  rowsAccepted: number;
  rowsRejected: number;
  rowsBlank: number;
  errors: number;
  warnings: number;
  flags: number;
}

export interface ExtractOutcome {
  kind: 'xlsx' | 'csv' | null;
  refusal: Refusal | null;
  counts: ExtractCounts;
  /** Issues by code (row errors, warnings and flags) */
  issueCounts: Partial<Record<IssueCodeKey, number>>;
  headerRow: number | null;
  /** The heading row as given */
  header: string[];
  /** Cairn columns found, and headings ignored */
  columnsFound: string[];
  columnsIgnored: string[];
  /** Position of record_ref in the row (to pseudonymise refused rows for other viewers) */
  refColumnIndex: number | null;
  sheetName: string | null;
  delimiter: string | null;
  encoding: string | null;
}

const HEADER_SEARCH_ROWS = 20;
const TEMPLATE_SHEETS = new Set([
  'dictionary',
  'data dictionary',
  'instructions',
  'read me',
  'readme',
]);
const ISSUE_BATCH = 1000;
const RECORD_BATCH = 50;
const REJECTED_BATCH = 500;

const listRows = (rows: number[], max = 12) =>
  rows.length <= max
    ? joinList(rows.map(String))
    : `${rows.slice(0, max).join(', ')} and ${rows.length - max} more`;

function joinList(items: string[]): string {
  if (items.length <= 1) return items.join('');
  return `${items.slice(0, -1).join(', ')} and ${items[items.length - 1]}`;
}

export function headerRefusal(problem: HeaderProblem): Refusal {
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

export async function processExtract(
  bytes: Buffer,
  fileName: string,
  context: ValidationContext,
  submissionId: number,
  limits: ExtractLimits,
  sinks: ExtractSinks,
): Promise<ExtractOutcome> {
  const outcome: ExtractOutcome = {
    kind: null,
    refusal: null,
    counts: {
      rowsRead: 0,
      rowsAccepted: 0,
      rowsRejected: 0,
      rowsBlank: 0,
      errors: 0,
      warnings: 0,
      flags: 0,
    },
    issueCounts: {},
    headerRow: null,
    header: [],
    columnsFound: [],
    columnsIgnored: [],
    refColumnIndex: null,
    sheetName: null,
    delimiter: null,
    encoding: null,
  };
  // ── what the file is ──
  const opened = await openExtract(bytes, fileName, limits);
  outcome.kind = opened.kind;
  if ('refusal' in opened) {
    outcome.refusal = opened.refusal;
    return outcome;
  }
  try {
    return await readRows(opened.source, outcome, context, submissionId, limits, sinks);
  } finally {
    await opened.source.close?.();
  }
}

/** What the file is, and its rows ready to be read; or why it is refused. */
export type OpenedExtract =
  { kind: 'xlsx' | 'csv' | null; refusal: Refusal } | { kind: 'xlsx' | 'csv'; source: RowSource };

/** Sniffs the file, prescans a workbook, and opens its row source. */
export async function openExtract(
  bytes: Buffer,
  fileName: string,
  limits: ExtractLimits,
): Promise<OpenedExtract> {
  const sniffed = sniff(bytes, fileName, limits.maxZipEntries);
  if (sniffed.kind === 'refused') return { kind: null, refusal: sniffed.refusal };
  if (sniffed.kind === 'xlsx') {
    const cap = limits.maxUncompressedBytes;
    let source: XlsxRowSource | null = null;
    try {
      const plan = await planXlsx(bytes, sniffed.entries, cap);
      // exceljs starts on the rows while the sheet's scan runs (on a thread of its own when the
      // sheet is large); no row is handed out before the scan is done.
      source = new XlsxRowSource(
        bytes,
        plan,
        scanSheetFacts(bytes, plan.sheet, plan.budget, cap),
        sniffed.entries,
      );
      await source.ready;
      return { kind: 'xlsx', source };
    } catch (error) {
      await source?.close();
      if (error instanceof PrescanRefusal) return { kind: 'xlsx', refusal: error.refusal };
      throw error;
    }
  }
  const opened = openCsv(bytes);
  if ('refusal' in opened) return { kind: 'csv', refusal: opened.refusal };
  return { kind: 'csv', source: opened.source };
}

async function readRows(
  source: RowSource,
  outcome: ExtractOutcome,
  context: ValidationContext,
  submissionId: number,
  limits: ExtractLimits,
  sinks: ExtractSinks,
): Promise<ExtractOutcome> {
  const refuse = (r: Refusal) => {
    outcome.refusal = r;
    return outcome;
  };
  outcome.sheetName = source.notes.sheetName;
  outcome.delimiter = source.notes.delimiter;
  outcome.encoding = source.notes.encoding;

  if (source.valuedRows === 0) {
    return refuse(
      refusal(
        'empty_file',
        source.kind === 'xlsx'
          ? `The sheet “${source.notes.sheetName}” has no values in it.`
          : 'The file has no rows with values in it.',
        source.kind === 'xlsx'
          ? 'Put the extract on a sheet named “data” (or the first sheet), or check that you chose the right file.'
          : 'Check that you chose the right file; export the extract again if needed.',
      ),
    );
  }
  if (source.valuedRows - 1 > limits.maxRows)
    return refuse(tooManyRows(source.valuedRows - 1, limits.maxRows));

  // ── sinks, buffered ──
  let issueBuffer: Issue[] = [];
  const counts = outcome.counts;
  const addIssue = async (issue: Issue) => {
    issueBuffer.push(issue);
    outcome.issueCounts[issue.code] = (outcome.issueCounts[issue.code] ?? 0) + 1;
    if (issue.severity === 'error') counts.errors++;
    else if (issue.severity === 'warning') counts.warnings++;
    else counts.flags++;
    if (issueBuffer.length >= ISSUE_BATCH) await flushIssues();
  };
  const flushIssues = async () => {
    if (issueBuffer.length === 0) return;
    const batch = issueBuffer;
    issueBuffer = [];
    await sinks.issues(batch);
  };
  let recordBuffer: RecordRow[] = [];
  const flushRecords = async () => {
    if (recordBuffer.length === 0) return;
    const batch = recordBuffer;
    recordBuffer = [];
    await sinks.records(batch);
  };
  let rejectedBuffer: RejectedRow[] = [];
  const flushRejected = async () => {
    if (rejectedBuffer.length === 0) return;
    const batch = rejectedBuffer;
    rejectedBuffer = [];
    await sinks.rejectedRows(batch);
  };

  // ── rows ──
  const state = { mapping: null as HeaderMapping | null, validator: null as RowValidator | null };
  const beforeHeader: { row: number; cells: Cell[] }[] = [];
  let headerWidth = 0;
  let dataRows = 0;
  let lastRow = 0;
  let pendingBlank: number[] = [];
  const blankRows: number[] = [];
  let extraCellRows = 0;
  let firstExtraColumn = '';
  const rowsTotal = Math.max(0, source.valuedRows - 1);
  let lastProgress = 0;

  const startData = async (
    headerRowNumber: number,
    headerCells: Cell[],
  ): Promise<Refusal | null> => {
    outcome.headerRow = headerRowNumber;
    outcome.header = headerCells.map((c) => cellText(c).trim());
    const mapped = mapHeader(outcome.header);
    if ('problem' in mapped) return headerRefusal(mapped.problem);
    state.mapping = mapped.mapping;
    headerWidth = outcome.header.length;
    outcome.columnsFound = state.mapping.columns.map((m) => m.def.key);
    outcome.columnsIgnored = state.mapping.warnings
      .filter((w) => w.code === 'unknown_column')
      .map((w) => w.heading);
    outcome.refColumnIndex = state.mapping.byKey.get('record_ref')?.index ?? null;
    state.validator = new RowValidator(
      state.mapping,
      // A workbook in the 1904 date system (older Mac Excel) counts its date serials from 1904.
      source.date1904 ? { ...context, date1904: true } : context,
      submissionId,
    );
    for (const w of state.mapping.warnings) {
      await addIssue(
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
    const aboveHeader = beforeHeader.filter(
      (r) => r.row < headerRowNumber && r.cells.some((c) => !isBlank(c)),
    );
    if (aboveHeader.length > 0) {
      await addIssue(
        makeIssue(
          'rows_above_header',
          null,
          null,
          null,
          `Cairn found the headings on row ${headerRowNumber} and ignored the ${aboveHeader.length === 1 ? 'row' : `${aboveHeader.length} rows`} above them (row${aboveHeader.length === 1 ? '' : 's'} ${listRows(aboveHeader.map((r) => r.row))}).`,
          'Nothing to fix if those rows are titles or notes; if they hold people, move the headings to the top.',
        ),
      );
    }
    await fileNotes(headerRowNumber);
    return null;
  };

  const fileNotes = async (headerRowNumber: number) => {
    const notes = source.notes;
    for (const m of notes.merges) {
      if (m.bottom < headerRowNumber) continue;
      if (m.top <= headerRowNumber) {
        await addIssue(
          makeIssue(
            'merged_cells',
            headerRowNumber,
            null,
            m.ref,
            `Heading cells ${m.ref} are merged, so only the first of those columns has a heading.`,
            'Unmerge the heading cells and give every column its own heading.',
          ),
        );
      } else {
        await addIssue(
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
    const hiddenData = notes.hiddenRows.filter((r) => r > headerRowNumber);
    if (hiddenData.length > 0) {
      await addIssue(
        makeIssue(
          'hidden_rows',
          null,
          null,
          null,
          `${hiddenData.length === 1 ? 'Row' : 'Rows'} ${listRows(hiddenData)} ${hiddenData.length === 1 ? 'is' : 'are'} hidden in the spreadsheet; Cairn read ${hiddenData.length === 1 ? 'it' : 'them'} like any other row.`,
          'Unhide the rows to check them, and delete any you did not mean to send.',
        ),
      );
    }
    if (notes.hiddenColumns.length > 0) {
      const letters = notes.hiddenColumns.map((c) => columnLetter(c - 1));
      await addIssue(
        makeIssue(
          'hidden_columns',
          null,
          null,
          null,
          `${letters.length === 1 ? 'Column' : 'Columns'} ${joinList(letters.slice(0, 12))}${letters.length > 12 ? ` and ${letters.length - 12} more` : ''} ${letters.length === 1 ? 'is' : 'are'} hidden in the spreadsheet; Cairn read ${letters.length === 1 ? 'it' : 'them'} like the others.`,
          'Unhide the columns to check what they hold.',
        ),
      );
    }
    const others = notes.otherSheets.filter((s) => !TEMPLATE_SHEETS.has(s.trim().toLowerCase()));
    if (others.length > 0) {
      const named = (notes.sheetName ?? '').trim().toLowerCase() === 'data';
      await addIssue(
        makeIssue(
          'other_sheets',
          null,
          null,
          null,
          named
            ? `The workbook has other sheets (${joinList(others.map((s) => `“${s}”`))}); Cairn read only the sheet “${notes.sheetName}”.`
            : `The workbook has no sheet named “data”, so Cairn read the first sheet, “${notes.sheetName}”, and not ${joinList(others.map((s) => `“${s}”`))}.`,
          named
            ? 'Nothing to fix if the extract is on the sheet “data”.'
            : 'Name the sheet that holds the extract “data” so that Cairn reads the right one.',
        ),
      );
    }
  };

  try {
    for await (const batch of source.batches()) {
      for (const { row, cells } of batch) {
        if (state.mapping === null) {
          if (cells.every((c) => isBlank(c))) continue;
          beforeHeader.push({ row, cells });
          const texts = cells.map((c) => (typeof c === 'string' ? c : ''));
          if (knownHeadingCount(texts) >= 3) {
            const problem = await startData(row, cells);
            if (problem) return refuse(problem);
            lastRow = row;
            continue;
          }
          if (beforeHeader.length >= HEADER_SEARCH_ROWS) return refuse(noHeader());
          continue;
        }
        // Rows the file skips entirely (an XLSX leaves out empty rows) are blank rows too.
        for (let r = lastRow + 1; r < row; r++) pendingBlank.push(r);
        lastRow = row;
        let blank = true;
        for (let c = 0; c < cells.length; c++) {
          if (!isBlank(cells[c]!)) {
            blank = false;
            break;
          }
        }
        if (blank) {
          pendingBlank.push(row);
          continue;
        }
        if (pendingBlank.length > 0) {
          for (const r of pendingBlank) blankRows.push(r);
          pendingBlank = [];
        }
        dataRows++;
        counts.rowsRead++;
        if (dataRows > limits.maxRows) return refuse(tooManyRows(null, limits.maxRows));
        for (let c = headerWidth; c < cells.length; c++) {
          if (!isBlank(cells[c]!)) {
            if (extraCellRows === 0) firstExtraColumn = columnLetter(c);
            extraCellRows++;
            break;
          }
        }
        const result = state.validator!.validate(row, cells);
        if (result.kind === 'refused') return refuse(result.refusal);
        if (result.kind === 'accepted') {
          counts.rowsAccepted++;
          recordBuffer.push(result.record);
          if (recordBuffer.length >= RECORD_BATCH) await flushRecords();
          if (result.issues) for (const issue of result.issues) await addIssue(issue);
        } else {
          counts.rowsRejected++;
          for (const issue of result.issues) await addIssue(issue);
          rejectedBuffer.push({ row, cells: cells.map((c) => cellText(c)) });
          if (rejectedBuffer.length >= REJECTED_BATCH) await flushRejected();
        }
        if (counts.rowsRead === 200) {
          const national = state.validator!.nationalNumberRefusal(false);
          if (national) return refuse(national);
        }
      }
      if (counts.rowsRead - lastProgress >= 1000 || counts.rowsRead < 1000) {
        lastProgress = counts.rowsRead;
        await sinks.progress(counts.rowsRead, rowsTotal);
        await sinks.checkpoint?.();
      }
    }
  } catch (error) {
    if (error instanceof SheetNotReadError)
      return refuse(unreadable(`the sheet “${error.sheetName}” could not be read`));
    if (error instanceof ZipError) return refuse(unreadable(error.message));
    if (isExceljsParseError(error)) return refuse(unreadable('its sheet XML is not well formed'));
    throw error;
  }

  if (state.mapping === null) return refuse(noHeader());
  if (dataRows === 0) {
    return refuse(
      refusal(
        'header_only',
        `The file has the headings (row ${outcome.headerRow}) but no rows of data below them.`,
        'Check that you chose the right file; export the extract again with the people included.',
      ),
    );
  }
  const national = state.validator!.nationalNumberRefusal(true);
  if (national) return refuse(national);

  // ── file-level notes that need the whole file ──
  for (const [first, later] of state.validator!.repeatedRefs) {
    const issue = makeIssue(
      'duplicate_record_ref_kept',
      first,
      state.mapping.byKey.get('record_ref')?.heading ?? 'record_ref',
      null,
      `The record_ref of this row appears again on row${later.length === 1 ? '' : 's'} ${listRows(later)}, which Cairn refused; this row was kept.`,
      'Check which row is right for this person; keep only that one next time.',
    );
    issue.key = 'record_ref';
    await addIssue(issue);
  }
  counts.rowsBlank = blankRows.length;
  if (blankRows.length > 0) {
    await addIssue(
      makeIssue(
        'blank_rows',
        null,
        null,
        null,
        `${blankRows.length === 1 ? 'One blank row was' : `${blankRows.length} blank rows were`} skipped (row${blankRows.length === 1 ? '' : 's'} ${listRows(blankRows)}).`,
        'Nothing to fix; delete blank rows if you want the row numbers to match.',
      ),
    );
  }
  if (extraCellRows > 0) {
    await addIssue(
      makeIssue(
        'extra_cells',
        null,
        firstExtraColumn,
        null,
        `${extraCellRows === 1 ? 'One row has' : `${extraCellRows} rows have`} values to the right of the last heading (from column ${firstExtraColumn}); Cairn ignored them.`,
        'Give those columns a heading if they belong to the extract, or delete them.',
      ),
    );
  }
  if (source.formulaCells > 0) {
    await addIssue(
      makeIssue(
        'formulas_used',
        null,
        null,
        null,
        `${source.formulaCells === 1 ? 'One cell holds a formula' : `${source.formulaCells} cells hold formulas`}; Cairn used the result${source.formulaCells === 1 ? '' : 's'} saved in the file.`,
        'Nothing to fix if the results are right; to be sure, paste the values in place of the formulas before uploading.',
      ),
    );
  }
  await flushRecords();
  await flushRejected();
  await flushIssues();
  await sinks.progress(counts.rowsRead, counts.rowsRead);

  if (counts.rowsAccepted === 0) {
    return refuse(
      refusal(
        'no_valid_rows',
        `None of the ${counts.rowsRead} rows could be accepted: every row has at least one error (listed in the report).`,
        'Fix the errors listed in the report (the first rows usually show what is wrong with all of them) and upload the file again.',
      ),
    );
  }
  return outcome;
}

function tooManyRows(count: number | null, max: number): Refusal {
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

function noHeader(): Refusal {
  return refusal(
    'no_header_row',
    `Cairn could not find the heading row: none of the first ${HEADER_SEARCH_ROWS} rows with values names at least three of Cairn’s columns (record_ref, birth_year, sex, diabetes_type, …).`,
    'Put Cairn’s headings in the first row, exactly as in the template, or start from Cairn’s template.',
  );
}

function isExceljsParseError(error: unknown): boolean {
  const message = (error as Error)?.message ?? '';
  return (
    /Unexpected|Invalid|end of data|unclosed|attribute|saxes|xml/i.test(message) &&
    !(error instanceof TypeError)
  );
}
