/**
 * CRC-32 (the reflected polynomial 0xEDB88320 with initial value and final XOR 0xFFFFFFFF, as
 * in ISO 3309 / ITU-T V.42, zlib and PNG), table-driven. The encoded sums carry it so that
 * damaged bytes are refused instead of read as counts.
 */
const TABLE = (() => {
  const table = new Uint32Array(256);
  for (let n = 0; n < 256; n++) {
    let c = n;
    for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
    table[n] = c >>> 0;
  }
  return table;
})();

/** CRC-32 of bytes[from … to − 1]. */
export function crc32(bytes: Uint8Array, from = 0, to = bytes.length): number {
  let c = 0xffffffff;
  for (let i = from; i < to; i++) {
    c = (TABLE[(c ^ (bytes[i] as number)) & 0xff] as number) ^ (c >>> 8);
  }
  return (c ^ 0xffffffff) >>> 0;
}
