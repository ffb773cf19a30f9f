/**
 * Writes rows in Cairn's extract format as XLSX (exceljs streaming writer)
 * or CSV. Used by the demo scenario generator, the benchmark and the tests,
 * so that what they upload is what a spreadsheet program would produce.
 */
import { createWriteStream } from 'node:fs';
import { PassThrough } from 'node:stream';
import ExcelJS from 'exceljs';

export type ExtractValue =
  | string
  | number
  | boolean
  | Date
  | null
  | { formula: string; result?: string | number | Date | boolean };

export interface ExtractSheet {
  headings: string[];
  rows: Iterable<ExtractValue[]>;
}

export interface CsvOptions {
  delimiter?: ',' | ';' | '\t';
  bom?: boolean;
  newline?: '\n' | '\r\n';
  /** Format for Date values (default ISO YYYY-MM-DD) */
  formatDate?: (date: Date) => string;
  /** Decimal comma for numbers (semicolon files from some locales) */
  decimalComma?: boolean;
}

const iso = (d: Date) => d.toISOString().slice(0, 10);

function csvField(value: ExtractValue, options: CsvOptions, delimiter: string): string {
  let text: string;
  if (value === null || value === undefined) text = '';
  else if (value instanceof Date) text = (options.formatDate ?? iso)(value);
  else if (typeof value === 'object') text = value.result === undefined ? '' : String(value.result);
  else if (typeof value === 'number')
    text = options.decimalComma ? String(value).replace('.', ',') : String(value);
  else text = String(value);
  if (
    text.includes('"') ||
    text.includes(delimiter) ||
    text.includes('\n') ||
    text.includes('\r')
  ) {
    return `"${text.replace(/"/g, '""')}"`;
  }
  return text;
}

export function writeCsv(sheet: ExtractSheet, options: CsvOptions = {}): Buffer {
  const delimiter = options.delimiter ?? ',';
  const newline = options.newline ?? '\r\n';
  const parts: string[] = [
    sheet.headings.map((h) => csvField(h, options, delimiter)).join(delimiter),
  ];
  for (const row of sheet.rows)
    parts.push(row.map((v) => csvField(v, options, delimiter)).join(delimiter));
  const text = parts.join(newline) + newline;
  return Buffer.from((options.bom ? '\uFEFF' : '') + text, 'utf8');
}

export interface XlsxOptions {
  sheetName?: string;
  /** Sheets before the data sheet, each with a few rows of text */
  sheetsBefore?: { name: string; rows: string[][] }[];
  sheetsAfter?: { name: string; rows: string[][] }[];
  /** Rows (1-based, as in the sheet) to hide */
  hiddenRows?: number[];
  /** Ranges to merge, e.g. 'C5:C7' */
  merges?: string[];
  /** Rows written above the heading row (titles) */
  titleRows?: string[][];
  /** Write to this file instead of returning a Buffer */
  filename?: string;
  /** Shared strings table (as Excel writes) or inline strings */
  sharedStrings?: boolean;
  /** Number format of Date cells */
  dateFormat?: string;
}

export async function writeXlsx(
  sheet: ExtractSheet,
  options: XlsxOptions = {},
): Promise<Buffer | null> {
  const chunks: Buffer[] = [];
  const sink = options.filename ? createWriteStream(options.filename) : new PassThrough();
  if (!options.filename) (sink as PassThrough).on('data', (c: Buffer) => chunks.push(c));
  const done = new Promise<void>((resolve, reject) => {
    sink.on(options.filename ? 'finish' : 'end', () => resolve());
    sink.on('error', reject);
  });
  const workbook = new ExcelJS.stream.xlsx.WorkbookWriter({
    stream: sink,
    useSharedStrings: options.sharedStrings ?? false,
    useStyles: true,
  });
  for (const extra of options.sheetsBefore ?? []) {
    const ws = workbook.addWorksheet(extra.name);
    for (const r of extra.rows) ws.addRow(r).commit();
    ws.commit();
  }
  const ws = workbook.addWorksheet(options.sheetName ?? 'data', {
    views: [{ state: 'frozen', ySplit: 1 }],
  });
  const dateFormat = options.dateFormat ?? 'yyyy-mm-dd';
  const hidden = new Set(options.hiddenRows ?? []);
  // The streaming writer merges only rows it still holds, and makes the rows a merge covers
  // itself: merging before the rows are added would push every added row below the range.
  // So rows are held (not committed) until the last row a merge covers, then merged.
  const merges = options.merges ?? [];
  const lastMergedRow = Math.max(0, ...merges.map((ref) => Number(/(\d+)$/.exec(ref)?.[1] ?? 0)));
  let merged = merges.length === 0;
  const merge = () => {
    for (const ref of merges) ws.mergeCells(ref);
    merged = true;
  };
  let rowNumber = 0;
  const add = (values: ExtractValue[]) => {
    rowNumber++;
    const row = ws.addRow(values);
    values.forEach((v, i) => {
      if (v instanceof Date) row.getCell(i + 1).numFmt = dateFormat;
    });
    if (hidden.has(rowNumber)) row.hidden = true;
    if (!merged && rowNumber >= lastMergedRow) merge();
    if (merged) row.commit();
  };
  for (const title of options.titleRows ?? []) add(title);
  add(sheet.headings);
  for (const values of sheet.rows) add(values);
  if (!merged) merge();
  ws.commit();
  for (const extra of options.sheetsAfter ?? []) {
    const other = workbook.addWorksheet(extra.name);
    for (const r of extra.rows) other.addRow(r).commit();
    other.commit();
  }
  await workbook.commit();
  await done;
  return options.filename ? null : Buffer.concat(chunks);
}
