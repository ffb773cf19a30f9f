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
  const strataValues = new Float64Array(idList.length * width);
  idList.forEach((id, j) =>
    strataValues.set(dense.subarray(id * width, (id + 1) * width), j * width),
  );
  const sums: Record<Section, Float64Array> = {
    cells: add((s) => s.cells, first.cells.length),
    eligible: add((s) => s.eligible, first.eligible.length),
    strataValues,
    insulin: add((s) => s.insulin.counts, insulinLength),
    values: add((s) => s.values, first.values.length),
    kidney: add((s) => s.kidney, first.kidney.length),
  };
  const lengths = {} as Record<Section, number>;
  for (const section of SECTIONS) lengths[section] = sums[section].length;
  const widths = sumsWidths(records[1] as number, fullestStratum(strataValues, width));
  const a = allocateSums(lengths, idList.length, widths);
  a.records.set(records);
  a.ids.set(idList);
  for (const section of SECTIONS) a[section].set(sums[section]);
  return {
    measureSetId: first.measureSetId,
    fingerprint: first.fingerprint,
    quarter: { year: first.quarter.year, quarter: first.quarter.quarter },
    practices,
    records: a.records,
    cells: a.cells,
    eligible: a.eligible,
    strata: { ids: a.ids, values: a.strataValues },
    insulin: { counts: a.insulin, excluded },
    values: a.values,
    kidney: a.kidney,
    tallies: Uint32Array.from(add((s) => s.tallies, first.tallies.length)),
  };
}

/** The sums of two practices (or groups of practices). */
export function addSums(a: PracticeSums, b: PracticeSums): PracticeSums {
  return mergeSums([a, b]);
}
