/**
 * Writes a data pack's sheets with exceljs's streaming writer: each sheet's
 * header row frozen and filtered, numbers stored as numbers with the column's
 * format (non-integers to six significant figures, as the API sends them),
 * every text neutralised (common/neutralise.ts) so that nothing written can
 * run as a formula, rows committed as they are made.
 */
import type { Writable } from 'node:stream';
import ExcelJS from 'exceljs';
import { neutralise } from '../common/neutralise.js';
import { toSignificant } from '../common/sent-figures.js';

export type PackValue = number | string | null;

export interface PackColumn {
  header: string;
  width: number;
  /** Excel number format of the column's numbers, e.g. '0', '0.0%' */
  format?: string;
}

export interface PackSheet {
  name: string;
  columns: PackColumn[];
  rows: Iterable<PackValue[]>;
  /** false for the about sheet: no filter, no frozen header */
  table?: boolean;
}

export interface PackMeta {
  title: string;
  subject: string;
  /** The report's publication time: the workbook's created and modified dates */
  created: Date;
}

export const PERCENT = '0.0%';
export const INTEGER = '0';
export const DECIMAL = '0.000';

/** Column letters of a 1-based column number (1 → A, 27 → AA). */
export function columnLetter(n: number): string {
  let s = '';
  for (let x = n; x > 0; x = Math.floor((x - 1) / 26))
    s = String.fromCharCode(65 + ((x - 1) % 26)) + s;
  return s;
}

/** The style of every data row (none): one object, so that exceljs looks it up once. */
const ROW_STYLE: Partial<ExcelJS.Style> = {};

/** The zip writer (archiver) inside exceljs's streaming workbook writer. */
interface ZipInside {
  append(source: unknown, data: { name: string; date?: string }): unknown;
}

/**
 * exceljs's streaming workbook writer with every zip entry dated `date` (exceljs leaves the date
 * to the zip writer: now), so that the same report's pack is the same bytes on every request and
 * in every process. The first two parts are added while the writer is constructed, hence the
 * hooks rather than a change after construction.
 */
function datedWriter(date: Date) {
  const iso = date.toISOString();
  const dated = new WeakSet<object>();
  const dateEntries = (writer: object) => {
    const zip = (writer as { zip: ZipInside }).zip;
    if (dated.has(zip)) return;
    dated.add(zip);
    const append = zip.append.bind(zip);
    zip.append = (source, data) => append(source, { ...data, date: iso });
  };
  return class extends ExcelJS.stream.xlsx.WorkbookWriter {
    override addThemes() {
      dateEntries(this);
      return super.addThemes();
    }
    override addOfficeRels() {
      dateEntries(this);
      return super.addOfficeRels();
    }
  };
}

/** Text neutralised; numbers to six significant figures, as every response sends them. */
const cellValue = (v: PackValue): PackValue =>
  typeof v === 'string' ? neutralise(v) : typeof v === 'number' ? toSignificant(v) : v;

export async function writePack(
  sheets: readonly PackSheet[],
  meta: PackMeta,
  stream: Writable,
): Promise<void> {
  const workbook = new (datedWriter(meta.created))({
    stream,
    useStyles: true,
    useSharedStrings: false,
  });
  workbook.creator = 'Cairn';
  workbook.title = meta.title;
  workbook.subject = meta.subject;
  workbook.created = meta.created;
  workbook.modified = meta.created;
  for (const sheet of sheets) {
    const table = sheet.table !== false;
    const ws = workbook.addWorksheet(sheet.name, {
      views: table ? [{ state: 'frozen', ySplit: 1, xSplit: 0 }] : [],
    });
    ws.columns = sheet.columns.map((c) => ({
      header: c.header,
      width: c.width,
      style: c.format ? { numFmt: c.format } : {},
    }));
    const header = ws.getRow(1);
    header.font = { bold: true };
    header.commit();
    if (table) {
      ws.autoFilter = `A1:${columnLetter(sheet.columns.length)}1`;
    }
    // One style object per column, shared by its cells: exceljs keeps a style's id by the
    // object, so a shared one is looked up once (a cell's own copy would be serialised per cell).
    const styles = sheet.columns.map((c) => (c.format ? { numFmt: c.format } : {}));
    let r = 2;
    for (const values of sheet.rows) {
      const row = ws.getRow(r++);
      (row as unknown as { style: Partial<ExcelJS.Style> }).style = ROW_STYLE;
      for (let i = 0; i < values.length; i++) {
        const v = values[i];
        if (v === null || v === undefined) continue;
        const target = row.getCell(i + 1);
        target.style = styles[i] ?? {};
        target.value = cellValue(v);
      }
      row.commit();
    }
    ws.commit();
  }
  await workbook.commit();
}
