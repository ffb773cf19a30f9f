import type { AuditQuarter } from '../measures/quarter.js';
import type { SumsLayout } from './sums-layout.js';

/**
 * Everything a quarter's benchmark needs to know about one practice's records, as counts that
 * add up: the sums of a locality or the region are the element-wise sums of its practices'
 * (merge-sums.ts). The API computes a submission's sums once, when it is confirmed
 * (sums-of-columns.ts), stores them as bytes (encode-sums.ts) and builds the region's benchmark
 * from the stored sums of the current submissions; no statistic needs the records again.
 *
 * Sections and their layout are described in sums-layout.ts. Count arrays are as narrow as a
 * bound on their counts allows (8, 16 or 32 bits): the eligible records for every section but
 * the strata, the records of the fullest stratum for the strata. Computed, decoded and merged
 * sums follow the same rule, so that equal sums are equal objects; a practice's strata, for
 * instance, rarely need more than 8 bits.
 */
export type Counts = Uint8Array | Uint16Array | Uint32Array;
export type CountWidth = 1 | 2 | 4;

export interface PracticeSums {
  /** The measure set the sums were made under, and the sums layout's fingerprint. */
  readonly measureSetId: string;
  readonly fingerprint: string;
  readonly quarter: AuditQuarter;
  /** Practices summed: 1 for one practice's sums, more for a locality or the region. */
  readonly practices: number;
  /** Records: all, eligible, not eligible for an unknown type, not eligible by age. */
  readonly records: Uint32Array;
  /** Outcome histograms per type group × breakdown category (sums-layout.ts). */
  readonly cells: Counts;
  /** Eligible records per type group × category (category 0 everyone). */
  readonly eligible: Counts;
  /** Case-mix strata: sorted stratum ids and `valuesPerStratum` counts for each. */
  readonly strata: { readonly ids: Uint32Array; readonly values: Counts };
  /**
   * Type 2 time from diagnosis to insulin: per whole year y, events at 2y and censored at
   * 2y + 1, up to the last year with a count; and the records left out for incomplete or
   * inconsistent insulin data (progression/insulin.ts).
   */
  readonly insulin: { readonly counts: Counts; readonly excluded: number };
  /** Value histograms per type group (value-bins.ts). */
  readonly values: Counts;
  /** KDIGO grid per type group (kidney-grid.ts). */
  readonly kidney: Counts;
  /**
   * Derived, not stored: each measure's events, measured and denominator in each type group's
   * everyone category, at (g·M + m)·3 + 0, 1, 2, read off the cells when the sums are made or
   * read (sums-tallies.ts), and added up when they are merged. What the benchmark reads most.
   */
  readonly tallies: Uint32Array;
}

/** Bytes per count needed for counts up to `max`. */
export function widthFor(max: number): CountWidth {
  return max < 256 ? 1 : max < 65536 ? 2 : 4;
}

/** The count widths of sums with `eligible` eligible records and `fullest` in one stratum. */
export function sumsWidths(eligible: number, fullest: number): Record<Section, CountWidth> {
  const w = widthFor(eligible);
  return {
    cells: w,
    eligible: w,
    strataValues: widthFor(fullest),
    insulin: w,
    values: w,
    kidney: w,
  };
}

/** The records of the fullest stratum (each stratum's first count is its records). */
export function fullestStratum(values: ArrayLike<number>, valuesPerStratum: number): number {
  let max = 0;
  for (let i = 0; i < values.length; i += valuesPerStratum) {
    if ((values[i] as number) > max) max = values[i] as number;
  }
  return max;
}

/** The width of a count array. */
export function widthOf(counts: Counts): CountWidth {
  return counts.BYTES_PER_ELEMENT as CountWidth;
}

/** The sections of counts, in their order in `SumsArrays` and in the encoded form. */
export const SECTIONS = [
  'cells',
  'eligible',
  'strataValues',
  'insulin',
  'values',
  'kidney',
] as const;
export type Section = (typeof SECTIONS)[number];

/** The arrays of one sums, as views of a single buffer (one allocation instead of eight). */
export interface SumsArrays {
  records: Uint32Array;
  ids: Uint32Array;
  cells: Counts;
  eligible: Counts;
  strataValues: Counts;
  insulin: Counts;
  values: Counts;
  kidney: Counts;
}

/** Section lengths of sums with `strata` strata and an insulin table of `insulinLength`. */
export function sectionLengths(
  layout: SumsLayout,
  strata: number,
  insulinLength: number,
): Record<Section, number> {
  return {
    cells: layout.cellCount,
    eligible: layout.eligibleCount,
    strataValues: strata * layout.valuesPerStratum,
    insulin: insulinLength,
    values: 2 * layout.valuesPerGroup,
    kidney: 2 * layout.kidneyPerGroup,
  };
}

/**
 * Allocates the arrays of one sums in one buffer: records and stratum ids, then the sections
 * of 32-bit counts, 16-bit, 8-bit (so that every view is aligned).
 */
export function allocateSums(
  lengths: Readonly<Record<Section, number>>,
  strata: number,
  widths: Readonly<Record<Section, CountWidth>>,
): SumsArrays {
  let size = 4 * (4 + strata);
  for (const section of SECTIONS) size += widths[section] * lengths[section];
  const buffer = new ArrayBuffer(size);
  const views = {} as Record<Section, Counts>;
  let offset = 4 * (4 + strata);
  for (const width of [4, 2, 1] as const) {
    for (const section of SECTIONS) {
      if (widths[section] !== width) continue;
      const length = lengths[section];
      views[section] =
        width === 4
          ? new Uint32Array(buffer, offset, length)
          : width === 2
            ? new Uint16Array(buffer, offset, length)
            : new Uint8Array(buffer, offset, length);
      offset += width * length;
    }
  }
  return {
    records: new Uint32Array(buffer, 0, 4),
    ids: new Uint32Array(buffer, 16, strata),
    ...views,
  };
}

/** The error for sums that do not belong to the layout or quarter at hand. */
export class SumsMismatchError extends Error {
  override name = 'SumsMismatchError';
}

function sameQuarter(a: AuditQuarter, b: AuditQuarter): boolean {
  return a.year === b.year && a.quarter === b.quarter;
}

/** Throws a SumsMismatchError naming `what` when the sums were made under another layout. */
export function assertSumsOf(
  sums: PracticeSums,
  layout: SumsLayout,
  quarter: AuditQuarter | null,
  what: string,
): void {
  if (sums.fingerprint !== layout.fingerprint || sums.measureSetId !== layout.compiled.id) {
    throw new SumsMismatchError(
      `${what} were made under measure set ${sums.measureSetId} (layout ${sums.fingerprint}), ` +
        `not ${layout.compiled.id} (layout ${layout.fingerprint}): recompute them from the records`,
    );
  }
  if (quarter !== null && !sameQuarter(sums.quarter, quarter)) {
    throw new SumsMismatchError(
      `${what} are for ${sums.quarter.year} Q${sums.quarter.quarter}, ` +
        `not ${quarter.year} Q${quarter.quarter}`,
    );
  }
}
