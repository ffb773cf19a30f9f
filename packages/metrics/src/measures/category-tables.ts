import type { CompiledMeasureSet } from './compile.js';

/**
 * Lookup tables of the columnar loops: age → age band and whole years since diagnosis →
 * duration band (ages and durations above `MAX_AGE` are read as `MAX_AGE`), and the offset of
 * each breakdown dimension's first category in the category axis (compile.ts).
 */
export const MAX_AGE = 200;

export interface CategoryTables {
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
export function categoryTables(compiled: CompiledMeasureSet): CategoryTables {
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
