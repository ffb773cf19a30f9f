/**
 * The steps of reading an extract's rows that look at the file as a whole, each as a table of
 * cases: a CSV made here (the template's example row, columns.ts, under Cairn's headings, with
 * rows changed, added or moved), read in memory through the whole pipeline into sinks that keep
 * what they are given. No database: the uploads through HTTP and MariaDB are
 * test/extracts-*.e2e-spec.ts, the workbook-only notes test/extracts-workbook-notes.e2e-spec.ts.
 */
import { COLUMNS } from '../format/columns.js';
import { type Issue, ISSUE_CODES, type IssueCodeKey } from '../format/issue-codes.js';
import { type ExtractOutcome, processExtract, type RejectedRow } from './process-extract.js';

const KEYS = COLUMNS.map((c) => c.key);
const CONTEXT = {
  practiceCode: 'OV101',
  windowStartIndex: 2025 * 12 + 9,
  windowEndIndex: 2026 * 12 + 8,
  windowEnd: '2026-09',
  endYear: 2026,
  currentMonthIndex: 2026 * 12 + 9,
  dateConvention: null,
  date1904: false,
};

/** One line of the example row with its reference, and `changes` by column. */
function person(ref: string, changes: Record<string, string> = {}): string {
  return COLUMNS.map((c) => (c.key === 'record_ref' ? ref : (changes[c.key] ?? c.example))).join(
    ',',
  );
}
const HEADINGS = KEYS.join(',');
const people = (n: number) => Array.from({ length: n }, (_, i) => person(`P-${i + 1}`));

async function read(lines: string[], maxRows = 100) {
  const records: unknown[] = [];
  const issues: Issue[] = [];
  const rejected: RejectedRow[] = [];
  const outcome: ExtractOutcome = await processExtract(
    Buffer.from(lines.join('\r\n') + '\r\n', 'utf8'),
    'extract.csv',
    CONTEXT,
    3,
    { maxRows, maxUncompressedBytes: 1 << 20, maxZipEntries: 100 },
    {
      records: (rows) => void records.push(...rows),
      issues: (list) => void issues.push(...list),
      rejectedRows: (rows) => void rejected.push(...rows),
      progress: () => undefined,
    },
  );
  return { outcome, records, issues, rejected };
}

type Note = [code: IssueCodeKey, message: string];

describe('notes about the file as a whole (the file kept)', () => {
  it.each<[string, string[], Note[]]>([
    ['a clean file', [HEADINGS, ...people(3)], []],
    [
      'title rows above the headings',
      ['Diabetes extract,,', 'OV101 2026 Q3', '', HEADINGS, ...people(2)],
      [
        [
          'rows_above_header',
          'Cairn found the headings on row 4 and ignored the 2 rows above them (rows 1 and 2).',
        ],
      ],
    ],
    [
      'a column Cairn does not know, and one without a heading',
      [`${HEADINGS},,comment`, ...people(2).map((p) => `${p},x,seen`)],
      [
        ['unnamed_column', `Column ${columnAfter(0)} has no heading; Cairn ignored it.`],
        [
          'unknown_column',
          `The column “comment” (column ${columnAfter(1)}) is not part of Cairn’s extract format; Cairn ignored it.`,
        ],
      ],
    ],
    [
      'an empty column at the end: the spreadsheet’s padding, not noted',
      [`${HEADINGS},`, ...people(2).map((p) => `${p},`)],
      [],
    ],
    [
      'blank rows between people (and at the end, not counted)',
      [HEADINGS, person('A'), '', ',,', person('B'), '', ''],
      [['blank_rows', '2 blank rows were skipped (rows 3 and 4).']],
    ],
    [
      'values beyond the last heading',
      [HEADINGS, `${person('A')},,note`, person('B'), `${person('C')},x`],
      [
        [
          'extra_cells',
          `2 rows have values to the right of the last heading (from column ${columnAfter(1)}); Cairn ignored them.`,
        ],
      ],
    ],
    [
      'a record_ref used twice: the later row refused, the first noted',
      [HEADINGS, person('A'), person('B'), person('A'), person('A')],
      [
        [
          'duplicate_record_ref',
          'The same record_ref is already used on row 2; each person must appear once. Cairn kept row 2 and refused this row.',
        ],
        [
          'duplicate_record_ref',
          'The same record_ref is already used on row 2; each person must appear once. Cairn kept row 2 and refused this row.',
        ],
        [
          'duplicate_record_ref_kept',
          'The record_ref of this row appears again on rows 4 and 5, which Cairn refused; this row was kept.',
        ],
      ],
    ],
  ])('%s', async (_name, lines, notes) => {
    const { outcome, issues } = await read(lines);
    expect(outcome.refusal).toBeNull();
    expect(issues.map(({ code, severity, message }) => ({ code, severity, message }))).toEqual(
      notes.map(([code, message]) => ({ code, severity: ISSUE_CODES[code].severity, message })),
    );
    expect(outcome.issueCounts).toEqual(
      notes.reduce<Record<string, number>>((counts, [code]) => {
        counts[code] = (counts[code] ?? 0) + 1;
        return counts;
      }, {}),
    );
  });

  it('counts what it read, kept, refused and skipped', async () => {
    const { outcome, records, rejected } = await read([
      HEADINGS,
      person('A'),
      '',
      person('B', { bmi_value: 'tall' }),
      person('C', { diabetes_type: '' }),
    ]);
    expect(outcome.counts).toEqual({
      rowsRead: 3,
      rowsAccepted: 2,
      rowsRejected: 1,
      rowsBlank: 1,
      errors: 1,
      warnings: 2,
      flags: 0,
    });
    expect(records).toHaveLength(2);
    expect(rejected.map((r) => [r.row, r.cells[0]])).toEqual([[4, 'B']]);
    expect(outcome).toMatchObject({
      headerRow: 1,
      columnsFound: KEYS,
      columnsIgnored: [],
      refColumnIndex: 0,
    });
  });
});

describe('refusals decided by the file as a whole', () => {
  it.each<[string, string[], number, IssueCodeKey, string]>([
    [
      'no heading row among the first 20 rows with values',
      Array.from({ length: 21 }, (_, i) => `note ${i},x,y`),
      100,
      'no_header_row',
      'Cairn could not find the heading row: none of the first 20 rows with values names at least three of Cairn’s columns (record_ref, birth_year, sex, diabetes_type, …).',
    ],
    [
      'headings but no rows',
      ['Extract', HEADINGS, '', ''],
      100,
      'header_only',
      'The file has the headings (row 2) but no rows of data below them.',
    ],
    [
      'more rows than the limit',
      [HEADINGS, ...people(4)],
      3,
      'too_many_rows',
      'The file has 4 rows of data; Cairn accepts at most 3 in one extract.',
    ],
    [
      'no row accepted',
      [HEADINGS, person('A', { birth_year: '' }), person('B', { sex: 'Q' })],
      100,
      'no_valid_rows',
      'None of the 2 rows could be accepted: every row has at least one error (listed in the report).',
    ],
    [
      'a column that identifies people',
      [`${HEADINGS},patient_name`, `${person('A')},Someone`],
      100,
      'identifier_column',
      `The file has a column that could identify people: “patient_name” (column ${columnAfter(0)}, looks like names). Cairn accepts only de-identified data, so the file was not accepted and nothing from it was kept.`,
    ],
  ])('%s', async (_name, lines, maxRows, code, message) => {
    const { outcome } = await read(lines, maxRows);
    expect(outcome.refusal).toMatchObject({ code, message });
  });
});

/** The spreadsheet letter of the n-th column after Cairn's own. */
function columnAfter(n: number): string {
  let index = KEYS.length + n + 1;
  let letters = '';
  while (index > 0) {
    letters = String.fromCharCode(65 + ((index - 1) % 26)) + letters;
    index = Math.floor((index - 1) / 26);
  }
  return letters;
}

describe('every problem of the heading row in one refusal', () => {
  /** The headings with `drop` left out, `rename` applied and `extra` added at the end. */
  const headings = (
    options: { drop?: string[]; rename?: Record<string, string>; extra?: string[] } = {},
  ) =>
    [
      ...KEYS.filter((k) => !options.drop?.includes(k)).map((k) => options.rename?.[k] ?? k),
      ...(options.extra ?? []),
    ].join(',');
  /** A data row matching `headings`: the example values, blank under the extra columns. */
  const rowFor = (options: { drop?: string[]; extra?: string[] }) =>
    [
      ...COLUMNS.filter((c) => !options.drop?.includes(c.key)).map((c) =>
        c.key === 'record_ref' ? 'P-1' : c.example,
      ),
      ...(options.extra ?? []).map(() => 'x'),
    ].join(',');

  it.each<
    [string, { drop?: string[]; rename?: Record<string, string>; extra?: string[] }, IssueCodeKey[]]
  >([
    ['a column that identifies people alone', { extra: ['NHS number'] }, ['identifier_column']],
    ['a missing column alone', { drop: ['sex'] }, ['missing_columns']],
    [
      'a column that identifies people and a missing column',
      { drop: ['sex'], extra: ['Patient name'] },
      ['identifier_column', 'missing_columns'],
    ],
    [
      'an unknown unit, a repeated column and two missing columns',
      {
        drop: ['sex', 'diabetes_type'],
        rename: { hba1c_value: 'hba1c_value (mg)' },
        extra: ['bmi_value', 'BMI value'],
      },
      ['unknown_unit_in_header', 'duplicate_column', 'missing_columns'],
    ],
    [
      'two unknown units and two repeated columns',
      {
        rename: { hba1c_value: 'hba1c_value (mg)', cholesterol_value: 'cholesterol_value (g)' },
        extra: ['bp systolic', 'BMI value'],
      },
      ['unknown_unit_in_header', 'unknown_unit_in_header', 'duplicate_column', 'duplicate_column'],
    ],
  ])('%s', async (_name, options, codes) => {
    const { outcome, records, issues } = await read([headings(options), rowFor(options)]);
    const refusal = outcome.refusal!;
    expect(refusal.code).toBe(codes[0]);
    expect(refusal.problems?.map((p) => p.code)).toEqual(codes);
    for (const problem of refusal.problems ?? []) {
      expect(problem.message).not.toBe('');
      expect(problem.fix).not.toBe('');
    }
    if (codes.length === 1) {
      expect(refusal.message).toBe(refusal.problems![0]!.message);
    } else {
      expect(refusal.message).toBe(
        `The heading row has ${codes.length} problems (${codes
          .map((c) => ISSUE_CODES[c].title.replace(/^./, (ch) => ch.toLowerCase()))
          .join('; ')}), so the file was not accepted and nothing from it was kept.`,
      );
    }
    expect(records).toHaveLength(0);
    expect(issues).toHaveLength(0);
  });

  it('says what each problem is and how to fix it', async () => {
    const options = { drop: ['sex', 'bmi_value'], extra: ['Postcode'] };
    const { outcome } = await read([headings(options), rowFor(options)]);
    expect(outcome.refusal?.problems).toEqual([
      {
        code: 'identifier_column',
        message: `The file has a column that could identify people: “Postcode” (column ${columnAfter(-2)}, looks like a postcode or ZIP code). Cairn accepts only de-identified data, so the file was not accepted and nothing from it was kept.`,
        fix: 'Delete that column from the file (Cairn needs only the columns of its template) and upload again.',
        detail: {
          headings: [
            { heading: 'Postcode', what: 'a postcode or ZIP code', column: columnAfter(-2) },
          ],
        },
      },
      {
        code: 'missing_columns',
        message: 'The file has no columns sex and bmi_value, which Cairn needs.',
        fix: 'Add the columns with those headings (leave cells blank where nothing was recorded), or start from Cairn’s template.',
        detail: { missing: ['sex', 'bmi_value'] },
      },
    ]);
    expect(outcome.refusal?.fix).toBe(
      'Fix each of them as its own note says, then upload the file again; or start from Cairn’s template.',
    );
  });
});
