/**
 * Staged records as LOAD DATA text (its default format: fields separated by
 * tabs, one record per line, \N for NULL, backslash escapes for a backslash,
 * tab, line break, carriage return or NUL), written straight into Buffers.
 *
 * A record is a few dozen short values (numbers, months, codes), and a
 * large extract is a hundred thousand records: building each line as
 * strings and then converting it to bytes made several short-lived strings
 * per value for the garbage collector while the file was still being read.
 * Bytes written into a buffer outside the JavaScript heap leave it nothing.
 */

const TAB = 0x09;
const NL = 0x0a;
const BACKSLASH = 0x5c;
const N = 0x4e;
const ZERO = 0x30;

// eslint-disable-next-line no-control-regex
const NEEDS_ESCAPE = /[\\\t\n\r\u0000]/;
// eslint-disable-next-line no-control-regex
const NEEDS_ESCAPE_ALL = /[\\\t\n\r\u0000]/g;

export type TsvValue = string | number | null;

/** The escape LOAD DATA reads back for a character that needs one, else 0. */
function escapeOf(code: number): number {
  switch (code) {
    case 0x5c:
      return 0x5c; // \\
    case 0x09:
      return 0x74; // \t
    case 0x0a:
      return 0x6e; // \n
    case 0x0d:
      return 0x72; // \r
    case 0x00:
      return 0x30; // \0
    default:
      return 0;
  }
}

export class TsvEncoder {
  private buf: Buffer;
  private pos = 0;

  /**
   * @param emit receives each filled buffer (the encoder never writes to it again)
   * @param chunkBytes size of the buffers
   */
  constructor(
    private readonly emit: (chunk: Buffer) => void,
    private readonly chunkBytes = 1 << 20,
  ) {
    this.buf = Buffer.allocUnsafe(chunkBytes);
  }

  /** Emits what has been written so far (nothing when empty). */
  flush(): void {
    if (this.pos === 0) return;
    this.emit(this.buf.subarray(0, this.pos));
    this.buf = Buffer.allocUnsafe(this.chunkBytes);
    this.pos = 0;
  }

  /** Forgets what has been written and not emitted. */
  discard(): void {
    this.pos = 0;
  }

  private room(bytes: number): void {
    if (this.pos + bytes <= this.buf.length) return;
    this.flush();
    if (bytes > this.buf.length) this.buf = Buffer.allocUnsafe(bytes);
  }

  /** One record as a line; the value at `skip` (a column MariaDB fills itself) is left out. */
  line(values: readonly (TsvValue | undefined)[], skip = -1): void {
    // Room for the whole line at its longest, made once: a number is at most 24 characters, a
    // UTF-16 unit of text at most 3 bytes of UTF-8 (an escape is 2), plus a tab or line break each.
    let need = 0;
    for (let i = 0; i < values.length; i++) {
      const v = values[i];
      need += typeof v === 'string' ? v.length * 3 + 1 : 25;
    }
    this.room(need);
    const buf = this.buf;
    let pos = this.pos;
    let first = true;
    for (let i = 0; i < values.length; i++) {
      if (i === skip) continue;
      if (first) first = false;
      else buf[pos++] = TAB;
      const v = values[i] ?? null;
      if (v === null) {
        buf[pos++] = BACKSLASH;
        buf[pos++] = N;
      } else if (typeof v === 'number') {
        if (v >= 0 && v < 4294967296 && v === Math.floor(v)) {
          // Whole numbers, the usual case (years, rows, blood pressures): digits written directly.
          let n = v >>> 0;
          let digits = 1;
          for (let t = n; t >= 10; t = (t / 10) >>> 0) digits++;
          let p = pos + digits;
          pos = p;
          do {
            const q = (n / 10) >>> 0;
            buf[--p] = ZERO + (n - q * 10);
            n = q;
          } while (n > 0);
        } else {
          // Fractions (53.2), negative numbers, the rare very large or small one: as JavaScript
          // writes it, which MariaDB reads back exactly (1e-7 included).
          const text = String(v);
          for (let k = 0; k < text.length; k++) buf[pos++] = text.charCodeAt(k);
        }
      } else {
        let ascii = true;
        const start = pos;
        for (let k = 0; k < v.length; k++) {
          const code = v.charCodeAt(k);
          if (code >= 0x80) {
            ascii = false;
            break;
          }
          const escape = escapeOf(code);
          if (escape !== 0) {
            buf[pos++] = BACKSLASH;
            buf[pos++] = escape;
          } else {
            buf[pos++] = code;
          }
        }
        if (!ascii) pos = start + this.unicodeAt(v, start);
      }
    }
    buf[pos++] = NL;
    this.pos = pos;
  }

  /** Text beyond ASCII, escaped, as UTF-8 at `at` (room made by the caller); returns its length. */
  private unicodeAt(text: string, at: number): number {
    const escaped = NEEDS_ESCAPE.test(text)
      ? text.replace(
          NEEDS_ESCAPE_ALL,
          (ch) => `\\${String.fromCharCode(escapeOf(ch.charCodeAt(0)))}`,
        )
      : text;
    return this.buf.write(escaped, at, 'utf8');
  }
}
