/**
 * LOAD DATA's default text format, as MariaDB's LOAD DATA INFILE reference
 * describes it (FIELDS TERMINATED BY '\t' ESCAPED BY '\\' LINES TERMINATED
 * BY '\n'): \N is NULL; a backslash, tab, line feed, carriage return or NUL
 * inside a value is written as \\, \t, \n, \r, \0. Each case is checked
 * against that rule written the plain way (strings, then UTF-8); reading
 * the bytes back through MariaDB is test/record-loader.e2e-spec.ts.
 */
import { TsvEncoder, type TsvValue } from './tsv-encoder.js';

function plain(values: TsvValue[], skip = -1): string {
  return (
    values
      .filter((_, i) => i !== skip)
      .map((v) =>
        v === null
          ? '\\N'
          : typeof v === 'number'
            ? String(v)
            : v.replace(/[\\\t\n\r\0]/g, (ch) =>
                ch === '\\'
                  ? '\\\\'
                  : ch === '\t'
                    ? '\\t'
                    : ch === '\n'
                      ? '\\n'
                      : ch === '\r'
                        ? '\\r'
                        : '\\0',
              ),
      )
      .join('\t') + '\n'
  );
}

function encode(rows: TsvValue[][], chunkBytes?: number, skip = -1) {
  const chunks: Buffer[] = [];
  const encoder = new TsvEncoder((c) => chunks.push(Buffer.from(c)), chunkBytes);
  for (const row of rows) encoder.line(row, skip);
  encoder.flush();
  return { bytes: Buffer.concat(chunks), chunks };
}

describe('TsvEncoder', () => {
  const cases: [string, TsvValue[]][] = [
    ['whole numbers', [0, 7, 10, 99, 1935, 4294967295, 123456789]],
    ['negative and fractional numbers', [-1, -40, 53.2, 0.1, -7.25, 6.02e23, 1e-7, 4294967296]],
    ['NULL', [null, 'a', null]],
    ['months and codes', ['2026-09', 'type2', 'F', 'fasting_glucose']],
    ['an empty string (not NULL)', ['', 'x']],
    ['characters that need an escape', ['a\\b', 'tab\there', 'two\nlines', 'cr\r', 'nul\0']],
    ['text beyond ASCII', ['µmol/L', 'Zoë', 'ref→7', '😀 emoji', 'Zoë\twith tab']],
  ];
  it.each(cases)('writes %s as LOAD DATA reads them', (_label, row) => {
    expect(encode([row]).bytes.toString('utf8')).toBe(plain(row));
  });

  it('leaves out the column MariaDB fills itself', () => {
    const row: TsvValue[] = [12, 3, 'R1', 'pseudonym', 1950];
    expect(encode([row], undefined, 3).bytes.toString('utf8')).toBe('12\t3\tR1\t1950\n');
  });

  it('splits long output into chunks without changing a byte', () => {
    const rows: TsvValue[][] = [];
    for (let i = 0; i < 500; i++) rows.push([i, `ref-${i}-Zoë\t`, null, i * 0.5, '2026-01']);
    const { bytes, chunks } = encode(rows, 64);
    expect(chunks.length).toBeGreaterThan(100);
    for (const chunk of chunks) expect(chunk.length).toBeLessThanOrEqual(64);
    expect(bytes.toString('utf8')).toBe(rows.map((r) => plain(r)).join(''));
  });

  it('takes a value longer than a whole chunk', () => {
    const long = 'é'.repeat(100);
    const { bytes } = encode([[long, 1]], 16);
    expect(bytes.toString('utf8')).toBe(`${long}\t1\n`);
  });

  it('emits nothing when nothing was written', () => {
    expect(encode([]).chunks).toHaveLength(0);
  });
});
