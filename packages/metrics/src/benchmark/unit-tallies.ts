import type { PracticeSums } from '../sums/practice-sums.js';
import type { SumsLayout } from '../sums/sums-layout.js';

/**
 * Each unit's events, measured and denominator per measure and type group, and its record
 * counts: practices from their sums' tallies (the everyone category, sums-tallies.ts),
 * localities as sums of their practices. Columns as in benchmark.ts: (u·M + m)·2 + g; records u·4 + k.
 */
export interface UnitTallies {
  events: Uint32Array;
  measured: Uint32Array;
  denominator: Uint32Array;
  records: Uint32Array;
}

export function unitTallies(
  layout: SumsLayout,
  sums: readonly Pick<PracticeSums, 'tallies' | 'records'>[],
  practiceLocality: Int32Array,
  localities: number,
): UnitTallies {
  const P = sums.length;
  const U = P + localities;
  const M = layout.compiled.measures.length;
  const events = new Uint32Array(U * M * 2);
  const measured = new Uint32Array(U * M * 2);
  const denominator = new Uint32Array(U * M * 2);
  const records = new Uint32Array(U * 4);
  const add = (array: Uint32Array, from: number, to: number): void => {
    array[to] = (array[to] as number) + (array[from] as number);
  };
  for (let p = 0; p < P; p++) {
    const s = sums[p] as Pick<PracticeSums, 'tallies' | 'records'>;
    const t = s.tallies;
    for (let g = 0; g < 2; g++) {
      for (let m = 0; m < M; m++) {
        const x = (p * M + m) * 2 + g;
        const from = (g * M + m) * 3;
        events[x] = t[from] as number;
        measured[x] = t[from + 1] as number;
        denominator[x] = t[from + 2] as number;
      }
    }
    records.set(s.records, p * 4);
    const l = practiceLocality[p] as number;
    if (l < 0) continue;
    const u = P + l;
    for (let k = 0; k < M * 2; k++) {
      add(events, p * M * 2 + k, u * M * 2 + k);
      add(measured, p * M * 2 + k, u * M * 2 + k);
      add(denominator, p * M * 2 + k, u * M * 2 + k);
    }
    for (let k = 0; k < 4; k++) add(records, p * 4 + k, u * 4 + k);
  }
  return { events, measured, denominator, records };
}
