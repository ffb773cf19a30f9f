/**
 * The bad-file corpus: every refusal class and every row-error code of the
 * extract format, each in a file generated here, uploaded through the real
 * HTTP stack by a practice lead. Each case asserts the exact code and
 * message, and that the practice's current submission and its records are
 * exactly as before.
 */
import { QueryTypes } from 'sequelize';
import type TestAgent from 'supertest/lib/agent.js';
import ExcelJS from 'exceljs';
import { signInAs } from './support/auth.js';
import { createTestApp, type TestApp } from './support/test-app.js';
import {
  arrange,
  currentState,
  upload,
  waitDone,
  type ExtractsWorld,
} from './extracts-fixtures/api.js';
import {
  csvOf,
  goodRow,
  goodRows,
  HEADINGS,
  REQUIRED_HEADINGS,
  type Row,
  xlsxOf,
} from './extracts-fixtures/rows.js';
import { alterSheet, alterWorkbook, buildZip } from './extracts-fixtures/zip.js';
import { encryptXlsx, wordDocument, xlsWorkbook } from './extracts-fixtures/compound.js';
import { columnLetter } from '../src/submissions/format/header.js';

const BOMB_CAP = 8 * 1024 * 1024;

interface Expect {
  refusal?: {
    code: string;
    message: string;
    fix?: string;
    problems?: { code: string; title: string; message: string; fix: string }[];
  };
  issue?: {
    row: number | null;
    code: string;
    message: string;
    column?: string | null;
    value?: string | null;
    fix?: string;
  };
  problem?: { status: number; type: string; code?: string; detail: string };
}

interface Case {
  name: string;
  file: () => Promise<{ buf: Buffer; name: string }> | { buf: Buffer; name: string };
  dateConvention?: 'day_first' | 'month_first';
  quarter?: string;
  expect: Expect;
}

/** A clean file with one row changed: the bad row is spreadsheet row 4 (heading row 1). */
const withRow = (overrides: Row, n = 5) => {
  const rows = goodRows(
    n,
    1000 + Object.keys(overrides).length * 37 + JSON.stringify(overrides).length,
  );
  rows[2] = { ...rows[2]!, ...overrides };
  return rows;
};
const csvCase = (overrides: Row) => () => ({ buf: csvOf(withRow(overrides)), name: 'extract.csv' });

function tenDigitModulus11(i: number): string {
  for (let k = 0; ; k++) {
    const nine = String(400_000_000 + i * 97 + k).padStart(9, '0');
    let sum = 0;
    for (let d = 0; d < 9; d++) sum += Number(nine[d]) * (10 - d);
    const check = 11 - (sum % 11);
    if (check === 10) continue;
    return nine + String(check === 11 ? 0 : check);
  }
}

const cases: Case[] = [
  // ───────────── refusals: the whole file ─────────────
  {
    name: 'a PDF',
    file: () => ({
      buf: Buffer.from('%PDF-1.7\n%\u00e2\u00e3\n1 0 obj\n<<>>\nendobj\n', 'latin1'),
      name: 'annual-review.pdf',
    }),
    expect: {
      refusal: {
        code: 'unsupported_file_type',
        message: '“annual-review.pdf” is a PDF document, not a spreadsheet or CSV file.',
        fix: 'Upload the extract as an .xlsx workbook or a .csv file; start from Cairn’s template if in doubt.',
      },
    },
  },
  {
    name: 'an Excel 97–2003 workbook (.xls)',
    file: () => ({ buf: xlsWorkbook(), name: 'extract.xls' }),
    expect: {
      refusal: {
        code: 'save_as_xlsx',
        message: 'This is an Excel 97–2003 workbook (.xls), which Cairn does not read.',
        fix: 'Open it in Excel (or LibreOffice), choose File › Save As, pick “Excel Workbook (.xlsx)” or “CSV UTF-8”, and upload that file.',
      },
    },
  },
  {
    name: 'a macro-enabled workbook (.xlsm)',
    file: async () => ({
      buf: alterWorkbook(await xlsxOf(goodRows(3)), (parts) => [
        ...parts,
        { name: 'xl/vbaProject.bin', data: Buffer.alloc(64, 1) },
      ]),
      name: 'extract.xlsm',
    }),
    expect: {
      refusal: {
        code: 'save_as_xlsx',
        message:
          'This is a macro-enabled workbook (.xlsm). Cairn does not accept files that can carry macros.',
        fix: 'Open it in Excel, choose File › Save As, pick “Excel Workbook (.xlsx)” (which leaves the macros out) or “CSV UTF-8”, and upload that file.',
      },
    },
  },
  {
    name: 'an OpenDocument spreadsheet (.ods)',
    file: () => ({
      buf: buildZip([
        { name: 'mimetype', data: Buffer.from('application/vnd.oasis.opendocument.spreadsheet') },
        { name: 'content.xml', data: Buffer.from('<office:document-content/>') },
      ]),
      name: 'extract.ods',
    }),
    expect: {
      refusal: {
        code: 'save_as_xlsx',
        message: 'This is an OpenDocument spreadsheet (.ods), which Cairn does not read.',
        fix: 'Open it in LibreOffice Calc, choose File › Save As, pick “Excel 2007-365 (.xlsx)” or “Text CSV”, and upload that file.',
      },
    },
  },
  {
    name: 'an Apple Numbers file',
    file: () => ({
      buf: buildZip([{ name: 'Index/Document.iwa', data: Buffer.alloc(100, 3) }]),
      name: 'extract.numbers',
    }),
    expect: {
      refusal: {
        code: 'save_as_xlsx',
        message: 'This is an Apple Numbers file (.numbers), which Cairn does not read.',
        fix: 'In Numbers choose File › Export To › Excel… (or CSV…), and upload the exported file.',
      },
    },
  },
  {
    name: 'a workbook encrypted with a password',
    file: async () => ({ buf: encryptXlsx(await xlsxOf(goodRows(3))), name: 'extract.xlsx' }),
    expect: {
      refusal: {
        code: 'encrypted_workbook',
        message: 'The workbook is protected with a password, so Cairn cannot read it.',
        fix: 'In Excel choose File › Info › Protect Workbook › Encrypt with Password, delete the password, save, and upload the file again.',
      },
    },
  },
  {
    name: 'an Excel 97–2003 workbook protected with a password',
    file: () => ({ buf: xlsWorkbook({ password: true, large: true }), name: 'extract.xls' }),
    expect: {
      refusal: {
        code: 'encrypted_workbook',
        message:
          'This is an Excel 97–2003 workbook (.xls) protected with a password, so Cairn cannot read it.',
        fix: 'Open it in Excel with its password, choose File › Info › Protect Workbook › Encrypt with Password and delete the password, then choose File › Save As, pick “Excel Workbook (.xlsx)” or “CSV UTF-8”, and upload that file.',
      },
    },
  },
  {
    name: 'a Word 97–2003 document',
    file: () => ({ buf: wordDocument(), name: 'annual-review.doc' }),
    expect: {
      refusal: {
        code: 'unsupported_file_type',
        message: '“annual-review.doc” is a Word 97–2003 document, not a spreadsheet or CSV file.',
      },
    },
  },
  {
    name: 'a workbook cut short',
    file: async () => {
      const whole = await xlsxOf(goodRows(20));
      return { buf: whole.subarray(0, Math.floor(whole.length * 0.6)), name: 'extract.xlsx' };
    },
    expect: {
      refusal: {
        code: 'unreadable_file',
        message:
          'The workbook is damaged and cannot be read (the end of the ZIP directory is missing (the file is cut short)). It may have been cut short while it was copied or downloaded.',
        fix: 'Open it in Excel to check that it opens, save it again as .xlsx, and upload the new file.',
      },
    },
  },
  {
    name: 'an empty file',
    file: () => ({ buf: Buffer.alloc(0), name: 'extract.csv' }),
    expect: { refusal: { code: 'empty_file', message: 'The file is empty (0 bytes).' } },
  },
  {
    name: 'a workbook whose data sheet has no values',
    file: async () => ({ buf: await xlsxOf([], []), name: 'extract.xlsx' }),
    expect: { refusal: { code: 'empty_file', message: 'The sheet “data” has no values in it.' } },
  },
  {
    name: 'headings only',
    file: () => ({ buf: csvOf([]), name: 'extract.csv' }),
    expect: {
      refusal: {
        code: 'header_only',
        message: 'The file has the headings (row 1) but no rows of data below them.',
      },
    },
  },
  {
    name: 'required columns missing',
    file: () => ({
      buf: csvOf(
        goodRows(3),
        HEADINGS.filter((h) => h !== 'bp_systolic' && h !== 'bmi_value'),
      ),
      name: 'extract.csv',
    }),
    expect: {
      refusal: {
        code: 'missing_columns',
        message: 'The file has no columns bp_systolic and bmi_value, which Cairn needs.',
        fix: 'Add the columns with those headings (leave cells blank where nothing was recorded), or start from Cairn’s template.',
      },
    },
  },
  {
    name: 'identifier-like columns (Safe Harbor list)',
    file: () => ({
      buf: csvOf(
        goodRows(3).map((r) => ({ ...r, 'Patient Name': 'A Person', Postcode: 'ZZ1 1ZZ' })),
        [...HEADINGS, 'Patient Name', 'Postcode'],
      ),
      name: 'extract.csv',
    }),
    expect: {
      refusal: {
        code: 'identifier_column',
        message:
          'The file has columns that could identify people: “Patient Name” (column AI, looks like names) and “Postcode” (column AJ, looks like a postcode or ZIP code). Cairn accepts only de-identified data, so the file was not accepted and nothing from it was kept.',
        fix: 'Delete those columns from the file (Cairn needs only the columns of its template) and upload again.',
      },
    },
  },
  {
    name: 'a column that identifies people and missing columns, refused for both at once',
    file: () => ({
      buf: csvOf(
        goodRows(3).map((r) => ({ ...r, 'NHS number': '' })),
        [...HEADINGS.filter((h) => h !== 'sex' && h !== 'bmi_value'), 'NHS number'],
      ),
      name: 'extract.csv',
    }),
    expect: {
      refusal: {
        code: 'identifier_column',
        message:
          'The heading row has 2 problems (column that identifies people; required columns missing), so the file was not accepted and nothing from it was kept.',
        fix: 'Fix each of them as its own note says, then upload the file again; or start from Cairn’s template.',
        problems: [
          {
            code: 'identifier_column',
            title: 'Column that identifies people',
            message: `The file has a column that could identify people: “NHS number” (column ${columnLetter(HEADINGS.length - 2)}, looks like a national health or insurance number). Cairn accepts only de-identified data, so the file was not accepted and nothing from it was kept.`,
            fix: 'Delete that column from the file (Cairn needs only the columns of its template) and upload again.',
          },
          {
            code: 'missing_columns',
            title: 'Required columns missing',
            message: 'The file has no columns sex and bmi_value, which Cairn needs.',
            fix: 'Add the columns with those headings (leave cells blank where nothing was recorded), or start from Cairn’s template.',
          },
        ],
      },
    },
  },
  {
    name: 'a full date of birth column',
    file: () => ({
      buf: csvOf(
        goodRows(2).map((r) => ({ ...r, DOB: '1956-03-14' })),
        [...HEADINGS, 'DOB'],
      ),
      name: 'extract.csv',
    }),
    expect: {
      refusal: {
        code: 'identifier_column',
        message:
          'The file has a column that could identify people: “DOB” (column AI, looks like a full date of birth). Cairn accepts only de-identified data, so the file was not accepted and nothing from it was kept.',
      },
    },
  },
  {
    name: 'e-mail addresses as record references',
    file: csvCase({ record_ref: 'someone@example.invalid' }),
    expect: {
      refusal: {
        code: 'identifier_values',
        message:
          'record_ref on row 4 is an e-mail address. Cairn accepts only de-identified data, so the file was not accepted and nothing from it was kept.',
      },
    },
  },
  {
    name: 'national health numbers as record references',
    file: () => ({
      buf: csvOf(goodRows(12).map((r, i) => ({ ...r, record_ref: tenDigitModulus11(i) }))),
      name: 'extract.csv',
    }),
    expect: {
      refusal: {
        code: 'identifier_values',
        message:
          'The record_ref values look like national health numbers (12 of 12 are 10-digit numbers with a valid check digit, e.g. row 2). Cairn accepts only de-identified data, so the file was not accepted and nothing from it was kept.',
      },
    },
  },
  {
    name: 'full dates of birth in birth_year',
    file: csvCase({ birth_year: '14/03/1956' }),
    expect: {
      refusal: {
        code: 'full_birth_date',
        message:
          'birth_year on row 4 holds a full date (14/03/1956). A date of birth identifies a person, so the file was not accepted and nothing from it was kept.',
      },
    },
  },
  {
    name: '250,000 rows, over the row limit',
    file: () => {
      const header = REQUIRED_HEADINGS.join(',');
      const blanks = ','.repeat(REQUIRED_HEADINGS.length - 4);
      const lines = new Array<string>(250_001);
      lines[0] = header;
      for (let i = 1; i <= 250_000; i++) lines[i] = `R${i},1950,F,type2${blanks}`;
      return { buf: Buffer.from(lines.join('\n') + '\n'), name: 'whole-region.csv' };
    },
    expect: {
      refusal: {
        code: 'too_many_rows',
        message: 'The file has 250,000 rows of data; Cairn accepts at most 200,000 in one extract.',
        fix: 'Check that the file holds one practice’s people with diabetes, one row each; if the practice really has more, ask the regional lead to raise the limit.',
      },
    },
  },
  {
    name: 'a 30 MB file, over the size limit',
    file: () => {
      const header = Buffer.from(HEADINGS.join(',') + '\n');
      const line = Buffer.from(`${'x'.repeat(100)}\n`);
      const body = Buffer.alloc(30 * 1024 * 1024 - header.length);
      for (let i = 0; i < body.length; i += line.length) line.copy(body, i);
      return { buf: Buffer.concat([header, body]), name: 'big.csv' };
    },
    expect: {
      problem: {
        status: 413,
        type: '/api/problems/extract-too-large',
        code: 'file_too_large',
        detail: 'The file is larger than 25 MB, the most Cairn accepts for one extract.',
      },
    },
  },
  {
    name: 'a workbook that expands far beyond its size (honest directory)',
    file: async () => ({
      buf: alterWorkbook(await xlsxOf(goodRows(2)), (parts) => [
        ...parts,
        { name: 'xl/media/filler.xml', data: Buffer.alloc(BOMB_CAP + 1024, 0x20) },
      ]),
      name: 'extract.xlsx',
    }),
    expect: {
      refusal: {
        code: 'uncompressed_too_large',
        message:
          'The workbook expands to more than 8 MB when opened, far more than an extract needs, so Cairn stopped reading it.',
        fix: 'Save only the data sheet, without images or other sheets, as a new .xlsx workbook (or as CSV UTF-8), and upload that.',
      },
    },
  },
  {
    name: 'a zip bomb whose directory lies about its size',
    file: async () => ({
      buf: alterWorkbook(await xlsxOf(goodRows(2)), (parts) => [
        ...parts,
        {
          name: 'xl/media/filler.xml',
          data: Buffer.alloc(BOMB_CAP + 1024, 0x20),
          declaredSize: 100,
        },
      ]),
      name: 'extract.xlsx',
    }),
    expect: {
      refusal: {
        code: 'uncompressed_too_large',
        message:
          'The workbook expands to more than 8 MB when opened, far more than an extract needs, so Cairn stopped reading it.',
      },
    },
  },
  ...(
    [
      ['more', -40],
      ['less', 40],
    ] as const
  ).map(([than, declaredMinusReal]): Case => ({
    name: `a sheet that expands to ${than} than its directory says`,
    file: async () => ({
      buf: alterSheet(await xlsxOf(goodRows(20)), (p) => ({
        ...p,
        declaredSize: p.data.length + declaredMinusReal,
      })),
      name: 'extract.xlsx',
    }),
    expect: {
      refusal: {
        code: 'unreadable_file',
        message:
          'The workbook is damaged and cannot be read (the part xl/worksheets/sheet1.xml is not the size its directory says). It may have been cut short while it was copied or downloaded.',
      },
    },
  })),
  {
    name: 'XML entity declarations (entity expansion)',
    file: async () => ({
      buf: alterWorkbook(await xlsxOf(goodRows(2)), (parts) =>
        parts.map((p) =>
          p.name === 'xl/worksheets/sheet1.xml'
            ? {
                name: p.name,
                data: Buffer.from(
                  p.data
                    .toString('utf8')
                    .replace(
                      '?>',
                      '?><!DOCTYPE worksheet [<!ENTITY a "aaaaaaaaaa"><!ENTITY b "&a;&a;&a;&a;&a;&a;&a;&a;">]>',
                    ),
                ),
              }
            : p,
        ),
      ),
      name: 'extract.xlsx',
    }),
    expect: {
      refusal: {
        code: 'xml_entities',
        message:
          'The workbook part xl/worksheets/sheet1.xml contains XML declarations (DOCTYPE or ENTITY) that spreadsheet programs never write; Cairn does not open such files.',
      },
    },
  },
  {
    name: 'a CSV not saved as UTF-8',
    file: () => {
      const text = csvOf(withRow({ smoking_status: 'never' }))
        .toString('utf8')
        .replace('T-', 'é-');
      return { buf: Buffer.from(text, 'latin1'), name: 'extract.csv' };
    },
    expect: {
      refusal: {
        code: 'not_utf8',
        message:
          'The file is not saved as UTF-8 text (the first character Cairn cannot read is on line 2), so letters such as é or µ would be misread.',
      },
    },
  },
  {
    name: 'a CSV with an unclosed quote',
    file: () => {
      const text = csvOf(goodRows(4)).toString('utf8').split('\r\n');
      text[2] = text[2]!.replace('never', '"never');
      return { buf: Buffer.from(text.join('\r\n')), name: 'extract.csv' };
    },
    expect: {
      refusal: {
        code: 'csv_malformed',
        message:
          'A quote mark (") opened on row 3 is never closed, so the rest of the file would be read as one cell.',
      },
    },
  },
  {
    name: 'no heading row',
    file: () => ({ buf: Buffer.from('name of list,count\nsomething,3\n'), name: 'extract.csv' }),
    expect: {
      refusal: {
        code: 'no_header_row',
        message:
          'Cairn could not find the heading row: none of the first 20 rows with values names at least three of Cairn’s columns (record_ref, birth_year, sex, diabetes_type, …).',
      },
    },
  },
  {
    name: 'a column given twice',
    file: () => ({ buf: csvOf(goodRows(2), [...HEADINGS, 'HbA1c value']), name: 'extract.csv' }),
    expect: {
      refusal: {
        code: 'duplicate_column',
        message:
          'The column hba1c_value appears more than once (columns H and AI: “hba1c_value” and “HbA1c value”), so Cairn cannot tell which to use.',
      },
    },
  },
  {
    name: 'a unit in a heading Cairn does not know',
    file: () => ({
      buf: csvOf(
        goodRows(2),
        HEADINGS.map((h) => (h === 'hba1c_value' ? 'hba1c_value (mg)' : h)),
      ),
      name: 'extract.csv',
    }),
    expect: {
      refusal: {
        code: 'unknown_unit_in_header',
        message:
          'The heading “hba1c_value (mg)” names the unit “mg”, which Cairn does not know for hba1c_value.',
        fix: 'Use mmol/mol and % in the heading, or write the heading without a unit.',
      },
    },
  },
  {
    name: 'no row that can be accepted',
    file: () => ({
      buf: csvOf(goodRows(3).map((r) => ({ ...r, birth_year: 1850 }))),
      name: 'extract.csv',
    }),
    expect: {
      refusal: {
        code: 'no_valid_rows',
        message:
          'None of the 3 rows could be accepted: every row has at least one error (listed in the report).',
      },
    },
  },
  {
    name: 'an upload to a closed quarter',
    quarter: '2026 Q2',
    file: () => ({ buf: csvOf(goodRows(3, 7000)), name: 'late.csv' }),
    expect: {
      problem: {
        status: 409,
        type: '/api/problems/quarter-closed',
        detail:
          '2026 Q2 is closed to uploads (its deadline was 2026-09-15). Ask your regional lead if a late extract should still be accepted.',
      },
    },
  },

  // ───────────── row errors: the row is refused, the rest kept ─────────────
  {
    name: 'record_ref missing',
    file: csvCase({ record_ref: null }),
    expect: {
      issue: {
        row: 4,
        code: 'record_ref_missing',
        message: 'This row has no record_ref.',
        fix: "Fill in the practice's own reference for the person, so that the practice can find them again.",
      },
    },
  },
  {
    name: 'formula injection in record_ref (=HYPERLINK)',
    file: csvCase({
      record_ref: '=HYPERLINK("http://example.invalid","open")',
      smoking_status: '@SUM(A1:A9)',
    }),
    expect: {
      issue: {
        row: 4,
        code: 'record_ref_formula',
        column: 'record_ref',
        value: '=HYPERLINK("http://example.invalid","open")',
        message:
          'record_ref “=HYPERLINK("http://example.invalid","open")” starts with “=”, which spreadsheet programs treat as the start of a formula.',
      },
    },
  },
  {
    name: 'formula injection in a coded cell (@SUM)',
    file: csvCase({ smoking_status: '@SUM(A1:A9)' }),
    expect: {
      issue: {
        row: 4,
        code: 'invalid_code',
        value: '@SUM(A1:A9)',
        message: 'smoking_status “@SUM(A1:A9)” is not one of the allowed values.',
        fix: 'Use one of: current, ex, never (or leave it blank if not recorded).',
      },
    },
  },
  {
    name: 'record_ref too long',
    file: csvCase({ record_ref: 'R'.repeat(70) }),
    expect: {
      issue: {
        row: 4,
        code: 'record_ref_too_long',
        message: 'record_ref is 70 characters long; Cairn accepts up to 64.',
      },
    },
  },
  {
    name: 'record_ref with a line break inside',
    file: csvCase({ record_ref: 'AB\n12' }),
    expect: {
      issue: {
        row: 4,
        code: 'record_ref_invalid',
        message: 'record_ref contains hidden control characters (such as a line break or tab).',
      },
    },
  },
  {
    name: 'the same record_ref twice',
    file: () => {
      const rows = goodRows(5, 3100);
      rows[3] = { ...rows[3]!, record_ref: rows[1]!.record_ref ?? null };
      return { buf: csvOf(rows), name: 'extract.csv' };
    },
    expect: {
      issue: {
        row: 5,
        code: 'duplicate_record_ref',
        message:
          'The same record_ref is already used on row 3; each person must appear once. Cairn kept row 3 and refused this row.',
      },
    },
  },
  {
    name: 'birth_year missing',
    file: csvCase({ birth_year: null }),
    expect: {
      issue: { row: 4, code: 'birth_year_missing', message: 'This row has no birth_year.' },
    },
  },
  {
    name: 'a year that is not a year',
    file: csvCase({ diagnosis_year: 'about 2010' }),
    expect: {
      issue: {
        row: 4,
        code: 'invalid_year',
        message: 'diagnosis_year “about 2010” is not a year.',
      },
    },
  },
  {
    name: 'a two-digit year',
    file: csvCase({ birth_year: '56' }),
    expect: {
      issue: { row: 4, code: 'two_digit_year', message: 'birth_year “56” has only two digits.' },
    },
  },
  {
    name: 'a birth year before 1900',
    file: csvCase({ birth_year: 1888 }),
    expect: {
      issue: {
        row: 4,
        code: 'birth_year_out_of_range',
        message: 'birth_year 1888 is before 1900.',
      },
    },
  },
  {
    name: 'diagnosed before birth',
    file: csvCase({ birth_year: 1990, diagnosis_year: 1985 }),
    expect: {
      issue: {
        row: 4,
        code: 'diagnosis_year_out_of_range',
        message: 'diagnosis_year 1985 is before birth_year 1990.',
      },
    },
  },
  {
    name: 'a code not in the list',
    file: csvCase({ sex: 'Q' }),
    expect: {
      issue: {
        row: 4,
        code: 'invalid_code',
        message: 'sex “Q” is not one of the allowed values.',
        fix: 'Use one of: F, M, X, U (or leave it blank if not recorded).',
      },
    },
  },
  {
    name: 'not yes or no',
    file: csvCase({ on_statin: 'sometimes' }),
    expect: {
      issue: { row: 4, code: 'invalid_yes_no', message: 'on_statin “sometimes” is not yes or no.' },
    },
  },
  {
    name: 'not a number',
    file: csvCase({ bmi_value: 'tall' }),
    expect: {
      issue: { row: 4, code: 'invalid_number', message: 'bmi_value “tall” is not a number.' },
    },
  },
  {
    name: 'a number with an unclear separator',
    file: csvCase({ acr_value: '1,200', acr_unit: 'mg/g' }),
    expect: {
      issue: {
        row: 4,
        code: 'ambiguous_number',
        message: '“1,200” could be a decimal comma or a thousands separator.',
      },
    },
  },
  {
    name: 'a unit Cairn does not know',
    file: csvCase({ hba1c_unit: 'mmol/dl' }),
    expect: {
      issue: {
        row: 4,
        code: 'invalid_unit',
        message: 'hba1c_unit “mmol/dl” is not a unit Cairn knows for hba1c_value.',
        fix: 'Use mmol/mol or %.',
      },
    },
  },
  {
    name: 'two different units',
    file: csvCase({ hba1c_value: '7.5 %', hba1c_unit: 'mmol/mol' }),
    expect: {
      issue: {
        row: 4,
        code: 'unit_conflict',
        message: 'The value says % but hba1c_unit says mmol/mol.',
      },
    },
  },
  {
    name: 'an implausible value',
    file: csvCase({ bp_systolic: 300 }),
    expect: {
      issue: {
        row: 4,
        code: 'out_of_range',
        value: '300',
        message: 'bp_systolic 300 mmHg is outside the plausible range 60–260 mmHg.',
      },
    },
  },
  {
    name: 'an implausible value after conversion',
    file: csvCase({ cholesterol_value: 900, cholesterol_unit: 'mg/dL' }),
    expect: {
      issue: {
        row: 4,
        code: 'out_of_range',
        message:
          'cholesterol_value 900 mg/dL (23.3 mmol/L) is outside the plausible range 1–20 mmol/L.',
      },
    },
  },
  {
    name: 'systolic not above diastolic',
    file: csvCase({ bp_systolic: 80, bp_diastolic: 120 }),
    expect: {
      issue: {
        row: 4,
        code: 'systolic_not_above_diastolic',
        message: 'Blood pressure 80/120: the systolic value must be higher than the diastolic one.',
      },
    },
  },
  {
    name: 'a date that does not exist',
    file: csvCase({ hba1c_date: '31/02/2026' }),
    expect: {
      issue: {
        row: 4,
        code: 'invalid_date',
        message: '“31/02/2026” is not a date Cairn can read.',
      },
    },
  },
  {
    name: 'a date that reads two ways',
    file: csvCase({ bp_date: '04/05/2026' }),
    expect: {
      issue: {
        row: 4,
        code: 'ambiguous_date',
        message: '“04/05/2026” can be read as 2026-05-04 (day first) or 2026-04-05 (month first).',
        fix: 'When you upload, say whether the file writes dates day first (DD/MM/YYYY) or month first (MM/DD/YYYY); or write dates as YYYY-MM-DD.',
      },
    },
  },
  {
    name: 'a date that cannot be month first',
    dateConvention: 'month_first',
    file: csvCase({ bmi_date: '13/05/2026' }),
    expect: {
      issue: {
        row: 4,
        code: 'date_contradicts_convention',
        message: '“13/05/2026” cannot be read month first, as this upload says dates are written.',
      },
    },
  },
  {
    name: 'a year where a date belongs',
    file: csvCase({ foot_check_date: '2026' }),
    expect: {
      issue: {
        row: 4,
        code: 'date_year_only',
        message: '“2026” is a year without a month; Cairn needs at least the month.',
      },
    },
  },
  {
    name: 'a date after the review window',
    file: csvCase({ acr_date: '2026-10-15' }),
    expect: {
      issue: {
        row: 4,
        code: 'date_after_window',
        message:
          "The date “2026-10-15” (2026-10) is after the end of this quarter's review window (2026-09).",
        fix: 'Check that you are uploading to the right quarter, or correct the date.',
      },
    },
  },
  {
    name: 'a date in the future',
    file: csvCase({ retinal_screening_date: '2031-01-01' }),
    expect: {
      issue: {
        row: 4,
        code: 'date_in_future',
        message: 'The date “2031-01-01” (2031-01) is in the future.',
      },
    },
  },
  {
    name: 'a date before birth',
    file: csvCase({ birth_year: 1990, diagnosis_year: 2000, smoking_date: '1985-06-01' }),
    expect: {
      issue: {
        row: 4,
        code: 'date_before_birth',
        message: 'The date “1985-06-01” (1985-06) is before the person was born.',
      },
    },
  },
  {
    name: 'a formula with no saved result',
    file: async () => ({
      buf: await xlsxOf(withRow({ bmi_value: { formula: 'B4/100' } })),
      name: 'extract.xlsx',
    }),
    expect: {
      issue: {
        row: 4,
        code: 'formula_without_result',
        message:
          'The cell holds a formula that was never calculated, so the file has no value for it.',
      },
    },
  },
  {
    name: 'a spreadsheet error in a cell',
    file: async () => {
      const rows = withRow({ creatinine_value: 1 });
      const buf = await xlsxOf(rows);
      const cell = `${columnLetter(HEADINGS.indexOf('creatinine_value'))}4`;
      // Replace the creatinine value of row 4 with a #N/A error cell, as Excel writes it.
      return {
        buf: alterWorkbook(buf, (parts) =>
          parts.map((p) =>
            p.name === 'xl/worksheets/sheet1.xml'
              ? {
                  name: p.name,
                  data: Buffer.from(
                    p.data
                      .toString('utf8')
                      .replace(
                        new RegExp(`<c r="${cell}"([^>]*)><v>1</v></c>`),
                        `<c r="${cell}" t="e"><v>#N/A</v></c>`,
                      ),
                  ),
                }
              : p,
          ),
        ),
        name: 'extract.xlsx',
      };
    },
    expect: {
      issue: {
        row: 4,
        code: 'cell_error',
        value: '#N/A',
        message: 'The cell shows the spreadsheet error #N/A instead of a value.',
      },
    },
  },
];

describe('the bad-file corpus', () => {
  let t: TestApp;
  let w: ExtractsWorld;
  let lead: TestAgent;
  let practice: number;
  let baseline: Awaited<ReturnType<typeof currentState>>;

  beforeAll(async () => {
    t = await createTestApp({
      configure: (c) => ({ ...c, extracts: { ...c.extracts, maxUncompressedBytes: BOMB_CAP } }),
    });
    w = await arrange(t);
    lead = await signInAs(t, 'practice_lead_one');
    practice = w.practice('OV102');
    const quarter = w.quarter('2026 Q3');
    const first = await upload(lead, practice, quarter, csvOf(goodRows(40)), { name: 'good.csv' });
    await waitDone(lead, practice, first.body.id);
    await lead.post(`/api/practices/${practice}/submissions/${first.body.id}/confirm`).expect(200);
    baseline = await currentState(t, practice, quarter);
    expect(baseline).toMatchObject({ current: first.body.id, records: 40 });
  });
  afterAll(async () => {
    await t?.close();
  });

  it('has at least 30 bad files', () => {
    expect(cases.length).toBeGreaterThanOrEqual(30);
  });

  it.each(cases.map((c) => [c.name, c] as const))('%s', async (_name, c) => {
    const quarter = w.quarter(c.quarter ?? '2026 Q3');
    const { buf, name } = await c.file();
    const res = await upload(lead, practice, quarter, buf, {
      name,
      dateConvention: c.dateConvention,
    });
    if (c.expect.problem) {
      expect(res.status).toBe(c.expect.problem.status);
      expect(res.body).toMatchObject({
        type: c.expect.problem.type,
        detail: c.expect.problem.detail,
      });
      if (c.expect.problem.code) expect(res.body.code).toBe(c.expect.problem.code);
    } else {
      expect(res.status).toBe(202);
      const done = await waitDone(lead, practice, res.body.id);
      if (c.expect.refusal) {
        expect(done.status).toBe('rejected');
        expect(done.refusal).toMatchObject(c.expect.refusal);
        const [staged] = await t.db.query<{ n: number }>(
          'SELECT COUNT(*) AS n FROM care_records WHERE submission_id = ?',
          {
            replacements: [res.body.id],
            type: QueryTypes.SELECT,
          },
        );
        expect(Number(staged!.n)).toBe(0);
      } else {
        expect(done.status).toBe('awaiting_confirmation');
        const issues = await lead
          .get(`/api/practices/${practice}/submissions/${res.body.id}/issues`)
          .query({ code: c.expect.issue!.code })
          .expect(200);
        const { fix, column, value, ...rest } = c.expect.issue!;
        expect(issues.body.items[0]).toMatchObject({
          ...rest,
          severity: 'error',
          ...(fix ? { fix } : {}),
          ...(column !== undefined ? { column } : {}),
          ...(value !== undefined ? { value } : {}),
        });
        expect(done.counts.rowsRejected).toBe(1);
        await lead.post(`/api/practices/${practice}/submissions/${res.body.id}/cancel`).expect(200);
        const [staged] = await t.db.query<{ n: number }>(
          'SELECT COUNT(*) AS n FROM care_records WHERE submission_id = ?',
          {
            replacements: [res.body.id],
            type: QueryTypes.SELECT,
          },
        );
        expect(Number(staged!.n)).toBe(0);
      }
    }
    expect(await currentState(t, practice, w.quarter('2026 Q3'))).toEqual(baseline);
  });

  it('refuses the identical file and says which submission it repeats', async () => {
    const quarter = w.quarter('2026 Q3');
    const res = await upload(lead, practice, quarter, csvOf(goodRows(40)), {
      name: 'good-again.csv',
    });
    expect(res.status).toBe(409);
    expect(res.body).toMatchObject({
      type: '/api/problems/identical-extract',
      code: 'identical_extract',
      submissionId: baseline.current,
    });
    expect(res.body.detail).toMatch(
      new RegExp(
        `^This file is identical to the extract uploaded on \\d{4}-\\d{2}-\\d{2} \\d{2}:\\d{2} UTC by Priya Calloway \\(submission ${baseline.current}\\), which is already the current submission for 2026 Q3\\. Nothing was changed\\.$`,
      ),
    );
    expect(await currentState(t, practice, quarter)).toEqual(baseline);
  });

  it('neutralises injection strings in the refused-rows download', async () => {
    const quarter = w.quarter('2026 Q3');
    const rows = withRow({
      record_ref: '=HYPERLINK("http://example.invalid","open")',
      smoking_status: '@SUM(A1:A9)',
    });
    rows.push(goodRow(9999, { cvd_history: '+cmd', bmi_value: '-5' }));
    const res = await upload(lead, practice, quarter, csvOf(rows), { name: 'injection.csv' });
    await waitDone(lead, practice, res.body.id);
    const xlsx = await lead
      .get(`/api/practices/${practice}/submissions/${res.body.id}/rejected-rows.xlsx`)
      .buffer(true)
      .parse((r, cb) => {
        const chunks: Buffer[] = [];
        r.on('data', (c: Buffer) => chunks.push(c));
        r.on('end', () => cb(null, Buffer.concat(chunks)));
      })
      .expect(200);
    const workbook = new ExcelJS.Workbook();
    await workbook.xlsx.load(xlsx.body as unknown as ArrayBuffer);
    const sheet = workbook.getWorksheet('rejected rows')!;
    const heading = (sheet.getRow(1).values as unknown[]).slice(1);
    expect(heading[0]).toBe('row');
    expect(heading[heading.length - 1]).toBe('Cairn issues');
    const refused = new Map<number, unknown[]>();
    sheet.eachRow((row, n) => {
      if (n > 1) refused.set(Number(row.getCell(1).value), (row.values as unknown[]).slice(1));
    });
    const row4 = refused.get(4)!;
    expect(row4[1]).toBe('\'=HYPERLINK("http://example.invalid","open")');
    expect(row4[1 + HEADINGS.indexOf('smoking_status')]).toBe("'@SUM(A1:A9)");
    expect(String(row4[row4.length - 1])).toContain('Error (record_ref): record_ref “=HYPERLINK(');
    const last = refused.get(rows.length + 1)!;
    expect(last[1 + HEADINGS.indexOf('cvd_history')]).toBe("'+cmd");
    expect(last[1 + HEADINGS.indexOf('bmi_value')]).toBe('-5');
    const json = await lead
      .get(`/api/practices/${practice}/submissions/${res.body.id}/report.json`)
      .expect(200);
    expect(json.body.issues.some((i: { code: string }) => i.code === 'record_ref_formula')).toBe(
      true,
    );
    await lead.post(`/api/practices/${practice}/submissions/${res.body.id}/cancel`).expect(200);
    expect(await currentState(t, practice, quarter)).toEqual(baseline);
  });
});
