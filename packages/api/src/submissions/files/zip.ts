/**
 * A small, defensive reader of ZIP containers (XLSX is a ZIP of XML parts,
 * ECMA-376 Part 2; the container is PKWARE's APPNOTE format). It reads the
 * central directory, checks that the entries tile the file (no hidden or
 * overlapping data, so what exceljs streams is what was checked), and
 * inflates entries as streams with a cap on the bytes they expand to, so
 * that a "zip bomb" is refused after reading at most the cap.
 */
import { createInflateRaw } from 'node:zlib';

export interface ZipEntry {
  name: string;
  method: number;
  encrypted: boolean;
  compressedSize: number;
  uncompressedSize: number;
  localOffset: number;
  dataStart: number;
  /** The byte after the part as saved: its data and any data descriptor after it */
  end: number;
}

export class ZipError extends Error {
  constructor(
    readonly reason:
      'not_zip' | 'damaged' | 'too_many_entries' | 'encrypted' | 'too_large' | 'method',
    message: string,
  ) {
    super(message);
    this.name = 'ZipError';
  }
}

const EOCD = 0x06054b50;
const ZIP64_EOCD = 0x06064b50;
const ZIP64_LOCATOR = 0x07064b50;
const CENTRAL = 0x02014b50;
const LOCAL = 0x04034b50;

export function isZip(buf: Buffer): boolean {
  return buf.length >= 4 && buf.readUInt32LE(0) === LOCAL;
}

/** Reads and checks the central directory. */
export function readZipDirectory(buf: Buffer, maxEntries = 10_000): ZipEntry[] {
  if (!isZip(buf)) throw new ZipError('not_zip', 'not a ZIP container');
  let eocd = -1;
  for (let i = buf.length - 22; i >= Math.max(0, buf.length - 22 - 65_535); i--) {
    if (buf.readUInt32LE(i) === EOCD) {
      eocd = i;
      break;
    }
  }
  if (eocd < 0)
    throw new ZipError(
      'damaged',
      'the end of the ZIP directory is missing (the file is cut short)',
    );
  let count = buf.readUInt16LE(eocd + 10);
  let cdSize = buf.readUInt32LE(eocd + 12);
  let cdOffset = buf.readUInt32LE(eocd + 16);
  if (count === 0xffff || cdSize === 0xffffffff || cdOffset === 0xffffffff) {
    const locator = eocd - 20;
    if (locator < 0 || buf.readUInt32LE(locator) !== ZIP64_LOCATOR)
      throw new ZipError('damaged', 'ZIP64 locator missing');
    const z64 = Number(buf.readBigUInt64LE(locator + 8));
    if (z64 < 0 || z64 + 56 > buf.length || buf.readUInt32LE(z64) !== ZIP64_EOCD)
      throw new ZipError('damaged', 'ZIP64 directory missing');
    count = Number(buf.readBigUInt64LE(z64 + 32));
    cdSize = Number(buf.readBigUInt64LE(z64 + 40));
    cdOffset = Number(buf.readBigUInt64LE(z64 + 48));
  }
  if (count > maxEntries) throw new ZipError('too_many_entries', `${count} parts`);
  if (cdOffset + cdSize > buf.length)
    throw new ZipError('damaged', 'the ZIP directory points past the end of the file');

  const entries: ZipEntry[] = [];
  let p = cdOffset;
  for (let n = 0; n < count; n++) {
    if (p + 46 > buf.length || buf.readUInt32LE(p) !== CENTRAL)
      throw new ZipError('damaged', 'a ZIP directory entry is damaged');
    const flags = buf.readUInt16LE(p + 8);
    const method = buf.readUInt16LE(p + 10);
    let compressedSize = buf.readUInt32LE(p + 20);
    let uncompressedSize = buf.readUInt32LE(p + 24);
    const nameLength = buf.readUInt16LE(p + 28);
    const extraLength = buf.readUInt16LE(p + 30);
    const commentLength = buf.readUInt16LE(p + 32);
    let localOffset = buf.readUInt32LE(p + 42);
    const name = buf.toString('utf8', p + 46, p + 46 + nameLength);
    // ZIP64 extended information (header id 0x0001) carries the real sizes and offset.
    let e = p + 46 + nameLength;
    const extraEnd = e + extraLength;
    while (e + 4 <= extraEnd) {
      const id = buf.readUInt16LE(e);
      const size = buf.readUInt16LE(e + 2);
      if (id === 0x0001) {
        let q = e + 4;
        if (uncompressedSize === 0xffffffff) {
          uncompressedSize = Number(buf.readBigUInt64LE(q));
          q += 8;
        }
        if (compressedSize === 0xffffffff) {
          compressedSize = Number(buf.readBigUInt64LE(q));
          q += 8;
        }
        if (localOffset === 0xffffffff) localOffset = Number(buf.readBigUInt64LE(q));
      }
      e += 4 + size;
    }
    if (localOffset + 30 > buf.length || buf.readUInt32LE(localOffset) !== LOCAL)
      throw new ZipError('damaged', `the part ${name} is damaged`);
    const dataStart =
      localOffset + 30 + buf.readUInt16LE(localOffset + 26) + buf.readUInt16LE(localOffset + 28);
    if (dataStart + compressedSize > cdOffset)
      throw new ZipError('damaged', `the part ${name} runs past the ZIP directory`);
    entries.push({
      name,
      method,
      encrypted: (flags & 1) === 1,
      compressedSize,
      uncompressedSize,
      localOffset,
      dataStart,
      end: 0, // set below, once every part's start is known
    });
    p += 46 + nameLength + extraLength + commentLength;
  }

  // The parts must tile the file: nothing hidden between them, nothing overlapping.
  const sorted = [...entries].sort((a, b) => a.dataStart - b.dataStart);
  let expected = 0;
  let previous: ZipEntry | null = null;
  for (const entry of sorted) {
    const gap = entry.localOffset - expected;
    if (gap < 0 || (gap !== 0 && gap !== 12 && gap !== 16 && gap !== 20 && gap !== 24)) {
      throw new ZipError('damaged', 'the ZIP parts overlap or leave unexplained gaps');
    }
    if (previous) previous.end = entry.localOffset;
    previous = entry;
    expected = entry.dataStart + entry.compressedSize;
  }
  const tail = cdOffset - expected;
  if (tail < 0 || (tail !== 0 && tail !== 12 && tail !== 16 && tail !== 20 && tail !== 24)) {
    throw new ZipError('damaged', 'the ZIP parts overlap or leave unexplained gaps');
  }
  if (previous) previous.end = cdOffset;
  return entries;
}

export interface InflateBudget {
  /** Bytes the whole workbook may expand to */
  remaining: number;
}

/**
 * Streams one entry's expanded bytes to `onChunk`, stopping with ZipError
 * 'too_large' as soon as the budget is spent.
 */
export async function inflateEntry(
  buf: Buffer,
  entry: ZipEntry,
  budget: InflateBudget,
  onChunk: (chunk: Buffer) => void | 'stop',
): Promise<void> {
  if (entry.encrypted) throw new ZipError('encrypted', `the part ${entry.name} is encrypted`);
  const data = buf.subarray(entry.dataStart, entry.dataStart + entry.compressedSize);
  if (entry.method === 0) {
    if (data.length > budget.remaining) throw new ZipError('too_large', entry.name);
    budget.remaining -= data.length;
    for (let i = 0; i < data.length; i += 1 << 16) {
      if (onChunk(data.subarray(i, i + (1 << 16))) === 'stop') return;
    }
    return;
  }
  if (entry.method !== 8)
    throw new ZipError('method', `the part ${entry.name} uses compression method ${entry.method}`);
  await new Promise<void>((resolve, reject) => {
    const inflate = createInflateRaw({ chunkSize: 1 << 16 });
    let done = false;
    const finish = (error?: Error) => {
      if (done) return;
      done = true;
      inflate.removeAllListeners('data');
      inflate.destroy();
      if (error) reject(error);
      else resolve();
    };
    inflate.on('data', (chunk: Buffer) => {
      budget.remaining -= chunk.length;
      if (budget.remaining < 0) return finish(new ZipError('too_large', entry.name));
      try {
        if (onChunk(chunk) === 'stop') finish();
      } catch (error) {
        finish(error as Error);
      }
    });
    inflate.on('end', () => finish());
    inflate.on('error', () =>
      finish(new ZipError('damaged', `the part ${entry.name} cannot be expanded`)),
    );
    inflate.end(data);
  });
}
