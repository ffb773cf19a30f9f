/**
 * How a results answer becomes bytes: its JSON with every non-integer number
 * to six significant figures, as every JSON response of the API
 * (common/sent-figures.ts), and its gzip.
 *
 * The gzip level: 6 (zlib's default) for answers of a few megabytes at most,
 * which is a few milliseconds on libuv's threads and about a fifth smaller than
 * level 1; level 1 for larger ones (a national answer of every practice),
 * where level 6 would cost about three times as long for a tenth less.
 *
 * The brotli form, at its highest quality (11), is about a third smaller than
 * the gzip, but takes about a second per megabyte: it is made after the answer
 * is first served, never on a request's path, and only for answers of a few
 * megabytes at most.
 */
import { promisify } from 'node:util';
import { brotliCompress, constants, gzip } from 'node:zlib';
import { figuresAsSent } from '../../common/sent-figures.js';

const gzipAsync = promisify(gzip);
const brotliAsync = promisify(brotliCompress);

/** Above this many bytes of JSON an answer is gzipped at level 1 and has no brotli form. */
const FAST_GZIP_FROM = 4 * 1024 * 1024;

/** An answer's JSON bytes, numbers to six significant figures, and their gzip. */
export async function encodeAnswer(value: unknown): Promise<{ plain: Buffer; gzip: Buffer }> {
  const plain = Buffer.from(JSON.stringify(value, figuresAsSent), 'utf8');
  // Compressed on libuv's threads, not this one.
  const compressed = await gzipAsync(plain, { level: plain.length > FAST_GZIP_FROM ? 1 : 6 });
  return { plain, gzip: compressed };
}

/**
 * The brotli form of an answer's JSON (quality 11, text mode), on libuv's threads; null for
 * answers too large to be worth it.
 */
export async function brotliOf(plain: Buffer): Promise<Buffer | null> {
  if (plain.length > FAST_GZIP_FROM) return null;
  return brotliAsync(plain, {
    params: {
      [constants.BROTLI_PARAM_MODE]: constants.BROTLI_MODE_TEXT,
      [constants.BROTLI_PARAM_QUALITY]: constants.BROTLI_MAX_QUALITY,
      [constants.BROTLI_PARAM_SIZE_HINT]: plain.length,
    },
  });
}
