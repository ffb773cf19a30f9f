/**
 * Rows of an XLSX workbook through exceljs's streaming WorkbookReader
 * (toolchain.md): date cells arrive as Date objects (styles cached),
 * formulas as { formula, result } (the saved result is used; none saved is
 * a problem cell), errors as { error }. Merged ranges, invisible to the
 * streaming reader, are filled in from the prescan: every cell of a merge
 * shows the value of its top-left cell, as it does on screen.
 */
import { Readable } from 'node:stream';
import ExcelJS from 'exceljs';
import { type Cell, CellProblem } from '../format/values.js';
import type { RowSource, SourceNotes, SourceRow } from './row-source.js';
import type { CellRange, XlsxPrescan } from './xlsx-prescan.js';

const BATCH = 100;

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
    onFormula();
    const formula = String(v.formula ?? v.sharedFormula ?? '');
    if (!('result' in v) || v.result === undefined) return new CellProblem('no_result', formula);
    const result = v.result;
    if (typeof result === 'number' && Number.isNaN(result))
      return new CellProblem('error', '#VALUE!');
    if (result !== null && typeof result === 'object' && 'error' in (result as object)) {
      return new CellProblem('error', String((result as { error: unknown }).error));
    }
    return toCell(result, () => undefined);
  }
  if ('error' in v) return new CellProblem('error', String(v.error));
  if (Array.isArray(v.richText))
    return (v.richText as { text?: string }[]).map((r) => r.text ?? '').join('');
  if ('text' in v) return typeof v.text === 'string' ? v.text : toCell(v.text, onFormula);
  return null;
}

export class XlsxRowSource implements RowSource {
  readonly kind = 'xlsx' as const;
  formulaCells = 0;
  readonly valuedRows: number;
  readonly date1904: boolean;
  readonly notes: SourceNotes;

  constructor(
    private readonly buf: Buffer,
    private readonly prescan: XlsxPrescan,
  ) {
    this.valuedRows = prescan.valuedRows;
    this.date1904 = prescan.date1904;
    this.notes = {
      sheetName: prescan.sheetName,
      otherSheets: prescan.otherSheets,
      merges: prescan.merges,
      hiddenRows: prescan.hiddenRows,
      hiddenColumns: prescan.hiddenColumns,
      delimiter: null,
      encoding: null,
    };
  }

  async *batches(): AsyncGenerator<SourceRow[]> {
    const reader = new ExcelJS.stream.xlsx.WorkbookReader(Readable.from([this.buf]), {
      sharedStrings: 'cache',
      styles: 'cache',
      hyperlinks: 'ignore',
      worksheets: 'emit',
      entries: 'ignore',
    });
    const merges = new MergeFiller(this.prescan.merges);
    const onFormula = () => void this.formulaCells++;
    let batch: SourceRow[] = [];
    let found = false;
    for await (const worksheet of reader) {
      if (found || (worksheet as unknown as { name: string }).name !== this.prescan.sheetName)
        continue;
      found = true;
      for await (const row of worksheet) {
        const values = row.values as unknown[];
        const cells: Cell[] = new Array<Cell>(Math.max(0, values.length - 1));
        for (let c = 1; c < values.length; c++) cells[c - 1] = toCell(values[c], onFormula);
        for (let c = 0; c < cells.length; c++) if (cells[c] === undefined) cells[c] = null;
        if (merges.active) merges.fill(row.number, cells);
        batch.push({ row: row.number, cells });
        if (batch.length >= BATCH) {
          yield batch;
          batch = [];
        }
      }
    }
    if (batch.length > 0) yield batch;
    if (!found) throw new SheetNotReadError(this.prescan.sheetName);
  }
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
