/**
 * What the streaming reader cannot see and the prescan finds in a workbook:
 * merged cells (filled with the value shown, and reported), hidden rows and
 * columns (read, and reported), rows without values (skipped and counted),
 * on a sheet long enough to span many expanded chunks, so that the scan's
 * carrying of a row cut by a chunk's end is exercised. No database: the
 * pipeline with sinks that collect.
 */
import ExcelJS from 'exceljs';
import type { RecordRow } from '../src/database/bulk-load/record-columns.js';
import { COL } from '../src/database/bulk-load/record-columns.js';
import type { Issue } from '../src/submissions/format/issue-codes.js';
import { sniff } from '../src/submissions/files/sniff.js';
import { prescanXlsx } from '../src/submissions/files/xlsx-prescan.js';
import { processExtract } from '../src/submissions/pipeline/process-extract.js';
import { goodRows, HEADINGS, toValues } from './extracts-fixtures/rows.js';

const ROWS = 4000;
const context = {
  practiceCode: 'ZZ001',
  windowStartIndex: 2025 * 12 + 9,
  windowEndIndex: 2026 * 12 + 8,
  windowEnd: '2026-09',
  endYear: 2026,
  currentMonthIndex: 2026 * 12 + 11,
  dateConvention: null,
  date1904: false,
};
const limits = { maxRows: 200_000, maxUncompressedBytes: 500 << 20, maxZipEntries: 1000 };

async function workbook(): Promise<Buffer> {
  const book = new ExcelJS.Workbook();
  const sheet = book.addWorksheet('data');
  sheet.addRow(HEADINGS);
  for (const values of toValues(goodRows(ROWS))) sheet.addRow(values);
  const typeColumn = HEADINGS.indexOf('diabetes_type') + 1;
  const letter = String.fromCharCode(64 + typeColumn);
  // People on spreadsheet rows 21 to 23 share one merged diabetes_type cell.
  sheet.getCell(`${letter}21`).value = 'type1';
  sheet.mergeCells(`${letter}21:${letter}23`);
  sheet.getRow(11).hidden = true;
  sheet.getRow(3001).hidden = true;
  sheet.getColumn(HEADINGS.indexOf('deprivation_quintile') + 1).hidden = true;
  // Spreadsheet row 501 keeps its cells but loses every value.
  sheet.getRow(501).values = [];
  return Buffer.from(await book.xlsx.writeBuffer());
}

describe('workbook notes', () => {
  let bytes: Buffer;
  beforeAll(async () => {
    bytes = await workbook();
  });

  it('the prescan counts rows with values and finds hidden rows, hidden columns and merges', async () => {
    const sniffed = sniff(bytes, 'notes.xlsx');
    if (sniffed.kind !== 'xlsx') throw new Error(`sniffed ${sniffed.kind}`);
    const prescan = await prescanXlsx(bytes, sniffed.entries, limits.maxUncompressedBytes);
    expect(prescan.sheetName).toBe('data');
    expect(prescan.valuedRows).toBe(1 + ROWS - 1);
    expect(prescan.hiddenRows).toEqual([11, 3001]);
    expect(prescan.hiddenColumns).toEqual([HEADINGS.indexOf('deprivation_quintile') + 1]);
    expect(prescan.merges.map((m) => m.ref)).toEqual([
      `${String.fromCharCode(65 + HEADINGS.indexOf('diabetes_type'))}21:${String.fromCharCode(65 + HEADINGS.indexOf('diabetes_type'))}23`,
    ]);
  });

  it('the pipeline fills merged cells, reads hidden rows, and reports all of it', async () => {
    const records: RecordRow[] = [];
    const issues: Issue[] = [];
    const outcome = await processExtract(bytes, 'notes.xlsx', context, 1, limits, {
      records: (rows) => void records.push(...rows),
      issues: (list) => void issues.push(...list),
      rejectedRows: () => undefined,
      progress: () => undefined,
    });
    expect(outcome.refusal).toBeNull();
    expect(outcome.counts).toMatchObject({
      rowsRead: ROWS - 1,
      rowsAccepted: ROWS - 1,
      rowsBlank: 1,
    });
    const bySourceRow = new Map(records.map((r) => [r[COL.source_row], r]));
    for (const row of [21, 22, 23]) expect(bySourceRow.get(row)![COL.diabetes_type]).toBe('type1');
    expect(bySourceRow.get(24)![COL.diabetes_type]).toBe('type2');
    expect(bySourceRow.has(11)).toBe(true);
    expect(bySourceRow.has(501)).toBe(false);
    const codes = issues.map((i) => i.code);
    expect(codes).toEqual(
      expect.arrayContaining(['merged_cells', 'hidden_rows', 'hidden_columns', 'blank_rows']),
    );
    expect(issues.find((i) => i.code === 'merged_cells')).toMatchObject({ row: 21 });
    expect(issues.find((i) => i.code === 'hidden_rows')!.message).toContain('Rows 11 and 3001');
    expect(issues.find((i) => i.code === 'blank_rows')!.message).toContain('(row 501)');
  });

  it('uses a formula cell’s saved result and counts only the results it used', async () => {
    const book = new ExcelJS.Workbook();
    const sheet = book.addWorksheet('data');
    sheet.addRow(HEADINGS);
    for (const values of toValues(goodRows(3))) sheet.addRow(values);
    const bmi = String.fromCharCode(64 + HEADINGS.indexOf('bmi_value') + 1);
    // Row 2: a formula with its result saved; row 3: one never calculated.
    sheet.getCell(`${bmi}2`).value = { formula: '2810/100', result: 28.1 };
    sheet.getCell(`${bmi}3`).value = { formula: '2930/100' } as ExcelJS.CellFormulaValue;
    const records: RecordRow[] = [];
    const issues: Issue[] = [];
    await processExtract(
      Buffer.from(await book.xlsx.writeBuffer()),
      'formulas.xlsx',
      context,
      1,
      limits,
      {
        records: (rows) => void records.push(...rows),
        issues: (list) => void issues.push(...list),
        rejectedRows: () => undefined,
        progress: () => undefined,
      },
    );
    expect(records.find((r) => r[COL.source_row] === 2)![COL.bmi_kg_m2]).toBe(28.1);
    expect(issues.find((i) => i.code === 'formula_without_result')).toMatchObject({ row: 3 });
    expect(issues.find((i) => i.code === 'formulas_used')!.message).toBe(
      'One cell holds a formula; Cairn used the result saved in the file.',
    );
  });
});
