import { fromBase64, toBase64 } from './base64.js';

/**
 * A typed column in a JSON-serialisable form: its element type, length and bytes (little-endian
 * on every platform) as base64. A benchmark of 7,000 practices keeps its per-practice numbers
 * this way, a few MB instead of tens as JSON number arrays.
 */
export type ColumnType = 'uint8' | 'uint16' | 'uint32' | 'float64';

export interface PackedColumn {
  type: ColumnType;
  length: number;
  data: string;
}

export type ColumnArray = Uint8Array | Uint16Array | Uint32Array | Float64Array;

const SIZE: Record<ColumnType, number> = { uint8: 1, uint16: 2, uint32: 4, float64: 8 };

/** Typed arrays hold their bytes in the platform's order; most platforms are little-endian. */
const LITTLE_ENDIAN = new Uint8Array(new Uint16Array([1]).buffer)[0] === 1;

/** Packs a count column in the narrowest unsigned type that holds it, or a float64 column. */
export function packColumn(values: ColumnArray): PackedColumn {
  let type: ColumnType;
  if (values instanceof Float64Array) type = 'float64';
  else {
    let max = 0;
    for (let i = 0; i < values.length; i++)
      if ((values[i] as number) > max) max = values[i] as number;
    type = max < 256 ? 'uint8' : max < 65536 ? 'uint16' : 'uint32';
  }
  const size = SIZE[type];
  let bytes: Uint8Array;
  if (LITTLE_ENDIAN && values.BYTES_PER_ELEMENT === size) {
    bytes = new Uint8Array(values.buffer, values.byteOffset, values.byteLength);
  } else {
    bytes = new Uint8Array(values.length * size);
    const view = new DataView(bytes.buffer);
    for (let i = 0; i < values.length; i++) {
      const v = values[i] as number;
      if (type === 'float64') view.setFloat64(i * 8, v, true);
      else if (type === 'uint32') view.setUint32(i * 4, v, true);
      else if (type === 'uint16') view.setUint16(i * 2, v, true);
      else bytes[i] = v;
    }
  }
  return { type, length: values.length, data: toBase64(bytes) };
}

export function unpackColumn(column: PackedColumn, what: string): ColumnArray {
  const size = SIZE[column?.type];
  if (size === undefined || !Number.isInteger(column.length) || column.length < 0) {
    throw new RangeError(`${what}: not a packed column`);
  }
  const bytes = fromBase64(column.data);
  if (bytes.length !== column.length * size) {
    throw new RangeError(`${what}: ${bytes.length} bytes do not hold ${column.length} values`);
  }
  const n = column.length;
  if (LITTLE_ENDIAN) {
    switch (column.type) {
      case 'float64':
        return new Float64Array(bytes.buffer, bytes.byteOffset, n);
      case 'uint32':
        return new Uint32Array(bytes.buffer, bytes.byteOffset, n);
      case 'uint16':
        return new Uint16Array(bytes.buffer, bytes.byteOffset, n);
      case 'uint8':
        return bytes;
    }
  }
  const view = new DataView(bytes.buffer);
  switch (column.type) {
    case 'float64': {
      const out = new Float64Array(n);
      for (let i = 0; i < n; i++) out[i] = view.getFloat64(i * 8, true);
      return out;
    }
    case 'uint32': {
      const out = new Uint32Array(n);
      for (let i = 0; i < n; i++) out[i] = view.getUint32(i * 4, true);
      return out;
    }
    case 'uint16': {
      const out = new Uint16Array(n);
      for (let i = 0; i < n; i++) out[i] = view.getUint16(i * 2, true);
      return out;
    }
    case 'uint8':
      return bytes;
  }
}
