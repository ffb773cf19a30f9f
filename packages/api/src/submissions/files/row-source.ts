import type { Cell } from '../format/values.js';
import type { CellRange } from './xlsx-prescan.js';

/** One row of the chosen sheet (or CSV record); `row` is the spreadsheet row number, from 1. */
export interface SourceRow {
  row: number;
  cells: Cell[];
}

export interface SourceNotes {
  sheetName: string | null;
  otherSheets: string[];
  merges: CellRange[];
  hiddenRows: number[];
  hiddenColumns: number[];
  delimiter: string | null;
  encoding: string | null;
}

/** Rows of an extract, read as a stream in batches. */
export interface RowSource {
  readonly kind: 'xlsx' | 'csv';
  /** Rows holding values, heading row included, counted before reading */
  readonly valuedRows: number;
  readonly date1904: boolean;
  readonly notes: SourceNotes;
  /** Formula cells whose saved result was used */
  formulaCells: number;
  batches(): AsyncGenerator<SourceRow[]>;
  /** Stops reading ahead, when the rows are not all wanted */
  close?(): Promise<void>;
}
