/**
 * Base64 (RFC 4648 §4, with padding) in plain TypeScript, for the packed columns of a stored
 * benchmark. The encoded characters are written as bytes and turned into a string by the
 * standard `TextDecoder` (as UTF-8, of which ASCII is a part) where there is one (browsers,
 * Node.js), else in chunks.
 */
const ALPHABET = 'ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789+/';
const ENCODE = Uint8Array.from(ALPHABET, (c) => c.charCodeAt(0));
const DECODE = new Int16Array(256).fill(-1);
for (let i = 0; i < ALPHABET.length; i++) DECODE[ALPHABET.charCodeAt(i)] = i;
const PAD = 61; // '='
const CHUNK = 0x1000;

export function toBase64(bytes: Uint8Array): string {
  const n = bytes.length;
  const out = new Uint8Array(Math.ceil(n / 3) * 4);
  let o = 0;
  let i = 0;
  for (; i + 2 < n; i += 3) {
    const v =
      ((bytes[i] as number) << 16) | ((bytes[i + 1] as number) << 8) | (bytes[i + 2] as number);
    out[o++] = ENCODE[v >> 18] as number;
    out[o++] = ENCODE[(v >> 12) & 63] as number;
    out[o++] = ENCODE[(v >> 6) & 63] as number;
    out[o++] = ENCODE[v & 63] as number;
  }
  if (i < n) {
    const a = bytes[i] as number;
    const b = i + 1 < n ? (bytes[i + 1] as number) : 0;
    out[o++] = ENCODE[a >> 2] as number;
    out[o++] = ENCODE[((a & 3) << 4) | (b >> 4)] as number;
    out[o++] = i + 1 < n ? (ENCODE[(b & 15) << 2] as number) : PAD;
    out[o] = PAD;
  }
  return asciiText(out);
}

const decoder: { decode(bytes: Uint8Array): string } | null =
  typeof (globalThis as { TextDecoder?: unknown }).TextDecoder === 'function'
    ? new (
        globalThis as unknown as {
          TextDecoder: new (label: string) => { decode(bytes: Uint8Array): string };
        }
      ).TextDecoder('utf-8')
    : null;

/** A string of ASCII bytes. */
function asciiText(bytes: Uint8Array): string {
  if (decoder !== null) return decoder.decode(bytes);
  const parts: string[] = [];
  const chunk: number[] = [];
  for (let k = 0; k < bytes.length; k += CHUNK) {
    const m = Math.min(CHUNK, bytes.length - k);
    chunk.length = m;
    for (let j = 0; j < m; j++) chunk[j] = bytes[k + j] as number;
    parts.push(String.fromCharCode.apply(null, chunk));
  }
  return parts.join('');
}

export function fromBase64(text: string): Uint8Array {
  if (typeof text !== 'string' || text.length % 4 !== 0) {
    throw new RangeError('base64 text must be a string whose length is a multiple of 4');
  }
  const padding = text.endsWith('==') ? 2 : text.endsWith('=') ? 1 : 0;
  const out = new Uint8Array((text.length / 4) * 3 - padding);
  const body = text.length - (padding > 0 ? 4 : 0);
  let o = 0;
  // Characters beyond 255 set bits above the low byte; unknown ones decode to −1.
  let wide = 0;
  let bad = 0;
  for (let i = 0; i < body; i += 4) {
    const c0 = text.charCodeAt(i);
    const c1 = text.charCodeAt(i + 1);
    const c2 = text.charCodeAt(i + 2);
    const c3 = text.charCodeAt(i + 3);
    wide |= c0 | c1 | c2 | c3;
    const a = DECODE[c0 & 255] as number;
    const b = DECODE[c1 & 255] as number;
    const c = DECODE[c2 & 255] as number;
    const d = DECODE[c3 & 255] as number;
    bad |= a | b | c | d;
    const v = (a << 18) | (b << 12) | (c << 6) | d;
    out[o++] = v >> 16;
    out[o++] = (v >> 8) & 255;
    out[o++] = v & 255;
  }
  if (padding > 0) {
    const i = body;
    const c0 = text.charCodeAt(i);
    const c1 = text.charCodeAt(i + 1);
    const c2 = padding === 1 ? text.charCodeAt(i + 2) : 65;
    wide |= c0 | c1 | c2;
    const a = DECODE[c0 & 255] as number;
    const b = DECODE[c1 & 255] as number;
    const c = DECODE[c2 & 255] as number;
    bad |= a | b | c;
    const v = (a << 18) | (b << 12) | (c << 6);
    out[o++] = v >> 16;
    if (padding === 1) out[o] = (v >> 8) & 255;
  }
  if (bad < 0 || wide > 255) {
    throw new RangeError('base64 text holds a character that is not base64');
  }
  return out;
}
