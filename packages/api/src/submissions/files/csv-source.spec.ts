/**
 * CSV rows read in slices: slices without a quote mark are split directly,
 * slices with one go through papaparse (RFC 4180: quoted fields, doubled
 * quotes, line breaks inside quotes). Either way the cells are the same, and
 * row numbers run on across slices.
 */
import Papa from 'papaparse';
import type { Cell } from '../format/values.js';
import { openCsv } from './csv-source.js';

async function rowsOf(text: string) {
  const opened = openCsv(Buffer.from(text, 'utf8'));
  if ('refusal' in opened) throw new Error(opened.refusal.message);
  const rows: { row: number; cells: Cell[] }[] = [];
  for await (const batch of opened.source.batches()) rows.push(...batch);
  return rows;
}

/** The same text through papaparse in one go: the reference for every slice. */
function papaRows(text: string, newline: string, delimiter: string) {
  const body = text.endsWith(newline) ? text.slice(0, -newline.length) : text;
  return Papa.parse<string[]>(body, {
    delimiter,
    newline: newline as '\r\n',
    header: false,
  }).data.map((cells, i) => ({ row: i + 1, cells: cells.map((c) => (c === '' ? null : c)) }));
}

function file(rows: number, newline: string, delimiter: string, quotedAt: Set<number>) {
  const lines = ['record_ref,birth_year,sex,note'.replaceAll(',', delimiter)];
  for (let i = 1; i <= rows; i++) {
    const note = quotedAt.has(i)
      ? `"said ""hello""${delimiter} then${newline}a second line"`
      : i % 7 === 0
        ? ''
        : `plain note ${i}`;
    lines.push([`R${i}`, String(1930 + (i % 70)), i % 2 ? 'F' : 'M', note].join(delimiter));
  }
  return lines.join(newline) + newline;
}

describe('CSV rows', () => {
  it.each([
    ['comma, LF, no quotes anywhere', '\n', ',', new Set<number>()],
    ['comma, CRLF, quotes in one slice', '\r\n', ',', new Set([300, 301])],
    ['semicolon, LF, quotes in the first and last slices', '\n', ';', new Set([3, 999])],
    ['tab, CRLF, quotes here and there', '\r\n', '\t', new Set([10, 260, 777])],
  ])(
    '%s: the same cells as papaparse reading the whole file',
    async (_label, nl, delim, quoted) => {
      const text = file(1000, nl, delim, quoted);
      const rows = await rowsOf(text);
      expect(rows).toHaveLength(1001);
      expect(rows).toEqual(papaRows(text, nl, delim));
      if (quoted.size > 0) {
        const first = [...quoted][0]!;
        expect(rows[first]!.cells[3]).toBe(`said "hello"${delim} then${nl}a second line`);
      }
      expect(rows[7]!.cells).toEqual(['R7', String(1930 + 7), 'F', null]);
    },
  );
});
