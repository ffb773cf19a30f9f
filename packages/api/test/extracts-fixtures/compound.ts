/**
 * Office 97–2003 compound files for the tests, written by the `cfb` package (a general-purpose
 * [MS-CFB] writer from the npm registry), and Office 2007+ workbooks encrypted with a password by
 * `officecrypto-tool` (ECMA-376 agile encryption): real files, not byte patterns.
 */
import CFB from 'cfb';
import officeCrypto from 'officecrypto-tool';

/** A BIFF record: type, length, data ([MS-XLS] 2.1.4). */
function record(type: number, data: Buffer = Buffer.alloc(0)): Buffer {
  const head = Buffer.alloc(4);
  head.writeUInt16LE(type, 0);
  head.writeUInt16LE(data.length, 2);
  return Buffer.concat([head, data]);
}

/** The workbook globals of an Excel 97–2003 workbook: BOF (BIFF8, globals), [FILEPASS], EOF. */
export function biff8Globals(options: { password?: boolean; padTo?: number } = {}): Buffer {
  const bof = Buffer.alloc(16);
  bof.writeUInt16LE(0x0600, 0); // BIFF8
  bof.writeUInt16LE(0x0005, 2); // workbook globals
  // FILEPASS with RC4 CryptoAPI encryption ([MS-XLS] 2.4.117): wEncryptionType 1, then the header.
  const filePass = Buffer.concat([
    Buffer.from([0x01, 0x00, 0x04, 0x00, 0x02, 0x00]),
    Buffer.alloc(48, 3),
  ]);
  const records = Buffer.concat([
    record(0x0809, bof),
    ...(options.password ? [record(0x002f, filePass)] : []),
    record(0x0042, Buffer.from([0xb0, 0x04])), // CodePage 1200
    record(0x000a),
  ]);
  return options.padTo && records.length < options.padTo
    ? Buffer.concat([records, Buffer.alloc(options.padTo - records.length)])
    : records;
}

/** A compound file holding these streams (at its root). */
export function compoundFile(streams: Record<string, Buffer>): Buffer {
  const file = CFB.utils.cfb_new();
  for (const [name, data] of Object.entries(streams)) CFB.utils.cfb_add(file, `/${name}`, data);
  return Buffer.from(CFB.write(file, { type: 'buffer' }) as Uint8Array);
}

/** An Excel 97–2003 workbook; with `password`, protected by one. Large ones use regular sectors. */
export const xlsWorkbook = (options: { password?: boolean; large?: boolean } = {}) =>
  compoundFile({
    Workbook: biff8Globals({ password: options.password, padTo: options.large ? 9000 : 0 }),
    '\u0005SummaryInformation': Buffer.alloc(200, 0),
  });

/** A Word 97–2003 document (its main stream only). */
export const wordDocument = () =>
  compoundFile({ WordDocument: Buffer.alloc(600, 0x20), '1Table': Buffer.alloc(100) });

/** An .xlsx encrypted with a password (the file an "Encrypt with Password" save writes). */
export function encryptXlsx(xlsx: Buffer, password = 'not-the-password'): Buffer {
  return Buffer.from(officeCrypto.encrypt(xlsx, { password }) as Uint8Array);
}
