/**
 * Rows of an XLSX workbook through exceljs's streaming WorkbookReader
 * (toolchain.md): date cells arrive as Date objects (styles cached),
 * formulas as { formula, result } (the saved result is used; none saved is
 * a problem cell), errors as { error }. Merged ranges, invisible to the
 * streaming reader, are filled in from the prescan: every cell of a merge
 * shows the value of its top-left cell, as it does on screen.
 *
 * The reader is given the workbook's parts in the order it needs them
 * (readerOrder): otherwise it writes every sheet saved before the shared
 * strings, expanded, to a temporary file and reads it back, and most programs
 * save the sheets first.
 */
import { Readable } from 'node:stream';
import { crc32, createInflateRaw } from 'node:zlib';
import ExcelJS from 'exceljs';
import { type Cell, CellProblem } from '../format/values.js';
import type { RowSource, SourceNotes, SourceRow } from './row-source.js';
import type { CellRange, SheetFacts, XlsxPrescan } from './xlsx-prescan.js';
import { ZipError, type ZipEntry } from './zip.js';

const BATCH = 25;

/**
 * exceljs's streaming reader options: shared strings and styles kept (dates are told by their
 * number format), hyperlinks ignored, each sheet handed out as it is reached.
 */
export const READER_OPTIONS = {
  sharedStrings: 'cache',
  styles: 'cache',
  hyperlinks: 'ignore',
  worksheets: 'emit',
  entries: 'ignore',
} as const;

/** The parts exceljs's streaming reader reads before it can read a sheet without a temporary file */
const READER_FIRST = [
  'xl/_rels/workbook.xml.rels',
  'xl/workbook.xml',
  'xl/styles.xml',
  'xl/sharedStrings.xml',
] as const;
const SHARED_STRINGS = 'xl/sharedStrings.xml';
/** Shared strings with none in them, for a workbook saved with its text in the cells (inline strings). */
const EMPTY_SHARED_STRINGS = Buffer.from(
  '<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n' +
    '<sst xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main" count="0" uniqueCount="0"/>',
);

/**
 * The workbook's bytes in the order exceljs's streaming reader wants them: the workbook, its
 * relationships, styles and shared strings, then the one sheet Cairn reads, and nothing else.
 * exceljs reads a ZIP front to back and parses a sheet at once only if the shared strings and
 * the workbook's relationships came before it; a sheet that comes earlier (the order most
 * programs save in) it writes, expanded, to a temporary file and reads back afterwards. Here no
 * row of an extract is written to disk, and the time that took is saved. Each part is passed on
 * as saved (local header, compressed data, data descriptor), then the central directory, which
 * is all a front-to-back ZIP reader uses; a workbook without shared strings gets an empty set of
 * them, stored uncompressed.
 * Returns null, for the file to be read as saved, when a part the reader needs is missing.
 */
export function readerOrder(
  buf: Buffer,
  entries: readonly ZipEntry[],
  sheetPath: string,
): Buffer[] | null {
  const byName = new Map(entries.map((e) => [e.name, e]));
  const sheet = byName.get(sheetPath);
  if (!sheet || !byName.has('xl/workbook.xml') || !byName.has('xl/_rels/workbook.xml.rels'))
    return null;
  const parts: Buffer[] = [];
  for (const name of READER_FIRST) {
    const entry = byName.get(name);
    if (entry) parts.push(buf.subarray(entry.localOffset, entry.end));
    else if (name === SHARED_STRINGS) parts.push(storedEntry(SHARED_STRINGS, EMPTY_SHARED_STRINGS));
  }
  parts.push(buf.subarray(sheet.localOffset, sheet.end));
  // And the directory after them, as saved: the reader stops at its signature. Without it the
  // input would end exactly where the sheet does, and unzipper, asked for the next signature
  // when the input has just finished, fails with FILE_ENDED though the bytes are in its buffer.
  const directory = entries.reduce((at, e) => Math.max(at, e.end), 0);
  parts.push(buf.subarray(directory));
  return parts;
}

/** Expanded bytes of the sheet kept ready ahead of exceljs (64 KB each: 4 MB) */
const EXPANDED_AHEAD = 64;
const EXPAND_CHUNK = 1 << 16;

/**
 * What exceljs reads: the parts in its order (readerOrder), the sheet among them already
 * expanded and passed on as a stored part. zlib expands the sheet in 64 KB pieces, up to a few
 * megabytes ahead of the XML parser, instead of the 16 KB pieces exceljs's unzipper asks for one
 * at a time (about 0.2 s less per 100,000 rows, measured in alternating ingests). The expanded size must be the one the workbook's directory
 * declares (the local header says so); a sheet expanding to more or less is damaged.
 */
export function readerInput(
  buf: Buffer,
  entries: readonly ZipEntry[],
  sheetPath: string,
): ReaderInput {
  const parts = readerOrder(buf, entries, sheetPath);
  const none = () => null;
  if (!parts) return { input: Readable.from([buf]), problem: none };
  const sheet = entries.find((e) => e.name === sheetPath)!;
  if (sheet.method !== 8 || sheet.encrypted || sheet.uncompressedSize >= 0xffffffff)
    return { input: Readable.from(parts), problem: none };
  const before = parts.slice(0, -2);
  const directory = parts[parts.length - 1]!;
  let problem: ZipError | null = null;
  // The input never fails as a stream (the reader would not hear it, and wait): on a problem it
  // ends short of the sheet's declared size, the reader fails, and problem() says why.
  async function* bytes(): AsyncGenerator<Buffer> {
    yield* before;
    // CRC 0: known only once the sheet is expanded, and the streaming reader does not check it.
    yield storedHeader(sheet.name, sheet.uncompressedSize, 0);
    const inflate = createInflateRaw({ chunkSize: EXPAND_CHUNK });
    inflate.end(buf.subarray(sheet.dataStart, sheet.dataStart + sheet.compressedSize));
    let expanded = 0;
    try {
      for await (const chunk of inflate as AsyncIterable<Buffer>) {
        expanded += chunk.length;
        if (expanded > sheet.uncompressedSize) break;
        yield chunk;
      }
    } catch {
      problem = new ZipError('damaged', `the part ${sheet.name} cannot be expanded`);
      return;
    } finally {
      inflate.destroy();
    }
    if (expanded !== sheet.uncompressedSize) {
      problem = new ZipError(
        'damaged',
        `the part ${sheet.name} is not the size its directory says`,
      );
      return;
    }
    yield directory;
  }
  return {
    input: Readable.from(bytes(), { highWaterMark: EXPANDED_AHEAD }),
    problem: () => problem,
  };
}

export interface ReaderInput {
  input: Readable;
  /** Why the input ended early (the sheet is damaged), once it has */
  problem(): ZipError | null;
}

/** The local file header of an uncompressed part of `size` bytes (APPNOTE.TXT 4.3.7). */
function storedHeader(name: string, size: number, crc: number): Buffer {
  const nameBytes = Buffer.from(name, 'utf8');
  const header = Buffer.alloc(30);
  header.writeUInt32LE(0x04034b50, 0);
  header.writeUInt16LE(10, 4); // version needed to extract: 1.0
  header.writeUInt16LE(0x0800, 6); // the name is UTF-8
  header.writeUInt16LE(0, 8); // stored, not compressed
  header.writeUInt32LE(0, 10); // time and date
  header.writeUInt32LE(crc, 14);
  header.writeUInt32LE(size, 18);
  header.writeUInt32LE(size, 22);
  header.writeUInt16LE(nameBytes.length, 26);
  header.writeUInt16LE(0, 28);
  return Buffer.concat([header, nameBytes]);
}

/** The local file header and data of an uncompressed ZIP part. */
function storedEntry(name: string, data: Buffer): Buffer {
  return Buffer.concat([storedHeader(name, data.length, crc32(data)), data]);
}

export function toCell(value: unknown, onFormula: () => void): Cell {
  if (value === null || value === undefined) return null;
  switch (typeof value) {
    case 'string':
      return value;
    case 'number':
      return Number.isFinite(value) ? value : new CellProblem('error', '#NUM!');
    case 'boolean':
      return value;
    case 'object':
      break;
    default:
      return null;
  }
  if (value instanceof Date) return value;
  const v = value as Record<string, unknown>;
  if ('formula' in v || 'sharedFormula' in v) {
    const formula = String(v.formula ?? v.sharedFormula ?? '');
    if (!('result' in v) || v.result === undefined) return new CellProblem('no_result', formula);
    const result = v.result;
    if (typeof result === 'number' && Number.isNaN(result))
      return new CellProblem('error', '#VALUE!');
    if (result !== null && typeof result === 'object' && 'error' in (result as object)) {
      return new CellProblem('error', String((result as { error: unknown }).error));
    }
    onFormula();
    return toCell(result, () => undefined);
  }
  if ('error' in v) return new CellProblem('error', String(v.error));
  if (Array.isArray(v.richText))
    return (v.richText as { text?: string }[]).map((r) => r.text ?? '').join('');
  if ('text' in v) return typeof v.text === 'string' ? v.text : toCell(v.text, onFormula);
  return null;
}

/** The sheet as the prescan's plan names it (xlsx-prescan.ts, planXlsx). */
export type XlsxSheetPlan = Pick<
  XlsxPrescan,
  'sheetName' | 'sheetPath' | 'otherSheets' | 'date1904'
>;

/**
 * Rows exceljs may read ahead while the sheet's own scan (its row count, merges, hidden rows)
 * is still running, on a thread of its own for a large sheet (sheet-scan-thread.ts). Past this
 * many, reading waits for the scan, so a workbook the scan then refuses has cost little.
 */
const READ_AHEAD_ROWS = 20_000;

export class XlsxRowSource implements RowSource {
  readonly kind = 'xlsx' as const;
  formulaCells = 0;
  readonly date1904: boolean;
  /** Settles once the sheet's scan is done; rejects with its refusal (PrescanRefusal). */
  readonly ready: Promise<void>;
  private facts: SheetFacts | null = null;
  private scanSettled = false;
  private readonly raw: AsyncGenerator<SourceRow[]>;
  /** Batches read while the scan ran, their merges not yet filled */
  private early: SourceRow[][] = [];
  private rawDone = false;
  private readError: unknown = null;
  private readonly readingAhead: Promise<void>;
  private noteCache: SourceNotes | null = null;

  /**
   * Starts reading at once; `facts` (the sheet's scan, usually still running) is needed before
   * the first batch is handed out, and `ready` says when it is known.
   */
  constructor(
    private readonly buf: Buffer,
    private readonly plan: XlsxSheetPlan,
    facts: Promise<SheetFacts> | SheetFacts,
    private readonly entries: readonly ZipEntry[],
  ) {
    this.date1904 = plan.date1904;
    this.ready = Promise.resolve(facts).then(
      (known) => {
        this.facts = known;
        this.scanSettled = true;
      },
      (error: unknown) => {
        this.scanSettled = true;
        throw error;
      },
    );
    this.ready.catch(() => undefined); // the caller awaits it; never an unhandled rejection
    this.raw = this.read();
    this.readingAhead = this.readAhead();
  }

  private known(): SheetFacts {
    if (!this.facts) throw new Error('the sheet scan has not finished');
    return this.facts;
  }

  get valuedRows(): number {
    return this.known().valuedRows;
  }

  get notes(): SourceNotes {
    const facts = this.known();
    this.noteCache ??= {
      sheetName: this.plan.sheetName,
      otherSheets: this.plan.otherSheets,
      merges: facts.merges,
      hiddenRows: facts.hiddenRows,
      hiddenColumns: facts.hiddenColumns,
      delimiter: null,
      encoding: null,
    };
    return this.noteCache;
  }

  /** Reads batches until the scan is done (or enough are waiting). */
  private async readAhead(): Promise<void> {
    let rows = 0;
    try {
      while (!this.scanSettled && rows < READ_AHEAD_ROWS) {
        const next = await this.raw.next();
        if (next.done) {
          this.rawDone = true;
          return;
        }
        this.early.push(next.value);
        rows += next.value.length;
      }
    } catch (error) {
      this.readError = error;
      this.rawDone = true;
    }
  }

  async *batches(): AsyncGenerator<SourceRow[]> {
    await this.ready;
    await this.readingAhead;
    if (this.readError) throw this.readError;
    const merges = new MergeFiller(this.known().merges);
    const fill = (batch: SourceRow[]) => {
      if (merges.active) for (const r of batch) merges.fill(r.row, r.cells);
      return batch;
    };
    const early = this.early;
    this.early = [];
    for (const batch of early) yield fill(batch);
    if (this.rawDone) return;
    for await (const batch of this.raw) yield fill(batch);
  }

  /** Stops reading (the file was refused, or its rows are not wanted). */
  async close(): Promise<void> {
    await this.readingAhead;
    this.early = [];
    await this.raw.return(undefined);
  }

  /** The sheet's rows as exceljs reads them, in batches; merges are filled in by batches(). */
  private read(): AsyncGenerator<SourceRow[]> {
    return readSheet(this.buf, this.entries, this.plan, () => void this.formulaCells++);
  }
}

/**
 * The chosen sheet's rows as exceljs reads them, in batches of BATCH, merges not filled in;
 * `onFormula` counts the formula cells whose saved result was used.
 */
export async function* readSheet(
  buf: Buffer,
  entries: readonly ZipEntry[],
  plan: Pick<XlsxSheetPlan, 'sheetName' | 'sheetPath'>,
  onFormula: () => void,
): AsyncGenerator<SourceRow[]> {
  const { input, problem } = readerInput(buf, entries, plan.sheetPath);
  const reader = new ExcelJS.stream.xlsx.WorkbookReader(input, READER_OPTIONS);
  let batch: SourceRow[] = [];
  let found = false;
  try {
    for await (const worksheet of reader) {
      if (found || (worksheet as unknown as { name: string }).name !== plan.sheetName) continue;
      found = true;
      for await (const row of worksheet) {
        const values = row.values as unknown[];
        const cells: Cell[] = new Array<Cell>(Math.max(0, values.length - 1));
        for (let c = 1; c < values.length; c++) cells[c - 1] = toCell(values[c], onFormula);
        for (let c = 0; c < cells.length; c++) if (cells[c] === undefined) cells[c] = null;
        batch.push({ row: row.number, cells });
        if (batch.length >= BATCH) {
          yield batch;
          batch = [];
        }
      }
    }
  } catch (error) {
    // The reader's own complaint (the input ended early) says less than why it did.
    throw problem() ?? error;
  }
  const damaged = problem();
  if (damaged) throw damaged;
  if (batch.length > 0) yield batch;
  if (!found) throw new SheetNotReadError(plan.sheetName);
}

/** The chosen sheet never came out of the reader (a workbook written by an unusual program). */
export class SheetNotReadError extends Error {
  constructor(readonly sheetName: string) {
    super(`the sheet ${sheetName} could not be read`);
  }
}

/** Fills every cell of a merged range with the value of its top-left cell. */
class MergeFiller {
  private readonly byTop = new Map<number, CellRange[]>();
  private readonly open: { range: CellRange; value: Cell }[] = [];
  readonly active: boolean;

  constructor(merges: readonly CellRange[]) {
    for (const m of merges) {
      if (m.right - m.left > 1000 || m.bottom - m.top > 1_000_000) continue;
      const list = this.byTop.get(m.top);
      if (list) list.push(m);
      else this.byTop.set(m.top, [m]);
    }
    this.active = this.byTop.size > 0;
  }

  fill(rowNumber: number, cells: Cell[]): void {
    for (const range of this.byTop.get(rowNumber) ?? []) {
      this.open.push({ range, value: cells[range.left - 1] ?? null });
    }
    for (let i = this.open.length - 1; i >= 0; i--) {
      const { range, value } = this.open[i]!;
      if (rowNumber > range.bottom) {
        this.open.splice(i, 1);
        continue;
      }
      if (rowNumber < range.top) continue;
      for (let c = range.left; c <= range.right; c++) {
        while (cells.length < c) cells.push(null);
        cells[c - 1] = value;
      }
    }
  }
}
