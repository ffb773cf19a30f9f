import { type CareColumns, MISSING_YEAR, TYPE_1, TYPE_UNKNOWN } from '../records/columns.js';
import type { CompiledMeasureSet } from './compile.js';
import { type CategoryTables, MAX_AGE } from './category-tables.js';
import { BLOCK, evaluateNode, type NodeSlot } from './condition-bits.js';
import { histogramKernel } from './histogram-kernel.js';
import { canBeUnknown, type HistogramLayout, isRestricted } from './layout.js';
import type { ReviewWindow } from './quarter.js';
import type { StorageShape } from './roll-up.js';

/**
 * The interpreted (table-driven) record loop of the columnar path, used where generated code
 * is not allowed and by the tests: per block of `BLOCK` records,
 * 1. eligibility and breakdown categories of each record;
 * 2. each condition of the measure set sets its bits in the records' outcome state
 *    (condition-bits.ts); measures that need a slot of their own copy their node's bits and
 *    apply their population;
 * 3. the histogram loop (histogram-kernel.ts) adds each eligible record to its cells.
 * It produces exactly what the generated loop (record-kernel.ts) produces.
 */
export interface LoopOutputs {
  counts: Uint16Array | Uint32Array;
  rollupCounts: Uint32Array;
  eligible: Uint32Array;
  records: Uint32Array;
  strataCounts: Uint32Array | null;
  cellOf: Uint8Array | null;
  stratumOf: Int32Array | null;
}

/** Bit slots of every node, and of each measure that needs a slot of its own. */
function allocate(
  compiled: CompiledMeasureSet,
  layout: HistogramLayout,
): { nodeSlot: NodeSlot[]; ownSlot: boolean[]; totalWords: number } {
  const nodeSlot: (NodeSlot | undefined)[] = compiled.nodes.map(() => undefined);
  const ownSlot = compiled.measures.map(() => false);
  compiled.measures.forEach((m, i) => {
    const n = compiled.measureNode[i] as number;
    if (!isRestricted(m) && nodeSlot[n] === undefined) {
      nodeSlot[n] = { bit: layout.measureBit[i] as number, width: layout.measureWidth[i] as 1 | 2 };
    } else ownSlot[i] = true;
  });
  let bit = layout.words * 32;
  compiled.nodes.forEach((_, n) => {
    if (nodeSlot[n] !== undefined) return;
    const width: 1 | 2 = canBeUnknown(compiled.nodes, n) ? 2 : 1;
    if ((bit % 32) + width > 32) bit = Math.ceil(bit / 32) * 32;
    nodeSlot[n] = { bit, width };
    bit += width;
  });
  return {
    nodeSlot: nodeSlot as NodeSlot[],
    ownSlot,
    totalWords: Math.max(layout.words, Math.ceil(bit / 32)),
  };
}

/** Writes a measure's own 2-bit slot (excluded 1) from its node's bits and its population. */
function measureSlot(
  state: Int32Array,
  from: NodeSlot,
  toBit: number,
  toWidth: 1 | 2,
  typeMask: number,
  population: { minAge: number | null; maxAge: number | null },
  diabetesType: Uint8Array,
  ageOf: Int32Array,
  start: number,
  len: number,
): void {
  const fromWord = Math.floor(from.bit / 32) * BLOCK;
  const fromShift = from.bit % 32;
  const fromMask = from.width === 1 ? 1 : 3;
  const toWord = Math.floor(toBit / 32) * BLOCK;
  const toShift = toBit % 32;
  const lo = population.minAge ?? -1e9;
  const hi = population.maxAge ?? 1e9;
  for (let j = 0; j < len; j++) {
    const age = ageOf[j] as number;
    const inside = (typeMask >> (diabetesType[start + j] as number)) & 1 && age >= lo && age <= hi;
    const v = ((state[fromWord + j] as number) >>> fromShift) & fromMask;
    // A one-bit node becomes 2 (not met) or 3 (met) in a two-bit slot.
    // A one-bit slot (a measure over everyone sharing another's node) copies the bit.
    const value = toWidth === 1 ? v : inside ? (from.width === 1 ? 2 | v : v) : 1;
    state[toWord + j] = (state[toWord + j] as number) | (value << toShift);
  }
}

export function interpretedLoop(
  compiled: CompiledMeasureSet,
  layout: HistogramLayout,
  columns: CareColumns,
  w: ReviewWindow,
  tables: CategoryTables,
  shape: StorageShape,
  rollupUnit: Int32Array,
  out: LoopOutputs,
): void {
  const { nodeSlot, ownSlot, totalWords } = allocate(compiled, layout);
  const N = columns.length;
  const M = compiled.measures.length;
  const C = compiled.categoryCount;
  const K = layout.cellsPerBlock;
  const practiceBreakdowns = shape.practiceBlock === shape.rollupBlock;
  const kernel = histogramKernel(layout);
  const state = new Int32Array(totalWords * BLOCK);
  const isEligible = new Uint8Array(BLOCK);
  const ageOf = new Int32Array(BLOCK);
  const practiceBlocks = new Int32Array(BLOCK * 4);
  const rollupBlocks = new Int32Array(BLOCK * 4);
  const strata = new Int32Array(BLOCK);
  const { practice, birthYear, diabetesType, diagnosisYear, sex, deprivation } = columns;
  const { ageBandOf, durationBandOf } = tables;
  const D = tables.durationBands;
  const A = tables.ageBands;
  const offsets = [
    tables.ageOffset,
    tables.sexOffset,
    tables.deprivationOffset,
    tables.durationOffset,
  ];
  const endYear = w.endYear;
  const minAge = compiled.eligibilityMinAge;
  for (let start = 0; start < N; start += BLOCK) {
    const len = Math.min(BLOCK, N - start);
    // 1. Eligibility and categories.
    for (let j = 0; j < len; j++) {
      const i = start + j;
      const p = practice[i] as number;
      const t = diabetesType[i] as number;
      let age = endYear - (birthYear[i] as number);
      ageOf[j] = age;
      if (t === TYPE_UNKNOWN || age < minAge) {
        const k = p * 4 + (t === TYPE_UNKNOWN ? 2 : 3);
        out.records[k] = (out.records[k] as number) + 1;
        isEligible[j] = 0;
        if (out.stratumOf !== null) out.stratumOf[i] = -1;
        continue;
      }
      isEligible[j] = 1;
      if (age > MAX_AGE) age = MAX_AGE;
      const g = t === TYPE_1 ? 0 : 1;
      const a = ageBandOf[age] as number;
      const s = sex[i] as number;
      const q = deprivation[i] as number;
      const d = q === 0 ? 5 : q - 1;
      const dy = diagnosisYear[i] as number;
      let u = D;
      if (dy !== MISSING_YEAR && dy <= endYear) {
        const years = endYear - dy;
        u = durationBandOf[years > MAX_AGE ? MAX_AGE : years] as number;
      }
      const within = [a, s, d, u];
      const group = p * 2 + g;
      const rollupGroup = (rollupUnit[p] as number) * 2 + g;
      for (let k = 0; k < 4; k++) {
        const c = (offsets[k] as number) + (within[k] as number);
        practiceBlocks[j * 4 + k] = practiceBreakdowns ? (group * (C - 1) + c - 1) * K : group * K;
        rollupBlocks[j * 4 + k] = (rollupGroup * (C - 1) + c - 1) * K;
      }
      strata[j] = ((((t - 1) * A + a) * 4 + s) * 6 + d) * (D + 1) + u;
      if (out.stratumOf !== null) out.stratumOf[i] = strata[j] as number;
    }
    // 2. Outcome state.
    state.fill(0, 0, totalWords * BLOCK);
    for (let n = 0; n < compiled.nodes.length; n++) {
      evaluateNode(compiled.nodes, n, nodeSlot, columns, w, start, len, ageOf, state);
    }
    for (let m = 0; m < M; m++) {
      if (!ownSlot[m]) continue;
      const info = compiled.measures[m] as CompiledMeasureSet['measures'][number];
      const from = nodeSlot[compiled.measureNode[m] as number] as NodeSlot;
      const typeMask =
        (info.population.types.includes('type1') ? 2 : 0) |
        (info.population.types.includes('type2') ? 4 : 0) |
        (info.population.types.includes('other') ? 8 : 0);
      measureSlot(
        state,
        from,
        layout.measureBit[m] as number,
        layout.measureWidth[m] as 1 | 2,
        typeMask,
        info.population,
        diabetesType,
        ageOf,
        start,
        len,
      );
    }
    // 3. Histograms.
    kernel(
      state,
      isEligible,
      practiceBlocks,
      practiceBreakdowns ? null : rollupBlocks,
      out,
      len,
      BLOCK,
      strata,
      start,
    );
  }
}
