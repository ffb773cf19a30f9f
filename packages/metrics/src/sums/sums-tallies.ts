import type { SumsLayout } from './sums-layout.js';

/**
 * Per-measure counts read off the outcome histograms of sums (the packed layout of
 * measures/layout.ts): for a block of K cells, each measure's records by outcome are the sums
 * over its pack's cells of each outcome code; events = met, measured = not met + met,
 * denominator = unknown + not met + met (excluded records are in none). The everyone category
 * of a type group is the sum of its four sex categories (result.ts).
 */
export interface CellEntries {
  /** For cell x of a block: entries start[x] … start[x + 1] − 1. */
  start: Int32Array;
  /** Each entry's measure and the outcome code the cell has for it. */
  measure: Int32Array;
  code: Uint8Array;
}

const entriesCache = new WeakMap<SumsLayout, CellEntries>();

export function cellEntries(layout: SumsLayout): CellEntries {
  const cached = entriesCache.get(layout);
  if (cached !== undefined) return cached;
  const h = layout.histogram;
  const start = new Int32Array(h.cellsPerBlock + 1);
  const measure: number[] = [];
  const code: number[] = [];
  for (const pack of h.packs) {
    for (let x = 0; x < pack.cells; x++) {
      start[pack.offset + x] = measure.length;
      for (const m of pack.measures) {
        measure.push(m);
        code.push((h.cellCodes[m] as Uint8Array)[x] as number);
      }
      start[pack.offset + x + 1] = measure.length;
    }
  }
  const entries = { start, measure: Int32Array.from(measure), code: Uint8Array.from(code) };
  entriesCache.set(layout, entries);
  return entries;
}

/** Offset of category c (1 … C − 1) of type group g in the cells of sums. */
export function blockOffset(layout: SumsLayout, g: number, c: number): number {
  return (g * (layout.categories - 1) + c - 1) * layout.cellsPerBlock;
}

/**
 * Adds one type group and category of the cells to `out` per measure m: events at 3m,
 * measured at 3m + 1, denominator at 3m + 2. `block` is a scratch array of K cells.
 */
export function addTallies(
  layout: SumsLayout,
  cells: ArrayLike<number>,
  g: number,
  c: number,
  block: Float64Array,
  out: Float64Array | Uint32Array,
): void {
  const K = layout.cellsPerBlock;
  // Everyone (c = 0) is stored as the four sex categories.
  const first = c === 0 ? (layout.compiled.dimensions[1]?.offset ?? 1) : c;
  const last = c === 0 ? first + 3 : c;
  block.fill(0);
  for (let x = first; x <= last; x++) {
    const base = blockOffset(layout, g, x);
    for (let k = 0; k < K; k++) block[k] = (block[k] as number) + (cells[base + k] as number);
  }
  const { start, measure, code } = cellEntries(layout);
  for (let x = 0; x < K; x++) {
    const count = block[x] as number;
    if (count === 0) continue;
    const end = start[x + 1] as number;
    for (let e = start[x] as number; e < end; e++) {
      const o = 3 * (measure[e] as number);
      const k = code[e] as number;
      if (k === 3) out[o] = (out[o] as number) + count;
      if (k >= 2) out[o + 1] = (out[o + 1] as number) + count;
      if (k >= 1) out[o + 2] = (out[o + 2] as number) + count;
    }
  }
}

/**
 * The everyone category of type group g (the sum of its four sex categories) into `out` as
 * `addTallies` does, reading the four blocks together: the benchmark's hot path.
 */
export function addEveryoneTallies(
  layout: SumsLayout,
  cells: ArrayLike<number>,
  g: number,
  out: Float64Array,
): void {
  const K = layout.cellsPerBlock;
  const sex = layout.compiled.dimensions[1]?.offset ?? 1;
  const b0 = blockOffset(layout, g, sex);
  const b1 = b0 + K;
  const b2 = b1 + K;
  const b3 = b2 + K;
  const { start, measure, code } = cellEntries(layout);
  for (let x = 0; x < K; x++) {
    const count =
      (cells[b0 + x] as number) +
      (cells[b1 + x] as number) +
      (cells[b2 + x] as number) +
      (cells[b3 + x] as number);
    if (count === 0) continue;
    const end = start[x + 1] as number;
    for (let e = start[x] as number; e < end; e++) {
      const o = 3 * (measure[e] as number);
      const k = code[e] as number;
      if (k === 3) out[o] = (out[o] as number) + count;
      if (k >= 2) out[o + 1] = (out[o + 1] as number) + count;
      if (k >= 1) out[o + 2] = (out[o + 2] as number) + count;
    }
  }
}

/** The derived tallies of `PracticeSums` from its cells: (g·M + m)·3 + 0 events, 1 measured, 2 denominator. */
export function everyoneTallies(layout: SumsLayout, cells: ArrayLike<number>): Uint32Array {
  const M = layout.compiled.measures.length;
  const out = new Float64Array(3 * M);
  const tallies = new Uint32Array(2 * 3 * M);
  for (let g = 0; g < 2; g++) {
    out.fill(0);
    addEveryoneTallies(layout, cells, g, out);
    tallies.set(out, g * 3 * M);
  }
  return tallies;
}
