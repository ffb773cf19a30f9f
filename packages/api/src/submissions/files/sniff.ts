/**
 * What kind of file an upload is, from its bytes (and its name only to word
 * the message): an XLSX workbook, CSV text, or something Cairn refuses with
 * a specific reason (.xls, .xlsm, .xlsb, .ods, .numbers, encrypted, damaged,
 * not a spreadsheet at all). An OLE compound file is told apart by its
 * directory (cfb.ts): a workbook, one protected with a password, an encrypted
 * Office 2007+ workbook, or another Office document.
 */
import { type Refusal, refusal } from '../format/issue-codes.js';
import { CfbError, type CompoundKind, compoundKind } from './cfb.js';
import { isZip, readZipDirectory, ZipError, type ZipEntry } from './zip.js';

export type Sniffed =
  { kind: 'xlsx'; entries: ZipEntry[] } | { kind: 'csv' } | { kind: 'refused'; refusal: Refusal };

const CFB = Buffer.from([0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1]);
const ENCRYPTED_PACKAGE = Buffer.from('EncryptedPackage', 'utf16le');

const extension = (name: string) => /\.([a-z0-9]+)$/i.exec(name)?.[1]?.toLowerCase() ?? '';

const saveAs = (what: string, fix?: string): Sniffed => ({
  kind: 'refused',
  refusal: refusal(
    'save_as_xlsx',
    `This is ${what}, which Cairn does not read.`,
    fix ??
      'Open it in Excel (or LibreOffice), choose File › Save As, pick “Excel Workbook (.xlsx)” or “CSV UTF-8”, and upload that file.',
  ),
});

export const unreadable = (why: string): Refusal =>
  refusal(
    'unreadable_file',
    `The workbook is damaged and cannot be read (${why}). It may have been cut short while it was copied or downloaded.`,
    'Open it in Excel to check that it opens, save it again as .xlsx, and upload the new file.',
  );

export const encrypted = (): Refusal =>
  refusal(
    'encrypted_workbook',
    'The workbook is protected with a password, so Cairn cannot read it.',
    'In Excel choose File › Info › Protect Workbook › Encrypt with Password, delete the password, save, and upload the file again.',
  );

/** An Excel 97–2003 workbook with a password: both the password and the old format must go. */
export const encryptedXls = (): Refusal =>
  refusal(
    'encrypted_workbook',
    'This is an Excel 97–2003 workbook (.xls) protected with a password, so Cairn cannot read it.',
    'Open it in Excel with its password, choose File › Info › Protect Workbook › Encrypt with Password and delete the password, then choose File › Save As, pick “Excel Workbook (.xlsx)” or “CSV UTF-8”, and upload that file.',
  );

/** An OLE compound file (an Office 97–2003 document, or an encrypted Office 2007+ one). */
function compound(buf: Buffer, fileName: string, ext: string): Sniffed {
  let kind: CompoundKind;
  try {
    kind = compoundKind(buf);
  } catch (error) {
    if (!(error instanceof CfbError)) throw error;
    // A directory that cannot be read (cut short, damaged): an encrypted workbook is still told by
    // its stream's name; anything else is damaged.
    if (buf.includes(ENCRYPTED_PACKAGE)) return { kind: 'refused', refusal: encrypted() };
    return {
      kind: 'refused',
      refusal: unreadable(`its directory cannot be read: ${error.message}`),
    };
  }
  switch (kind) {
    case 'encrypted_ooxml':
      return { kind: 'refused', refusal: encrypted() };
    case 'xls_password':
      return { kind: 'refused', refusal: encryptedXls() };
    case 'xls':
      return saveAs('an Excel 97–2003 workbook (.xls)');
    case 'xls_old':
      return saveAs('an Excel 5.0/95 workbook (.xls)');
    case 'word':
      return notSpreadsheet(fileName, 'a Word 97–2003 document');
    case 'powerpoint':
      return notSpreadsheet(fileName, 'a PowerPoint 97–2003 presentation');
    default:
      return ext === 'xls'
        ? { kind: 'refused', refusal: unreadable('it is named .xls but holds no workbook') }
        : notSpreadsheet(fileName, 'an Office 97–2003 file that is not a workbook');
  }
}

export function sniff(buf: Buffer, fileName: string, maxEntries = 10_000): Sniffed {
  const ext = extension(fileName);
  if (buf.length === 0) {
    return {
      kind: 'refused',
      refusal: refusal(
        'empty_file',
        'The file is empty (0 bytes).',
        'Check that you chose the right file; export the extract again if needed.',
      ),
    };
  }
  if (buf.length >= 8 && buf.subarray(0, 8).equals(CFB)) return compound(buf, fileName, ext);
  if (isZip(buf)) {
    let entries: ZipEntry[];
    try {
      entries = readZipDirectory(buf, maxEntries);
    } catch (error) {
      if (error instanceof ZipError && error.reason === 'too_many_entries') {
        return {
          kind: 'refused',
          refusal: refusal(
            'uncompressed_too_large',
            `The workbook is made of more parts than a spreadsheet has (${error.message}), so Cairn did not open it.`,
            'Save the data sheet alone as a new .xlsx workbook (or as CSV UTF-8) and upload that.',
          ),
        };
      }
      return {
        kind: 'refused',
        refusal: unreadable(error instanceof ZipError ? error.message : 'not a valid workbook'),
      };
    }
    const names = new Set(entries.map((e) => e.name));
    if (names.has('xl/workbook.bin')) return saveAs('an Excel binary workbook (.xlsb)');
    if (names.has('xl/workbook.xml')) {
      if (names.has('xl/vbaProject.bin') || ext === 'xlsm' || ext === 'xltm') {
        return {
          kind: 'refused',
          refusal: refusal(
            'save_as_xlsx',
            'This is a macro-enabled workbook (.xlsm). Cairn does not accept files that can carry macros.',
            'Open it in Excel, choose File › Save As, pick “Excel Workbook (.xlsx)” (which leaves the macros out) or “CSV UTF-8”, and upload that file.',
          ),
        };
      }
      return { kind: 'xlsx', entries };
    }
    if (names.has('content.xml') && names.has('mimetype')) {
      return saveAs(
        'an OpenDocument spreadsheet (.ods)',
        'Open it in LibreOffice Calc, choose File › Save As, pick “Excel 2007-365 (.xlsx)” or “Text CSV”, and upload that file.',
      );
    }
    if ([...names].some((n) => n.startsWith('Index/') || n === 'Index.zip') || ext === 'numbers') {
      return saveAs(
        'an Apple Numbers file (.numbers)',
        'In Numbers choose File › Export To › Excel… (or CSV…), and upload the exported file.',
      );
    }
    if (names.has('word/document.xml')) return notSpreadsheet(fileName, 'a Word document');
    if (names.has('ppt/presentation.xml'))
      return notSpreadsheet(fileName, 'a PowerPoint presentation');
    return notSpreadsheet(fileName, 'a ZIP archive');
  }
  if (ext === 'ods') return saveAs('an OpenDocument spreadsheet (.ods)');
  if (ext === 'numbers') return saveAs('an Apple Numbers file (.numbers)');
  if (ext === 'xls' || ext === 'xlsb' || ext === 'xlsm')
    return { kind: 'refused', refusal: unreadable(`it is named .${ext} but is not a workbook`) };
  if (buf.subarray(0, 5).toString('latin1') === '%PDF-')
    return notSpreadsheet(fileName, 'a PDF document');
  if (looksLikeText(buf)) {
    if (ext === 'xlsx') {
      // A CSV saved under an .xlsx name: read it as the text it is.
      return { kind: 'csv' };
    }
    if (ext === 'csv' || ext === 'tsv' || ext === 'txt' || ext === '') return { kind: 'csv' };
    return notSpreadsheet(fileName, 'a text file that is not a CSV extract');
  }
  if (ext === 'xlsx')
    return {
      kind: 'refused',
      refusal: unreadable('it is named .xlsx but its contents are not a workbook'),
    };
  return notSpreadsheet(fileName, 'a file of another kind');
}

function notSpreadsheet(fileName: string, what: string): Sniffed {
  return {
    kind: 'refused',
    refusal: refusal(
      'unsupported_file_type',
      `“${fileName}” is ${what}, not a spreadsheet or CSV file.`,
      'Upload the extract as an .xlsx workbook or a .csv file; start from Cairn’s template if in doubt.',
    ),
  };
}

/** Text: a UTF-16 byte-order mark, or no NUL bytes in the first 8 KB. */
function looksLikeText(buf: Buffer): boolean {
  if (
    buf.length >= 2 &&
    ((buf[0] === 0xff && buf[1] === 0xfe) || (buf[0] === 0xfe && buf[1] === 0xff))
  )
    return true;
  const head = buf.subarray(0, 8192);
  return !head.includes(0);
}
