import {
  allocateSums,
  fullestStratum,
  type PracticeSums,
  type Section,
  SECTIONS,
  sumsWidths,
  SumsMismatchError,
} from './practice-sums.js';

/**
 * Sums of several practices (a locality, the region): every count is the sum of the practices'
 * counts, strata are the union of theirs. All sums must be made under the same layout and for
 * the same quarter. The result is canonical (sorted strata, a life table up to its last count,
 * the count widths of practice-sums.ts), so merging in any grouping gives equal sums.
 */
export function mergeSums(list: readonly PracticeSums[]): PracticeSums {
  const first = list[0];
  if (first === undefined) throw new RangeError('mergeSums needs at least one practice’s sums');
  const records = [0, 0, 0, 0];
  let practices = 0;
  let excluded = 0;
  let insulinLength = 0;
  let maxId = -1;
  // Counts per stratum: the same for all sums that have strata (same layout).
  let width = 0;
  list.forEach((s, i) => {
    if (s.fingerprint !== first.fingerprint || s.measureSetId !== first.measureSetId) {
      throw new SumsMismatchError(
        `sums[${i}] were made under measure set ${s.measureSetId} (layout ${s.fingerprint}), ` +
          `sums[0] under ${first.measureSetId} (layout ${first.fingerprint})`,
      );
    }
    if (s.quarter.year !== first.quarter.year || s.quarter.quarter !== first.quarter.quarter) {
      throw new SumsMismatchError(
        `sums[${i}] are for ${s.quarter.year} Q${s.quarter.quarter}, ` +
          `sums[0] for ${first.quarter.year} Q${first.quarter.quarter}`,
      );
    }
    if (
      s.cells.length !== first.cells.length ||
      s.eligible.length !== first.eligible.length ||
      s.values.length !== first.values.length ||
      s.kidney.length !== first.kidney.length
    ) {
      throw new SumsMismatchError(`sums[${i}] do not have the layout of sums[0]`);
    }
    practices += s.practices;
    for (let k = 0; k < 4; k++) records[k] = (records[k] as number) + (s.records[k] as number);
    excluded += s.insulin.excluded;
    if (s.insulin.counts.length > insulinLength) insulinLength = s.insulin.counts.length;
    const ids = s.strata.ids;
    if (ids.length === 0) return;
    const w = s.strata.values.length / ids.length;
    if (width === 0) width = w;
    if (w !== width || !Number.isInteger(w)) {
      throw new SumsMismatchError(`sums[${i}] do not have the case-mix layout of the others`);
    }
    maxId = Math.max(maxId, ids[ids.length - 1] as number);
  });
  const add = (pick: (s: PracticeSums) => ArrayLike<number>, length: number): Float64Array => {
    const acc = new Float64Array(length);
    for (const s of list) {
      const a = pick(s);
      for (let i = 0; i < a.length; i++) acc[i] = (acc[i] as number) + (a[i] as number);
    }
    return acc;
  };
  // Strata: dense accumulation over the ids present, then their union in order.
  const dense = new Float64Array((maxId + 1) * width);
  const present = new Uint8Array(maxId + 1);
  for (const s of list) {
    const { ids, values } = s.strata;
    for (let j = 0; j < ids.length; j++) {
      const id = ids[j] as number;
      present[id] = 1;
      const to = id * width;
      const from = j * width;
      for (let k = 0; k < width; k++) {
        dense[to + k] = (dense[to + k] as number) + (values[from + k] as number);
      }
    }
  }
  const idList: number[] = [];
  for (let id = 0; id <= maxId; id++) if (present[id] === 1) idList.push(id);
  return packSums(
    first,
    practices,
    records,
    excluded,
    { dense, width, ids: idList },
    {
      cells: add((s) => s.cells, first.cells.length),
      eligible: add((s) => s.eligible, first.eligible.length),
      insulin: add((s) => s.insulin.counts, insulinLength),
      values: add((s) => s.values, first.values.length),
      kidney: add((s) => s.kidney, first.kidney.length),
      tallies: add((s) => s.tallies, first.tallies.length),
    },
  );
}

/** Summed counts of every section but the strata, as `packSums` takes them. */
type SummedSections = Record<Exclude<Section, 'strataValues'> | 'tallies', Float64Array>;

/**
 * Sums packed into one allocation (practice-sums.ts' layout and count widths): the strata
 * `ids` taken from their dense table (`width` counts per stratum id), every other section as
 * summed. `like` gives the measure set, layout and quarter.
 */
function packSums(
  like: PracticeSums,
  practices: number,
  records: number[],
  excluded: number,
  strata: { dense: Float64Array; width: number; ids: number[] },
  summed: SummedSections,
): PracticeSums {
  const { dense, width, ids } = strata;
  const strataValues = new Float64Array(ids.length * width);
  ids.forEach((id, j) => strataValues.set(dense.subarray(id * width, (id + 1) * width), j * width));
  const sums: Record<Section, Float64Array> = { ...summed, strataValues };
  const lengths = {} as Record<Section, number>;
  for (const section of SECTIONS) lengths[section] = sums[section].length;
  const widths = sumsWidths(records[1] as number, fullestStratum(strataValues, width));
  const a = allocateSums(lengths, ids.length, widths);
  a.records.set(records);
  a.ids.set(ids);
  for (const section of SECTIONS) a[section].set(sums[section]);
  return {
    measureSetId: like.measureSetId,
    fingerprint: like.fingerprint,
    quarter: { year: like.quarter.year, quarter: like.quarter.quarter },
    practices,
    records: a.records,
    cells: a.cells,
    eligible: a.eligible,
    strata: { ids: a.ids, values: a.strataValues },
    insulin: { counts: a.insulin, excluded },
    values: a.values,
    kidney: a.kidney,
    tallies: Uint32Array.from(summed.tallies),
  };
}

/**
 * The sums of a group of practices after some left it and others joined: `total` minus each of
 * `removed` plus each of `added` (a quarter's region after a confirm: the replaced submission's
 * sums out, the new one's in). `removed` must be sums that `total` holds. The result equals
 * `mergeSums` of the group's practices as they are now, object for object (strata that no
 * record falls in any more are dropped, the life table ends at its last count, the count widths
 * follow practice-sums.ts); null when no practice is left.
 */
export function replaceSums(
  total: PracticeSums,
  removed: readonly PracticeSums[],
  added: readonly PracticeSums[],
): PracticeSums | null {
  const all = [total, ...removed, ...added];
  all.forEach((s, i) => {
    if (s.fingerprint !== total.fingerprint || s.measureSetId !== total.measureSetId) {
      throw new SumsMismatchError(
        `sums[${i}] were made under measure set ${s.measureSetId} (layout ${s.fingerprint}), ` +
          `the total under ${total.measureSetId} (layout ${total.fingerprint})`,
      );
    }
    if (s.quarter.year !== total.quarter.year || s.quarter.quarter !== total.quarter.quarter) {
      throw new SumsMismatchError(
        `sums[${i}] are for ${s.quarter.year} Q${s.quarter.quarter}, ` +
          `the total for ${total.quarter.year} Q${total.quarter.quarter}`,
      );
    }
    if (
      s.cells.length !== total.cells.length ||
      s.eligible.length !== total.eligible.length ||
      s.values.length !== total.values.length ||
      s.kidney.length !== total.kidney.length
    ) {
      throw new SumsMismatchError(`sums[${i}] do not have the layout of the total`);
    }
  });
  const sign = (i: number): number => (i === 0 ? 1 : i <= removed.length ? -1 : 1);
  let practices = 0;
  let excluded = 0;
  let insulinLength = 0;
  let maxId = -1;
  let width = 0;
  const records = [0, 0, 0, 0];
  all.forEach((s, i) => {
    const f = sign(i);
    practices += f * s.practices;
    excluded += f * s.insulin.excluded;
    for (let k = 0; k < 4; k++) records[k] = (records[k] as number) + f * (s.records[k] as number);
    if (s.insulin.counts.length > insulinLength) insulinLength = s.insulin.counts.length;
    const ids = s.strata.ids;
    if (ids.length === 0) return;
    const w = s.strata.values.length / ids.length;
    if (width === 0) width = w;
    if (w !== width || !Number.isInteger(w)) {
      throw new SumsMismatchError(`sums[${i}] do not have the case-mix layout of the others`);
    }
    maxId = Math.max(maxId, ids[ids.length - 1] as number);
  });
  if (practices < 0 || records.some((r) => r < 0) || excluded < 0) {
    throw new RangeError('replaceSums: the removed sums are not part of the total');
  }
  if (practices === 0) return null;
  const add = (pick: (s: PracticeSums) => ArrayLike<number>, length: number): Float64Array => {
    const acc = new Float64Array(length);
    all.forEach((s, i) => {
      const f = sign(i);
      const a = pick(s);
      for (let x = 0; x < a.length; x++) acc[x] = (acc[x] as number) + f * (a[x] as number);
    });
    for (let x = 0; x < length; x++) {
      if ((acc[x] as number) < 0) {
        throw new RangeError('replaceSums: the removed sums are not part of the total');
      }
    }
    return acc;
  };
  const dense = new Float64Array((maxId + 1) * width);
  all.forEach((s, i) => {
    const f = sign(i);
    const { ids, values } = s.strata;
    for (let j = 0; j < ids.length; j++) {
      const to = (ids[j] as number) * width;
      const from = j * width;
      for (let k = 0; k < width; k++) {
        dense[to + k] = (dense[to + k] as number) + f * (values[from + k] as number);
      }
    }
  });
  // A stratum is present while a record falls in it (its first count, the records, above 0).
  const idList: number[] = [];
  for (let id = 0; id <= maxId; id++) if ((dense[id * width] as number) > 0) idList.push(id);
  // The life table up to its last count, in whole years (pairs), as practices' sums keep it.
  const insulinAll = add((s) => s.insulin.counts, insulinLength);
  let length = insulinLength;
  while (length > 0 && insulinAll[length - 1] === 0) length--;
  if (length % 2 === 1) length++;
  return packSums(
    total,
    practices,
    records,
    excluded,
    { dense, width, ids: idList },
    {
      cells: add((s) => s.cells, total.cells.length),
      eligible: add((s) => s.eligible, total.eligible.length),
      insulin: insulinAll.subarray(0, length),
      values: add((s) => s.values, total.values.length),
      kidney: add((s) => s.kidney, total.kidney.length),
      tallies: add((s) => s.tallies, total.tallies.length),
    },
  );
}

/** The sums of two practices (or groups of practices). */
export function addSums(a: PracticeSums, b: PracticeSums): PracticeSums {
  return mergeSums([a, b]);
}
