import { crc32 as zlibCrc32 } from 'node:zlib';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { syntheticColumns } from '../../bench/synthetic.js';
import { defaultMeasureSet, defaultMeasureSetJson } from '../../test/measure-set.js';
import { arbitraryRecords } from '../../test/sums-reference.js';
import { parseMeasureSet } from '../measures/schema.js';
import { toColumns } from '../records/columns.js';
import { crc32 } from './crc32.js';
import { decodeSums, SumsDecodeError } from './decode-sums.js';
import { encodeSums } from './encode-sums.js';
import type { PracticeSums } from './practice-sums.js';
import { sumsLayout } from './sums-layout.js';
import { sumsOfColumns } from './sums-of-columns.js';

const set = defaultMeasureSet();
const quarter = { year: 2026, quarter: 3 } as const;

function decodeError(bytes: Uint8Array, measureSet = set): SumsDecodeError {
  try {
    decodeSums(bytes, measureSet);
  } catch (error) {
    if (error instanceof SumsDecodeError) return error;
    throw error;
  }
  throw new Error('decodeSums accepted the bytes');
}

/** Sums of one synthetic practice of about `records` records. */
function practiceOf(records: number, seed: number): PracticeSums {
  const columns = syntheticColumns({ records, practices: 1, seed, endMonthIndex: 2026 * 12 + 8 });
  return [...sumsOfColumns(columns, set, quarter).values()][0] as PracticeSums;
}

describe('crc32', () => {
  it('gives the catalogue check value and agrees with node:zlib (zlib’s crc32)', () => {
    const digits = Uint8Array.from('123456789', (c) => c.charCodeAt(0));
    expect(crc32(digits)).toBe(0xcbf43926);
    fc.assert(
      fc.property(fc.uint8Array({ maxLength: 300 }), (bytes) => {
        expect(crc32(bytes)).toBe(zlibCrc32(bytes));
      }),
    );
  });
});

describe('encodeSums / decodeSums', () => {
  it('round-trips the sums of random practices exactly (property)', () => {
    fc.assert(
      fc.property(arbitraryRecords(4), (records) => {
        for (const sums of sumsOfColumns(toColumns(records), set, quarter).values()) {
          expect(decodeSums(encodeSums(sums), set)).toEqual(sums);
        }
      }),
      { numRuns: 60 },
    );
  });

  it('round-trips large practices (16- and 32-bit counts) and stays compact', () => {
    const sizes: number[] = [];
    for (const [records, bound] of [
      [50, 2_000],
      [500, 6_000],
      [5_000, 16_000],
    ] as const) {
      const sums = practiceOf(records, records);
      const bytes = encodeSums(sums);
      expect(decodeSums(bytes, set)).toEqual(sums);
      expect(bytes.length).toBeLessThan(bound);
      sizes.push(bytes.length);
    }
    expect(sizes[0]).toBeLessThan(sizes[1] as number);
    const wide = practiceOf(70_000, 3);
    expect(wide.cells).toBeInstanceOf(Uint32Array);
    expect(decodeSums(encodeSums(wide), set)).toEqual(wide);
  });

  it('refuses bytes that are not sums', () => {
    expect(decodeError(new Uint8Array(0)).problem).toBe('not_sums');
    expect(
      decodeError(Uint8Array.from([80, 75, 3, 4, 20, 0, 0, 0, 8, 0, 0, 0, 0, 0, 0, 0, 0])),
    ).toMatchObject({
      problem: 'not_sums',
      message: expect.stringMatching(/not Cairn practice sums/),
    });
    expect(() => decodeSums('CRNS' as unknown as Uint8Array, set)).toThrow(/bytes/);
  });

  it('refuses truncated sums at every length, naming what was being read', () => {
    const bytes = encodeSums(practiceOf(200, 7));
    for (let length = 1; length < bytes.length; length++) {
      const error = decodeError(bytes.subarray(0, length));
      expect(['truncated', 'damaged', 'invalid']).toContain(error.problem);
      if (length > 40 && length < bytes.length - 4) {
        expect(error.problem === 'truncated' || error.problem === 'damaged').toBe(true);
      }
    }
    expect(decodeError(bytes.subarray(0, bytes.length - 200)).message).toMatch(
      /truncated: they end at byte \d+ while reading/,
    );
  });

  it('refuses damaged sums by their checksum', () => {
    const bytes = encodeSums(practiceOf(300, 11));
    for (const at of [20, 40, Math.floor(bytes.length / 2), bytes.length - 6, bytes.length - 1]) {
      const damaged = bytes.slice();
      damaged[at] = (damaged[at] as number) ^ 0x10;
      const error = decodeError(damaged);
      expect(['damaged', 'invalid', 'truncated', 'measure_set']).toContain(error.problem);
    }
    const body = bytes.slice();
    const middle = Math.floor(bytes.length / 2);
    body[middle] = (body[middle] as number) ^ 1;
    expect(() => decodeSums(body, set)).toThrow(SumsDecodeError);
    const extra = new Uint8Array(bytes.length + 3);
    extra.set(bytes);
    expect(() => decodeSums(extra, set)).toThrow(SumsDecodeError);
  });

  it('refuses to encode sums whose arrays do not have the widths of their counts', () => {
    const sums = practiceOf(60, 13);
    expect(() => encodeSums({ ...sums, cells: Uint32Array.from(sums.cells) })).toThrow(
      /sums\.cells must be 8-bit counts/,
    );
    expect(() => encodeSums({ ...sums, fingerprint: 'x' })).toThrow(/fingerprint/);
  });

  it('refuses sums made under another measure set or format version', () => {
    const bytes = encodeSums(practiceOf(100, 5));
    const json = defaultMeasureSetJson() as Record<string, unknown> & {
      targets: { threshold?: number }[];
    };
    json.id = 'cairn-default-2026.2';
    const other = parseMeasureSet(json);
    const error = decodeError(bytes, other);
    expect(error.problem).toBe('measure_set');
    expect(error.message).toMatch(/made under measure set cairn-default-2026\.1/);
    expect(error.message).toMatch(/not cairn-default-2026\.2/);
    // Same id, different content: the fingerprint tells them apart.
    const changed = defaultMeasureSetJson() as { targets: { key: string; threshold?: number }[] };
    (changed.targets.find((t) => t.key === 'hba1c_le_53') as { threshold: number }).threshold = 52;
    const sameId = parseMeasureSet(changed);
    expect(sumsLayout(sameId).fingerprint).not.toBe(sumsLayout(set).fingerprint);
    expect(decodeError(bytes, sameId).problem).toBe('measure_set');
    const version = bytes.slice();
    version[4] = 9;
    expect(decodeError(version)).toMatchObject({
      problem: 'version',
      message: expect.stringMatching(/format version 9; this build reads version 1/),
    });
  });
});
