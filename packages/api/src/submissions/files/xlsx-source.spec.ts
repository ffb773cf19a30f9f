/**
 * The workbook reaches exceljs's streaming reader in the order it needs
 * (readerOrder): workbook, relationships, styles, shared strings, then the
 * one sheet read. The rows are the same as when the file is read as saved;
 * no sheet is written to a temporary file on the way (exceljs does that with
 * a sheet saved before the shared strings, as most programs save them).
 */
import { jest } from '@jest/globals';
import fs from 'node:fs';
import { Readable } from 'node:stream';
import ExcelJS from 'exceljs';
import { writeXlsx } from '../template/extract-writer.js';
import type { Cell } from '../format/values.js';
import { openExtract } from '../pipeline/process-extract.js';
import { sniff } from './sniff.js';
import { readerOrder, toCell } from './xlsx-source.js';

const limits = { maxRows: 10_000, maxUncompressedBytes: 100 << 20, maxZipEntries: 1000 };
const HEADINGS = ['record_ref', 'birth_year', 'sex', 'hba1c_date', 'note'];

function sheetRows(n: number): (string | number | Date | null)[][] {
  return Array.from({ length: n }, (_, i) => [
    `R${1000 + i}`,
    1940 + (i % 50),
    i % 2 ? 'female' : 'male',
    new Date(Date.UTC(2026, i % 9, 1 + (i % 27))),
    i % 7 === 0 ? null : `note ${i % 11}`,
  ]);
}

async function workbook(sharedStrings: boolean): Promise<Buffer> {
  return (await writeXlsx(
    { headings: HEADINGS, rows: sheetRows(600) },
    {
      sharedStrings,
      sheetsBefore: [{ name: 'instructions', rows: [['Read me first'], ['One row per person']] }],
      sheetsAfter: [{ name: 'dictionary', rows: [['column', 'meaning']] }],
    },
  ))!;
}

/** The part names of a ZIP read front to back, in order. */
function localNames(parts: Buffer[]): string[] {
  const buf = Buffer.concat(parts);
  const names: string[] = [];
  for (let p = 0; p + 30 <= buf.length && buf.readUInt32LE(p) === 0x04034b50;) {
    const nameLength = buf.readUInt16LE(p + 26);
    names.push(buf.toString('utf8', p + 30, p + 30 + nameLength));
    const next = buf.indexOf(Buffer.from([0x50, 0x4b, 0x03, 0x04]), p + 30 + nameLength);
    if (next < 0) break;
    p = next;
  }
  return names;
}

/** The data sheet's rows read from the file as saved, by exceljs alone. */
async function rowsAsSaved(bytes: Buffer): Promise<{ row: number; cells: Cell[] }[]> {
  const reader = new ExcelJS.stream.xlsx.WorkbookReader(Readable.from([bytes]), {
    sharedStrings: 'cache',
    styles: 'cache',
    hyperlinks: 'ignore',
    worksheets: 'emit',
    entries: 'ignore',
  });
  const rows: { row: number; cells: Cell[] }[] = [];
  for await (const sheet of reader) {
    if ((sheet as unknown as { name: string }).name !== 'data') {
      for await (const _row of sheet) void _row;
      continue;
    }
    for await (const row of sheet) {
      const values = row.values as unknown[];
      const cells = Array.from({ length: Math.max(0, values.length - 1) }, (_, c) =>
        toCell(values[c + 1], () => undefined),
      );
      rows.push({ row: row.number, cells });
    }
  }
  return rows;
}

async function rowsThroughSource(bytes: Buffer) {
  const opened = await openExtract(bytes, 'extract.xlsx', limits);
  if (!('source' in opened)) throw new Error(opened.refusal.message);
  const rows: { row: number; cells: Cell[] }[] = [];
  for await (const batch of opened.source.batches()) rows.push(...batch);
  return rows;
}

describe('readerOrder', () => {
  afterEach(() => jest.restoreAllMocks());

  it.each([
    ['a shared strings table', true],
    ['inline strings (no shared strings part)', false],
  ])(
    'with %s: puts the parts exceljs needs first and the data sheet last, and nothing else',
    async (_label, shared) => {
      const bytes = await workbook(shared);
      const sniffed = sniff(bytes, 'extract.xlsx');
      if (sniffed.kind !== 'xlsx') throw new Error(sniffed.kind);
      const asSaved = sniffed.entries.map((e) => e.name);
      expect(asSaved.indexOf('xl/worksheets/sheet2.xml')).toBeGreaterThanOrEqual(0);
      if (shared) {
        // As saved, the sheets come before the shared strings: the order that costs a temporary file.
        expect(asSaved.indexOf('xl/worksheets/sheet2.xml')).toBeLessThan(
          asSaved.indexOf('xl/sharedStrings.xml'),
        );
      } else {
        expect(asSaved).not.toContain('xl/sharedStrings.xml');
      }
      const parts = readerOrder(bytes, sniffed.entries, 'xl/worksheets/sheet2.xml')!;
      expect(localNames(parts)).toEqual([
        'xl/_rels/workbook.xml.rels',
        'xl/workbook.xml',
        'xl/styles.xml',
        'xl/sharedStrings.xml',
        'xl/worksheets/sheet2.xml',
      ]);
      // Then the central directory as saved, ending with its end record: the input never ends
      // where the sheet does.
      const whole = Buffer.concat(parts);
      expect(whole.readUInt32LE(whole.length - 22)).toBe(0x06054b50);
      expect(whole.subarray(whole.length - 22).equals(bytes.subarray(bytes.length - 22))).toBe(
        true,
      );
    },
  );

  it.each([true, false])(
    'reads the same rows as the file read as saved, without a temporary file (shared strings: %s)',
    async (shared) => {
      const bytes = await workbook(shared);
      // exceljs spools a sheet through fs.createWriteStream to a temporary file.
      const tmpFile = jest.spyOn(fs, 'createWriteStream');
      const ours = await rowsThroughSource(bytes);
      expect(tmpFile).not.toHaveBeenCalled();
      const reference = await rowsAsSaved(bytes);
      // Read as saved, exceljs spools the sheets it meets before the shared strings to disk.
      if (shared) expect(tmpFile).toHaveBeenCalled();
      expect(ours).toHaveLength(601);
      expect(ours).toEqual(reference);
      expect(ours[1]!.cells[0]).toBe('R1000');
      expect(ours[1]!.cells[3]).toEqual(new Date(Date.UTC(2026, 0, 1)));
    },
  );

  it('leaves a workbook without its relationships part to be read as saved', async () => {
    const bytes = await workbook(true);
    const sniffed = sniff(bytes, 'extract.xlsx');
    if (sniffed.kind !== 'xlsx') throw new Error(sniffed.kind);
    const entries = sniffed.entries.filter((e) => e.name !== 'xl/_rels/workbook.xml.rels');
    expect(readerOrder(bytes, entries, 'xl/worksheets/sheet2.xml')).toBeNull();
    expect(readerOrder(bytes, sniffed.entries, 'xl/worksheets/sheet9.xml')).toBeNull();
  });
});
