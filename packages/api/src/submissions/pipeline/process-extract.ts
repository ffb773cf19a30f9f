/**
 * The extract pipeline, from bytes to validated records: sniff the file,
 * prescan a workbook, find and match the heading row, then stream every row
 * through the validator into the sinks (records for the loader, issues and
 * refused rows for the report). No database here: the caller supplies sinks,
 * so the same code runs in the API's job runner, the demo seeding and the
 * benchmark. Opening the file is here; reading its rows is read-rows.ts, and
 * what is said about the file as a whole is file-notes.ts.
 */
import type { RecordRow } from '../../database/bulk-load/record-columns.js';
import type { IssueCodeKey, Issue, Refusal } from '../format/issue-codes.js';
import { openCsv } from '../files/csv-source.js';
import type { RowSource } from '../files/row-source.js';
import { sniff } from '../files/sniff.js';
import { scanSheetFacts } from '../files/sheet-scan-thread.js';
import { planXlsx, PrescanRefusal } from '../files/xlsx-prescan.js';
import { XlsxRowSource } from '../files/xlsx-source.js';
import type { ValidationContext } from '../validate/row-validator.js';
import { readRows } from './read-rows.js';

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
