/**
 * The row checks of an extract, one table per check: the cells of one row (the template's
 * example row, columns.ts, with some cells changed, as a CSV or a workbook hands them over) and
 * what the validator makes of them: the issues in order (code, and the message the practice
 * reads) with each code's severity as issue-codes.ts defines it, whether the row is kept, and
 * the value it keeps. No database and no file: the uploads through HTTP and MariaDB are
 * test/extracts-*.e2e-spec.ts.
 *
 * Every case is audit quarter 2026 Q3: review window 2025-10 … 2026-09, and "now" in 2026-10.
 */
import { COL, RECORD_COLUMNS, type RecordRow } from '../../database/bulk-load/record-columns.js';
import { column, COLUMNS, DIAGNOSTIC_THRESHOLDS } from '../format/columns.js';
import { mapHeader } from '../format/header.js';
import { type Issue, ISSUE_CODES, type IssueCodeKey } from '../format/issue-codes.js';
import { type Cell, CellProblem } from '../format/values.js';
import { type RowOutcome, RowValidator, type ValidationContext } from './row-validator.js';

const month = (year: number, m: number) => year * 12 + m - 1;

const CONTEXT: ValidationContext = {
  practiceCode: 'OV101',
  windowStartIndex: month(2025, 10),
  windowEndIndex: month(2026, 9),
  windowEnd: '2026-09',
  endYear: 2026,
  currentMonthIndex: month(2026, 10),
  dateConvention: null,
  date1904: false,
};
const SUBMISSION = 7;
const ROW = 2;

const KEYS = COLUMNS.map((c) => c.key);
/** The template's example row, as text (a CSV's cells): every value of it is clean. */
const EXAMPLE: Record<string, Cell> = Object.fromEntries(
  COLUMNS.map((c) => [c.key, c.example === '' ? null : c.example]),
);

type Cells = Record<string, Cell>;

interface RowOptions {
  /** Headings as written, by column (the key otherwise) */
  headings?: Record<string, string>;
  /** Columns the file does not have */
  omit?: readonly string[];
  context?: Partial<ValidationContext>;
}

function validatorFor(options: RowOptions = {}) {
  const keys = KEYS.filter((k) => !options.omit?.includes(k));
  const mapped = mapHeader(keys.map((k) => options.headings?.[k] ?? k));
  if ('problems' in mapped)
    throw new Error(`heading row refused: ${mapped.problems.map((p) => p.code).join(', ')}`);
  const validator = new RowValidator(
    mapped.mapping,
    { ...CONTEXT, ...options.context },
    SUBMISSION,
  );
  const cellsOf = (changes: Cells): Cell[] =>
    keys.map((k) => (k in changes ? changes[k]! : EXAMPLE[k]!));
  return { validator, cellsOf };
}

/** The example row with `changes`, validated as spreadsheet row 2. */
function validate(changes: Cells, options: RowOptions = {}): RowOutcome {
  const { validator, cellsOf } = validatorFor(options);
  return validator.validate(ROW, cellsOf(changes));
}

type Expected = [code: IssueCodeKey, message: string];

const issuesOf = (outcome: RowOutcome): Issue[] =>
  outcome.kind === 'refused' ? [] : (outcome.issues ?? []);

/** The issues, in order, each with its code's severity; the row refused exactly when one is an error. */
function expectIssues(outcome: RowOutcome, expected: Expected[]): void {
  expect(outcome.kind).not.toBe('refused');
  expect(
    issuesOf(outcome).map(({ code, severity, message }) => ({ code, severity, message })),
  ).toEqual(
    expected.map(([code, message]) => ({ code, severity: ISSUE_CODES[code].severity, message })),
  );
  const refused = expected.some(([code]) => ISSUE_CODES[code].severity === 'error');
  expect(outcome.kind).toBe(refused ? 'rejected' : 'accepted');
  if (!refused && expected.length === 0) expect(outcome).toMatchObject({ issues: null });
}

function recordOf(outcome: RowOutcome): RecordRow {
  if (outcome.kind !== 'accepted')
    throw new Error(`row ${outcome.kind}: ${JSON.stringify(outcome)}`);
  return outcome.record;
}

describe('the example row', () => {
  it('is kept whole, in canonical units, dates as months, with no issue', () => {
    const outcome = validate({});
    expectIssues(outcome, []);
    const expected: RecordRow = RECORD_COLUMNS.map(() => null);
    const set = (values: Partial<Record<keyof typeof COL, string | number>>) => {
      for (const [k, v] of Object.entries(values)) expected[COL[k as keyof typeof COL]] = v;
    };
    set({
      submission_id: SUBMISSION,
      source_row: ROW,
      record_ref: 'QB-004217',
      birth_year: 1958,
      sex: 'F',
      diabetes_type: 'type2',
      diagnosis_year: 2014,
      deprivation_quintile: 3,
      hba1c_month: '2026-05',
      hba1c_mmol_mol: 58,
      blood_pressure_month: '2026-05',
      systolic: 134,
      diastolic: 78,
      cholesterol_month: '2026-03',
      total_cholesterol_mmol_l: 4.6,
      serum_creatinine_month: '2026-03',
      serum_creatinine_umol_l: 88,
      urine_albumin_month: '2026-03',
      acr_mg_mmol: 1.8,
      foot_surveillance_month: '2025-11',
      bmi_month: '2026-05',
      bmi_kg_m2: 31.4,
      smoking_month: '2026-05',
      smoking_status: 'never',
      retinal_screening_month: '2025-09',
      on_statin: 1,
      on_insulin: 0,
      cvd_history: 0,
      diagnostic_test: 'hba1c',
      diagnostic_value: 52,
    });
    expect(recordOf(outcome)).toEqual(expected);
  });

  it('reads the same from a workbook’s cells (numbers and date cells)', () => {
    const date = (y: number, m: number, d: number) => new Date(Date.UTC(y, m - 1, d));
    const fromText = recordOf(validate({}));
    const fromCells = recordOf(
      validate({
        birth_year: 1958,
        diagnosis_year: 2014,
        deprivation_quintile: 3,
        hba1c_date: date(2026, 5, 14),
        hba1c_value: 58,
        bp_date: date(2026, 5, 14),
        bp_systolic: 134,
        bp_diastolic: 78,
        cholesterol_date: date(2026, 3, 2),
        cholesterol_value: 4.6,
        creatinine_date: 46083, // Excel serial of 2026-03-02
        creatinine_value: 88,
        acr_value: 1.8,
        bmi_value: 31.4,
        on_statin: true,
        on_insulin: false,
        cvd_history: 0,
        diagnostic_value: 52,
      }),
    );
    expect(fromCells).toEqual(fromText);
  });
});

describe('cells that hold no value', () => {
  it.each<[string, Cell, Expected]>([
    [
      'a spreadsheet error',
      new CellProblem('error', '#N/A'),
      ['cell_error', 'The cell shows the spreadsheet error #N/A instead of a value.'],
    ],
    [
      'a formula never calculated',
      new CellProblem('no_result', 'B2*2'),
      [
        'formula_without_result',
        'The cell holds a formula that was never calculated, so the file has no value for it.',
      ],
    ],
  ])('%s refuses the row at once, with that issue alone', (_name, cell, issue) => {
    const outcome = validate({ bmi_value: cell, sex: 'nonsense' });
    expectIssues(outcome, [issue]);
    expect(issuesOf(outcome)[0]).toMatchObject({
      row: ROW,
      column: 'bmi_value',
      key: 'bmi_value',
      value: cell instanceof CellProblem && cell.kind === 'error' ? '#N/A' : '=B2*2',
    });
  });
});

describe('record_ref', () => {
  it.each<[string, Cell, Expected[], string | null]>([
    ['a reference', 'QB-1', [], 'QB-1'],
    ['a reference with spaces around it', '  QB-1 ', [], 'QB-1'],
    ['a number', 40172, [], '40172'],
    ['64 characters', 'R'.repeat(64), [], 'R'.repeat(64)],
    ['blank', null, [['record_ref_missing', 'This row has no record_ref.']], null],
    ['only spaces', '   ', [['record_ref_missing', 'This row has no record_ref.']], null],
    [
      '65 characters',
      'R'.repeat(65),
      [['record_ref_too_long', 'record_ref is 65 characters long; Cairn accepts up to 64.']],
      null,
    ],
    [
      'starting with =',
      '=A1',
      [
        [
          'record_ref_formula',
          'record_ref “=A1” starts with “=”, which spreadsheet programs treat as the start of a formula.',
        ],
      ],
      null,
    ],
    [
      'starting with +',
      '+4471',
      [
        [
          'record_ref_formula',
          'record_ref “+4471” starts with “+”, which spreadsheet programs treat as the start of a formula.',
        ],
      ],
      null,
    ],
    [
      'a negative number',
      -5,
      [
        [
          'record_ref_formula',
          'record_ref “-5” starts with “-”, which spreadsheet programs treat as the start of a formula.',
        ],
      ],
      null,
    ],
    [
      'starting with @',
      '@R1',
      [
        [
          'record_ref_formula',
          'record_ref “@R1” starts with “@”, which spreadsheet programs treat as the start of a formula.',
        ],
      ],
      null,
    ],
    [
      'starting with the minus sign',
      '\u221212',
      [
        [
          'record_ref_formula',
          'record_ref “\u221212” starts with “\u2212”, which spreadsheet programs treat as the start of a formula.',
        ],
      ],
      null,
    ],
    [
      'with a line break inside',
      'QB\n1',
      [
        [
          'record_ref_invalid',
          'record_ref contains hidden control characters (such as a line break or tab).',
        ],
      ],
      null,
    ],
  ])('%s', (_name, cell, expected, kept) => {
    const outcome = validate({ record_ref: cell });
    expectIssues(outcome, expected);
    if (kept !== null) expect(recordOf(outcome)[COL.record_ref]).toBe(kept);
  });

  it('an e-mail address refuses the whole file', () => {
    expect(validate({ record_ref: 'someone@example.org' })).toEqual({
      kind: 'refused',
      refusal: {
        code: 'identifier_values',
        message: `record_ref on row ${ROW} is an e-mail address. Cairn accepts only de-identified data, so the file was not accepted and nothing from it was kept.`,
        fix: "Put the practice's own internal reference for each person in record_ref (never an e-mail address, name or national health number), then upload again.",
        detail: { row: ROW },
      },
    });
  });

  it('a reference already kept refuses the later rows, and remembers them for the first', () => {
    const { validator, cellsOf } = validatorFor();
    expectIssues(validator.validate(2, cellsOf({ record_ref: 'QB-1' })), []);
    const repeated: Expected = [
      'duplicate_record_ref',
      'The same record_ref is already used on row 2; each person must appear once. Cairn kept row 2 and refused this row.',
    ];
    expectIssues(validator.validate(3, cellsOf({ record_ref: 'QB-1' })), [repeated]);
    expectIssues(validator.validate(4, cellsOf({ record_ref: 'QB-2' })), []);
    expectIssues(validator.validate(5, cellsOf({ record_ref: ' QB-1' })), [repeated]);
    expect([...validator.repeatedRefs]).toEqual([[2, [3, 5]]]);
  });

  it('a refused row does not claim its reference', () => {
    const { validator, cellsOf } = validatorFor();
    expect(validator.validate(2, cellsOf({ record_ref: 'QB-1', birth_year: null })).kind).toBe(
      'rejected',
    );
    expectIssues(validator.validate(3, cellsOf({ record_ref: 'QB-1' })), []);
    expect(validator.repeatedRefs.size).toBe(0);
  });
});

describe('record_ref values that look like national health numbers', () => {
  /** Ten digits whose last is the modulus 11 check digit of the first nine. */
  function passing(i: number): string {
    for (let k = 0; ; k++) {
      const nine = String(300_000_000 + i * 101 + k);
      let sum = 0;
      for (let d = 0; d < 9; d++) sum += Number(nine[d]) * (10 - d);
      const check = 11 - (sum % 11);
      if (check !== 10) return nine + String(check === 11 ? 0 : check);
    }
  }
  const failing = (i: number) => {
    const ok = passing(i);
    return ok.slice(0, 9) + String((Number(ok[9]) + 1) % 10);
  };

  function readRefs(refs: string[]) {
    const { validator, cellsOf } = validatorFor();
    refs.forEach((ref, i) => validator.validate(i + 2, cellsOf({ record_ref: ref })));
    return validator;
  }

  const refsOf = (passingCount: number, failingCount: number) => [
    ...Array.from({ length: passingCount }, (_, i) => passing(i)),
    ...Array.from({ length: failingCount }, (_, i) => failing(passingCount + i)),
  ];

  it.each<[string, number, number, boolean]>([
    ['five, all passing the check', 5, 0, true],
    ['four passing (too few to tell)', 4, 0, false],
    ['nine of ten passing', 9, 1, true],
    ['eight of ten passing', 8, 2, false],
  ])('at the end of the file: %s', (_name, passingCount, failingCount, refused) => {
    const validator = readRefs(refsOf(passingCount, failingCount));
    const found = validator.nationalNumberRefusal(true);
    if (!refused) {
      expect(found).toBeNull();
      return;
    }
    expect(found).toEqual({
      code: 'identifier_values',
      message: `The record_ref values look like national health numbers (${passingCount} of ${passingCount + failingCount} are 10-digit numbers with a valid check digit, e.g. row 2). Cairn accepts only de-identified data, so the file was not accepted and nothing from it was kept.`,
      fix: "Put the practice's own internal reference for each person in record_ref instead of the national number, then upload again.",
      detail: { row: 2 },
    });
  });

  it('is not decided before 200 references, unless the file has ended', () => {
    const refs = Array.from({ length: 199 }, (_, i) => passing(i));
    const validator = readRefs(refs);
    expect(validator.nationalNumberRefusal(false)).toBeNull();
    validator.validate(201, validatorFor().cellsOf({ record_ref: passing(199) }));
    expect(validator.nationalNumberRefusal(false)?.code).toBe('identifier_values');
  });
});

describe('birth_year', () => {
  it.each<[string, Cell, Expected[], number | null]>([
    ['four digits', '1958', [], 1958],
    ['a number cell', 1958, [], 1958],
    ['with a decimal point', '1958.0', [], 1958],
    ['1900, the earliest', '1900', [], 1900],
    ['blank', null, [['birth_year_missing', 'This row has no birth_year.']], null],
    ['two digits', '58', [['two_digit_year', 'birth_year “58” has only two digits.']], null],
    ['not a year', 'old', [['invalid_year', 'birth_year “old” is not a year.']], null],
    ['a fraction', 1958.5, [['invalid_year', 'birth_year “1958.5” is not a year.']], null],
    ['before 1900', '1899', [['birth_year_out_of_range', 'birth_year 1899 is before 1900.']], null],
    [
      'after the window',
      '2027',
      [
        [
          'birth_year_out_of_range',
          'birth_year 2027 is after the end of the review window (2026-09).',
        ],
      ],
      null,
    ],
  ])('%s', (_name, cell, expected, kept) => {
    const outcome = validate({ birth_year: cell });
    expectIssues(outcome, expected);
    if (kept !== null) expect(recordOf(outcome)[COL.birth_year]).toBe(kept);
  });

  it('may be the window’s last year, with every date after it', () => {
    const outcome = validate({
      birth_year: '2026',
      diagnosis_year: null,
      cholesterol_date: '2026-03-02',
      foot_check_date: '2026-01-20',
      retinal_screening_date: '2026-01-08',
    });
    expectIssues(outcome, []);
    expect(recordOf(outcome)[COL.birth_year]).toBe(2026);
  });

  it.each<[string, Cell, string]>([
    ['a date cell', new Date(Date.UTC(1958, 2, 4)), '1958-03-04'],
    ['a date written as text', '04/03/1958', '04/03/1958'],
  ])('%s refuses the whole file', (_name, cell, shown) => {
    expect(validate({ birth_year: cell })).toEqual({
      kind: 'refused',
      refusal: {
        code: 'full_birth_date',
        message: `birth_year on row ${ROW} holds a full date (${shown}). A date of birth identifies a person, so the file was not accepted and nothing from it was kept.`,
        fix: 'Keep only the year of birth in birth_year (e.g. 1958): in a spreadsheet, =YEAR(cell) and then paste the values; then upload again.',
        detail: { row: ROW },
      },
    });
  });
});

describe('coded person fields', () => {
  const notAllowed = (key: string, text: string): Expected => [
    'invalid_code',
    `${key} “${text}” is not one of the allowed values.`,
  ];

  it.each<[string, Cells, Expected[], keyof typeof COL, string | number | null]>([
    ['sex as written', { sex: 'M' }, [], 'sex', 'M'],
    ['sex in words', { sex: 'Female' }, [], 'sex', 'F'],
    ['sex blank, read as not recorded', { sex: null }, [], 'sex', 'U'],
    ['sex not in the list', { sex: 'Q' }, [notAllowed('sex', 'Q')], 'sex', null],
    [
      'diabetes type as written',
      { diabetes_type: 'type1', on_insulin: 'yes' },
      [],
      'diabetes_type',
      'type1',
    ],
    ['diabetes type in other words', { diabetes_type: 'T2DM' }, [], 'diabetes_type', 'type2'],
    ['diabetes type with a space', { diabetes_type: 'Type 2' }, [], 'diabetes_type', 'type2'],
    ['diabetes type as a number', { diabetes_type: 2 }, [], 'diabetes_type', 'type2'],
    [
      'diabetes type blank',
      { diabetes_type: null },
      [
        [
          'diabetes_type_missing',
          'diabetes_type is blank: the person is kept but not counted in any measure.',
        ],
      ],
      'diabetes_type',
      null,
    ],
    [
      'diabetes type not in the list',
      { diabetes_type: 'gestational' },
      [notAllowed('diabetes_type', 'gestational')],
      'diabetes_type',
      null,
    ],
    ['deprivation quintile as text', { deprivation_quintile: '1' }, [], 'deprivation_quintile', 1],
    [
      'deprivation quintile as a number',
      { deprivation_quintile: 5 },
      [],
      'deprivation_quintile',
      5,
    ],
    [
      'deprivation quintile blank',
      { deprivation_quintile: null },
      [],
      'deprivation_quintile',
      null,
    ],
    [
      'deprivation quintile out of the list',
      { deprivation_quintile: '6' },
      [notAllowed('deprivation_quintile', '6')],
      'deprivation_quintile',
      null,
    ],
  ])('%s', (_name, changes, expected, key, kept) => {
    const outcome = validate(changes);
    expectIssues(outcome, expected);
    if (outcome.kind === 'accepted') expect(outcome.record[COL[key]]).toBe(kept);
  });

  it('names the allowed values in the fix', () => {
    expect(issuesOf(validate({ sex: 'Q' }))[0]!.fix).toBe(
      `Use one of: ${column('sex')
        .codes!.map((c) => c.value)
        .join(', ')} (or leave it blank if not recorded).`,
    );
  });

  it('without the optional deprivation column, keeps no quintile and says nothing', () => {
    const outcome = validate({}, { omit: ['deprivation_quintile'] });
    expectIssues(outcome, []);
    expect(recordOf(outcome)[COL.deprivation_quintile]).toBeNull();
  });
});

describe('diagnosis_year', () => {
  it.each<[string, Cells, Expected[], number | null]>([
    ['after the birth year', { diagnosis_year: '2014' }, [], 2014],
    ['in the birth year', { diagnosis_year: 1958 }, [], 1958],
    ['blank', { diagnosis_year: null }, [], null],
    [
      'a date cell: its year kept',
      { diagnosis_year: new Date(Date.UTC(2014, 5, 1)) },
      [
        [
          'year_taken_from_date',
          'diagnosis_year holds a full date; Cairn kept only its year (2014).',
        ],
      ],
      2014,
    ],
    [
      'a date as text: its year kept',
      { diagnosis_year: '2014-06-01' },
      [
        [
          'year_taken_from_date',
          'diagnosis_year holds a full date; Cairn kept only its year (2014).',
        ],
      ],
      2014,
    ],
    [
      'before the birth year',
      { diagnosis_year: '1950' },
      [['diagnosis_year_out_of_range', 'diagnosis_year 1950 is before birth_year 1958.']],
      null,
    ],
    [
      'before 1900',
      { diagnosis_year: '1899' },
      [['diagnosis_year_out_of_range', 'diagnosis_year 1899 is before 1900.']],
      null,
    ],
    [
      'after the window',
      { diagnosis_year: '2027' },
      [
        [
          'diagnosis_year_out_of_range',
          'diagnosis_year 2027 is after the end of the review window (2026-09).',
        ],
      ],
      null,
    ],
    [
      'two digits',
      { diagnosis_year: '14' },
      [['two_digit_year', 'diagnosis_year “14” has only two digits.']],
      null,
    ],
    [
      'not a year',
      { diagnosis_year: 'soon' },
      [['invalid_year', 'diagnosis_year “soon” is not a year.']],
      null,
    ],
    [
      'a date that cannot be read',
      { diagnosis_year: '31/02/2014' },
      [['invalid_year', 'diagnosis_year “31/02/2014” is not a year.']],
      null,
    ],
    [
      'before a birth year that is itself refused: only the birth year is reported',
      { birth_year: 'old', diagnosis_year: '1950' },
      [['invalid_year', 'birth_year “old” is not a year.']],
      null,
    ],
  ])('%s', (_name, changes, expected, kept) => {
    const outcome = validate(changes);
    expectIssues(outcome, expected);
    if (outcome.kind === 'accepted') expect(outcome.record[COL.diagnosis_year]).toBe(kept);
  });
});

describe('care process dates', () => {
  const hba1c = (date: Cell, context: Partial<ValidationContext> = {}) =>
    validate({ hba1c_date: date }, { context });

  it.each<[string, Cell, Partial<ValidationContext>, string]>([
    ['ISO date', '2026-05-14', {}, '2026-05'],
    ['ISO date late in the month', '2026-05-31', {}, '2026-05'],
    ['ISO date and time', '2026-05-14T09:30:00Z', {}, '2026-05'],
    ['year and month', '2026-05', {}, '2026-05'],
    ['year/month/day', '2026/05/14', {}, '2026-05'],
    ['day first, unmistakably', '14/05/2026', {}, '2026-05'],
    ['month first, unmistakably', '05/14/2026', {}, '2026-05'],
    ['day and month the same', '05/05/2026', {}, '2026-05'],
    ['day first, as the upload says', '04/05/2026', { dateConvention: 'day_first' }, '2026-05'],
    ['month first, as the upload says', '05/04/2026', { dateConvention: 'month_first' }, '2026-05'],
    ['month and year', '05/2026', {}, '2026-05'],
    ['day, month name and year', '14 May 2026', {}, '2026-05'],
    ['month name and year', 'Sept 2025', {}, '2025-09'],
    ['a date cell', new Date(Date.UTC(2026, 4, 14)), {}, '2026-05'],
    ['an Excel serial', 46156, {}, '2026-05'],
    ['an Excel serial written as text', '46156', {}, '2026-05'],
    ['an Excel serial of the 1900 date system', 44694, {}, '2022-05'],
    ['the same serial in a 1904 date system workbook', 44694, { date1904: true }, '2026-05'],
    ['the last month of the window', '2026-09-30', {}, '2026-09'],
    ['before the window (kept: measures look at the window)', '2024-01-10', {}, '2024-01'],
  ])('%s', (_name, cell, context, kept) => {
    const outcome = hba1c(cell, context);
    expectIssues(outcome, []);
    expect(recordOf(outcome)[COL.hba1c_month]).toBe(kept);
    expect(recordOf(outcome)[COL.hba1c_mmol_mol]).toBe(58);
  });

  it.each<[string, Cell, Partial<ValidationContext>, Expected]>([
    [
      'day and month both possible',
      '05/04/2026',
      {},
      [
        'ambiguous_date',
        '“05/04/2026” can be read as 2026-04-05 (day first) or 2026-05-04 (month first).',
      ],
    ],
    [
      'not day first, though the upload says so',
      '05/14/2026',
      { dateConvention: 'day_first' },
      [
        'date_contradicts_convention',
        '“05/14/2026” cannot be read day first, as this upload says dates are written.',
      ],
    ],
    [
      'not month first, though the upload says so',
      '14/05/2026',
      { dateConvention: 'month_first' },
      [
        'date_contradicts_convention',
        '“14/05/2026” cannot be read month first, as this upload says dates are written.',
      ],
    ],
    [
      'a two-digit year',
      '14/05/26',
      {},
      ['two_digit_year', 'The date “14/05/26” has a two-digit year.'],
    ],
    [
      'a month name with a two-digit year',
      '14 May 26',
      {},
      ['two_digit_year', 'The date “14 May 26” has a two-digit year.'],
    ],
    [
      'a year alone',
      '2026',
      {},
      ['date_year_only', '“2026” is a year without a month; Cairn needs at least the month.'],
    ],
    [
      'a year alone as a number',
      2026,
      {},
      ['date_year_only', '“2026” is a year without a month; Cairn needs at least the month.'],
    ],
    ['words', 'last spring', {}, ['invalid_date', '“last spring” is not a date Cairn can read.']],
    [
      'a day that does not exist',
      '2026-02-30',
      {},
      ['invalid_date', '“2026-02-30” is not a date Cairn can read.'],
    ],
    [
      'a month that does not exist',
      '2026-13-01',
      {},
      ['invalid_date', '“2026-13-01” is not a date Cairn can read.'],
    ],
    ['a boolean cell', true, {}, ['invalid_date', '“TRUE” is not a date Cairn can read.']],
    [
      'in the future',
      '2026-11-03',
      {},
      ['date_in_future', 'The date “2026-11-03” (2026-11) is in the future.'],
    ],
    [
      'a serial in the future (1904 date system)',
      46156,
      { date1904: true },
      ['date_in_future', 'The date “46156” (2030-05) is in the future.'],
    ],
    [
      'after the window, not yet in the future',
      '2026-10-01',
      {},
      [
        'date_after_window',
        "The date “2026-10-01” (2026-10) is after the end of this quarter's review window (2026-09).",
      ],
    ],
    [
      'before the person was born',
      '1957-06-01',
      {},
      ['date_before_birth', 'The date “1957-06-01” (1957-06) is before the person was born.'],
    ],
    [
      'before 1900',
      '1899-12-01',
      {},
      ['date_before_birth', 'The date “1899-12-01” (1899-12) is before the person was born.'],
    ],
  ])('%s', (_name, cell, context, issue) => {
    expectIssues(hba1c(cell, context), [issue]);
  });

  it('a date before a birth year that is itself refused is not checked against it', () => {
    expectIssues(validate({ birth_year: '1990x', hba1c_date: '1957-06-01' }), [
      ['invalid_year', 'birth_year “1990x” is not a year.'],
    ]);
  });
});

describe('care process results and their dates', () => {
  it.each<[string, Cells, Expected[]]>([
    ['neither date nor result', { hba1c_date: null, hba1c_value: null }, []],
    [
      'a result without a date',
      { hba1c_date: null },
      [
        [
          'value_without_date',
          'HbA1c has a result but no date in hba1c_date, so it cannot be placed in the review window and is not counted.',
        ],
      ],
    ],
    [
      'a date without a result',
      { hba1c_value: null, hba1c_unit: null },
      [['date_without_value', 'HbA1c has a date but no result, so it is not counted as done.']],
    ],
    [
      'a blood pressure without its diastolic value',
      { bp_diastolic: null },
      [
        [
          'date_without_value',
          'Blood pressure is missing bp_diastolic, so it is not counted as done.',
        ],
      ],
    ],
    [
      'a blood pressure with neither value',
      { bp_systolic: null, bp_diastolic: null },
      [
        [
          'date_without_value',
          'Blood pressure has a date but no result, so it is not counted as done.',
        ],
      ],
    ],
    [
      'one blood pressure value not a number, the other missing: only the error',
      { bp_systolic: 'high', bp_diastolic: null },
      [['invalid_number', 'bp_systolic “high” is not a number.']],
    ],
    [
      'a result without a date, the result not a number: only the missing date',
      { smoking_date: null, smoking_status: 'sometimes' },
      [
        [
          'value_without_date',
          'Smoking status has a result but no date in smoking_date, so it cannot be placed in the review window and is not counted.',
        ],
      ],
    ],
    [
      'a date and a result both unreadable: both, date first',
      { hba1c_date: 'soon', hba1c_value: 'high' },
      [
        ['invalid_date', '“soon” is not a date Cairn can read.'],
        ['invalid_number', 'hba1c_value “high” is not a number.'],
      ],
    ],
    [
      'systolic not above diastolic',
      { bp_systolic: '80', bp_diastolic: '90' },
      [
        [
          'systolic_not_above_diastolic',
          'Blood pressure 80/90: the systolic value must be higher than the diastolic one.',
        ],
      ],
    ],
    [
      'systolic equal to diastolic',
      { bp_systolic: 90, bp_diastolic: 90 },
      [
        [
          'systolic_not_above_diastolic',
          'Blood pressure 90/90: the systolic value must be higher than the diastolic one.',
        ],
      ],
    ],
    [
      'smoking status not in the list',
      { smoking_status: 'sometimes' },
      [['invalid_code', 'smoking_status “sometimes” is not one of the allowed values.']],
    ],
  ])('%s', (_name, changes, expected) => {
    const outcome = validate(changes);
    expectIssues(outcome, expected);
    if (outcome.kind === 'accepted') {
      // A care process is kept whole or not at all.
      const r = outcome.record;
      const whole = (...values: (string | number | null | undefined)[]) =>
        values.every((v) => v === null) || values.every((v) => v !== null);
      expect(whole(r[COL.hba1c_month], r[COL.hba1c_mmol_mol])).toBe(true);
      expect(whole(r[COL.blood_pressure_month], r[COL.systolic], r[COL.diastolic])).toBe(true);
    }
  });

  it.each<[string, Cells, keyof typeof COL, string | null]>([
    [
      'a foot check is its date alone',
      { foot_check_date: '2026-01-15' },
      'foot_surveillance_month',
      '2026-01',
    ],
    ['no foot check', { foot_check_date: null }, 'foot_surveillance_month', null],
    [
      'a retinal screening is its date alone',
      { retinal_screening_date: '2026-02-01' },
      'retinal_screening_month',
      '2026-02',
    ],
    ['smoking status in other words', { smoking_status: 'Ex-smoker' }, 'smoking_status', 'ex'],
    ['a result without a date keeps neither', { hba1c_date: null }, 'hba1c_month', null],
    ['a date without a result keeps neither', { bmi_value: null }, 'bmi_month', null],
  ])('%s', (_name, changes, key, kept) => {
    const record = recordOf(validate(changes));
    expect(record[COL[key]]).toBe(kept);
  });

  it('says which column holds the result without a date', () => {
    expect(issuesOf(validate({ bp_date: null, bp_systolic: null }))[0]).toMatchObject({
      code: 'value_without_date',
      column: 'bp_diastolic',
      value: '78',
    });
  });
});

describe('plausible ranges (columns.ts), in the canonical unit', () => {
  /** Partners that keep a blood pressure reading in order while one value is tried. */
  const partner: Record<string, Cells> = {
    bp_systolic: { bp_diastolic: '30' },
    bp_diastolic: { bp_systolic: '260' },
  };
  const measured = COLUMNS.filter((c) => c.kind === 'number' && c.range && c.key !== 'hba1c_value');
  const outside = (key: string, shown: string): Expected => {
    const def = column(key);
    return [
      'out_of_range',
      `${key} ${shown} is outside the plausible range ${def.range!.min}–${def.range!.max} ${def.units![0]!.code}.`,
    ];
  };
  const cases = measured.flatMap((def) => {
    const { min, max } = def.range!;
    const unit = def.units![0]!.code;
    return [
      [def.key, min, [] as Expected[]],
      [def.key, max, []],
      [def.key, min - 1, [outside(def.key, `${min - 1} ${unit}`)]],
      [def.key, max + 1, [outside(def.key, `${max + 1} ${unit}`)]],
    ] as [string, number, Expected[]][];
  });

  it.each(cases)('%s %d', (key, value, expected) => {
    for (const cell of [value, String(value)]) {
      const outcome = validate({ [key]: cell, ...partner[key] });
      expectIssues(outcome, expected);
    }
  });

  it.each<[string, Cells, Expected[], number | null]>([
    ['HbA1c 21 mmol/mol, no unit', { hba1c_value: '21', hba1c_unit: null }, [], 21],
    ['HbA1c 200 mmol/mol, no unit', { hba1c_value: 200, hba1c_unit: null }, [], 200],
    [
      'HbA1c 201 mmol/mol',
      { hba1c_value: '201' },
      [
        [
          'out_of_range',
          'hba1c_value 201 mmol/mol is outside the plausible range 20–200 mmol/mol.',
        ],
      ],
      null,
    ],
    [
      'HbA1c 2, no unit (too low for %)',
      { hba1c_value: '2', hba1c_unit: null },
      [['out_of_range', 'hba1c_value 2 mmol/mol is outside the plausible range 20–200 mmol/mol.']],
      null,
    ],
    [
      'HbA1c 7 said to be mmol/mol',
      { hba1c_value: '7', hba1c_unit: 'mmol/mol' },
      [['out_of_range', 'hba1c_value 7 mmol/mol is outside the plausible range 20–200 mmol/mol.']],
      null,
    ],
    [
      // (25 − 2.15) × 10.929 = 249.7: IFCC–NGSP master equation
      'HbA1c 25 %, outside once converted',
      { hba1c_value: '25', hba1c_unit: '%' },
      [
        [
          'out_of_range',
          'hba1c_value 25 % (250 mmol/mol) is outside the plausible range 20–200 mmol/mol.',
        ],
      ],
      null,
    ],
  ])('%s', (_name, changes, expected, kept) => {
    const outcome = validate(changes);
    expectIssues(outcome, expected);
    if (kept !== null) expect(recordOf(outcome)[COL.hba1c_mmol_mol]).toBe(kept);
  });

  it('the fix points to the unit column where there is one', () => {
    expect(issuesOf(validate({ hba1c_value: '201' }))[0]!.fix).toBe(
      'Check the result and its unit; if it is in another unit, say so in hba1c_unit (mmol/mol or %).',
    );
    expect(issuesOf(validate({ bmi_value: '91' }))[0]!.fix).toBe(
      'Check the result in the clinical system and correct it.',
    );
  });
});

describe('units', () => {
  it.each<[string, Cells, RowOptions, keyof typeof COL, number, Expected[]]>([
    // HbA1c: mmol/mol = (% − 2.15) × 10.929, whole numbers (IFCC–NGSP master equation,
    // Hoelzel et al., Clin Chem 2004;50:166–74).
    [
      'HbA1c in mmol/mol, said so',
      { hba1c_value: '58', hba1c_unit: 'mmol/mol' },
      {},
      'hba1c_mmol_mol',
      58,
      [],
    ],
    [
      'HbA1c with the unit column blank',
      { hba1c_value: '58', hba1c_unit: null },
      {},
      'hba1c_mmol_mol',
      58,
      [],
    ],
    [
      'HbA1c unit in other words',
      { hba1c_value: '58', hba1c_unit: 'IFCC' },
      {},
      'hba1c_mmol_mol',
      58,
      [],
    ],
    [
      'HbA1c 7.0 % in the unit column: (7.0 − 2.15) × 10.929 = 53.0',
      { hba1c_value: '7.0', hba1c_unit: '%' },
      {},
      'hba1c_mmol_mol',
      53,
      [['unit_converted', '7 % was converted to 53 mmol/mol.']],
    ],
    [
      'HbA1c 7.0 % after the number',
      { hba1c_value: '7.0 %', hba1c_unit: null },
      {},
      'hba1c_mmol_mol',
      53,
      [['unit_converted', '7 % was converted to 53 mmol/mol.']],
    ],
    [
      'HbA1c in % by its heading: (7.5 − 2.15) × 10.929 = 58.5',
      { hba1c_value: '7.5', hba1c_unit: null },
      { headings: { hba1c_value: 'HbA1c value (%)' } },
      'hba1c_mmol_mol',
      58,
      [['unit_converted', '7.5 % was converted to 58 mmol/mol.']],
    ],
    [
      'HbA1c 7.0 with no unit anywhere: read as %',
      { hba1c_value: '7.0', hba1c_unit: null },
      {},
      'hba1c_mmol_mol',
      53,
      [
        [
          'hba1c_percent_assumed',
          'HbA1c 7 has no unit and is too low for mmol/mol, so Cairn read it as % and converted it to 53 mmol/mol.',
        ],
      ],
    ],
    [
      'HbA1c 20 with no unit: still read as % ((20 − 2.15) × 10.929 = 195.1)',
      { hba1c_value: 20, hba1c_unit: null },
      {},
      'hba1c_mmol_mol',
      195,
      [
        [
          'hba1c_percent_assumed',
          'HbA1c 20 has no unit and is too low for mmol/mol, so Cairn read it as % and converted it to 195 mmol/mol.',
        ],
      ],
    ],
    // Cholesterol: mmol/L = mg/dL ÷ 38.67, to 0.1 (molar mass 386.65 g/mol).
    [
      'cholesterol 193 mg/dL: 193 ÷ 38.67 = 4.99',
      { cholesterol_value: '193', cholesterol_unit: 'mg/dL' },
      {},
      'total_cholesterol_mmol_l',
      5,
      [['unit_converted', '193 mg/dL was converted to 5 mmol/L.']],
    ],
    [
      'cholesterol with a decimal comma',
      { cholesterol_value: '4,6' },
      {},
      'total_cholesterol_mmol_l',
      4.6,
      [],
    ],
    // Creatinine: µmol/L = mg/dL × 88.42, whole numbers (molar mass 113.12 g/mol).
    [
      'creatinine 1.2 mg/dL: 1.2 × 88.42 = 106.1',
      { creatinine_value: '1.2', creatinine_unit: 'mg/dL' },
      {},
      'serum_creatinine_umol_l',
      106,
      [['unit_converted', '1.2 mg/dL was converted to 106 umol/L.']],
    ],
    [
      'creatinine in µmol/L with the micro sign',
      { creatinine_value: '88', creatinine_unit: 'µmol/L' },
      {},
      'serum_creatinine_umol_l',
      88,
      [],
    ],
    [
      'creatinine in mg/dL by its heading',
      { creatinine_value: 1.2, creatinine_unit: null },
      { headings: { creatinine_value: 'creatinine_value_mg_dl' } },
      'serum_creatinine_umol_l',
      106,
      [['unit_converted', '1.2 mg/dL was converted to 106 umol/L.']],
    ],
    // ACR: mg/mmol = mg/g ÷ 8.84, to 0.1.
    [
      'ACR 30 mg/g: 30 ÷ 8.84 = 3.39',
      { acr_value: '30', acr_unit: 'mg/g' },
      {},
      'acr_mg_mmol',
      3.4,
      [['unit_converted', '30 mg/g was converted to 3.4 mg/mmol.']],
    ],
  ])('%s', (_name, changes, options, key, kept, expected) => {
    const outcome = validate(changes, options);
    expectIssues(outcome, expected);
    expect(recordOf(outcome)[COL[key]]).toBe(kept);
  });

  it.each<[string, Cells, Expected]>([
    [
      'a unit column with a unit Cairn does not know',
      { hba1c_unit: 'mg' },
      ['invalid_unit', 'hba1c_unit “mg” is not a unit Cairn knows for hba1c_value.'],
    ],
    [
      'a unit after the number that Cairn does not know',
      { hba1c_value: '58 mmol', hba1c_unit: null },
      ['invalid_unit', 'The unit “mmol” after the number is not one Cairn knows for hba1c_value.'],
    ],
    [
      'two different units',
      { hba1c_value: '7.2 %', hba1c_unit: 'mmol/mol' },
      ['unit_conflict', 'The value says % but hba1c_unit says mmol/mol.'],
    ],
    [
      'a thousands separator or a decimal comma',
      { creatinine_value: '1,200' },
      ['ambiguous_number', '“1,200” could be a decimal comma or a thousands separator.'],
    ],
    ['words', { bmi_value: 'tall' }, ['invalid_number', 'bmi_value “tall” is not a number.']],
    [
      'a boolean cell',
      { bmi_value: true },
      ['invalid_number', 'bmi_value “TRUE” is not a number.'],
    ],
    [
      'a date cell',
      { bmi_value: new Date(Date.UTC(2026, 0, 2)) },
      ['invalid_number', 'bmi_value “2026-01-02” is not a number.'],
    ],
  ])('%s', (_name, changes, issue) => {
    expectIssues(validate(changes), [issue]);
  });

  it('names the accepted units in the fix', () => {
    expect(issuesOf(validate({ cholesterol_unit: 'g/L' }))[0]!.fix).toBe('Use mmol/L or mg/dL.');
    expect(issuesOf(validate({ acr_value: '3 mg/L', acr_unit: null }))[0]!.fix).toBe(
      'Write just the number, with its unit mg/mmol or mg/g in acr_unit.',
    );
  });
});

describe('treatment and history', () => {
  it.each<[string, Cell, number | null]>([
    ['yes', 'yes', 1],
    ['Y', 'Y', 1],
    ['true', 'true', 1],
    ['1 as text', '1', 1],
    ['a TRUE cell', true, 1],
    ['1', 1, 1],
    ['no', 'no', 0],
    ['N', 'N', 0],
    ['a FALSE cell', false, 0],
    ['0', 0, 0],
    ['blank', null, null],
    ['not recorded', 'n/a', null],
    ['unknown', 'Unknown', null],
  ])('on_statin %s', (_name, cell, kept) => {
    const outcome = validate({ on_statin: cell });
    expectIssues(outcome, []);
    expect(recordOf(outcome)[COL.on_statin]).toBe(kept);
  });

  it.each<[string, Cells, Expected]>([
    [
      'on_statin',
      { on_statin: 'sometimes' },
      ['invalid_yes_no', 'on_statin “sometimes” is not yes or no.'],
    ],
    ['on_insulin', { on_insulin: 2 }, ['invalid_yes_no', 'on_insulin “2” is not yes or no.']],
    [
      'cvd_history',
      { cvd_history: 'maybe' },
      ['invalid_yes_no', 'cvd_history “maybe” is not yes or no.'],
    ],
  ])('%s neither yes nor no', (_name, changes, issue) => {
    expectIssues(validate(changes), [issue]);
  });

  it.each<[string, Cells, Expected[], number | null]>([
    [
      'insulin started after diagnosis',
      { on_insulin: 'yes', insulin_start_year: '2016' },
      [],
      2016,
    ],
    [
      'insulin started in the diagnosis year',
      { on_insulin: 'yes', insulin_start_year: 2014 },
      [],
      2014,
    ],
    [
      'insulin started before diagnosis',
      { on_insulin: 'yes', insulin_start_year: '2010' },
      [
        [
          'insulin_year_dropped',
          'insulin_start_year 2010 is before the diagnosis year (2014); Cairn kept the row but left the insulin start year out.',
        ],
      ],
      null,
    ],
    [
      'insulin started before birth, no diagnosis year',
      { on_insulin: 'yes', diagnosis_year: null, insulin_start_year: '1950' },
      [
        [
          'insulin_year_dropped',
          'insulin_start_year 1950 is before the birth year (1958); Cairn kept the row but left the insulin start year out.',
        ],
      ],
      null,
    ],
    [
      'insulin started after the window',
      { on_insulin: 'yes', insulin_start_year: '2027' },
      [
        [
          'insulin_year_dropped',
          'insulin_start_year 2027 is after the end of the review window (2026-09); Cairn kept the row but left the insulin start year out.',
        ],
      ],
      null,
    ],
    [
      'insulin start year but not on insulin',
      { on_insulin: 'no', insulin_start_year: '2016' },
      [
        [
          'insulin_year_without_insulin',
          'insulin_start_year is 2016 but on_insulin is “no”; Cairn kept both as given.',
        ],
      ],
      2016,
    ],
    [
      'insulin start year before 1900',
      { on_insulin: 'yes', insulin_start_year: '1899' },
      [['invalid_year', 'insulin_start_year 1899 is before 1900.']],
      null,
    ],
    [
      'insulin start year as a date',
      { on_insulin: 'yes', insulin_start_year: '2016-03-01' },
      [
        [
          'year_taken_from_date',
          'insulin_start_year holds a full date; Cairn kept only its year (2016).',
        ],
      ],
      2016,
    ],
  ])('%s', (_name, changes, expected, kept) => {
    const outcome = validate(changes);
    expectIssues(outcome, expected);
    if (outcome.kind === 'accepted') expect(outcome.record[COL.insulin_start_year]).toBe(kept);
  });
});

describe('type 1 diabetes but not on insulin (flag)', () => {
  const flag: Expected = [
    'type1_not_on_insulin',
    'Type 1 diabetes is recorded but on_insulin is “no”. Type 1 diabetes ends in complete insulin dependence, so one of the two is probably wrong.',
  ];
  it.each<[string, Cells, Expected[]]>([
    ['type 1, not on insulin', { diabetes_type: 'type1', on_insulin: 'no' }, [flag]],
    ['type 1 in other words, a FALSE cell', { diabetes_type: 'T1', on_insulin: false }, [flag]],
    ['type 1, on insulin', { diabetes_type: 'type1', on_insulin: 'yes' }, []],
    ['type 1, insulin not recorded', { diabetes_type: 'type1', on_insulin: null }, []],
    ['type 2, not on insulin', { diabetes_type: 'type2', on_insulin: 'no' }, []],
    [
      'type 1, not on insulin, with a row error: both reported',
      { diabetes_type: 'type1', on_insulin: 'no', bmi_value: 'tall' },
      [['invalid_number', 'bmi_value “tall” is not a number.'], flag],
    ],
  ])('%s', (_name, changes, expected) => {
    const outcome = validate(changes);
    expectIssues(outcome, expected);
    if (outcome.kind === 'accepted') {
      expect(outcome.record[COL.diabetes_type]).toBe(
        changes.diabetes_type === 'type2' ? 'type2' : 'type1',
      );
    }
  });
});

describe('diagnostic test and result (WHO thresholds, columns.ts)', () => {
  const below = (test: string, shown: string): Expected => {
    const t = DIAGNOSTIC_THRESHOLDS[test]!;
    return [
      'diagnostic_below_threshold',
      `The diagnostic ${test.replace(/_/g, ' ')} of ${shown} ${t.unit} is below the diagnostic threshold of ${t.min} ${t.unit} (${t.source}).`,
    ];
  };

  it.each<[string, Cells, Expected[], string | null, number | null]>([
    ['HbA1c at the threshold', { diagnostic_value: '48' }, [], 'hba1c', 48],
    ['HbA1c below it', { diagnostic_value: '47' }, [below('hba1c', '47')], 'hba1c', 47],
    [
      'HbA1c 6.4 with no unit, read as %: (6.4 − 2.15) × 10.929 = 46.4',
      { diagnostic_value: '6.4', diagnostic_unit: null },
      [below('hba1c', '46')],
      'hba1c',
      46,
    ],
    [
      'HbA1c 6.5 %: (6.5 − 2.15) × 10.929 = 47.5, rounded to 48',
      { diagnostic_value: '6.5', diagnostic_unit: '%' },
      [],
      'hba1c',
      48,
    ],
    [
      'fasting glucose 7.0 mmol/L',
      { diagnostic_test: 'fasting_glucose', diagnostic_value: '7.0', diagnostic_unit: 'mmol/L' },
      [],
      'fasting_glucose',
      7,
    ],
    [
      'fasting glucose 6.9 mmol/L',
      { diagnostic_test: 'FPG', diagnostic_value: 6.9, diagnostic_unit: null },
      [below('fasting_glucose', '6.9')],
      'fasting_glucose',
      6.9,
    ],
    [
      // mmol/L = mg/dL ÷ 18.016 (molar mass of glucose 180.16 g/mol), to 0.1: 6.99 → 7.0
      'fasting glucose 126 mg/dL, at the threshold once converted',
      { diagnostic_test: 'fasting_glucose', diagnostic_value: '126', diagnostic_unit: 'mg/dL' },
      [],
      'fasting_glucose',
      7,
    ],
    [
      'two-hour glucose 11.0 mmol/L',
      { diagnostic_test: 'OGTT', diagnostic_value: '11.0', diagnostic_unit: 'mmol/L' },
      [below('two_hour_glucose', '11')],
      'two_hour_glucose',
      11,
    ],
    [
      'random glucose 11.1 mmol/L',
      { diagnostic_test: 'random', diagnostic_value: '11.1 mmol/L', diagnostic_unit: null },
      [],
      'random_glucose',
      11.1,
    ],
    ['a test without a result', { diagnostic_value: null }, [], 'hba1c', null],
    [
      'neither',
      { diagnostic_test: null, diagnostic_value: null, diagnostic_unit: null },
      [],
      null,
      null,
    ],
    [
      'a result without a test',
      { diagnostic_test: null },
      [
        [
          'diagnostic_value_dropped',
          'diagnostic_value is filled in but diagnostic_test is blank, so Cairn left the result out.',
        ],
      ],
      null,
      null,
    ],
  ])('%s', (_name, changes, expected, test, kept) => {
    const outcome = validate(changes);
    expectIssues(outcome, expected);
    const record = recordOf(outcome);
    expect(record[COL.diagnostic_test]).toBe(test);
    expect(record[COL.diagnostic_value]).toBe(kept);
  });

  it.each<[string, Cells, Expected[]]>([
    [
      'a test not in the list: its result left out too',
      { diagnostic_test: 'urine dipstick' },
      [
        ['invalid_code', 'diagnostic_test “urine dipstick” is not one of the allowed values.'],
        [
          'diagnostic_value_dropped',
          'diagnostic_value is filled in but diagnostic_test is blank, so Cairn left the result out.',
        ],
      ],
    ],
    [
      'a result that is not a number',
      { diagnostic_value: 'high' },
      [['invalid_number', 'diagnostic_value “high” is not a number.']],
    ],
    [
      'a glucose unit for an HbA1c result',
      { diagnostic_unit: 'mg/dL' },
      [['invalid_unit', '“mg/dL” is not a unit for a HbA1c result.']],
    ],
    [
      'an HbA1c unit for a glucose result',
      { diagnostic_test: 'random_glucose', diagnostic_value: '12 %', diagnostic_unit: null },
      [['invalid_unit', '“%” is not a unit for a glucose result.']],
    ],
  ])('%s', (_name, changes, expected) => {
    expectIssues(validate(changes), expected);
  });

  it('without the optional diagnostic columns, keeps neither and says nothing', () => {
    const outcome = validate(
      {},
      { omit: ['diagnostic_test', 'diagnostic_value', 'diagnostic_unit'] },
    );
    expectIssues(outcome, []);
    expect(recordOf(outcome)[COL.diagnostic_test]).toBeNull();
    expect(recordOf(outcome)[COL.diagnostic_value]).toBeNull();
  });
});

describe('the outcome', () => {
  it('lists every issue of a refused row, in column order, with the column as headed', () => {
    const outcome = validate(
      {
        sex: 'Q',
        diabetes_type: null,
        hba1c_value: '7.0',
        hba1c_unit: null,
        bmi_value: '95',
        on_statin: 'sometimes',
      },
      { headings: { bmi_value: 'BMI value' } },
    );
    expectIssues(outcome, [
      ['invalid_code', 'sex “Q” is not one of the allowed values.'],
      [
        'diabetes_type_missing',
        'diabetes_type is blank: the person is kept but not counted in any measure.',
      ],
      [
        'hba1c_percent_assumed',
        'HbA1c 7 has no unit and is too low for mmol/mol, so Cairn read it as % and converted it to 53 mmol/mol.',
      ],
      ['out_of_range', 'bmi_value 95 kg/m2 is outside the plausible range 10–90 kg/m2.'],
      ['invalid_yes_no', 'on_statin “sometimes” is not yes or no.'],
    ]);
    expect(issuesOf(outcome).map((i) => [i.row, i.column, i.key, i.value])).toEqual([
      [ROW, 'sex', 'sex', 'Q'],
      [ROW, 'diabetes_type', 'diabetes_type', null],
      [ROW, 'hba1c_value', 'hba1c_value', '7.0'],
      [ROW, 'BMI value', 'bmi_value', '95'],
      [ROW, 'on_statin', 'on_statin', 'sometimes'],
    ]);
  });

  it('keeps a row with warnings and flags, with its issues', () => {
    const outcome = validate({
      diabetes_type: 'type1',
      on_insulin: 'no',
      hba1c_value: '7.0 %',
      hba1c_unit: null,
    });
    expect(outcome.kind).toBe('accepted');
    expect(issuesOf(outcome).map((i) => i.code)).toEqual([
      'unit_converted',
      'type1_not_on_insulin',
    ]);
  });

  it('cuts a long value to 255 characters in the issue', () => {
    const issue = issuesOf(validate({ sex: 'x'.repeat(300) }))[0]!;
    expect(issue.value).toBe('x'.repeat(255));
    expect(issue.message).toBe(`sex “${'x'.repeat(57)}…” is not one of the allowed values.`);
  });

  it('starts every row afresh', () => {
    const { validator, cellsOf } = validatorFor();
    expect(validator.validate(2, cellsOf({ record_ref: 'A', bmi_value: 'tall' })).kind).toBe(
      'rejected',
    );
    const next = validator.validate(3, cellsOf({ record_ref: 'B' }));
    expectIssues(next, []);
    expect(recordOf(next)[COL.source_row]).toBe(3);
    expect(recordOf(next)[COL.bmi_kg_m2]).toBe(31.4);
  });
});
