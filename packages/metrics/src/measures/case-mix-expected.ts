import { TYPE_1 } from '../records/columns.js';
import { CODE_MET, CODE_NOT_MET, CODE_UNKNOWN, type CompiledMeasureSet } from './compile.js';
import type { HistogramLayout } from './layout.js';
import type { ExpectedKernel } from './record-kernel.js';

/**
 * Case mix, the columnar path's second pass (indirect standardisation, docs/methods.md §8):
 * the region's stratum rates r_s per measure from the stratum histograms of the first pass,
 * then each eligible record adds r_s of its stratum to its practice's expected count E of every
 * measure whose denominator it is in. The generated kernel (record-kernel.ts) does the second
 * step straight-line; the loop here is its table-driven equivalent. Returns the expected
 * events per unit, type group and measure ((u·2 + g)·M + m; practices filled, the rest 0).
 */
export function caseMixExpected(
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
