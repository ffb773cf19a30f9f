import { ByteWriter } from './byte-codec.js';
import { crc32 } from './crc32.js';
import {
  fullestStratum,
  type PracticeSums,
  SECTIONS,
  sumsWidths,
  widthOf,
} from './practice-sums.js';
import { SUMS_FORMAT_VERSION } from './sums-layout.js';

/**
 * The stored form of `PracticeSums`: compact, versioned bytes.
 *
 * Header: the signature "CRNS", the format version (1 byte), the sums layout's fingerprint
 * (8 bytes, sums-layout.ts), the measure set id (varint length + ASCII), the audit quarter
 * (varint year, 1 byte quarter) and the number of practices summed (varint). Body: the four
 * record counts, the number of strata and the length of the insulin life table (varints); the
 * byte width of each section's counts (6 bytes, in the order of `SECTIONS`); the stratum ids
 * (the first, then the gaps between ids, as varints); the excluded insulin count (varint);
 * then each section's counts in the shorter of a sparse and a bit-packed form (byte-codec.ts).
 * Last, a CRC-32 of every byte before it (crc32.ts), little-endian.
 * A reader refuses other signatures, versions, fingerprints, damaged or truncated bytes.
 */
export const SUMS_SIGNATURE = [0x43, 0x52, 0x4e, 0x53] as const; // "CRNS"

// One writer reused by every call (encoding is synchronous): its buffer grows to the largest
// sums written and is copied out once per call.
const writer = new ByteWriter();

export function encodeSums(sums: PracticeSums): Uint8Array {
  if (!/^[0-9a-f]{16}$/.test(sums.fingerprint)) {
    throw new RangeError(`sums.fingerprint must be 16 hex characters (got ${sums.fingerprint})`);
  }
  if (!/^[\x20-\x7e]{1,200}$/.test(sums.measureSetId)) {
    throw new RangeError('sums.measureSetId must be 1–200 printable ASCII characters');
  }
  const w = writer;
  w.reset();
  w.raw(SUMS_SIGNATURE);
  w.byte(SUMS_FORMAT_VERSION);
  for (let i = 0; i < 16; i += 2) w.byte(parseInt(sums.fingerprint.slice(i, i + 2), 16));
  w.varint(sums.measureSetId.length);
  for (let i = 0; i < sums.measureSetId.length; i++) w.byte(sums.measureSetId.charCodeAt(i));
  w.varint(sums.quarter.year);
  w.byte(sums.quarter.quarter);
  w.varint(sums.practices);
  for (let k = 0; k < 4; k++) w.varint(sums.records[k] as number);
  const ids = sums.strata.ids;
  w.varint(ids.length);
  w.varint(sums.insulin.counts.length);
  const sections = {
    cells: sums.cells,
    eligible: sums.eligible,
    strataValues: sums.strata.values,
    insulin: sums.insulin.counts,
    values: sums.values,
    kidney: sums.kidney,
  };
  const widths = sumsWidths(
    sums.records[1] as number,
    ids.length > 0 ? fullestStratum(sums.strata.values, sums.strata.values.length / ids.length) : 0,
  );
  for (const section of SECTIONS) {
    if (widthOf(sections[section]) !== widths[section]) {
      throw new RangeError(
        `sums.${section} must be ${8 * widths[section]}-bit counts for sums of this size ` +
          '(practice-sums.ts): were the sums made by sumsOfColumns, mergeSums or decodeSums?',
      );
    }
    w.byte(widths[section]);
  }
  for (let j = 0; j < ids.length; j++) {
    w.varint(j === 0 ? (ids[0] as number) : (ids[j] as number) - (ids[j - 1] as number) - 1);
  }
  w.varint(sums.insulin.excluded);
  for (const section of SECTIONS) w.counts(sections[section]);
  const out = new Uint8Array(w.length + 4);
  out.set(w.bytes.subarray(0, w.length));
  const check = crc32(out, 0, w.length);
  out[w.length] = check & 0xff;
  out[w.length + 1] = (check >>> 8) & 0xff;
  out[w.length + 2] = (check >>> 16) & 0xff;
  out[w.length + 3] = (check >>> 24) & 0xff;
  return out;
}
