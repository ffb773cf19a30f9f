import type { HistogramLayout } from './layout.js';

/**
 * The histogram loop of the interpreted columnar path: for each eligible record of a block,
 * compute the cell of every pack from the record's outcome state bits (layout.ts) and add one
 * to that cell in the record's blocks: its four category blocks of its practice (with practice
 * breakdowns), or its practice's everyone block and its four category blocks of its locality
 * (or the region); for case mix also in its stratum's block. The generated record loop
 * (record-kernel.ts) does the same inline.
 */
export interface HistogramOutputs {
  counts: Uint16Array | Uint32Array;
  rollupCounts: Uint32Array;
  strataCounts: Uint32Array | null;
  cellOf: Uint8Array | null;
}

export type HistogramKernel = (
  state: Int32Array,
  isEligible: Uint8Array,
  practiceBlocks: Int32Array,
  rollupBlocks: Int32Array | null,
  out: HistogramOutputs,
  len: number,
  block: number,
  strata: Int32Array,
  start: number,
) => void;

export function histogramKernel(layout: HistogramLayout): HistogramKernel {
  const K = layout.cellsPerBlock;
  const packCount = layout.packs.length;
  const packOffset = Int32Array.from(layout.packs.map((p) => p.offset));
  const packFirst = new Int32Array(packCount + 1);
  const flat: number[] = [];
  layout.packs.forEach((p, i) => {
    packFirst[i] = flat.length;
    flat.push(...p.measures);
    packFirst[i + 1] = flat.length;
  });
  const word = Int32Array.from(flat.map((m) => Math.floor((layout.measureBit[m] as number) / 32)));
  const shift = Int32Array.from(flat.map((m) => (layout.measureBit[m] as number) % 32));
  const mask = Int32Array.from(flat.map((m) => ((layout.measureWidth[m] as number) === 1 ? 1 : 3)));
  const stride = Int32Array.from(flat.map((m) => layout.measureStride[m] as number));
  // Slot value → digit, per measure (4 entries each): radix 3 maps values 0, 2, 3 to 0, 1, 2.
  const digit = new Int32Array(flat.length * 4);
  flat.forEach((m, k) => {
    const radix = layout.measureRadix[m];
    for (let v = 0; v < 4; v++) digit[k * 4 + v] = radix === 3 ? v - (v >>> 1) : v;
  });
  return (state, isEligible, practiceBlocks, rollupBlocks, out, len, block, strata, start) => {
    const { counts, rollupCounts, strataCounts, cellOf } = out;
    for (let j = 0; j < len; j++) {
      if (isEligible[j] === 0) continue;
      const k = j * 4;
      for (let p = 0; p < packCount; p++) {
        let x = 0;
        for (let q = packFirst[p] as number; q < (packFirst[p + 1] as number); q++) {
          const v =
            ((state[(word[q] as number) * block + j] as number) >>> (shift[q] as number)) &
            (mask[q] as number);
          x += (digit[q * 4 + v] as number) * (stride[q] as number);
        }
        const o = (packOffset[p] as number) + x;
        if (rollupBlocks === null) {
          for (let c = 0; c < 4; c++) {
            const b = (practiceBlocks[k + c] as number) + o;
            counts[b] = (counts[b] as number) + 1;
          }
        } else {
          const b = (practiceBlocks[k] as number) + o;
          counts[b] = (counts[b] as number) + 1;
          for (let c = 0; c < 4; c++) {
            const r = (rollupBlocks[k + c] as number) + o;
            rollupCounts[r] = (rollupCounts[r] as number) + 1;
          }
        }
        if (strataCounts !== null && cellOf !== null) {
          const sb = (strata[j] as number) * K + o;
          strataCounts[sb] = (strataCounts[sb] as number) + 1;
          cellOf[(start + j) * packCount + p] = x;
        }
      }
    }
  };
}
