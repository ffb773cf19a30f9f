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

export async function prescanXlsx(
  buf: Buffer,
  entries: ZipEntry[],
  capBytes: number,
): Promise<XlsxPrescan> {
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

    // Check every XML part against the budget and for declarations; scan the chosen sheet.
    let scan: SheetScan | null = null;
    for (const entry of entries) {
      if (!/\.(xml|rels|vml)$/i.test(entry.name) || entry === workbookEntry || entry === relsEntry)
        continue;
      if (entry.name === chosen.path) {
        scan = new SheetScan();
        const s = scan;
        let first = true;
        await inflateEntry(buf, entry, budget, (chunk) => {
          const text = chunk.toString('latin1');
          if (first) {
            first = false;
            if (DTD.test(text.slice(0, 4096)))
              throw new PrescanRefusal(entitiesRefusal(entry.name));
          }
          s.push(text);
        });
        s.end();
      } else {
        let first = true;
        await inflateEntry(buf, entry, budget, (chunk) => {
          if (first) {
            first = false;
            if (DTD.test(chunk.toString('latin1', 0, 4096)))
              throw new PrescanRefusal(entitiesRefusal(entry.name));
          }
        });
      }
    }
    const result = scan!;
    return {
      sheetName: chosen.name,
      sheetPath: chosen.path,
      otherSheets: sheets.filter((s) => s !== chosen).map((s) => s.name),
      date1904,
      valuedRows: result.valuedRows,
      merges: result.merges,
      hiddenRows: result.hiddenRows,
      hiddenColumns: result.hiddenColumns,
    };
  } catch (error) {
    if (error instanceof PrescanRefusal) throw error;
    if (error instanceof ZipError) {
      if (error.reason === 'too_large') throw new PrescanRefusal(tooLarge(capBytes));
      if (error.reason === 'encrypted') throw new PrescanRefusal(encrypted());
      throw new PrescanRefusal(unreadable(error.message));
    }
    throw error;
  }
}

/**
 * Position of the next `<row` start tag at or after `from` (not `<rowBreaks` and the like):
 * −1 when there is none, −2 when the text ends inside a possible tag name.
 */
function nextRowTag(text: string, from: number): number {
  let at = text.indexOf('<row', from);
  while (at >= 0) {
    const next = text.charCodeAt(at + 4);
    if (Number.isNaN(next)) return -2;
    // space, tab, line feed, carriage return, '>' or '/'
    if (next === 32 || next === 9 || next === 10 || next === 13 || next === 62 || next === 47)
      return at;
    at = text.indexOf('<row', at + 4);
  }
  return -1;
}

/** Scans a worksheet's XML in chunks for rows with values, hidden rows and columns, and merges. */
class SheetScan {
  valuedRows = 0;
  hiddenRows: number[] = [];
  hiddenColumns: number[] = [];
  merges: CellRange[] = [];
  private carry = '';
  private phase: 'head' | 'rows' | 'tail' = 'head';
  private rowNumber = 0;

  push(chunk: string): void {
    const text = this.carry + chunk;
    let pos = 0;
    for (;;) {
      if (this.phase === 'head') {
        const sheetData = text.indexOf('<sheetData', pos);
        const headEnd = sheetData < 0 ? text.length - 512 : sheetData;
        for (const m of text.slice(pos, Math.max(pos, headEnd)).matchAll(/<col\b[^>]*>/g)) {
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
        const close = text.indexOf('>', sheetData);
        if (close < 0) {
          pos = sheetData;
          break;
        }
        this.phase = text[close - 1] === '/' ? 'tail' : 'rows';
        pos = close + 1;
      } else if (this.phase === 'rows') {
        // Every search below is bounded by the next row, so a chunk is scanned once (a search
        // to the end of the chunk for each row would make the scan quadratic in the chunk size).
        const rowStart = nextRowTag(text, pos);
        if (rowStart < 0) {
          const dataEnd = text.indexOf('</sheetData>', pos);
          if (dataEnd >= 0) {
            this.phase = 'tail';
            pos = dataEnd + 12;
            continue;
          }
          pos = Math.max(pos, text.length - 16);
          break;
        }
        // Rows live only inside sheetData: a row tag found means the data has not ended.
        if (rowStart === -2) {
          pos = Math.max(pos, text.length - 16);
          break;
        }
        const tagEnd = text.indexOf('>', rowStart);
        if (tagEnd < 0) {
          pos = rowStart;
          break;
        }
        const tag = text.slice(rowStart, tagEnd + 1);
        const r = /\sr="(\d+)"/.exec(tag);
        this.rowNumber = r ? Number(r[1]) : this.rowNumber + 1;
        if (/\shidden="(1|true)"/.test(tag)) this.hiddenRows.push(this.rowNumber);
        if (tag.endsWith('/>')) {
          pos = tagEnd + 1;
          continue;
        }
        const rowEnd = text.indexOf('</row>', tagEnd);
        if (rowEnd < 0) {
          // Incomplete row: keep it for the next chunk (the row number will be read again).
          if (/\shidden="(1|true)"/.test(tag)) this.hiddenRows.pop();
          pos = rowStart;
          break;
        }
        const body = text.slice(tagEnd, rowEnd);
        if (body.includes('<v') || body.includes('<is>')) this.valuedRows++;
        pos = rowEnd + 6;
      } else {
        const m = text.indexOf('<mergeCell ', pos);
        if (m < 0) {
          pos = Math.max(pos, text.length - 64);
          break;
        }
        const end = text.indexOf('>', m);
        if (end < 0) {
          pos = m;
          break;
        }
        const ref = attr(text.slice(m, end + 1), 'ref');
        const range = ref ? parseRange(ref) : null;
        if (range) this.merges.push(range);
        pos = end + 1;
      }
    }
    this.carry = text.slice(pos);
  }

  end(): void {
    this.carry = '';
  }
}
