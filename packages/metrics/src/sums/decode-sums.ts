import type { CompiledMeasureSet } from '../measures/compile.js';
import type { MeasureSet } from '../measures/schema.js';
import { ByteReader, SumsDecodeError } from './byte-codec.js';
import { crc32 } from './crc32.js';
import { SUMS_SIGNATURE } from './encode-sums.js';
import {
  allocateSums,
  type CountWidth,
  type PracticeSums,
  type Section,
  SECTIONS,
  sectionLengths,
  fullestStratum,
  sumsWidths,
} from './practice-sums.js';
import { SUMS_FORMAT_VERSION, sumsLayout, type SumsLayout } from './sums-layout.js';
import { everyoneTallies } from './sums-tallies.js';

/**
 * Reads sums written by `encodeSums` (encode-sums.ts) under the given measure set. Refuses,
 * with a `SumsDecodeError` whose `problem` says which and whose message says why: bytes that
 * are not sums ('not_sums'), another format version ('version'), sums made under another
 * measure set or layout ('measure_set'), bytes that end early ('truncated'), bytes whose
 * checksum does not match ('damaged') and contents that cannot be sums ('invalid').
 */
export { SumsDecodeError, type SumsDecodeProblem } from './byte-codec.js';

const HEADER = SUMS_SIGNATURE.length + 1 + 8;

export function decodeSums(
  bytes: Uint8Array,
  measureSet: MeasureSet | CompiledMeasureSet | SumsLayout,
): PracticeSums {
  if (!(bytes instanceof Uint8Array)) {
    throw new SumsDecodeError('not_sums', 'the sums must be given as bytes (a Uint8Array)');
  }
  const layout = sumsLayout(measureSet);
  const r = new ByteReader(bytes, Math.max(0, bytes.length - 4));
  if (bytes.length < HEADER + 4) {
    const signed = SUMS_SIGNATURE.every((b, i) => i >= bytes.length || bytes[i] === b);
    throw new SumsDecodeError(
      signed && bytes.length > 0 ? 'truncated' : 'not_sums',
      signed && bytes.length > 0
        ? `the sums are truncated: ${bytes.length} bytes is shorter than their header`
        : `these ${bytes.length} bytes are not Cairn practice sums`,
    );
  }
  for (let i = 0; i < SUMS_SIGNATURE.length; i++) {
    if (bytes[i] !== SUMS_SIGNATURE[i]) {
      throw new SumsDecodeError(
        'not_sums',
        'these bytes are not Cairn practice sums (they do not start with the sums signature)',
      );
    }
  }
  r.offset = SUMS_SIGNATURE.length;
  const version = r.byte('the format version');
  if (version !== SUMS_FORMAT_VERSION) {
    throw new SumsDecodeError(
      'version',
      `the sums are in format version ${version}; this build reads version ${SUMS_FORMAT_VERSION}: ` +
        'recompute them from the records',
    );
  }
  let fingerprint = '';
  for (let k = 0; k < 8; k++) {
    fingerprint += (r.byte('the fingerprint') as number).toString(16).padStart(2, '0');
  }
  const idLength = r.varint('the measure set id');
  if (idLength > 200)
    throw new SumsDecodeError('invalid', 'the sums hold a malformed measure set id');
  let measureSetId = '';
  for (let k = 0; k < idLength; k++) {
    const c = r.byte('the measure set id');
    if (c < 0x20 || c > 0x7e) {
      throw new SumsDecodeError('invalid', 'the sums hold a malformed measure set id');
    }
    measureSetId += String.fromCharCode(c);
  }
  if (fingerprint !== layout.fingerprint || measureSetId !== layout.compiled.id) {
    throw new SumsDecodeError(
      'measure_set',
      `the sums were made under measure set ${measureSetId} (layout ${fingerprint}), ` +
        `not ${layout.compiled.id} (layout ${layout.fingerprint}): recompute them from the records`,
    );
  }
  const stored =
    ((bytes[bytes.length - 4] as number) |
      ((bytes[bytes.length - 3] as number) << 8) |
      ((bytes[bytes.length - 2] as number) << 16) |
      ((bytes[bytes.length - 1] as number) << 24)) >>>
    0;
  const damaged = (): boolean => crc32(bytes, 0, r.end) !== stored;
  let sums: PracticeSums;
  try {
    sums = readBody(r, layout, measureSetId, fingerprint);
  } catch (error) {
    // Contents that make no sense are most likely damage; say so when the checksum agrees.
    if (error instanceof SumsDecodeError && error.problem === 'invalid' && damaged()) {
      throw new SumsDecodeError('damaged', 'the sums are damaged: their checksum does not match');
    }
    throw error;
  }
  if (damaged()) {
    throw new SumsDecodeError('damaged', 'the sums are damaged: their checksum does not match');
  }
  return sums;
}

function readBody(
  r: ByteReader,
  layout: SumsLayout,
  measureSetId: string,
  fingerprint: string,
): PracticeSums {
  const year = r.varint('the quarter');
  const q = r.byte('the quarter');
  if (q < 1 || q > 4 || year < 1900 || year > 2700) {
    throw new SumsDecodeError('invalid', `the sums hold an impossible quarter (${year} Q${q})`);
  }
  const practices = r.varint('the number of practices');
  const records: number[] = [];
  for (let k = 0; k < 4; k++) records.push(r.varint('the record counts'));
  if (records[0] !== (records[1] as number) + (records[2] as number) + (records[3] as number)) {
    throw new SumsDecodeError('invalid', 'the sums hold record counts that do not add up');
  }
  const strataCount = r.varint('the case-mix strata');
  if (strataCount > layout.strataCount) {
    throw new SumsDecodeError('invalid', 'the sums hold more case-mix strata than there are');
  }
  const insulinLength = r.varint('the insulin life table');
  if (insulinLength % 2 !== 0 || insulinLength > 2 * (layout.insulinMaxYears + 1)) {
    throw new SumsDecodeError('invalid', 'the sums hold a malformed insulin life table');
  }
  const widths = {} as Record<Section, CountWidth>;
  for (const section of SECTIONS) {
    const width = r.byte('the count widths');
    if (width !== 1 && width !== 2 && width !== 4) {
      throw new SumsDecodeError('invalid', `the sums give an impossible count width (${width})`);
    }
    widths[section] = width;
  }
  const a = allocateSums(sectionLengths(layout, strataCount, insulinLength), strataCount, widths);
  a.records.set(records);
  const ids = a.ids;
  let id = -1;
  for (let j = 0; j < strataCount; j++) {
    id += r.varint('the case-mix strata') + 1;
    if (id >= layout.strataCount) {
      throw new SumsDecodeError('invalid', 'the sums hold a case-mix stratum that does not exist');
    }
    ids[j] = id;
  }
  const excluded = r.varint('the insulin life table');
  r.counts(a.cells, 'the outcome histograms');
  r.counts(a.eligible, 'the eligible counts');
  r.counts(a.strataValues, 'the case-mix strata');
  r.counts(a.insulin, 'the insulin life table');
  r.counts(a.values, 'the value histograms');
  r.counts(a.kidney, 'the kidney grid');
  // The widths follow from the contents (practice-sums.ts); other widths are not sums.
  const expected = sumsWidths(
    records[1] as number,
    fullestStratum(a.strataValues, layout.valuesPerStratum),
  );
  if (SECTIONS.some((section) => expected[section] !== widths[section])) {
    throw new SumsDecodeError('invalid', 'the sums give count widths that do not fit their counts');
  }
  if (r.offset !== r.end) {
    throw new SumsDecodeError(
      'invalid',
      `the sums have ${r.end - r.offset} unexpected bytes after their contents`,
    );
  }
  return {
    measureSetId,
    fingerprint,
    quarter: { year, quarter: q as 1 | 2 | 3 | 4 },
    practices,
    records: a.records,
    cells: a.cells,
    eligible: a.eligible,
    strata: { ids, values: a.strataValues },
    insulin: { counts: a.insulin, excluded },
    values: a.values,
    kidney: a.kidney,
    tallies: everyoneTallies(layout, a.cells),
  };
}
