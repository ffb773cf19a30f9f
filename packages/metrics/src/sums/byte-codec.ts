/**
 * The byte-level pieces of the sums format: unsigned LEB128 varints, and blocks of counts in
 * whichever of two forms is shorter for the data at hand:
 * - 1 sparse: the number of non-zero counts, then for each its gap from the previous one and
 *   its value, as varints (for mostly-zero data, such as a small practice's histograms);
 * - 2 bit-packed: groups of 64 counts, each a byte giving the bit width w of its largest count
 *   (0 for a group of zeros) and then the 64 counts in w bits each, least significant first
 *   (for many small counts, such as the case-mix strata).
 * The reader names what it was reading when the bytes end or do not make sense, through
 * `SumsDecodeError`.
 */
export type SumsDecodeProblem =
  'not_sums' | 'version' | 'measure_set' | 'truncated' | 'damaged' | 'invalid';

export class SumsDecodeError extends Error {
  override name = 'SumsDecodeError';
  constructor(
    readonly problem: SumsDecodeProblem,
    message: string,
  ) {
    super(message);
  }
}

export const SPARSE = 1;
export const PACKED = 2;
const GROUP = 64;

export function varintLength(v: number): number {
  return v < 0x80 ? 1 : v < 0x4000 ? 2 : v < 0x200000 ? 3 : v < 0x10000000 ? 4 : 5;
}

function bitWidth(max: number): number {
  return max === 0 ? 0 : max >= 0x80000000 ? 32 : 32 - Math.clz32(max);
}

/** Bytes appended to a growing buffer (reused between uses: call `reset` first). */
export class ByteWriter {
  bytes = new Uint8Array(1 << 16);
  length = 0;

  reset(): void {
    this.length = 0;
  }

  private reserve(n: number): void {
    if (this.length + n <= this.bytes.length) return;
    let size = this.bytes.length * 2;
    while (size < this.length + n) size *= 2;
    const next = new Uint8Array(size);
    next.set(this.bytes.subarray(0, this.length));
    this.bytes = next;
  }

  byte(value: number): void {
    this.reserve(1);
    this.bytes[this.length++] = value & 0xff;
  }

  raw(values: ArrayLike<number>): void {
    this.reserve(values.length);
    for (let i = 0; i < values.length; i++)
      this.bytes[this.length++] = (values[i] as number) & 0xff;
  }

  varint(value: number): void {
    if (!Number.isInteger(value) || value < 0 || value > 0xffffffff) {
      throw new RangeError(`internal: ${value} is not an unsigned 32-bit count`);
    }
    this.reserve(5);
    const bytes = this.bytes;
    let v = value;
    while (v >= 0x80) {
      bytes[this.length++] = (v & 0x7f) | 0x80;
      v = Math.floor(v / 128);
    }
    bytes[this.length++] = v;
  }

  /** A block of counts in its shorter form (see above). */
  counts(values: Uint8Array | Uint16Array | Uint32Array): void {
    const n = values.length;
    let sparse = 0;
    let nonZero = 0;
    let last = -1;
    let packed = 0;
    for (let start = 0; start < n; start += GROUP) {
      const end = start + GROUP < n ? start + GROUP : n;
      let max = 0;
      for (let i = start; i < end; i++) {
        const v = values[i] as number;
        if (v === 0) continue;
        if (v > max) max = v;
        sparse += varintLength(i - last - 1) + varintLength(v);
        nonZero++;
        last = i;
      }
      packed += 1 + (((end - start) * bitWidth(max) + 7) >> 3);
    }
    sparse += varintLength(nonZero);
    if (sparse < packed) {
      this.byte(SPARSE);
      this.reserve(sparse);
      this.varint(nonZero);
      let previous = -1;
      for (let i = 0; i < n; i++) {
        const v = values[i] as number;
        if (v === 0) continue;
        this.varint(i - previous - 1);
        this.varint(v);
        previous = i;
      }
    } else {
      this.byte(PACKED);
      this.packed(values, packed);
    }
  }

  private packed(values: Uint8Array | Uint16Array | Uint32Array, size: number): void {
    this.reserve(size);
    const bytes = this.bytes;
    const n = values.length;
    let o = this.length;
    for (let start = 0; start < n; start += GROUP) {
      const end = start + GROUP < n ? start + GROUP : n;
      let max = 0;
      for (let i = start; i < end; i++) if ((values[i] as number) > max) max = values[i] as number;
      const w = bitWidth(max);
      bytes[o++] = w;
      if (w === 0) continue;
      if (w <= 24) {
        // At most 7 pending bits plus 24 new ones: 32-bit integer arithmetic is exact.
        let acc = 0;
        let bits = 0;
        for (let i = start; i < end; i++) {
          acc |= (values[i] as number) << bits;
          bits += w;
          while (bits >= 8) {
            bytes[o++] = acc & 0xff;
            acc >>>= 8;
            bits -= 8;
          }
        }
        if (bits > 0) bytes[o++] = acc;
      } else {
        // Wider counts: accumulate in a double (exact below 2^53).
        let acc = 0;
        let bits = 0;
        for (let i = start; i < end; i++) {
          acc += (values[i] as number) * 2 ** bits;
          bits += w;
          while (bits >= 8) {
            bytes[o++] = acc % 256;
            acc = Math.floor(acc / 256);
            bits -= 8;
          }
        }
        if (bits > 0) bytes[o++] = acc;
      }
    }
    this.length = o;
  }
}

export class ByteReader {
  offset = 0;
  constructor(
    readonly bytes: Uint8Array,
    readonly end: number,
  ) {}

  truncated(what: string): SumsDecodeError {
    return new SumsDecodeError(
      'truncated',
      `the sums are truncated: they end at byte ${this.end} while reading ${what}`,
    );
  }

  byte(what: string): number {
    if (this.offset >= this.end) throw this.truncated(what);
    return this.bytes[this.offset++] as number;
  }

  varint(what: string): number {
    const bytes = this.bytes;
    let value = 0;
    let scale = 1;
    for (let k = 0; k < 5; k++) {
      if (this.offset >= this.end) throw this.truncated(what);
      const b = bytes[this.offset++] as number;
      value += (b & 0x7f) * scale;
      if (b < 0x80) {
        if (value > 0xffffffff) break;
        return value;
      }
      scale *= 128;
    }
    throw new SumsDecodeError('invalid', `the sums hold a malformed number in ${what}`);
  }

  /** Reads a block of counts into `out` (its length is the block's length). */
  counts(out: Uint8Array | Uint16Array | Uint32Array, what: string): void {
    const mode = this.byte(what);
    const bits = 8 * out.BYTES_PER_ELEMENT;
    const limit = bits === 32 ? 0xffffffff : (1 << bits) - 1;
    if (mode === SPARSE) {
      const n = out.length;
      const nonZero = this.varint(what);
      if (nonZero > n) throw new SumsDecodeError('invalid', `the sums' ${what} do not fit`);
      let i = -1;
      for (let k = 0; k < nonZero; k++) {
        i += this.varint(what) + 1;
        const v = this.varint(what);
        if (i >= n || v === 0 || v > limit) {
          throw new SumsDecodeError('invalid', `the sums' ${what} do not fit`);
        }
        out[i] = v;
      }
    } else if (mode === PACKED) {
      this.packed(out, what, bits);
    } else {
      throw new SumsDecodeError('invalid', `the sums use an unknown form (${mode}) for ${what}`);
    }
  }

  private packed(out: Uint8Array | Uint16Array | Uint32Array, what: string, most: number): void {
    const n = out.length;
    const bytes = this.bytes;
    let o = this.offset;
    for (let start = 0; start < n; start += GROUP) {
      const end = start + GROUP < n ? start + GROUP : n;
      if (o >= this.end) throw this.truncated(what);
      const w = bytes[o++] as number;
      if (w === 0) continue;
      // The array is as narrow as its largest count: a wider group cannot belong to it.
      if (w > most) throw new SumsDecodeError('invalid', `the sums' ${what} do not fit`);
      if (o + (((end - start) * w + 7) >> 3) > this.end) throw this.truncated(what);
      if (w <= 24) {
        // At most 7 + 24 bits pending: 32-bit integer arithmetic is exact.
        const mask = (1 << w) - 1;
        let acc = 0;
        let bits = 0;
        for (let i = start; i < end; i++) {
          while (bits < w) {
            acc |= (bytes[o++] as number) << bits;
            bits += 8;
          }
          out[i] = acc & mask;
          acc >>>= w;
          bits -= w;
        }
      } else {
        let acc = 0;
        let bits = 0;
        const scale = 2 ** w;
        for (let i = start; i < end; i++) {
          while (bits < w) {
            acc += (bytes[o++] as number) * 2 ** bits;
            bits += 8;
          }
          out[i] = acc % scale;
          acc = Math.floor(acc / scale);
          bits -= w;
        }
      }
    }
    this.offset = o;
  }
}
