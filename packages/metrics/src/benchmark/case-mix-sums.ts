import type { PracticeSums } from '../sums/practice-sums.js';
import type { SumsLayout } from '../sums/sums-layout.js';

/**
 * Case mix by indirect standardisation from sums (docs/methods.md §8): the region's rate of
 * each measure in each stratum, r_s = Σ_i y_is / Σ_i n_is over the practices, then each
 * practice's expected events E_i = Σ_s n_is · r_s per measure and type group (a stratum
 * belongs to one diabetes type, so to one group), summed over its strata in ascending order;
 * a locality's E is the sum of its practices' in their order. The same integer sums in the same
 * order give the same floating-point E, whichever way the sums were made.
 * Returns E per unit at (u·M + m)·2 + g (benchmark.ts).
 */
/** Measure indices 0 … M − 1. */
function measureIndices(layout: SumsLayout): number[] {
  return layout.compiled.measures.map((_, m) => m);
}

export function expectedFromSums(
  layout: SumsLayout,
  sums: readonly Pick<PracticeSums, 'strata'>[],
  practiceLocality: Int32Array,
  localities: number,
): Float64Array {
  const P = sums.length;
  const M = layout.compiled.measures.length;
  const V = layout.valuesPerStratum;
  const S = layout.strataCount;
  const nSlot = layout.nSlot;
  // 1. The region's counts per stratum (exact in doubles), then its rates.
  const region = new Float64Array(S * V);
  for (const s of sums) {
    const { ids, values } = s.strata;
    for (let j = 0; j < ids.length; j++) {
      const to = (ids[j] as number) * V;
      const from = j * V;
      for (let k = 0; k < V; k++)
        region[to + k] = (region[to + k] as number) + (values[from + k] as number);
    }
  }
  const rates = new Float64Array(S * M);
  for (let s = 0; s < S; s++) {
    const b = s * V;
    if (region[b] === 0) continue;
    for (let m = 0; m < M; m++) {
      const n = region[b + (nSlot[m] as number)] as number;
      rates[s * M + m] = n > 0 ? (region[b + 1 + m] as number) / n : 0;
    }
  }
  // 2. Expected events per practice, then localities. Measures whose n is the stratum's records
  // take it once per stratum; the others read their own n.
  const U = P + localities;
  const expected = new Float64Array(U * M * 2);
  const perType = layout.strataPerType;
  // Every measure as if its n were the stratum's records (one contiguous loop), and the
  // measures with an n of their own apart; each sum is Σ n·r in stratum order either way.
  const own = Int32Array.from(measureIndices(layout).filter((m) => nSlot[m] !== 0));
  const ownSlot = Int32Array.from(own, (m) => nSlot[m] as number);
  const O = own.length;
  const byRecords = new Float64Array(2 * M);
  const byOwn = new Float64Array(2 * O);
  for (let p = 0; p < P; p++) {
    const { ids, values } = (sums[p] as Pick<PracticeSums, 'strata'>).strata;
    byRecords.fill(0);
    byOwn.fill(0);
    for (let j = 0; j < ids.length; j++) {
      const s = ids[j] as number;
      const r = s * M;
      const v = j * V;
      const records = values[v] as number;
      const e = s < perType ? 0 : M;
      for (let m = 0; m < M; m++) {
        byRecords[e + m] = (byRecords[e + m] as number) + records * (rates[r + m] as number);
      }
      const f = s < perType ? 0 : O;
      for (let k = 0; k < O; k++) {
        byOwn[f + k] =
          (byOwn[f + k] as number) +
          (values[v + (ownSlot[k] as number)] as number) *
            (rates[r + (own[k] as number)] as number);
      }
    }
    const base = p * M * 2;
    for (let m = 0; m < M; m++) {
      expected[base + 2 * m] = byRecords[m] as number;
      expected[base + 2 * m + 1] = byRecords[M + m] as number;
    }
    for (let k = 0; k < O; k++) {
      const m = own[k] as number;
      expected[base + 2 * m] = byOwn[k] as number;
      expected[base + 2 * m + 1] = byOwn[O + k] as number;
    }
  }
  for (let p = 0; p < P; p++) {
    const l = practiceLocality[p] as number;
    if (l < 0) continue;
    const from = p * M * 2;
    const to = (P + l) * M * 2;
    for (let k = 0; k < M * 2; k++)
      expected[to + k] = (expected[to + k] as number) + (expected[from + k] as number);
  }
  return expected;
}
