import { type CareColumns, MISSING_YEAR, TYPE_1, TYPE_UNKNOWN } from '../records/columns.js';
import {
  CODE_MET,
  CODE_NOT_MET,
  CODE_UNKNOWN,
  compileMeasureSet,
  type CompiledMeasureSet,
  type ConditionNode,
  MEASUREMENT_MONTH,
} from './compile.js';
import type { EvaluateOptions } from './evaluate-records.js';
import { histogramKernel } from './histogram-kernel.js';
import {
  type ExpectedKernel,
  generatedExpectedKernel,
  generatedRecordKernel,
  type KernelArrays,
  type KernelShape,
} from './record-kernel.js';
import {
  canBeUnknown,
  histogramLayout,
  type HistogramLayout,
  isRestricted,
  PACK_CELLS,
  PACK_CELLS_WITH_PRACTICE_BREAKDOWNS,
} from './layout.js';
import { resolveLocalities } from './localities.js';
import { type AuditQuarter, reviewWindow, type ReviewWindow } from './quarter.js';
import type { EvaluationResult } from './result.js';
import type { MeasureSet } from './schema.js';

/**
 * The columnar fast path: the same result as `evaluateRecords` (property-tested), in one pass
 * over typed arrays, a block of records at a time:
 * 1. eligibility and breakdown categories of each record;
 * 2. each condition of the measure set, by a loop specialised to its rule, sets its bits in
 *    the records' outcome state (1 bit for a yes/no condition, 2 for met/not met/unknown;
 *    composites combine their inputs' bits with word operations);
 * 3. each eligible record adds one to a histogram cell per pack of measures (layout.ts) in
 *    four blocks of its practice and type group: its age band, sex, deprivation quintile and
 *    duration band. The "everyone" category is the sum of the four sex categories.
 * Localities and the region are sums of practices. With case mix, a second light pass adds
 * each record's regional stratum rate to its practice's expected count, per measure.
 */
const BLOCK = 2048;

interface NodeSlot {
  bit: number;
  width: 1 | 2;
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

export function evaluateColumns(
  columns: CareColumns,
  measureSet: MeasureSet | CompiledMeasureSet,
  quarter: AuditQuarter,
  options: Omit<EvaluateOptions, 'practiceCodes'> = {},
): EvaluationResult {
  const compiled = 'nodes' in measureSet ? measureSet : compileMeasureSet(measureSet);
  const w = reviewWindow(quarter, compiled.retinalWindowMonths);
  const layout = histogramLayout(
    compiled,
    (options.practiceBreakdowns ?? false) ? PACK_CELLS_WITH_PRACTICE_BREAKDOWNS : PACK_CELLS,
  );
  const practices = columns.practiceCodes;
  const { localities, practiceLocality } = resolveLocalities(practices, options.localities);
  const P = practices.length;
  const L = localities.length;
  const U = P + L + 1;
  const C = compiled.categoryCount;
  const M = compiled.measures.length;
  const K = layout.cellsPerBlock;
  const caseMix = options.caseMix ?? true;
  const practiceBreakdowns = options.practiceBreakdowns ?? false;
  const N = columns.length;
  const practice = columns.practice;

  // Practice sizes; practice blocks are 16-bit when no practice has 65,536 records or more.
  const sizes = new Int32Array(P);
  const runStarts: number[] = [];
  for (let i = 0; i < N; i++) {
    const p = practice[i] as number;
    sizes[p] = (sizes[p] as number) + 1;
    if (i === 0 || p !== practice[i - 1]) runStarts.push(i);
  }
  let present = 0;
  let largest = 0;
  for (let p = 0; p < P; p++) {
    const size = sizes[p] as number;
    if (size > 0) present++;
    if (size > largest) largest = size;
  }
  const grouped = runStarts.length === present;
  const shape = storageShape(P, L, C, K, practiceBreakdowns);
  const counts =
    largest < 65536 ? new Uint16Array(shape.practiceSize) : new Uint32Array(shape.practiceSize);
  const rollupCounts = new Uint32Array(shape.rollupSize);
  const eligible = new Uint32Array(U * 2 * C);
  const records = new Uint32Array(U * 4);
  const S = compiled.strataCount;
  const strataCounts = caseMix ? new Uint32Array(S * K) : null;
  const stratumOf = caseMix ? new Int32Array(N).fill(-1) : null;
  const cellOf = caseMix ? new Uint8Array(N * layout.packs.length) : null;
  // Rollup unit of each practice's records: its locality, or the region (index L).
  const rollupUnit = new Int32Array(P);
  for (let p = 0; p < P; p++) {
    const loc = practiceLocality[p] as number;
    rollupUnit[p] = loc >= 0 ? loc : L;
  }

  const tables = lookupTables(compiled);
  const kernelShape: KernelShape = {
    categories: C,
    ageOffset: tables.ageOffset,
    sexOffset: tables.sexOffset,
    deprivationOffset: tables.deprivationOffset,
    durationOffset: tables.durationOffset,
    ageBands: tables.ageBands,
    durationBands: tables.durationBands,
    maxAge: MAX_AGE,
    practiceBreakdowns,
  };
  const generated =
    options.kernel === 'generic'
      ? null
      : generatedRecordKernel(compiled, layout, w, kernelShape, caseMix);

  // Mode with practice breakdowns: practices are rolled up into localities afterwards, each
  // right after its records when records come grouped by practice (its block is in cache).
  const rolledUp = new Uint8Array(P);
  const rollUpPractice = (p: number): void => {
    const to = (rollupUnit[p] as number) * shape.rollupBlock;
    if (counts instanceof Uint16Array)
      addBlock16(counts, p * shape.practiceBlock, rollupCounts, to, shape.practiceBlock);
    else addBlock(counts, p * shape.practiceBlock, rollupCounts, to, shape.practiceBlock);
    rolledUp[p] = 1;
  };

  if (generated !== null) {
    const arrays: KernelArrays = {
      practice,
      birthYear: columns.birthYear,
      diabetesType: columns.diabetesType,
      diagnosisYear: columns.diagnosisYear,
      sex: columns.sex,
      deprivation: columns.deprivation,
      months: columns.months,
      values: columns.values,
      flags: {
        onStatin: columns.onStatin,
        onInsulin: columns.onInsulin,
        cvdHistory: columns.cvdHistory,
      },
      ageBandOf: tables.ageBandOf,
      durationBandOf: tables.durationBandOf,
      rollupUnit,
      counts,
      rollupCounts,
      eligible,
      records,
      strataCounts,
      cellOf,
      stratumOf,
    };
    if (practiceBreakdowns && grouped) {
      for (let r = 0; r < runStarts.length; r++) {
        const from = runStarts[r] as number;
        const to = r + 1 < runStarts.length ? (runStarts[r + 1] as number) : N;
        generated(arrays, from, to);
        rollUpPractice(practice[from] as number);
      }
    } else generated(arrays, 0, N);
  } else {
    interpreted(compiled, layout, columns, w, tables, shape, rollupUnit, {
      counts,
      rollupCounts,
      eligible,
      records,
      strataCounts,
      cellOf,
      stratumOf,
    });
  }

  let expected: Float64Array | null = null;
  if (strataCounts !== null && stratumOf !== null && cellOf !== null) {
    expected = caseMixExpected(
      compiled,
      layout,
      strataCounts,
      stratumOf,
      cellOf,
      practice,
      columns.diabetesType,
      U,
      options.kernel === 'generic' ? null : generatedExpectedKernel(compiled, layout),
    );
  }

  // Roll up practices into localities (or the region) where not done yet, then localities into
  // the region.
  for (let p = 0; p < P; p++) {
    if (practiceBreakdowns && rolledUp[p] === 0) rollUpPractice(p);
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
  const sexOffset = tables.sexOffset;
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
  for (let p = 0; p < P; p++) {
    records[p * 4] = sizes[p] as number;
    records[p * 4 + 1] = (eligible[p * 2 * C] as number) + (eligible[(p * 2 + 1) * C] as number);
    addBlock(records, p * 4, records, (P + (rollupUnit[p] as number)) * 4, 4);
  }
  for (let l = 0; l < L; l++) addBlock(records, (P + l) * 4, records, (P + L) * 4, 4);
  const region = P + L;
  if (expected !== null) {
    const e = 2 * M;
    for (let p = 0; p < P; p++)
      addFloatBlock(expected, p * e, (P + (rollupUnit[p] as number)) * e, e);
    for (let l = 0; l < L; l++) addFloatBlock(expected, (P + l) * e, region * e, e);
  }

  return {
    measureSetId: compiled.id,
    quarter: w.quarter,
    window: w,
    measures: compiled.measures,
    dimensions: compiled.dimensions,
    categoryCount: C,
    practices,
    localities,
    practiceLocality,
    layout,
    practiceBreakdowns,
    counts,
    rollupCounts,
    eligible,
    records,
    expected,
  };
}

/** Sizes of the histogram arrays (see result.ts). */
export function storageShape(
  P: number,
  L: number,
  C: number,
  K: number,
  practiceBreakdowns: boolean,
): { practiceBlock: number; rollupBlock: number; practiceSize: number; rollupSize: number } {
  const practiceBlock = 2 * (practiceBreakdowns ? C - 1 : 1) * K;
  const rollupBlock = 2 * (C - 1) * K;
  return {
    practiceBlock,
    rollupBlock,
    practiceSize: P * practiceBlock,
    rollupSize: (L + 1) * rollupBlock,
  };
}

const MAX_AGE = 200;

interface Tables {
  ageBandOf: Uint8Array;
  durationBandOf: Uint8Array;
  ageBands: number;
  durationBands: number;
  ageOffset: number;
  sexOffset: number;
  deprivationOffset: number;
  durationOffset: number;
}

/** Age → age band and years since diagnosis → duration band, and the category offsets. */
function lookupTables(compiled: CompiledMeasureSet): Tables {
  const ageBandOf = new Uint8Array(MAX_AGE + 1);
  for (let age = 0; age <= MAX_AGE; age++) {
    let band = 0;
    for (let b = 1; b < compiled.ageBands.length; b++) {
      if (age >= (compiled.ageBands[b] as number)) band = b;
    }
    ageBandOf[age] = band;
  }
  const D = compiled.durationBands.length;
  const durationBandOf = new Uint8Array(MAX_AGE + 1);
  for (let years = 0; years <= MAX_AGE; years++) {
    let band = 0;
    for (let b = 1; b < D; b++) if (years >= (compiled.durationBands[b] as number)) band = b;
    durationBandOf[years] = band;
  }
  return {
    ageBandOf,
    durationBandOf,
    ageBands: compiled.ageBands.length,
    durationBands: D,
    ageOffset: compiled.dimensions[0]?.offset ?? 1,
    sexOffset: compiled.dimensions[1]?.offset ?? 1,
    deprivationOffset: compiled.dimensions[2]?.offset ?? 1,
    durationOffset: compiled.dimensions[3]?.offset ?? 1,
  };
}

interface Outputs {
  counts: Uint16Array | Uint32Array;
  rollupCounts: Uint32Array;
  eligible: Uint32Array;
  records: Uint32Array;
  strataCounts: Uint32Array | null;
  cellOf: Uint8Array | null;
  stratumOf: Int32Array | null;
}

/**
 * The interpreted columnar loop (where generated code is not allowed): per block of records,
 * categories, then each condition by a loop specialised to its rule setting bits of the
 * records' outcome state, then the histogram loop (histogram-kernel.ts).
 */
function interpreted(
  compiled: CompiledMeasureSet,
  layout: HistogramLayout,
  columns: CareColumns,
  w: ReviewWindow,
  tables: Tables,
  shape: ReturnType<typeof storageShape>,
  rollupUnit: Int32Array,
  out: Outputs,
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

function addBlock(
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
function addBlock16(
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

function addFloatBlock(array: Float64Array, from: number, to: number, length: number): void {
  for (let k = 0; k < length; k++) {
    array[to + k] = (array[to + k] as number) + (array[from + k] as number);
  }
}

/** Expected events per practice, type group and measure from the regional stratum rates. */
function caseMixExpected(
  compiled: CompiledMeasureSet,
  layout: HistogramLayout,
  strataCounts: Uint32Array,
  stratumOf: Int32Array,
  cellOf: Uint8Array,
  practice: Int32Array,
  diabetesType: Uint8Array,
  units: number,
  generated: ExpectedKernel | null,
): Float64Array {
  const M = compiled.measures.length;
  const K = layout.cellsPerBlock;
  const S = compiled.strataCount;
  const inDenominator = (m: number, code: number): boolean =>
    compiled.measures[m]?.denominator === 'measured' ? code >= CODE_NOT_MET : code >= CODE_UNKNOWN;
  // Stratum rates per measure, over the strata that have records (each record is in one cell
  // of the first pack). Each cell's role for a measure: 1 met, 2 in the denominator.
  const roles = compiled.measures.map((_, m) => {
    const cells = layout.cellCodes[m] as Uint8Array;
    return Uint8Array.from(
      cells,
      (code) => (code === CODE_MET ? 1 : 0) | (inDenominator(m, code) ? 2 : 0),
    );
  });
  const offsets = Int32Array.from(
    compiled.measures.map((_, m) => layout.packs[layout.measurePack[m] as number]?.offset ?? 0),
  );
  const firstCells = layout.packs[0]?.cells ?? 0;
  const rates = new Float64Array(S * M);
  for (let s = 0; s < S; s++) {
    const base = s * K;
    let records = 0;
    for (let c = 0; c < firstCells; c++) records += strataCounts[base + c] as number;
    if (records === 0) continue;
    for (let m = 0; m < M; m++) {
      const role = roles[m] as Uint8Array;
      const from = base + (offsets[m] as number);
      let events = 0;
      let n = 0;
      for (let c = 0; c < role.length; c++) {
        const count = strataCounts[from + c] as number;
        const r = role[c] as number;
        if (r & 1) events += count;
        if (r & 2) n += count;
      }
      rates[s * M + m] = n > 0 ? events / n : 0;
    }
  }
  const expected = new Float64Array(units * 2 * M);
  if (generated !== null) {
    generated(stratumOf, cellOf, practice, diabetesType, rates, expected);
    return expected;
  }
  // For each cell (over all packs), the measures whose denominator it is in, as one flat list.
  const packCount = layout.packs.length;
  const packOffset = Int32Array.from(layout.packs.map((p) => p.offset));
  const listStart = new Int32Array(K + 1);
  const listed: number[] = [];
  layout.packs.forEach((pack) => {
    for (let c = 0; c < pack.cells; c++) {
      listStart[pack.offset + c] = listed.length;
      for (const m of pack.measures) {
        if (inDenominator(m, layout.cellCodes[m]?.[c] as number)) listed.push(m);
      }
      listStart[pack.offset + c + 1] = listed.length;
    }
  });
  const measures = Int32Array.from(listed);
  const N = stratumOf.length;
  for (let i = 0; i < N; i++) {
    const s = stratumOf[i] as number;
    if (s < 0) continue;
    const eb = ((practice[i] as number) * 2 + (diabetesType[i] === TYPE_1 ? 0 : 1)) * M;
    const rb = s * M;
    const ci = i * packCount;
    for (let p = 0; p < packCount; p++) {
      const cell = (packOffset[p] as number) + (cellOf[ci + p] as number);
      const end = listStart[cell + 1] as number;
      for (let k = listStart[cell] as number; k < end; k++) {
        const m = measures[k] as number;
        expected[eb + m] = (expected[eb + m] as number) + (rates[rb + m] as number);
      }
    }
  }
  return expected;
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

/** Sets a node's bits for records start … start + len − 1. */
function evaluateNode(
  nodes: readonly ConditionNode[],
  n: number,
  slots: readonly NodeSlot[],
  columns: CareColumns,
  w: ReviewWindow,
  start: number,
  len: number,
  ageOf: Int32Array,
  state: Int32Array,
): void {
  const node = nodes[n] as ConditionNode;
  const slot = slots[n] as NodeSlot;
  const o = Math.floor(slot.bit / 32) * BLOCK;
  const sh = slot.bit % 32;
  switch (node.op) {
    case 'recorded': {
      const lo = node.window === 'retinal' ? w.retinalStartIndex : w.startIndex;
      recordedBits(columns.months[node.field], lo, w.endIndex - lo, start, len, state, o, sh);
      return;
    }
    case 'value': {
      const months = columns.months[MEASUREMENT_MONTH[node.measurement]];
      const values = columns.values[node.measurement];
      const span = w.endIndex - w.startIndex;
      valueBits(
        months,
        values,
        node.comparator,
        node.threshold,
        w.startIndex,
        span,
        start,
        len,
        state,
        o,
        sh,
      );
      return;
    }
    case 'bloodPressure':
      bloodPressureBits(columns, node.bands, w, start, len, ageOf, state, o, sh);
      return;
    case 'flag': {
      const yes = node.equals ? 3 : 2;
      const no = node.equals ? 2 : 3;
      flagBits(columns[node.flag], yes, no, start, len, state, o, sh);
      return;
    }
    case 'all':
    case 'any':
      compositeBits(node.op, node.inputs, slots, slot.width, len, state, o, sh);
      return;
  }
}

function recordedBits(
  months: Int16Array,
  lo: number,
  span: number,
  start: number,
  len: number,
  state: Int32Array,
  o: number,
  sh: number,
): void {
  for (let j = 0; j < len; j++) {
    const inside = +(((months[start + j] as number) - lo) >>> 0 <= span);
    state[o + j] = (state[o + j] as number) | (inside << sh);
  }
}

function valueBits(
  months: Int16Array,
  values: Float64Array,
  comparator: 'lt' | 'le' | 'gt' | 'ge',
  t: number,
  lo: number,
  span: number,
  start: number,
  len: number,
  state: Int32Array,
  o: number,
  sh: number,
): void {
  // Two bits: known (in the window) and met; unknown 0, not met 2, met 3.
  const cmp = comparator === 'lt' ? 0 : comparator === 'le' ? 1 : comparator === 'gt' ? 2 : 3;
  for (let j = 0; j < len; j++) {
    const known = +(((months[start + j] as number) - lo) >>> 0 <= span);
    const v = values[start + j] as number;
    const met = cmp === 0 ? +(v < t) : cmp === 1 ? +(v <= t) : cmp === 2 ? +(v > t) : +(v >= t);
    state[o + j] = (state[o + j] as number) | (((known << 1) | (known & met)) << sh);
  }
}

function bloodPressureBits(
  columns: CareColumns,
  bands: readonly { minAge: number; systolicBelow: number; diastolicBelow: number }[],
  w: ReviewWindow,
  start: number,
  len: number,
  ageOf: Int32Array,
  state: Int32Array,
  o: number,
  sh: number,
): void {
  const months = columns.months.bloodPressure;
  const systolic = columns.values.systolic;
  const diastolic = columns.values.diastolic;
  const lo = w.startIndex;
  const span = w.endIndex - w.startIndex;
  const first = bands[0] as (typeof bands)[number];
  const second = bands[1];
  const twoBands = bands.length === 2 && second !== undefined;
  for (let j = 0; j < len; j++) {
    const known = +(((months[start + j] as number) - lo) >>> 0 <= span);
    let band = first;
    if (twoBands) {
      if ((ageOf[j] as number) >= second.minAge) band = second;
    } else {
      for (let b = 1; b < bands.length; b++) {
        const candidate = bands[b] as (typeof bands)[number];
        if ((ageOf[j] as number) >= candidate.minAge) band = candidate;
      }
    }
    const met =
      +((systolic[start + j] as number) < band.systolicBelow) &
      +((diastolic[start + j] as number) < band.diastolicBelow);
    state[o + j] = (state[o + j] as number) | (((known << 1) | (known & met)) << sh);
  }
}

function flagBits(
  flags: Uint8Array,
  yes: number,
  no: number,
  start: number,
  len: number,
  state: Int32Array,
  o: number,
  sh: number,
): void {
  // Flag codes: 0 not recorded, 1 no, 2 yes.
  const lut = new Uint8Array([0, no, yes]);
  for (let j = 0; j < len; j++) {
    const v = lut[flags[start + j] as number] as number;
    state[o + j] = (state[o + j] as number) | (v << sh);
  }
}

function compositeBits(
  op: 'all' | 'any',
  inputs: readonly number[],
  slots: readonly NodeSlot[],
  width: 1 | 2,
  len: number,
  state: Int32Array,
  o: number,
  sh: number,
): void {
  // Per state word: bits of one-bit inputs, met bits and known bits of two-bit inputs.
  const words = new Map<number, { one: number; met: number; known: number }>();
  for (const input of inputs) {
    const s = slots[input] as NodeSlot;
    const word = Math.floor(s.bit / 32);
    const m = words.get(word) ?? { one: 0, met: 0, known: 0 };
    if (s.width === 1) m.one |= 1 << (s.bit % 32);
    else {
      m.met |= 1 << (s.bit % 32);
      m.known |= 1 << ((s.bit % 32) + 1);
    }
    words.set(word, m);
  }
  const list = [...words.entries()];
  const wordOffset = Int32Array.from(list.map(([word]) => word * BLOCK));
  const one = Int32Array.from(list.map(([, m]) => m.one));
  const met = Int32Array.from(list.map(([, m]) => m.met));
  const known = Int32Array.from(list.map(([, m]) => m.known));
  const all = op === 'all';
  for (let j = 0; j < len; j++) {
    let anyNotMet = 0;
    let anyUnknown = 0;
    let anyMet = 0;
    for (let k = 0; k < wordOffset.length; k++) {
      const s = state[(wordOffset[k] as number) + j] as number;
      const oneBits = one[k] as number;
      const metBits = met[k] as number;
      const knownBits = known[k] as number;
      anyNotMet |= (~s & oneBits) | ((s >>> 1) & ~s & metBits);
      anyUnknown |= ~s & knownBits;
      anyMet |= s & (oneBits | metBits);
    }
    let v: number;
    if (all) {
      v = anyNotMet !== 0 ? 2 : anyUnknown !== 0 ? 0 : 3;
    } else {
      v = anyMet !== 0 ? 3 : anyUnknown !== 0 ? 0 : 2;
    }
    // A one-bit composite (inputs never unknown) keeps only the met bit.
    if (width === 1) v &= 1;
    state[o + j] = (state[o + j] as number) | (v << sh);
  }
}
