import type { CompiledMeasureSet } from './compile.js';
import type { HistogramLayout } from './layout.js';

/**
 * The columnar path's last step: practices are summed into their locality (or the region when
 * they have none) and localities into the region; eligible counts are read off the histograms
 * (each eligible record is in exactly one cell of the first pack of each of its blocks) and
 * record totals off the practice sizes. Also the sizes of the histogram arrays (result.ts).
 */
export interface StorageShape {
  practiceBlock: number;
  rollupBlock: number;
  practiceSize: number;
  rollupSize: number;
}

/** Sizes of the histogram arrays (see result.ts). */
export function storageShape(
  P: number,
  L: number,
  C: number,
  K: number,
  practiceBreakdowns: boolean,
): StorageShape {
  const practiceBlock = 2 * (practiceBreakdowns ? C - 1 : 1) * K;
  const rollupBlock = 2 * (C - 1) * K;
  return {
    practiceBlock,
    rollupBlock,
    practiceSize: P * practiceBlock,
    rollupSize: (L + 1) * rollupBlock,
  };
}

export function addBlock(
  source: Uint16Array | Uint32Array,
  from: number,
  target: Uint32Array,
  to: number,
  length: number,
): void {
  for (let k = 0; k < length; k++) {
    target[to + k] = (target[to + k] as number) + (source[from + k] as number);
  }
}

/** addBlock for 16-bit practice counts (a separate function keeps each loop monomorphic). */
export function addBlock16(
  source: Uint16Array,
  from: number,
  target: Uint32Array,
  to: number,
  length: number,
): void {
  for (let k = 0; k < length; k++) {
    target[to + k] = (target[to + k] as number) + (source[from + k] as number);
  }
}

export function addFloatBlock(array: Float64Array, from: number, to: number, length: number): void {
  for (let k = 0; k < length; k++) {
    array[to + k] = (array[to + k] as number) + (array[from + k] as number);
  }
}

/** What the roll-up reads and completes (arrays as result.ts describes them). */
export interface RollUpInput {
  compiled: CompiledMeasureSet;
  layout: HistogramLayout;
  shape: StorageShape;
  practiceBreakdowns: boolean;
  /** Number of practices and localities. */
  practices: number;
  localities: number;
  /** Records per practice. */
  sizes: Int32Array;
  /** Rollup unit of each practice: its locality, or the region (index `localities`). */
  rollupUnit: Int32Array;
  /** Practices already added to their rollup unit during the pass (practice breakdowns). */
  rolledUp: Uint8Array;
  sexOffset: number;
  counts: Uint16Array | Uint32Array;
  rollupCounts: Uint32Array;
  eligible: Uint32Array;
  records: Uint32Array;
  expected: Float64Array | null;
}

/** Adds one practice's blocks to its rollup unit (practice-breakdown mode). */
export function rollUpPractice(input: RollUpInput, p: number): void {
  const { shape, counts, rollupCounts } = input;
  const to = (input.rollupUnit[p] as number) * shape.rollupBlock;
  if (counts instanceof Uint16Array)
    addBlock16(counts, p * shape.practiceBlock, rollupCounts, to, shape.practiceBlock);
  else addBlock(counts, p * shape.practiceBlock, rollupCounts, to, shape.practiceBlock);
  input.rolledUp[p] = 1;
}

/** Completes the histograms, eligible counts, record counts and expected counts in place. */
export function rollUp(input: RollUpInput): void {
  const { layout, shape, practiceBreakdowns, counts, rollupCounts, eligible, records } = input;
  const P = input.practices;
  const L = input.localities;
  const U = P + L + 1;
  const C = input.compiled.categoryCount;
  const M = input.compiled.measures.length;
  const K = layout.cellsPerBlock;
  const rollupUnit = input.rollupUnit;
  // Roll up practices into localities (or the region) where not done yet, then localities into
  // the region.
  for (let p = 0; p < P; p++) {
    if (practiceBreakdowns && input.rolledUp[p] === 0) rollUpPractice(input, p);
  }
  for (let l = 0; l < L; l++) {
    addBlock(
      rollupCounts,
      l * shape.rollupBlock,
      rollupCounts,
      L * shape.rollupBlock,
      shape.rollupBlock,
    );
  }
  // Eligible records per unit, type group and category, from the histograms: each eligible
  // record is in exactly one cell of the first pack of each of its blocks. Everyone is the sum
  // of the four sex categories. Practices without breakdowns have everyone only.
  const firstCells = layout.packs[0]?.cells ?? 0;
  const sexOffset = input.sexOffset;
  const sumCells = (array: Uint16Array | Uint32Array, base: number): number => {
    let n = 0;
    for (let x = 0; x < firstCells; x++) n += array[base + x] as number;
    return n;
  };
  for (let u = 0; u < U; u++) {
    const isPractice = u < P;
    const array = isPractice ? counts : rollupCounts;
    const v = isPractice ? u : u - P;
    for (let g = 0; g < 2; g++) {
      const e = (u * 2 + g) * C;
      if (isPractice && !practiceBreakdowns) {
        eligible[e] = sumCells(array, (v * 2 + g) * K);
        continue;
      }
      for (let c = 1; c < C; c++)
        eligible[e + c] = sumCells(array, ((v * 2 + g) * (C - 1) + c - 1) * K);
      let everyone = 0;
      for (let x = 0; x < 4; x++) everyone += eligible[e + sexOffset + x] as number;
      eligible[e] = everyone;
    }
  }
  // Records: totals from the sizes (exclusions were counted by the loop).
  const sizes = input.sizes;
  for (let p = 0; p < P; p++) {
    records[p * 4] = sizes[p] as number;
    records[p * 4 + 1] = (eligible[p * 2 * C] as number) + (eligible[(p * 2 + 1) * C] as number);
    addBlock(records, p * 4, records, (P + (rollupUnit[p] as number)) * 4, 4);
  }
  for (let l = 0; l < L; l++) addBlock(records, (P + l) * 4, records, (P + L) * 4, 4);
  const region = P + L;
  const expected = input.expected;
  if (expected !== null) {
    const e = 2 * M;
    for (let p = 0; p < P; p++)
      addFloatBlock(expected, p * e, (P + (rollupUnit[p] as number)) * e, e);
    for (let l = 0; l < L; l++) addFloatBlock(expected, (P + l) * e, region * e, e);
  }
}
