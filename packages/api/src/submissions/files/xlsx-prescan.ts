/**
 * A cheap second look at an XLSX workbook before exceljs streams it:
 *
 * - every XML part is expanded under one byte budget (a "zip bomb" stops at
 *   the cap) and refused if it declares a DOCTYPE or entities (Excel never
 *   writes them; they are how XML entity expansion attacks work);
 * - the sheet to read: the one named "data", else the first;
 * - what the streaming reader cannot see: merged cells, hidden rows and
 *   columns, and how many rows hold values (for the row limit and progress).
 */
import { type Refusal, refusal } from '../format/issue-codes.js';
import { encrypted, unreadable } from './sniff.js';
import { inflateEntry, type InflateBudget, ZipError, type ZipEntry } from './zip.js';

export interface CellRange {
  ref: string;
  top: number;
  left: number;
  bottom: number;
  right: number;
}

export interface XlsxPrescan {
  sheetName: string;
  sheetPath: string;
  otherSheets: string[];
  date1904: boolean;
  /** Rows holding at least one value */
  valuedRows: number;
  merges: CellRange[];
  hiddenRows: number[];
  /** 1-based column numbers hidden in the sheet */
  hiddenColumns: number[];
}

const decodeXml = (s: string) =>
  s
    .replace(/&lt;/g, '<')
    .replace(/&gt;/g, '>')
    .replace(/&quot;/g, '"')
    .replace(/&apos;/g, "'")
    .replace(/&amp;/g, '&');

const attr = (tag: string, name: string) => {
  const m = new RegExp(`\\s${name}="([^"]*)"`).exec(tag);
  return m ? decodeXml(m[1]!) : null;
};

const DTD = /<!DOCTYPE|<!ENTITY/i;

function columnNumber(letters: string): number {
  let n = 0;
  for (const ch of letters.toUpperCase()) n = n * 26 + (ch.charCodeAt(0) - 64);
  return n;
}

export function parseRange(ref: string): CellRange | null {
  const m = /^([A-Z]+)(\d+)(?::([A-Z]+)(\d+))?$/i.exec(ref);
  if (!m) return null;
  const left = columnNumber(m[1]!);
  const top = Number(m[2]);
  const right = m[3] ? columnNumber(m[3]) : left;
  const bottom = m[4] ? Number(m[4]) : top;
  return {
    ref,
    top: Math.min(top, bottom),
    left: Math.min(left, right),
    bottom: Math.max(top, bottom),
    right: Math.max(left, right),
  };
}

export class PrescanRefusal extends Error {
  constructor(readonly refusal: Refusal) {
    super(refusal.message);
  }
}

function tooLarge(capBytes: number): Refusal {
  return refusal(
    'uncompressed_too_large',
    `The workbook expands to more than ${Math.round(capBytes / 1_048_576)} MB when opened, far more than an extract needs, so Cairn stopped reading it.`,
    'Save only the data sheet, without images or other sheets, as a new .xlsx workbook (or as CSV UTF-8), and upload that.',
  );
}

const entitiesRefusal = (part: string) =>
  refusal(
    'xml_entities',
    `The workbook part ${part} contains XML declarations (DOCTYPE or ENTITY) that spreadsheet programs never write; Cairn does not open such files.`,
    'Open the file in Excel or LibreOffice, save it again as .xlsx, and upload the new file.',
  );

async function readText(buf: Buffer, entry: ZipEntry, budget: InflateBudget): Promise<string> {
  const chunks: Buffer[] = [];
  await inflateEntry(buf, entry, budget, (chunk) => {
    chunks.push(chunk);
  });
  const text = Buffer.concat(chunks).toString('utf8');
  if (DTD.test(text.slice(0, 4096))) throw new PrescanRefusal(entitiesRefusal(entry.name));
  return text;
}

/** What the workbook says of itself: the sheet to read, and the byte budget its other parts left. */
export interface XlsxPlan {
  sheetName: string;
  sheetPath: string;
  otherSheets: string[];
  date1904: boolean;
  /** The chosen sheet's part, not yet expanded */
  sheet: ZipEntry;
  /** What is left of the byte budget for expanding the chosen sheet */
  budget: InflateBudget;
}

/** What only a scan of the whole chosen sheet tells. */
export interface SheetFacts {
  valuedRows: number;
  merges: CellRange[];
  hiddenRows: number[];
  hiddenColumns: number[];
}

/** A zip failure as the refusal a practice lead reads; anything else is rethrown. */
function asRefusal(error: unknown, capBytes: number): never {
  if (error instanceof PrescanRefusal) throw error;
  if (error instanceof ZipError) {
    if (error.reason === 'too_large') throw new PrescanRefusal(tooLarge(capBytes));
    if (error.reason === 'encrypted') throw new PrescanRefusal(encrypted());
    throw new PrescanRefusal(unreadable(error.message));
  }
  throw error;
}

/** Expands one part under the budget for its checks only, refusing declarations in its head. */
async function checkPart(buf: Buffer, entry: ZipEntry, budget: InflateBudget): Promise<void> {
  let first = true;
  await inflateEntry(buf, entry, budget, (chunk) => {
    if (first) {
      first = false;
      if (DTD.test(chunk.toString('latin1', 0, 4096)))
        throw new PrescanRefusal(entitiesRefusal(entry.name));
    }
  });
}

/**
 * Everything of the prescan but the chosen sheet's own scan: which sheet to read, and every
 * other XML part expanded under the byte budget and checked for declarations. These parts are
 * small, and exceljs reads some of them (shared strings, styles) whole before the sheet, so they
 * are checked before exceljs is given the file.
 */
export async function planXlsx(
  buf: Buffer,
  entries: ZipEntry[],
  capBytes: number,
): Promise<XlsxPlan> {
  const byName = new Map(entries.map((e) => [e.name, e]));
  const declared = entries.reduce((sum, e) => sum + e.uncompressedSize, 0);
  if (declared > capBytes) throw new PrescanRefusal(tooLarge(capBytes));
  if (entries.some((e) => e.encrypted)) throw new PrescanRefusal(encrypted());
  const budget: InflateBudget = { remaining: capBytes };
  try {
    const workbookEntry = byName.get('xl/workbook.xml')!;
    const workbook = await readText(buf, workbookEntry, budget);
    const relsEntry = byName.get('xl/_rels/workbook.xml.rels');
    if (!relsEntry) throw new PrescanRefusal(unreadable('the list of its sheets is missing'));
    const rels = await readText(buf, relsEntry, budget);
    const targets = new Map<string, string>();
    for (const m of rels.matchAll(/<Relationship\b[^>]*>/g)) {
      const id = attr(m[0], 'Id');
      const target = attr(m[0], 'Target');
      if (id && target) targets.set(id, target.replace(/^\/?xl\//, '').replace(/^\//, ''));
    }
    const sheets: { name: string; path: string }[] = [];
    for (const m of workbook.matchAll(/<(?:\w+:)?sheet\b[^>]*>/g)) {
      const name = attr(m[0], 'name');
      const rid = attr(m[0], 'r:id') ?? /\s\w+:id="([^"]*)"/.exec(m[0])?.[1] ?? null;
      const target = rid ? targets.get(rid) : undefined;
      if (name !== null && target) sheets.push({ name, path: `xl/${target}` });
    }
    const worksheets = sheets.filter(
      (s) => /^xl\/worksheets\/sheet\d+\.xml$/.test(s.path) && byName.has(s.path),
    );
    if (worksheets.length === 0)
      throw new PrescanRefusal(unreadable('it has no worksheet Cairn can read'));
    const chosen = worksheets.find((s) => s.name.trim().toLowerCase() === 'data') ?? worksheets[0]!;
    const date1904 = /<(?:\w+:)?workbookPr\b[^>]*\sdate1904="(1|true)"/.test(workbook);
    const sheet = byName.get(chosen.path)!;

    // Every other XML part against the budget and for declarations; the chosen sheet is scanned
    // apart (scanSheet), with what the budget has left.
    for (const entry of entries) {
      if (!/\.(xml|rels|vml)$/i.test(entry.name)) continue;
      if (entry === workbookEntry || entry === relsEntry || entry === sheet) continue;
      await checkPart(buf, entry, budget);
    }
    return {
      sheetName: chosen.name,
      sheetPath: chosen.path,
      otherSheets: sheets.filter((s) => s !== chosen).map((s) => s.name),
      date1904,
      sheet,
      budget,
    };
  } catch (error) {
    asRefusal(error, capBytes);
  }
}

/**
 * The chosen sheet expanded under what is left of the budget: refused if it declares a DOCTYPE
 * or entities, else its rows with values, hidden rows and columns, and merges. `sheet` may be a
 * part alone in `buf` (dataStart 0), as the scan thread receives it (sheet-scan-thread.ts).
 */
export async function scanSheet(
  buf: Buffer,
  sheet: ZipEntry,
  budget: InflateBudget,
  capBytes: number,
): Promise<SheetFacts> {
  const scan = new SheetScan();
  let first = true;
  try {
    await inflateEntry(buf, sheet, budget, (chunk) => {
      if (first) {
        first = false;
        if (DTD.test(chunk.toString('latin1', 0, 4096)))
          throw new PrescanRefusal(entitiesRefusal(sheet.name));
      }
      scan.push(chunk);
    });
  } catch (error) {
    asRefusal(error, capBytes);
  }
  scan.end();
  return {
    valuedRows: scan.valuedRows,
    merges: scan.merges,
    hiddenRows: scan.hiddenRows,
    hiddenColumns: scan.hiddenColumns,
  };
}

/** The whole prescan in one step, the sheet scanned on this thread. */
export async function prescanXlsx(
  buf: Buffer,
  entries: ZipEntry[],
  capBytes: number,
): Promise<XlsxPrescan> {
  const plan = await planXlsx(buf, entries, capBytes);
  const facts = await scanSheet(buf, plan.sheet, plan.budget, capBytes);
  return {
    sheetName: plan.sheetName,
    sheetPath: plan.sheetPath,
    otherSheets: plan.otherSheets,
    date1904: plan.date1904,
    ...facts,
  };
}

const ROW_TAG = Buffer.from('<row', 'latin1');
const ROW_END = Buffer.from('</row>', 'latin1');
const SHEET_DATA = Buffer.from('<sheetData', 'latin1');
const SHEET_DATA_END = Buffer.from('</sheetData>', 'latin1');
const MERGE_CELL = Buffer.from('<mergeCell ', 'latin1');
const VALUE_TAG = Buffer.from('<v', 'latin1');
const INLINE_STRING = Buffer.from('<is>', 'latin1');
const GT = 0x3e;
const SLASH = 0x2f;

/**
 * Position of the next `<row` start tag at or after `from` (not `<rowBreaks` and the like):
 * −1 when there is none, −2 when the bytes end inside a possible tag name.
 */
function nextRowTag(xml: Buffer, from: number): number {
  let at = xml.indexOf(ROW_TAG, from);
  while (at >= 0) {
    if (at + 4 >= xml.length) return -2;
    const next = xml[at + 4];
    // space, tab, line feed, carriage return, '>' or '/'
    if (next === 32 || next === 9 || next === 10 || next === 13 || next === GT || next === SLASH)
      return at;
    at = xml.indexOf(ROW_TAG, at + 4);
  }
  return -1;
}

/**
 * Scans a worksheet's XML in chunks for rows with values, hidden rows and columns, and merges.
 * It searches the expanded bytes themselves and makes text only of the few tags it reads: the
 * sheet of a large extract is a hundred megabytes or more, and turning every chunk of it into a
 * string kept the garbage collector busy while exceljs read the same sheet.
 */
class SheetScan {
  valuedRows = 0;
  hiddenRows: number[] = [];
  hiddenColumns: number[] = [];
  merges: CellRange[] = [];
  private carry: Buffer | null = null;
  private phase: 'head' | 'rows' | 'tail' = 'head';
  private rowNumber = 0;

  push(chunk: Buffer): void {
    const xml = this.carry ? Buffer.concat([this.carry, chunk]) : chunk;
    let pos = 0;
    for (;;) {
      if (this.phase === 'head') {
        const sheetData = xml.indexOf(SHEET_DATA, pos);
        const headEnd = sheetData < 0 ? xml.length - 512 : sheetData;
        const head = xml.toString('latin1', pos, Math.max(pos, headEnd));
        for (const m of head.matchAll(/<col\b[^>]*>/g)) {
          if (/\shidden="(1|true)"/.test(m[0])) {
            const min = Number(attr(m[0], 'min'));
            const max = Math.min(Number(attr(m[0], 'max')), min + 200);
            for (let c = min; c <= max; c++) this.hiddenColumns.push(c);
          }
        }
        if (sheetData < 0) {
          pos = Math.max(pos, headEnd);
          break;
        }
        const close = xml.indexOf(GT, sheetData);
        if (close < 0) {
          pos = sheetData;
          break;
        }
        this.phase = xml[close - 1] === SLASH ? 'tail' : 'rows';
        pos = close + 1;
      } else if (this.phase === 'rows') {
        // Every search below is bounded by the next row, so a chunk is scanned once (a search
        // to the end of the chunk for each row would make the scan quadratic in the chunk size).
        const rowStart = nextRowTag(xml, pos);
        if (rowStart < 0) {
          const dataEnd = xml.indexOf(SHEET_DATA_END, pos);
          if (dataEnd >= 0) {
            this.phase = 'tail';
            pos = dataEnd + SHEET_DATA_END.length;
            continue;
          }
          pos = Math.max(pos, xml.length - 16);
          break;
        }
        // Rows live only inside sheetData: a row tag found means the data has not ended.
        if (rowStart === -2) {
          pos = Math.max(pos, xml.length - 16);
          break;
        }
        const tagEnd = xml.indexOf(GT, rowStart);
        if (tagEnd < 0) {
          pos = rowStart;
          break;
        }
        const tag = xml.toString('latin1', rowStart, tagEnd + 1);
        const r = /\sr="(\d+)"/.exec(tag);
        const rowNumber = r ? Number(r[1]) : this.rowNumber + 1;
        if (xml[tagEnd - 1] === SLASH) {
          this.rowNumber = rowNumber;
          if (/\shidden="(1|true)"/.test(tag)) this.hiddenRows.push(rowNumber);
          pos = tagEnd + 1;
          continue;
        }
        const rowEnd = xml.indexOf(ROW_END, tagEnd);
        // Incomplete row: keep it for the next chunk (its tag will be read again).
        if (rowEnd < 0) {
          pos = rowStart;
          break;
        }
        this.rowNumber = rowNumber;
        if (/\shidden="(1|true)"/.test(tag)) this.hiddenRows.push(rowNumber);
        const body = xml.subarray(tagEnd, rowEnd);
        if (body.indexOf(VALUE_TAG) >= 0 || body.indexOf(INLINE_STRING) >= 0) this.valuedRows++;
        pos = rowEnd + ROW_END.length;
      } else {
        const m = xml.indexOf(MERGE_CELL, pos);
        if (m < 0) {
          pos = Math.max(pos, xml.length - 64);
          break;
        }
        const end = xml.indexOf(GT, m);
        if (end < 0) {
          pos = m;
          break;
        }
        const ref = attr(xml.toString('latin1', m, end + 1), 'ref');
        const range = ref ? parseRange(ref) : null;
        if (range) this.merges.push(range);
        pos = end + 1;
      }
    }
    // What is left (a row cut by the chunk's end) is copied, so the chunk itself can go.
    this.carry = pos < xml.length ? Buffer.from(xml.subarray(pos)) : null;
  }

  end(): void {
    this.carry = null;
  }
}
