/**
 * Rows of a CSV extract: UTF-8 with or without a byte-order mark (UTF-16
 * with a mark also, as "Unicode text" exports are), comma, semicolon or tab
 * delimited (detected from the heading row), quoted fields with embedded
 * line breaks (RFC 4180).
 *
 * A quote-aware pass first finds record boundaries, counts the records
 * holding values (row limit, progress) and catches an unclosed quote; the
 * records are then read in slices of 250, so the API keeps answering while
 * a large file is read. A slice with a quote mark anywhere in it is parsed
 * by papaparse; one without (most exports quote nothing) is split at line
 * breaks and delimiters, which gives the same cells: on a 100,000-row file
 * papaparse spent more time in the garbage collector than in parsing.
 */
import Papa from 'papaparse';
import { type Refusal, refusal } from '../format/issue-codes.js';
import type { Cell } from '../format/values.js';
import type { RowSource, SourceNotes, SourceRow } from './row-source.js';

const SLICE = 250;

export class CsvRowSource implements RowSource {
  readonly kind = 'csv' as const;
  readonly date1904 = false;
  formulaCells = 0;

  constructor(
    private readonly text: string,
    private readonly delimiter: string,
    private readonly newline: string,
    /** String offsets where every SLICE-th record starts, and the end */
    private readonly boundaries: number[],
    /** Per slice, whether it holds a quote mark (and needs papaparse) */
    private readonly quotedSlices: Uint8Array,
    readonly valuedRows: number,
    readonly notes: SourceNotes,
  ) {}

  async *batches(): AsyncGenerator<SourceRow[]> {
    let row = 0;
    for (let i = 0; i + 1 < this.boundaries.length; i++) {
      const start = this.boundaries[i]!;
      let end = this.boundaries[i + 1]!;
      if (this.text.endsWith(this.newline, end) && end - this.newline.length >= start)
        end -= this.newline.length;
      const slice = this.text.slice(start, end);
      const records = this.quotedSlices[i]
        ? Papa.parse<string[]>(slice, {
            delimiter: this.delimiter,
            newline: this.newline as '\r\n',
            quoteChar: '"',
            escapeChar: '"',
            header: false,
            skipEmptyLines: false,
            dynamicTyping: false,
          }).data
        : slice.split(this.newline).map((line) => line.split(this.delimiter));
      const batch: SourceRow[] = new Array<SourceRow>(records.length);
      for (let r = 0; r < records.length; r++) {
        // The parsed record becomes the row's cells in place (blank fields read as null).
        const cells = records[r]! as Cell[];
        for (let c = 0; c < cells.length; c++) if (cells[c] === '') cells[c] = null;
        batch[r] = { row: ++row, cells };
      }
      yield batch;
      // Let other requests (progress polls) through between slices.
      await new Promise<void>((resolve) => setImmediate(resolve));
    }
  }
}

function decode(buf: Buffer): { text: string; encoding: string } | { refusal: Refusal } {
  if (buf[0] === 0xff && buf[1] === 0xfe)
    return { text: new TextDecoder('utf-16le').decode(buf.subarray(2)), encoding: 'UTF-16' };
  if (buf[0] === 0xfe && buf[1] === 0xff)
    return { text: new TextDecoder('utf-16be').decode(buf.subarray(2)), encoding: 'UTF-16' };
  const bom = buf[0] === 0xef && buf[1] === 0xbb && buf[2] === 0xbf;
  try {
    const text = new TextDecoder('utf-8', { fatal: true }).decode(bom ? buf.subarray(3) : buf);
    return { text, encoding: bom ? 'UTF-8 with byte-order mark' : 'UTF-8' };
  } catch {
    const bad = firstInvalidUtf8(buf);
    const line = buf.subarray(0, bad).reduce((n, b) => (b === 0x0a ? n + 1 : n), 1);
    return {
      refusal: refusal(
        'not_utf8',
        `The file is not saved as UTF-8 text (the first character Cairn cannot read is on line ${line}), so letters such as é or µ would be misread.`,
        'In Excel choose File › Save As › “CSV UTF-8 (Comma delimited)”; in LibreOffice choose “Text CSV” with the character set “Unicode (UTF-8)”. Then upload the new file.',
        { line },
      ),
    };
  }
}

function firstInvalidUtf8(buf: Buffer): number {
  let i = 0;
  while (i < buf.length) {
    const b = buf[i]!;
    const need =
      b < 0x80
        ? 0
        : b >= 0xc2 && b < 0xe0
          ? 1
          : b >= 0xe0 && b < 0xf0
            ? 2
            : b >= 0xf0 && b < 0xf5
              ? 3
              : -1;
    if (need < 0) return i;
    for (let k = 1; k <= need; k++) if (((buf[i + k] ?? 0) & 0xc0) !== 0x80) return i;
    i += need + 1;
  }
  return i;
}

/** Opens CSV bytes: decoding, delimiter and line breaks, record boundaries, and the checks that refuse a file. */
export function openCsv(buf: Buffer): { source: CsvRowSource } | { refusal: Refusal } {
  const decoded = decode(buf);
  if ('refusal' in decoded) return decoded;
  const text = decoded.text.replace(/^\uFEFF/, '');
  const lf = text.indexOf('\n');
  const newline =
    lf > 0 && text[lf - 1] === '\r' ? '\r\n' : lf >= 0 ? '\n' : text.includes('\r') ? '\r' : '\n';
  const delimiter = detectDelimiter(text);

  const Q = 34;
  const D = delimiter.charCodeAt(0);
  const NL = newline === '\r' ? '\r' : '\n';
  const NLC = NL.charCodeAt(0);
  const boundaries: number[] = [0];
  const quotedSlices = new Uint8Array(Math.floor(text.length / SLICE) + 2);
  let records = 0;
  let valued = 0;
  let inQuotes = false;
  let quoteOpenedAtRecord = 0;
  const n = text.length;
  let nextQuote = text.indexOf('"');
  let pos = 0;
  while (pos < n) {
    if (nextQuote !== -1 && nextQuote < pos) nextQuote = text.indexOf('"', pos);
    let end = text.indexOf(NL, pos);
    if (end === -1) end = n;
    let hasValue = false;
    if (nextQuote !== -1 && nextQuote < end) {
      quotedSlices[boundaries.length - 1] = 1;
      // A record with quotes: walk it character by character (quoted fields may hold line breaks).
      let i = pos;
      for (; i < n; i++) {
        const ch = text.charCodeAt(i);
        if (ch === Q) {
          if (!inQuotes) quoteOpenedAtRecord = records;
          inQuotes = !inQuotes;
          hasValue = true;
        } else if (inQuotes) {
          hasValue = true;
        } else if (ch === NLC) {
          break;
        } else if (ch !== D && ch !== 32 && ch !== 13 && ch !== 9) {
          hasValue = true;
        }
      }
      if (inQuotes) break;
      end = i;
    } else {
      for (let i = pos; i < end; i++) {
        const ch = text.charCodeAt(i);
        if (ch !== D && ch !== 32 && ch !== 13 && ch !== 9) {
          hasValue = true;
          break;
        }
      }
    }
    records++;
    if (hasValue) valued++;
    if (records % SLICE === 0 && end + 1 < n) boundaries.push(end + 1);
    pos = end + 1;
  }
  if (inQuotes) {
    return {
      refusal: refusal(
        'csv_malformed',
        `A quote mark (") opened on row ${quoteOpenedAtRecord + 1} is never closed, so the rest of the file would be read as one cell.`,
        `Check row ${quoteOpenedAtRecord + 1} for a stray quote mark, or export the CSV again from your spreadsheet program.`,
        { row: quoteOpenedAtRecord + 1 },
      ),
    };
  }
  if (boundaries[boundaries.length - 1] !== n) boundaries.push(n);
  return {
    source: new CsvRowSource(text, delimiter, newline, boundaries, quotedSlices, valued, {
      sheetName: null,
      otherSheets: [],
      merges: [],
      hiddenRows: [],
      hiddenColumns: [],
      delimiter,
      encoding: decoded.encoding,
    }),
  };
}

/** The delimiter used most often outside quotes on the first line that has any. */
function detectDelimiter(text: string): string {
  const counts = { ',': 0, ';': 0, '\t': 0 };
  let inQuotes = false;
  for (let i = 0; i < text.length && i < 1_000_000; i++) {
    const ch = text[i]!;
    if (ch === '"') inQuotes = !inQuotes;
    else if (!inQuotes) {
      if (ch === '\n' || ch === '\r') {
        if (counts[','] + counts[';'] + counts['\t'] > 0) break;
      } else if (ch === ',' || ch === ';' || ch === '\t') counts[ch]++;
    }
  }
  if (counts[';'] > counts[','] && counts[';'] >= counts['\t']) return ';';
  if (counts['\t'] > counts[','] && counts['\t'] > counts[';']) return '\t';
  return ',';
}
