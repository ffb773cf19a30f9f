/**
 * Just enough of the Compound File Binary format ([MS-CFB]: header, FAT, DIFAT, mini FAT,
 * directory entries) to tell what an OLE compound file is: an Excel 97–2003 workbook (a
 * "Workbook" or "Book" stream), one protected with a password (a FILEPASS record in the
 * workbook's globals, [MS-XLS] 2.4.117, record type 0x002F), an Office 2007+ workbook encrypted
 * with a password ("EncryptionInfo" and "EncryptedPackage" streams, [MS-OFFCRYPTO] 2.3.4), or
 * another Office document. Reads only the directory and the first bytes of one stream; never
 * trusts a sector number without checking it against the file.
 */

export class CfbError extends Error {}

const END_OF_CHAIN = 0xfffffffe;
const FREE_SECTOR = 0xffffffff;
const NO_STREAM = 0xffffffff;
const HEADER_DIFAT_ENTRIES = 109;

export interface CfbEntry {
  name: string;
  /** 1 storage, 2 stream, 5 root */
  type: number;
  start: number;
  size: number;
}

export interface CompoundFile {
  entries: CfbEntry[];
  /** The first `max` bytes of a stream (all of it when shorter) */
  read(entry: CfbEntry, max: number): Buffer;
}

export function readCompoundFile(buf: Buffer): CompoundFile {
  if (buf.length < 512) throw new CfbError('shorter than its header');
  if (buf.readUInt16LE(0x1c) !== 0xfffe) throw new CfbError('byte order mark missing');
  const sectorShift = buf.readUInt16LE(0x1e);
  const miniShift = buf.readUInt16LE(0x20);
  if (sectorShift !== 9 && sectorShift !== 12) throw new CfbError('unexpected sector size');
  if (miniShift !== 6) throw new CfbError('unexpected mini sector size');
  const sectorSize = 1 << sectorShift;
  const sectorCount = Math.floor((buf.length - sectorSize) / sectorSize) + 1;
  const fatSectorCount = buf.readUInt32LE(0x2c);
  const firstDirSector = buf.readUInt32LE(0x30);
  const miniCutoff = buf.readUInt32LE(0x38);
  const firstMiniFatSector = buf.readUInt32LE(0x3c);
  const firstDifatSector = buf.readUInt32LE(0x44);
  const difatSectorCount = buf.readUInt32LE(0x48);
  if (fatSectorCount > sectorCount) throw new CfbError('more FAT sectors than the file holds');

  const sector = (n: number): Buffer => {
    if (n >= sectorCount) throw new CfbError('the file ends before the parts its directory lists');
    const at = (n + 1) * sectorSize;
    return buf.subarray(at, Math.min(at + sectorSize, buf.length));
  };

  // The FAT's own sectors: 109 in the header, the rest in a chain of DIFAT sectors.
  const fatSectors: number[] = [];
  for (let i = 0; i < HEADER_DIFAT_ENTRIES && fatSectors.length < fatSectorCount; i++) {
    fatSectors.push(buf.readUInt32LE(0x4c + i * 4));
  }
  let difat = firstDifatSector;
  for (let d = 0; d < difatSectorCount && fatSectors.length < fatSectorCount; d++) {
    if (difat === END_OF_CHAIN || difat === FREE_SECTOR) break;
    const s = sector(difat);
    const perSector = sectorSize / 4 - 1;
    for (let i = 0; i < perSector && fatSectors.length < fatSectorCount; i++) {
      fatSectors.push(s.readUInt32LE(i * 4));
    }
    difat = s.readUInt32LE(perSector * 4);
  }
  const fat = new Uint32Array(fatSectors.length * (sectorSize / 4));
  fatSectors.forEach((n, i) => {
    const s = sector(n);
    for (let k = 0; k < sectorSize / 4 && k * 4 < s.length; k++)
      fat[i * (sectorSize / 4) + k] = s.readUInt32LE(k * 4);
  });

  /** A chain of sectors, at most `limit` of them, refusing loops and sectors out of range. */
  const chain = (start: number, table: Uint32Array, limit: number): number[] => {
    const out: number[] = [];
    const seen = new Set<number>();
    for (let n = start; n !== END_OF_CHAIN && out.length < limit;) {
      if (n >= table.length || seen.has(n)) throw new CfbError('broken sector chain');
      seen.add(n);
      out.push(n);
      n = table[n]!;
    }
    return out;
  };

  const directory = Buffer.concat(chain(firstDirSector, fat, sectorCount).map((n) => sector(n)));
  const entries: CfbEntry[] = [];
  for (let at = 0; at + 128 <= directory.length; at += 128) {
    const nameBytes = directory.readUInt16LE(at + 0x40);
    const type = directory[at + 0x42]!;
    if (type === 0 || nameBytes < 2 || nameBytes > 64) continue;
    entries.push({
      name: directory.toString('utf16le', at, at + nameBytes - 2),
      type,
      start: directory.readUInt32LE(at + 0x74),
      // Version 3 files leave the high 32 bits undefined; no stream Cairn reads is that large.
      size: directory.readUInt32LE(at + 0x78),
    });
  }
  const root = entries.find((e) => e.type === 5);
  if (!root) throw new CfbError('no root entry');

  let miniFat: Uint32Array | null = null;
  let miniStream: Buffer | null = null;
  const mini = () => {
    if (!miniFat || !miniStream) {
      const miniFatBytes = Buffer.concat(
        firstMiniFatSector === END_OF_CHAIN
          ? []
          : chain(firstMiniFatSector, fat, sectorCount).map((n) => sector(n)),
      );
      miniFat = new Uint32Array(miniFatBytes.length / 4);
      for (let i = 0; i < miniFat.length; i++) miniFat[i] = miniFatBytes.readUInt32LE(i * 4);
      miniStream = Buffer.concat(
        root.start === END_OF_CHAIN ? [] : chain(root.start, fat, sectorCount).map(sector),
      );
    }
    return { miniFat, miniStream };
  };

  return {
    entries,
    read(entry, max) {
      const want = Math.min(entry.size, max);
      if (want === 0 || entry.start === NO_STREAM || entry.start === END_OF_CHAIN)
        return Buffer.alloc(0);
      if (entry.size < miniCutoff) {
        const { miniFat: table, miniStream: stream } = mini();
        const parts = chain(entry.start, table, Math.ceil(want / 64)).map((n) => {
          if ((n + 1) * 64 > stream.length)
            throw new CfbError('mini sector beyond the mini stream');
          return stream.subarray(n * 64, n * 64 + 64);
        });
        return Buffer.concat(parts).subarray(0, want);
      }
      const parts = chain(entry.start, fat, Math.ceil(want / sectorSize)).map(sector);
      return Buffer.concat(parts).subarray(0, want);
    },
  };
}

export type CompoundKind =
  'encrypted_ooxml' | 'xls_password' | 'xls' | 'xls_old' | 'word' | 'powerpoint' | 'other';

const BOF = 0x0809;
const FILEPASS = 0x002f;
const EOF = 0x000a;

/** What an OLE compound file holds, from its directory (and the workbook's first records). */
export function compoundKind(buf: Buffer): CompoundKind {
  const file = readCompoundFile(buf);
  const streams = new Map(
    file.entries.filter((e) => e.type === 2).map((e) => [e.name.toLowerCase(), e]),
  );
  if (streams.has('encryptedpackage') || streams.has('encryptioninfo')) return 'encrypted_ooxml';
  const workbook = streams.get('workbook') ?? streams.get('book');
  if (workbook) {
    const head = file.read(workbook, 64 * 1024);
    return filePassed(head) ? 'xls_password' : streams.has('workbook') ? 'xls' : 'xls_old';
  }
  if (streams.has('worddocument')) return 'word';
  if (streams.has('powerpoint document')) return 'powerpoint';
  return 'other';
}

/**
 * Whether the workbook globals (from the first BOF to its EOF) carry a FILEPASS record: the
 * workbook is encrypted with a password ([MS-XLS] 2.4.117). Records are a 2-byte type, a 2-byte
 * length and the data.
 */
export function filePassed(stream: Buffer): boolean {
  let at = 0;
  let first = true;
  while (at + 4 <= stream.length) {
    const type = stream.readUInt16LE(at);
    const length = stream.readUInt16LE(at + 2);
    if (first && type !== BOF) return false;
    first = false;
    if (type === FILEPASS) return true;
    if (type === EOF) return false;
    at += 4 + length;
  }
  return false;
}
