/**
 * A small ZIP writer (stored or deflated entries, PKWARE APPNOTE layout) and
 * a reader of exceljs-made workbooks, to build damaged or hostile XLSX files.
 */
import { deflateRawSync, inflateRawSync } from 'node:zlib';
import { readZipDirectory } from '../../src/submissions/files/zip.js';

export interface ZipPart {
  name: string;
  data: Buffer;
  /** Write this uncompressed size into the directory instead of the real one (a lying archive) */
  declaredSize?: number;
}

const crcTable = Array.from({ length: 256 }, (_, n) => {
  let c = n;
  for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
  return c >>> 0;
});

function crc32(buf: Buffer): number {
  let c = 0xffffffff;
  for (const byte of buf) c = crcTable[(c ^ byte) & 0xff]! ^ (c >>> 8);
  return (c ^ 0xffffffff) >>> 0;
}

export function buildZip(parts: ZipPart[]): Buffer {
  const locals: Buffer[] = [];
  const centrals: Buffer[] = [];
  let offset = 0;
  for (const part of parts) {
    const name = Buffer.from(part.name, 'utf8');
    const compressed = deflateRawSync(part.data);
    const size = part.declaredSize ?? part.data.length;
    const crc = crc32(part.data);
    const local = Buffer.alloc(30);
    local.writeUInt32LE(0x04034b50, 0);
    local.writeUInt16LE(20, 4);
    local.writeUInt16LE(0, 6);
    local.writeUInt16LE(8, 8);
    local.writeUInt32LE(crc, 14);
    local.writeUInt32LE(compressed.length, 18);
    local.writeUInt32LE(size, 22);
    local.writeUInt16LE(name.length, 26);
    locals.push(local, name, compressed);
    const central = Buffer.alloc(46);
    central.writeUInt32LE(0x02014b50, 0);
    central.writeUInt16LE(20, 4);
    central.writeUInt16LE(20, 6);
    central.writeUInt16LE(8, 10);
    central.writeUInt32LE(crc, 16);
    central.writeUInt32LE(compressed.length, 20);
    central.writeUInt32LE(size, 24);
    central.writeUInt16LE(name.length, 28);
    central.writeUInt32LE(offset, 42);
    centrals.push(central, name);
    offset += 30 + name.length + compressed.length;
  }
  const cd = Buffer.concat(centrals);
  const end = Buffer.alloc(22);
  end.writeUInt32LE(0x06054b50, 0);
  end.writeUInt16LE(parts.length, 8);
  end.writeUInt16LE(parts.length, 10);
  end.writeUInt32LE(cd.length, 12);
  end.writeUInt32LE(offset, 16);
  return Buffer.concat([...locals, cd, end]);
}

/** The parts of a workbook, expanded. */
export function unzip(buf: Buffer): ZipPart[] {
  return readZipDirectory(buf).map((entry) => {
    const raw = buf.subarray(entry.dataStart, entry.dataStart + entry.compressedSize);
    return { name: entry.name, data: entry.method === 0 ? Buffer.from(raw) : inflateRawSync(raw) };
  });
}

/** Rebuilds a workbook with some parts changed, added or removed. */
export function alterWorkbook(buf: Buffer, change: (parts: ZipPart[]) => ZipPart[]): Buffer {
  return buildZip(change(unzip(buf)));
}

/** Rebuilds a workbook with its data sheet changed: `change` gets the sheet part, returns it anew. */
export function alterSheet(buf: Buffer, change: (sheet: ZipPart) => ZipPart): Buffer {
  return alterWorkbook(buf, (parts) =>
    parts.map((p) => (p.name === 'xl/worksheets/sheet1.xml' ? change(p) : p)),
  );
}

/** Rebuilds a workbook with its data sheet's XML edited as text. */
export function editSheetXml(buf: Buffer, edit: (xml: string) => string): Buffer {
  return alterSheet(buf, (p) => ({
    name: p.name,
    data: Buffer.from(edit(p.data.toString('utf8'))),
  }));
}
