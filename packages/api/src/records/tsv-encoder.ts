/**
 * Staged records as LOAD DATA text (its default format: fields separated by
 * tabs, one record per line, \N for NULL, backslash escapes for a backslash,
 * tab, line break, carriage return or NUL), written straight into Buffers.
 *
 * A record is a few dozen short values (numbers, months, codes), and a
 * large extract is a hundred thousand records: building them as strings and
 * converting those to bytes made, on a 100,000-row file, hundreds of
 * megabytes of short-lived strings for the garbage collector to go through
 * while the workbook was still being read. Bytes written into a buffer
 * outside the JavaScript heap leave it nothing to do.
 */

const TAB = 0x09;
const NL = 0x0a;
const BACKSLASH = 0x5c;
const N = 0x4e;
const MINUS = 0x2d;
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

  /** Bytes written and not yet emitted */
  get pending(): number {
    return this.pos;
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
    let first = true;
    for (let i = 0; i < values.length; i++) {
      if (i === skip) continue;
      if (!first) {
        this.room(1);
        this.buf[this.pos++] = TAB;
      }
      first = false;
      this.value(values[i] ?? null);
    }
    this.room(1);
    this.buf[this.pos++] = NL;
  }

  value(value: TsvValue): void {
    if (value === null) {
      this.room(2);
      this.buf[this.pos++] = BACKSLASH;
      this.buf[this.pos++] = N;
    } else if (typeof value === 'number') {
      this.number(value);
    } else {
      this.text(value);
    }
  }

  private number(value: number): void {
    const negative = value < 0;
    const magnitude = negative ? -value : value;
    if (magnitude < 4294967296 && magnitude === Math.floor(magnitude)) {
      // Whole numbers, the usual case (years, rows, blood pressures): digits written directly.
      let n = magnitude >>> 0;
      let digits = 1;
      for (let t = n; t >= 10; t = (t / 10) >>> 0) digits++;
      this.room(digits + 1);
      if (negative) this.buf[this.pos++] = MINUS;
      let p = this.pos + digits;
      this.pos = p;
      do {
        const q = (n / 10) >>> 0;
        this.buf[--p] = ZERO + (n - q * 10);
        n = q;
      } while (n > 0);
      return;
    }
    // Fractions (53.2), and the rare very large or small number: as JavaScript writes it, which
    // MariaDB reads back exactly (1e-7 included).
    this.ascii(String(value));
  }

  /** Text of printable ASCII (what String(number) gives). */
  private ascii(text: string): void {
    this.room(text.length);
    for (let i = 0; i < text.length; i++) this.buf[this.pos++] = text.charCodeAt(i);
  }

  private text(text: string): void {
    const length = text.length;
    // Room for the worst case, made once: every UTF-16 unit 3 bytes of UTF-8 (an escape is 2).
    this.room(length * 3);
    const start = this.pos;
    for (let i = 0; i < length; i++) {
      const code = text.charCodeAt(i);
      if (code >= 0x80) {
        // Not ASCII: start again from this string's beginning with the general path.
        this.pos = start;
        this.unicode(text);
        return;
      }
      const escape = escapeOf(code);
      if (escape !== 0) {
        this.buf[this.pos++] = BACKSLASH;
        this.buf[this.pos++] = escape;
      } else {
        this.buf[this.pos++] = code;
      }
    }
  }

  private unicode(text: string): void {
    const escaped = NEEDS_ESCAPE.test(text)
      ? text.replace(
          NEEDS_ESCAPE_ALL,
          (ch) => `\\${String.fromCharCode(escapeOf(ch.charCodeAt(0)))}`,
        )
      : text;
    this.room(escaped.length * 3);
    this.pos += this.buf.write(escaped, this.pos, 'utf8');
  }
}
