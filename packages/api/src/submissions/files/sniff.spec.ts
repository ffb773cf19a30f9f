/**
 * What kind of file an upload is, for the OLE compound files (Office 97–2003, and encrypted
 * Office 2007+ workbooks), each case a real file written here (test/extracts-fixtures/compound.ts),
 * with the exact refusal. The rest of the refusals by kind are in test/extracts-corpus.e2e-spec.ts.
 */
import {
  compoundFile,
  encryptXlsx,
  wordDocument,
  xlsWorkbook,
} from '../../../test/extracts-fixtures/compound.js';
import { writeXlsx } from '../template/extract-writer.js';
import { compoundKind, filePassed, readCompoundFile } from './cfb.js';
import { sniff } from './sniff.js';

async function smallXlsx(): Promise<Buffer> {
  return (await writeXlsx({ headings: ['record_ref', 'birth_year'], rows: [['A-1', 1950]] }))!;
}

describe('compound files: what they hold', () => {
  it.each<[string, () => Buffer | Promise<Buffer>, string]>([
    [
      'an Excel 97–2003 workbook (small: its stream in the mini stream)',
      () => xlsWorkbook(),
      'xls',
    ],
    [
      'an Excel 97–2003 workbook (large: regular sectors)',
      () => xlsWorkbook({ large: true }),
      'xls',
    ],
    ['an .xls protected with a password', () => xlsWorkbook({ password: true }), 'xls_password'],
    [
      'a large .xls protected with a password',
      () => xlsWorkbook({ password: true, large: true }),
      'xls_password',
    ],
    ['a Word 97–2003 document', () => wordDocument(), 'word'],
    [
      'an .xlsx encrypted with a password',
      async () => encryptXlsx(await smallXlsx()),
      'encrypted_ooxml',
    ],
    ['something else', () => compoundFile({ Contents: Buffer.alloc(10) }), 'other'],
  ])('%s', async (_name, make, kind) => {
    expect(compoundKind(await make())).toBe(kind);
  });

  it('reads the directory and the streams as written', () => {
    const file = readCompoundFile(xlsWorkbook());
    const names = file.entries.map((e) => e.name);
    expect(names).toEqual(expect.arrayContaining(['Root Entry', 'Workbook']));
    const workbook = file.entries.find((e) => e.name === 'Workbook')!;
    expect(file.read(workbook, 4)).toEqual(Buffer.from([0x09, 0x08, 0x10, 0x00]));
  });

  it.each<[string, number[], boolean]>([
    ['BOF then FILEPASS', [0x0809, 0x002f, 0x000a], true],
    ['BOF, another record, then FILEPASS', [0x0809, 0x00e1, 0x002f, 0x000a], true],
    ['no FILEPASS before the globals end', [0x0809, 0x0042, 0x000a, 0x002f], false],
    ['not starting with BOF', [0x002f, 0x0809], false],
  ])('FILEPASS: %s', (_name, types, expected) => {
    const stream = Buffer.concat(
      types.map((t) => {
        const r = Buffer.alloc(6);
        r.writeUInt16LE(t, 0);
        r.writeUInt16LE(2, 2);
        return r;
      }),
    );
    expect(filePassed(stream)).toBe(expected);
  });
});

describe('compound files: the refusal', () => {
  it.each<[string, () => Buffer | Promise<Buffer>, string, string, string, RegExp]>([
    [
      'an Excel 97–2003 workbook',
      () => xlsWorkbook(),
      'extract.xls',
      'save_as_xlsx',
      'This is an Excel 97–2003 workbook (.xls), which Cairn does not read.',
      /Save As, pick “Excel Workbook \(\.xlsx\)”/,
    ],
    [
      'an .xls protected with a password',
      () => xlsWorkbook({ password: true }),
      'extract.xls',
      'encrypted_workbook',
      'This is an Excel 97–2003 workbook (.xls) protected with a password, so Cairn cannot read it.',
      /Encrypt with Password and delete the password, then choose File › Save As, pick “Excel Workbook \(\.xlsx\)”/,
    ],
    [
      'an .xlsx encrypted with a password',
      async () => encryptXlsx(await smallXlsx()),
      'extract.xlsx',
      'encrypted_workbook',
      'The workbook is protected with a password, so Cairn cannot read it.',
      /delete the password, save, and upload the file again/,
    ],
    [
      'an .xls protected with a password, named .xlsx',
      () => xlsWorkbook({ password: true }),
      'extract.xlsx',
      'encrypted_workbook',
      'This is an Excel 97–2003 workbook (.xls) protected with a password, so Cairn cannot read it.',
      /delete the password/,
    ],
    [
      'a Word 97–2003 document',
      () => wordDocument(),
      'notes.doc',
      'unsupported_file_type',
      '“notes.doc” is a Word 97–2003 document, not a spreadsheet or CSV file.',
      /\.xlsx workbook or a \.csv file/,
    ],
    [
      'a compound file cut short after its header',
      () => xlsWorkbook({ large: true }).subarray(0, 1024),
      'extract.xls',
      'unreadable_file',
      'The workbook is damaged and cannot be read (its directory cannot be read: the file ends before the parts its directory lists). It may have been cut short while it was copied or downloaded.',
      /check that it opens/,
    ],
  ])('%s', async (_name, make, fileName, code, message, fix) => {
    const sniffed = sniff(await make(), fileName);
    expect(sniffed.kind).toBe('refused');
    if (sniffed.kind !== 'refused') return;
    expect(sniffed.refusal.code).toBe(code);
    expect(sniffed.refusal.message).toBe(message);
    expect(sniffed.refusal.fix).toMatch(fix);
  });
});
