/**
 * The stored form of a quarter's built benchmark (`benchmark_results.body`):
 * what it was built from, the benchmark (@cairn/metrics, plain JSON) and the
 * region's merged sums (encodeSums), so that any API process can serve every
 * view of it — the region's tables and funnels, and a practice's page against
 * the region — without building anything again.
 *
 * Bytes: the signature "CRBR", the container version (1 byte), a flags byte
 * (bit 0: the rest is gzip-compressed), then the payload: the length of the
 * description JSON (4 bytes, little-endian), the description JSON (UTF-8), the
 * length of the benchmark JSON (4 bytes), the benchmark JSON, and the region's
 * sums (the rest; none when the benchmark has no practice). Container 2 stores
 * the payload as it is: a result is built again after every confirm, and at
 * national size compressing it took longer than storing and reading twice the
 * bytes (reading still accepts the gzip flag). Encoding is deterministic: the
 * same benchmark gives the same bytes.
 *
 * `RESULT_FORMAT` (the table's `format_version`) combines the container's
 * version with the benchmark's and the sums' formats, so that a change of any
 * of them makes new rows instead of a new reading of old bytes.
 */
import { gunzipSync } from 'node:zlib';
import {
  type Benchmark,
  BENCHMARK_FORMAT,
  decodeSums,
  encodeSums,
  type PracticeSums,
  SUMS_FORMAT_VERSION,
  type SumsLayout,
} from '@cairn/metrics';

const SIGNATURE = Buffer.from('CRBR', 'latin1');
const CONTAINER_VERSION = 2;
const GZIP = 1;

if (BENCHMARK_FORMAT >= 100 || SUMS_FORMAT_VERSION >= 100) {
  throw new Error('RESULT_FORMAT holds benchmark and sums formats below 100');
}
/** The format of stored results: container × 10,000 + benchmark format × 100 + sums format. */
export const RESULT_FORMAT =
  CONTAINER_VERSION * 10_000 + BENCHMARK_FORMAT * 100 + SUMS_FORMAT_VERSION;

/** What a stored result was built from (besides its table columns). */
export interface ResultDescription {
  quarterId: number;
  measureSetId: string;
  /** The practices in benchmark order (by code), each with the submission it was built from */
  practices: { code: string; submissionId: number }[];
}

export interface ResultContent {
  description: ResultDescription;
  benchmark: Benchmark;
  /** The region's sums (every practice's merged); null when there is no practice. */
  regionSums: PracticeSums | null;
}

export class ResultBodyError extends Error {
  override name = 'ResultBodyError';
}

function lengthPrefixed(bytes: Buffer): Buffer {
  const length = Buffer.alloc(4);
  length.writeUInt32LE(bytes.length, 0);
  return Buffer.concat([length, bytes]);
}

export function encodeResult(content: ResultContent): Buffer {
  const payload = Buffer.concat([
    lengthPrefixed(Buffer.from(JSON.stringify(content.description), 'utf8')),
    lengthPrefixed(Buffer.from(JSON.stringify(content.benchmark), 'utf8')),
    content.regionSums ? Buffer.from(encodeSums(content.regionSums)) : Buffer.alloc(0),
  ]);
  return Buffer.concat([SIGNATURE, Buffer.from([CONTAINER_VERSION, 0]), payload]);
}

/** Reads a stored result; throws ResultBodyError (or the sums' SumsDecodeError) saying why. */
export function decodeResult(body: Buffer, layout: SumsLayout): ResultContent {
  if (body.length < 6 || !body.subarray(0, 4).equals(SIGNATURE)) {
    throw new ResultBodyError('these bytes are not a stored benchmark result');
  }
  if (body[4] !== CONTAINER_VERSION) {
    throw new ResultBodyError(
      `the stored result is in container version ${body[4]}; this build reads ${CONTAINER_VERSION}`,
    );
  }
  const payload = body[5] === GZIP ? gunzipSync(body.subarray(6)) : body.subarray(6);
  let at = 0;
  const part = (what: string): Buffer => {
    if (at + 4 > payload.length) throw new ResultBodyError(`the stored result ends before ${what}`);
    const length = payload.readUInt32LE(at);
    at += 4;
    if (at + length > payload.length) {
      throw new ResultBodyError(`the stored result ends inside ${what}`);
    }
    const bytes = payload.subarray(at, at + length);
    at += length;
    return bytes;
  };
  const description = JSON.parse(part('its description').toString('utf8')) as ResultDescription;
  const benchmark = JSON.parse(part('its benchmark').toString('utf8')) as Benchmark;
  if (benchmark.format !== BENCHMARK_FORMAT) {
    throw new ResultBodyError(
      `the stored benchmark is in format ${String(benchmark.format)}; this build reads ${BENCHMARK_FORMAT}`,
    );
  }
  const rest = payload.subarray(at);
  const regionSums = rest.length === 0 ? null : decodeSums(rest, layout);
  return { description, benchmark, regionSums };
}
