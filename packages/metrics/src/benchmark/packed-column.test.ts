import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { fromBase64, toBase64 } from './base64.js';
import { packColumn, unpackColumn } from './packed-column.js';

describe('base64 (RFC 4648)', () => {
  it('gives the RFC 4648 §10 test vectors', () => {
    const vectors: [string, string][] = [
      ['', ''],
      ['f', 'Zg=='],
      ['fo', 'Zm8='],
      ['foo', 'Zm9v'],
      ['foob', 'Zm9vYg=='],
      ['fooba', 'Zm9vYmE='],
      ['foobar', 'Zm9vYmFy'],
    ];
    for (const [text, encoded] of vectors) {
      const bytes = Uint8Array.from(text, (c) => c.charCodeAt(0));
      expect(toBase64(bytes)).toBe(encoded);
      expect(fromBase64(encoded)).toEqual(bytes);
    }
  });

  it('agrees with Node’s Buffer on random bytes', () => {
    fc.assert(
      fc.property(fc.uint8Array({ maxLength: 500 }), (bytes) => {
        const text = toBase64(bytes);
        expect(text).toBe(Buffer.from(bytes).toString('base64'));
        expect(fromBase64(text)).toEqual(bytes);
      }),
    );
  });

  it('refuses text that is not base64', () => {
    expect(() => fromBase64('abc')).toThrow(/multiple of 4/);
    expect(() => fromBase64('ab$d')).toThrow(/not base64/);
    expect(() => fromBase64('abcé===')).toThrow(RangeError);
  });
});

describe('packed columns', () => {
  it('round-trip counts in the narrowest type, and doubles exactly', () => {
    expect(packColumn(Uint32Array.from([1, 200])).type).toBe('uint8');
    expect(packColumn(Uint32Array.from([1, 300])).type).toBe('uint16');
    expect(packColumn(Uint32Array.from([70_000])).type).toBe('uint32');
    fc.assert(
      fc.property(fc.array(fc.double({ noNaN: false })), fc.array(fc.nat()), (doubles, counts) => {
        const d = Float64Array.from(doubles);
        expect(unpackColumn(packColumn(d), 'd')).toEqual(d);
        const c = Uint32Array.from(counts);
        expect(Array.from(unpackColumn(packColumn(c), 'c'))).toEqual(Array.from(c));
      }),
    );
  });

  it('refuses a column whose bytes do not match its length', () => {
    const column = packColumn(Uint16Array.from([500, 600]));
    expect(() => unpackColumn({ ...column, length: 3 }, 'events')).toThrow(
      /events: 4 bytes do not hold 3 values/,
    );
    expect(() => unpackColumn({ ...column, type: 'int8' as 'uint8' }, 'events')).toThrow(
      /not a packed column/,
    );
  });
});
