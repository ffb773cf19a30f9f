/**
 * Reading the rows of an opened extract into the sinks, in four steps: the file's size is checked
 * against the limits; the heading row is looked for among the first rows with values and matched
 * to Cairn's columns; every data row after it is checked by the row validator and goes, batched,
 * to the sinks (records, issues, refused rows), blank rows and values beyond the headings being
 * counted on the way; then the checks and notes that need the whole file are made. A refusal
 * stops the reading, and is set on the outcome.
 *
 * The data rows are the hot loop of an ingest (100,000 rows and more): it awaits only when a
 * batch is full or a row has issues, never once per row.
 */
import type { RecordRow } from '../../database/bulk-load/record-columns.js';
import type { RowSource } from '../files/row-source.js';
import { unreadable } from '../files/sniff.js';
import { SheetNotReadError } from '../files/xlsx-source.js';
import { ZipError } from '../files/zip.js';
import {
  columnLetter,
  type HeaderMapping,
  knownHeadingCount,
  mapHeader,
} from '../format/header.js';
import type { Issue, Refusal } from '../format/issue-codes.js';
import { type Cell, cellText, isBlank } from '../format/values.js';
import { RowValidator, type ValidationContext } from '../validate/row-validator.js';
import {
  blankRowsNote,
  emptyFile,
  extraCellsNote,
  formulasNote,
  HEADER_SEARCH_ROWS,
  headerOnly,
  headerRefusal,
  headingNotes,
  noHeader,
  noValidRows,
  repeatedRefNotes,
  rowsAboveHeaderNote,
  tooManyRows,
  workbookNotes,
} from './file-notes.js';
import type {
  ExtractLimits,
  ExtractOutcome,
  ExtractSinks,
  RejectedRow,
} from './process-extract.js';

const ISSUE_BATCH = 1000;
const RECORD_BATCH = 50;
const REJECTED_BATCH = 500;
/** Data rows after which the record references are checked for national health numbers */
const NATIONAL_NUMBER_SAMPLE = 200;

/** Reads every row of `source` into the sinks; the outcome's counts, notes and any refusal. */
export async function readRows(
  source: RowSource,
  outcome: ExtractOutcome,
  context: ValidationContext,
  submissionId: number,
  limits: ExtractLimits,
  sinks: ExtractSinks,
): Promise<ExtractOutcome> {
  outcome.sheetName = source.notes.sheetName;
  outcome.delimiter = source.notes.delimiter;
  outcome.encoding = source.notes.encoding;
  const reading = new ExtractRows(source, outcome, context, submissionId, limits, sinks);
  const refused = await reading.read();
  if (refused) outcome.refusal = refused;
  return outcome;
}

/** The sinks, batched: issues (counted by code and severity as they come), records, refused rows. */
class SinkBatches {
  private issues: Issue[] = [];
  private records: RecordRow[] = [];
  private rejected: RejectedRow[] = [];

  constructor(
    private readonly sinks: ExtractSinks,
    private readonly outcome: ExtractOutcome,
  ) {}

  async addIssue(issue: Issue): Promise<void> {
    const counts = this.outcome.counts;
    this.issues.push(issue);
    this.outcome.issueCounts[issue.code] = (this.outcome.issueCounts[issue.code] ?? 0) + 1;
    if (issue.severity === 'error') counts.errors++;
    else if (issue.severity === 'warning') counts.warnings++;
    else counts.flags++;
    if (this.issues.length >= ISSUE_BATCH) await this.flushIssues();
  }

  /** Keeps an accepted record; true when its batch is full (flushRecords, then). */
  keepRecord(record: RecordRow): boolean {
    this.records.push(record);
    return this.records.length >= RECORD_BATCH;
  }

  /** Keeps a refused row as given; true when its batch is full (flushRejected, then). */
  keepRejected(row: number, cells: readonly Cell[]): boolean {
    this.rejected.push({ row, cells: cells.map((c) => cellText(c)) });
    return this.rejected.length >= REJECTED_BATCH;
  }

  async flushIssues(): Promise<void> {
    if (this.issues.length === 0) return;
    const batch = this.issues;
    this.issues = [];
    await this.sinks.issues(batch);
  }

  async flushRecords(): Promise<void> {
    if (this.records.length === 0) return;
    const batch = this.records;
    this.records = [];
    await this.sinks.records(batch);
  }

  async flushRejected(): Promise<void> {
    if (this.rejected.length === 0) return;
    const batch = this.rejected;
    this.rejected = [];
    await this.sinks.rejectedRows(batch);
  }
}

class ExtractRows {
  private readonly batches: SinkBatches;
  /** Set once the heading row is found and matched */
  private mapping: HeaderMapping | null = null;
  private validator: RowValidator | null = null;
  /** Rows with values read while looking for the heading row */
  private readonly beforeHeader: { row: number; cells: Cell[] }[] = [];
  private headerWidth = 0;
  private dataRows = 0;
  private lastRow = 0;
  /** Blank rows not yet followed by a data row (blank rows at the end are not worth a note) */
  private pendingBlank: number[] = [];
  private readonly blankRows: number[] = [];
  private extraCellRows = 0;
  private firstExtraColumn = '';
  private readonly rowsTotal: number;
  private lastProgress = 0;

  constructor(
    private readonly source: RowSource,
    private readonly outcome: ExtractOutcome,
    private readonly context: ValidationContext,
    private readonly submissionId: number,
    private readonly limits: ExtractLimits,
    private readonly sinks: ExtractSinks,
  ) {
    this.batches = new SinkBatches(sinks, outcome);
    this.rowsTotal = Math.max(0, source.valuedRows - 1);
  }

  /** The steps in order; the refusal that stopped the file, or null. */
  async read(): Promise<Refusal | null> {
    const { source, limits } = this;
    if (source.valuedRows === 0) return emptyFile(source.kind, source.notes.sheetName);
    if (source.valuedRows - 1 > limits.maxRows)
      return tooManyRows(source.valuedRows - 1, limits.maxRows);
    return (await this.readEveryRow()) ?? (await this.finish());
  }

  /** The heading row, then every data row through the validator into the sinks. */
  private async readEveryRow(): Promise<Refusal | null> {
    const counts = this.outcome.counts;
    const batches = this.batches;
    try {
      for await (const batch of this.source.batches()) {
        for (const { row, cells } of batch) {
          if (this.mapping === null) {
            const refused = await this.lookForHeading(row, cells);
            if (refused) return refused;
            continue;
          }
          if (this.skipsAsBlank(row, cells)) continue;
          const overLimit = this.countDataRow(cells);
          if (overLimit) return overLimit;
          const result = this.validator!.validate(row, cells);
          if (result.kind === 'refused') return result.refusal;
          if (result.kind === 'accepted') {
            counts.rowsAccepted++;
            if (batches.keepRecord(result.record)) await batches.flushRecords();
            if (result.issues) for (const issue of result.issues) await batches.addIssue(issue);
          } else {
            counts.rowsRejected++;
            for (const issue of result.issues) await batches.addIssue(issue);
            if (batches.keepRejected(row, cells)) await batches.flushRejected();
          }
          if (counts.rowsRead === NATIONAL_NUMBER_SAMPLE) {
            const national = this.validator!.nationalNumberRefusal(false);
            if (national) return national;
          }
        }
        if (counts.rowsRead - this.lastProgress >= 1000 || counts.rowsRead < 1000) {
          this.lastProgress = counts.rowsRead;
          await this.sinks.progress(counts.rowsRead, this.rowsTotal);
          await this.sinks.checkpoint?.();
        }
      }
    } catch (error) {
      if (error instanceof SheetNotReadError)
        return unreadable(`the sheet “${error.sheetName}” could not be read`);
      if (error instanceof ZipError) return unreadable(error.message);
      if (isExceljsParseError(error)) return unreadable('its sheet XML is not well formed');
      throw error;
    }
    return null;
  }

  /**
   * A row before the headings: the heading row is the first row with values naming at least
   * three of Cairn's columns, among the first HEADER_SEARCH_ROWS rows with values.
   */
  private async lookForHeading(row: number, cells: Cell[]): Promise<Refusal | null> {
    if (cells.every((c) => isBlank(c))) return null;
    this.beforeHeader.push({ row, cells });
    const texts = cells.map((c) => (typeof c === 'string' ? c : ''));
    if (knownHeadingCount(texts) >= 3) {
      const refused = await this.startData(row, cells);
      if (refused) return refused;
      this.lastRow = row;
      return null;
    }
    if (this.beforeHeader.length >= HEADER_SEARCH_ROWS) return noHeader();
    return null;
  }

  /** The heading row found: its columns matched, the validator made, the notes about the layout. */
  private async startData(headerRow: number, headerCells: Cell[]): Promise<Refusal | null> {
    const outcome = this.outcome;
    outcome.headerRow = headerRow;
    outcome.header = headerCells.map((c) => cellText(c).trim());
    const mapped = mapHeader(outcome.header);
    if ('problems' in mapped) return headerRefusal(mapped.problems);
    const mapping = mapped.mapping;
    this.mapping = mapping;
    this.headerWidth = outcome.header.length;
    outcome.columnsFound = mapping.columns.map((m) => m.def.key);
    outcome.columnsIgnored = mapping.warnings
      .filter((w) => w.code === 'unknown_column')
      .map((w) => w.heading);
    outcome.refColumnIndex = mapping.byKey.get('record_ref')?.index ?? null;
    this.validator = new RowValidator(
      mapping,
      // A workbook in the 1904 date system (older Mac Excel) counts its date serials from 1904.
      this.source.date1904 ? { ...this.context, date1904: true } : this.context,
      this.submissionId,
    );
    const above = this.beforeHeader
      .filter((r) => r.row < headerRow && r.cells.some((c) => !isBlank(c)))
      .map((r) => r.row);
    const notes = [
      ...headingNotes(mapping),
      rowsAboveHeaderNote(headerRow, above),
      ...workbookNotes(this.source.notes, headerRow),
    ];
    for (const issue of notes) if (issue) await this.batches.addIssue(issue);
    return null;
  }

  /**
   * A blank row (and any row the file leaves out: an XLSX has no empty rows) is skipped; it is
   * counted as blank once a data row follows it.
   */
  private skipsAsBlank(row: number, cells: readonly Cell[]): boolean {
    for (let r = this.lastRow + 1; r < row; r++) this.pendingBlank.push(r);
    this.lastRow = row;
    let blank = true;
    for (let c = 0; c < cells.length; c++) {
      if (!isBlank(cells[c]!)) {
        blank = false;
        break;
      }
    }
    if (blank) {
      this.pendingBlank.push(row);
      return true;
    }
    if (this.pendingBlank.length > 0) {
      for (const r of this.pendingBlank) this.blankRows.push(r);
      this.pendingBlank = [];
    }
    return false;
  }

  /** Counts a data row against the limit, and notes values to the right of the last heading. */
  private countDataRow(cells: readonly Cell[]): Refusal | null {
    this.dataRows++;
    this.outcome.counts.rowsRead++;
    if (this.dataRows > this.limits.maxRows) return tooManyRows(null, this.limits.maxRows);
    for (let c = this.headerWidth; c < cells.length; c++) {
      if (!isBlank(cells[c]!)) {
        if (this.extraCellRows === 0) this.firstExtraColumn = columnLetter(c);
        this.extraCellRows++;
        break;
      }
    }
    return null;
  }

  /** The checks and notes that need the whole file; then every batch flushed. */
  private async finish(): Promise<Refusal | null> {
    const { outcome, batches } = this;
    const counts = outcome.counts;
    if (this.mapping === null) return noHeader();
    if (this.dataRows === 0) return headerOnly(outcome.headerRow);
    const national = this.validator!.nationalNumberRefusal(true);
    if (national) return national;

    const refHeading = this.mapping.byKey.get('record_ref')?.heading ?? 'record_ref';
    for (const issue of repeatedRefNotes(this.validator!.repeatedRefs, refHeading))
      await batches.addIssue(issue);
    counts.rowsBlank = this.blankRows.length;
    const notes = [
      blankRowsNote(this.blankRows),
      extraCellsNote(this.extraCellRows, this.firstExtraColumn),
      formulasNote(this.source.formulaCells),
    ];
    for (const issue of notes) if (issue) await batches.addIssue(issue);
    await batches.flushRecords();
    await batches.flushRejected();
    await batches.flushIssues();
    await this.sinks.progress(counts.rowsRead, counts.rowsRead);

    if (counts.rowsAccepted === 0) return noValidRows(counts.rowsRead);
    return null;
  }
}

function isExceljsParseError(error: unknown): boolean {
  const message = (error as Error)?.message ?? '';
  return (
    /Unexpected|Invalid|end of data|unclosed|attribute|saxes|xml/i.test(message) &&
    !(error instanceof TypeError)
  );
}
