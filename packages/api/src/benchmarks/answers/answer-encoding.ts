/**
 * How a results answer becomes bytes: its JSON with every non-integer number
 * to six significant figures, as every JSON response of the API
 * (common/sent-figures.ts), and its gzip.
 *
 * The gzip level: 6 (zlib's default) for answers of a few megabytes at most,
 * which is a few milliseconds on libuv's threads and about a fifth smaller than
 * level 1; level 1 for larger ones (a national answer of every practice),
 * where level 6 would cost about three times as long for a tenth less.
 */
import { promisify } from 'node:util';
import { gzip } from 'node:zlib';
import { figuresAsSent } from '../../common/sent-figures.js';

const gzipAsync = promisify(gzip);

/** Above this many bytes of JSON an answer is compressed at level 1. */
const FAST_GZIP_FROM = 4 * 1024 * 1024;

/** An answer's JSON bytes, numbers to six significant figures, and their gzip. */
export async function encodeAnswer(value: unknown): Promise<{ plain: Buffer; gzip: Buffer }> {
  const plain = Buffer.from(JSON.stringify(value, figuresAsSent), 'utf8');
  // Compressed on libuv's threads, not this one.
  const compressed = await gzipAsync(plain, { level: plain.length > FAST_GZIP_FROM ? 1 : 6 });
  return { plain, gzip: compressed };
}
