/**
 * The extract templates, built from the column definitions:
 *
 * - XLSX: a "data" sheet (headings frozen, drop-downs on coded columns,
 *   date and number formats, widths), a "dictionary" sheet (column, meaning,
 *   allowed values and units, required, example) and an "instructions" sheet;
 * - CSV: the same headings, UTF-8 with a byte-order mark so that Excel opens
 *   it with the right characters.
 */
import ExcelJS from 'exceljs';
import { COLUMNS } from '../format/columns.js';
import { allowedValues, dropDownValues, requiredLabel } from '../format/describe.js';
import { neutralise } from '../../common/neutralise.js';

const BRAND = 'FF1D4E5F';
const SAND = 'FFE7DDC8';

export const TEMPLATE_INSTRUCTIONS: readonly string[] = [
  'Cairn extract: one row per person with diabetes on the practice register, for one audit quarter.',
  '',
  '1. Fill in the sheet “data”, one person per row, under the headings in row 1. Do not rename, reorder or delete the headings; leave a cell blank when nothing was recorded.',
  '2. Use the practice’s own reference in record_ref. Never add names, addresses, postcodes, full dates of birth, phone numbers, e-mail addresses or national health numbers: a file with such a column is refused.',
  '3. For each care process give the date of the most recent result and the result. Cairn keeps the month only. Dates after the end of the quarter’s review window are refused.',
  '4. Results go in the units shown in the dictionary. HbA1c may be in % and cholesterol or creatinine in mg/dL if the unit column says so; Cairn converts them and tells you.',
  '5. Coded columns (sex, diabetes_type, smoking_status, yes/no columns) have drop-down lists; other spellings listed in the dictionary are accepted too.',
  '6. Save as .xlsx (keep the sheet named “data”) or as CSV UTF-8, and upload it on Cairn’s Upload page for the right practice and quarter.',
  '7. Cairn checks the file and shows a report: rows refused (with the reason and how to fix it), warnings and data-quality flags. Nothing becomes current until you confirm.',
  '',
  'The sheet “dictionary” describes every column.',
];

export async function buildXlsxTemplate(maxRows: number): Promise<Buffer> {
  const workbook = new ExcelJS.Workbook();
  workbook.creator = 'Cairn';
  workbook.created = new Date(Date.UTC(2026, 0, 1));

  const data = workbook.addWorksheet('data', { views: [{ state: 'frozen', ySplit: 1 }] });
  data.columns = COLUMNS.map((def) => ({
    header: def.key,
    key: def.key,
    width: def.width ?? 14,
    style: def.numFmt ? { numFmt: def.numFmt } : {},
  }));
  const header = data.getRow(1);
  header.font = { bold: true, color: { argb: 'FFFFFFFF' } };
  header.fill = { type: 'pattern', pattern: 'solid', fgColor: { argb: BRAND } };
  header.alignment = { vertical: 'middle' };
  header.height = 20;
  const lastRow = maxRows + 1;
  // exceljs supports range validations at run time; its type declarations omit them.
  const validations = (
    data as unknown as {
      dataValidations: { add(range: string, rule: ExcelJS.DataValidation): void };
    }
  ).dataValidations;
  COLUMNS.forEach((def, i) => {
    const letter = data.getColumn(i + 1).letter;
    const range = `${letter}2:${letter}${lastRow}`;
    const values = dropDownValues(def);
    if (values) {
      validations.add(range, {
        type: 'list',
        allowBlank: true,
        formulae: [`"${values.join(',')}"`],
        showErrorMessage: true,
        errorStyle: 'warning',
        errorTitle: def.key,
        error: `Use one of: ${values.join(', ')}`,
      });
    } else if (def.kind === 'year') {
      validations.add(range, {
        type: 'whole',
        operator: 'between',
        allowBlank: true,
        formulae: [1900, 2100],
        showErrorMessage: true,
        errorStyle: 'warning',
        errorTitle: def.key,
        error: 'A four-digit year, e.g. 1958',
      });
    } else if (def.kind === 'date') {
      validations.add(range, {
        type: 'date',
        operator: 'greaterThan',
        allowBlank: true,
        formulae: [new Date(Date.UTC(1900, 0, 1))],
        showErrorMessage: true,
        errorStyle: 'warning',
        errorTitle: def.key,
        error: 'A date, e.g. 2026-05-14',
      });
    }
  });

  const dictionary = workbook.addWorksheet('dictionary', {
    views: [{ state: 'frozen', ySplit: 1 }],
  });
  dictionary.columns = [
    { header: 'column', key: 'key', width: 24 },
    { header: 'section', key: 'group', width: 20 },
    { header: 'meaning', key: 'meaning', width: 70 },
    { header: 'allowed values and units', key: 'allowed', width: 60 },
    { header: 'required', key: 'required', width: 28 },
    { header: 'example', key: 'example', width: 14 },
  ];
  for (const def of COLUMNS) {
    const row = dictionary.addRow({
      key: def.key,
      group: def.group,
      meaning: neutralise(def.meaning),
      allowed: neutralise(allowedValues(def)),
      required: requiredLabel(def),
      example: neutralise(def.example),
    });
    row.alignment = { wrapText: true, vertical: 'top' };
  }
  const dictHeader = dictionary.getRow(1);
  dictHeader.font = { bold: true };
  dictHeader.fill = { type: 'pattern', pattern: 'solid', fgColor: { argb: SAND } };

  const instructions = workbook.addWorksheet('instructions');
  instructions.getColumn(1).width = 120;
  TEMPLATE_INSTRUCTIONS.forEach((line, i) => {
    const cell = instructions.getCell(i + 1, 1);
    cell.value = neutralise(line);
    cell.alignment = { wrapText: true };
    if (i === 0) cell.font = { bold: true, size: 13 };
  });

  return Buffer.from(await workbook.xlsx.writeBuffer());
}

export function buildCsvTemplate(): Buffer {
  return Buffer.from(`\uFEFF${COLUMNS.map((c) => c.key).join(',')}\r\n`, 'utf8');
}
