import {
  CODE_EXCLUDED,
  CODE_MET,
  CODE_NOT_MET,
  CODE_UNKNOWN,
  type CompiledMeasureSet,
  type ConditionNode,
} from './compile.js';

/**
 * The layout of the outcome histograms.
 *
 * Each measure has a slot of 1 or 2 bits in a record's outcome state: 1 bit (not met 0, met 1)
 * for a measure that can be neither unknown nor excluded (a care process over everyone), else
 * 2 bits (unknown 0, excluded 1, not met 2, met 3). For counting, each measure's value is a
 * digit of radix 2 (not met, met), 3 (unknown, not met, met) or 4 (unknown, excluded, not met,
 * met, for a measure over part of the population). Consecutive measures are grouped into packs
 * whose radix product is at most a cap; a histogram cell counts the records whose pack has one
 * combination of digits, cell = Σ digit × stride. The cap trades memory for speed: 64 cells
 * (fewer packs, fewer increments per record) where only localities and the region hold
 * breakdown blocks, 16 where every practice does (see result.ts). A pack of four care processes thus
 * takes 16 cells and one increment per record instead of four, which is what makes the
 * columnar pass fast; the counts of any one measure are sums over its pack's cells
 * (see result.ts).
 */
export const PACK_CELLS = 64;
export const PACK_CELLS_WITH_PRACTICE_BREAKDOWNS = 16;

export interface HistogramPack {
  /** Offset of the pack's first cell within a histogram block, and its number of cells. */
  offset: number;
  cells: number;
  /** Measures in the pack. */
  measures: number[];
}

export interface HistogramLayout {
  /** Bit position of each measure's slot in the outcome state (word = ⌊bit/32⌋). */
  measureBit: number[];
  measureWidth: (1 | 2)[];
  /** Radix of each measure's digit (2, 3 or 4) and its stride within its pack. */
  measureRadix: (2 | 3 | 4)[];
  measureStride: number[];
  measurePack: number[];
  packs: HistogramPack[];
  /** Cells per histogram block (one unit, type group and category): Σ cells of the packs. */
  cellsPerBlock: number;
  /** Outcome code of measure m in each cell of its pack. */
  cellCodes: Uint8Array[];
  /** 32-bit words of outcome state the measure slots occupy. */
  words: number;
}

/** Whether a condition node can be unknown (missing measurement or flag). */
export function canBeUnknown(nodes: readonly ConditionNode[], index: number): boolean {
  const node = nodes[index] as ConditionNode;
  switch (node.op) {
    case 'recorded':
      return false;
    case 'value':
    case 'bloodPressure':
    case 'flag':
      return true;
    case 'all':
    case 'any':
      return node.inputs.some((i) => canBeUnknown(nodes, i));
  }
}

/** Whether a measure's population is narrower than everyone eligible. */
export function isRestricted(measure: CompiledMeasureSet['measures'][number]): boolean {
  const p = measure.population;
  return new Set(p.types).size < 3 || p.minAge !== null || p.maxAge !== null;
}

/** The outcome codes of each digit, by radix. */
const DIGIT_CODES: Record<2 | 3 | 4, readonly number[]> = {
  2: [CODE_NOT_MET, CODE_MET],
  3: [CODE_UNKNOWN, CODE_NOT_MET, CODE_MET],
  4: [CODE_UNKNOWN, CODE_EXCLUDED, CODE_NOT_MET, CODE_MET],
};

/** The digit of an outcome code (throws on a code the measure cannot have). */
export function digitOf(radix: 2 | 3 | 4, code: number): number {
  const digit = DIGIT_CODES[radix].indexOf(code);
  if (digit < 0)
    throw new RangeError(`outcome code ${code} cannot occur for a radix-${radix} measure`);
  return digit;
}

export function histogramLayout(
  compiled: CompiledMeasureSet,
  maxCells: number = PACK_CELLS,
): HistogramLayout {
  const measureBit: number[] = [];
  const measureWidth: (1 | 2)[] = [];
  const measureRadix: (2 | 3 | 4)[] = [];
  const measureStride: number[] = [];
  const measurePack: number[] = [];
  const packs: HistogramPack[] = [];
  let bit = 0;
  let offset = 0;
  let current: HistogramPack | null = null;
  compiled.measures.forEach((m, i) => {
    const restricted = isRestricted(m);
    const unknown = canBeUnknown(compiled.nodes, compiled.measureNode[i] as number);
    const width: 1 | 2 = restricted || unknown ? 2 : 1;
    const radix: 2 | 3 | 4 = restricted ? 4 : unknown ? 3 : 2;
    if ((bit % 32) + width > 32) bit = Math.ceil(bit / 32) * 32; // never straddle words
    if (current === null || current.cells * radix > maxCells) {
      if (current !== null) offset += current.cells;
      current = { offset, cells: 1, measures: [] };
      packs.push(current);
    }
    measureBit.push(bit);
    measureWidth.push(width);
    measureRadix.push(radix);
    measureStride.push(current.cells);
    measurePack.push(packs.length - 1);
    current.cells *= radix;
    current.measures.push(i);
    bit += width;
  });
  if (current !== null) offset += (current as HistogramPack).cells;
  const cellCodes = compiled.measures.map((_, m) => {
    const pack = packs[measurePack[m] as number] as HistogramPack;
    const radix = measureRadix[m] as 2 | 3 | 4;
    const stride = measureStride[m] as number;
    const cells = new Uint8Array(pack.cells);
    for (let c = 0; c < cells.length; c++) {
      cells[c] = DIGIT_CODES[radix][Math.floor(c / stride) % radix] as number;
    }
    return cells;
  });
  return {
    measureBit,
    measureWidth,
    measureRadix,
    measureStride,
    measurePack,
    packs,
    cellsPerBlock: offset,
    cellCodes,
    words: Math.max(1, Math.ceil(bit / 32)),
  };
}

/** The cell index in each pack for one record's outcome codes (plain path). */
export function packCells(layout: HistogramLayout, codes: readonly number[]): number[] {
  const cells = layout.packs.map(() => 0);
  codes.forEach((code, m) => {
    const p = layout.measurePack[m] as number;
    const digit = digitOf(layout.measureRadix[m] as 2 | 3 | 4, code);
    cells[p] = (cells[p] as number) + digit * (layout.measureStride[m] as number);
  });
  return cells;
}
