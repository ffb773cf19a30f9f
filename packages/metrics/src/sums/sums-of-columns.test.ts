import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { defaultMeasureSet, defaultMeasureSetJson } from '../../test/measure-set.js';
import { record } from '../../test/records.js';
import { arbitraryRecords, type ReferenceSums, referenceSums } from '../../test/sums-reference.js';
import { evaluateRecords } from '../measures/evaluate-records.js';
import { type MeasureSet, parseMeasureSet } from '../measures/schema.js';
import { insulinProgression } from '../progression/insulin.js';
import { toColumns } from '../records/columns.js';
import type { CareRecord } from '../records/record.js';
import { kaplanMeierFromCounts } from '../stats/kaplan-meier.js';
import { KIDNEY_COLUMNS, KIDNEY_ROWS } from './kidney-grid.js';
import type { PracticeSums } from './practice-sums.js';
import { sumsLayout, type SumsLayout } from './sums-layout.js';
import { sumsOfColumns } from './sums-of-columns.js';
import { histogramSlots, VALUE_HISTOGRAMS } from './value-bins.js';

/**
 * Practice sums against the plain reference: the outcome histograms, eligible and record counts
 * against `evaluateRecords` with practice breakdowns (the same layout, cell for cell); the
 * strata, insulin life table, value histograms and kidney grid against a record-by-record
 * reference (test/sums-reference.ts) built from the per-record rules.
 */
const set = defaultMeasureSet();
const layout = sumsLayout(set);

/** A measure set with other bands, a restricted care process and measured denominators. */
function variedMeasureSet(): MeasureSet {
  const json = defaultMeasureSetJson() as Record<string, unknown> & {
    careProcesses: Record<string, unknown>[];
    targets: Record<string, unknown>[];
  };
  json.id = 'test-varied-2026.1';
  json.retinalWindowMonths = 24;
  json.breakdowns = { ageBands: [12, 18, 50, 70, 85], durationBands: [0, 1, 10] };
  (json.careProcesses[5] as { population: object }).population = {
    types: ['type1'],
    minAge: 18,
    maxAge: null,
  };
  (json.careProcesses[6] as { denominator: string }).denominator = 'measured';
  (json.targets[0] as { denominator: string }).denominator = 'measured';
  return parseMeasureSet(json);
}
const quarter = { year: 2026, quarter: 3 } as const;

/** The sums' strata, insulin, values and kidney in the reference's shape. */
function asReference(sums: PracticeSums, l: SumsLayout): ReferenceSums {
  const M = l.compiled.measures.length;
  const V = l.valuesPerStratum;
  const strata = new Map<number, number[]>();
  sums.strata.ids.forEach((id, j) => {
    const row = Array.from(sums.strata.values.subarray(j * V, (j + 1) * V));
    const full = [row[0] as number];
    for (let m = 0; m < M; m++) full.push(row[1 + m] as number);
    for (let m = 0; m < M; m++) full.push(row[l.nSlot[m] as number] as number);
    strata.set(id, full);
  });
  const insulin = new Map<number, [number, number]>();
  for (let y = 0; 2 * y < sums.insulin.counts.length; y++) {
    const e = sums.insulin.counts[2 * y] as number;
    const c = sums.insulin.counts[2 * y + 1] as number;
    if (e > 0 || c > 0) insulin.set(y, [e, c]);
  }
  const values = [0, 1].map((g) => {
    const map = new Map<string, number>();
    VALUE_HISTOGRAMS.forEach((spec, h) => {
      for (let slot = 0; slot < histogramSlots(spec); slot++) {
        const v = sums.values[
          g * l.valuesPerGroup + (l.valueOffsets[h] as number) + slot
        ] as number;
        if (v > 0) map.set(`${spec.key}/${slot}`, v);
      }
    });
    return map;
  });
  const kidney = [0, 1].map((g) => {
    const map = new Map<string, number>();
    KIDNEY_ROWS.forEach((row, r) =>
      KIDNEY_COLUMNS.forEach((column, c) => {
        const v = sums.kidney[g * l.kidneyPerGroup + r * KIDNEY_COLUMNS.length + c] as number;
        if (v > 0) map.set(`${row}/${column}`, v);
      }),
    );
    return map;
  });
  return { strata, insulin, excluded: sums.insulin.excluded, values, kidney };
}

function expectLikeReference(
  records: readonly CareRecord[],
  all: Map<string, PracticeSums>,
  measureSet: MeasureSet = set,
): void {
  const l = sumsLayout(measureSet);
  const { result } = evaluateRecords(records, measureSet, quarter, { practiceBreakdowns: true });
  expect([...all.keys()]).toEqual(result.practices);
  const C = l.categories;
  const block = l.cellCount;
  result.practices.forEach((code, p) => {
    const sums = all.get(code) as PracticeSums;
    expect(Array.from(sums.cells)).toEqual(
      Array.from(result.counts.subarray(p * block, (p + 1) * block)),
    );
    expect(Array.from(sums.eligible)).toStrictEqual(
      Array.from(result.eligible.subarray(p * 2 * C, (p + 1) * 2 * C)),
    );
    expect(Array.from(sums.records)).toEqual(Array.from(result.records.subarray(p * 4, p * 4 + 4)));
    expect(asReference(sums, l)).toEqual(
      referenceSums(
        records.filter((r) => r.practiceCode === code),
        measureSet,
        quarter,
      ),
    );
  });
}

describe('sumsOfColumns', () => {
  it('agrees with the plain reference on random records (property)', () => {
    fc.assert(
      fc.property(arbitraryRecords(6), (records) => {
        const all = sumsOfColumns(toColumns(records), set, quarter);
        expectLikeReference(records, all);
        // The table-driven loop gives the same sums.
        expect(sumsOfColumns(toColumns(records), set, quarter, { kernel: 'generic' })).toEqual(all);
      }),
      { numRuns: 60 },
    );
  });

  it('agrees with the plain reference under a varied measure set (property)', () => {
    const varied = variedMeasureSet();
    expect(sumsLayout(varied).ownN.length).toBeGreaterThan(sumsLayout(set).ownN.length);
    fc.assert(
      fc.property(arbitraryRecords(4), (records) => {
        const all = sumsOfColumns(toColumns(records), varied, quarter);
        expectLikeReference(records, all, varied);
        expect(sumsOfColumns(toColumns(records), varied, quarter, { kernel: 'generic' })).toEqual(
          all,
        );
      }),
      { numRuns: 40 },
    );
  });

  it('gives each practice the sums of its own records, whatever else is in the columns', () => {
    fc.assert(
      fc.property(arbitraryRecords(5, { minLength: 1 }), fc.integer(), (records, seed) => {
        const all = sumsOfColumns(toColumns(records), set, quarter);
        for (const [code, sums] of all) {
          const own = sumsOfColumns(
            toColumns(records.filter((r) => r.practiceCode === code)),
            set,
            quarter,
          );
          expect(own.get(code)).toEqual(sums);
        }
        // Records in another order (practices interleaved) give the same sums.
        const shuffled = [...records].sort(
          (a, b) => ((a.birthYear * 31 + seed) % 11) - ((b.birthYear * 31 + seed) % 11),
        );
        const again = sumsOfColumns(toColumns(shuffled), set, quarter);
        for (const [code, sums] of all) expect(again.get(code)).toEqual(sums);
      }),
      { numRuns: 40 },
    );
  });

  it('holds the life table kaplanMeier reads, as progression/insulin.ts counts it', () => {
    fc.assert(
      fc.property(arbitraryRecords(4, { minLength: 1 }), (records) => {
        const all = sumsOfColumns(toColumns(records), set, quarter);
        const reference = insulinProgression(records, quarter, { minAge: 12 });
        let excluded = 0;
        for (const p of reference.practices) {
          const sums = all.get(p.code) as PracticeSums;
          const c = sums.insulin.counts;
          const rows = Array.from({ length: c.length / 2 }, (_, y) => ({
            time: y,
            events: c[2 * y] as number,
            censored: c[2 * y + 1] as number,
          }));
          const km = kaplanMeierFromCounts(rows);
          expect([km.n, km.events, km.median]).toEqual([p.n, p.events, p.median]);
        }
        for (const sums of all.values()) excluded += sums.insulin.excluded;
        expect(excluded).toBe(reference.excluded);
      }),
      { numRuns: 40 },
    );
  });

  it('counts the kidney grid and value bins of hand-made records', () => {
    const month = '2026-05';
    const records = [
      // Man of 50 with creatinine 1.0 mg/dL: eGFR 91.7 (G1); ACR 2.5 (A1); HbA1c 48 → bin 28.
      record({
        sex: 'M',
        birthYear: 1976,
        serumCreatinine: { month, umolL: 88.42 },
        urineAlbumin: { month, acrMgMmol: 2.5 },
        hba1c: { month, mmolMol: 48 },
      }),
      // Sex X: eGFR not computed; ACR 31 (A3); cholesterol 5.0 → the bin opening at 5.0.
      record({
        sex: 'X',
        serumCreatinine: { month, umolL: 80 },
        urineAlbumin: { month, acrMgMmol: 31 },
        cholesterol: { month, totalMmolL: 5.0 },
      }),
      // Creatinine outside the review window: no creatinine; no ACR.
      record({ serumCreatinine: { month: '2025-01', umolL: 80 } }),
      // Under 18 (born 2010): no eGFR; a type 1 record.
      record({ birthYear: 2010, diabetesType: 'type1', serumCreatinine: { month, umolL: 60 } }),
    ];
    const sums = sumsOfColumns(toColumns(records), set, quarter).get('P1') as PracticeSums;
    const cell = (g: number, row: string, column: string): number =>
      sums.kidney[
        g * layout.kidneyPerGroup +
          KIDNEY_ROWS.indexOf(row as never) * KIDNEY_COLUMNS.length +
          KIDNEY_COLUMNS.indexOf(column as never)
      ] as number;
    expect(cell(1, 'G1', 'A1')).toBe(1);
    expect(cell(1, 'sex_not_f_or_m', 'A3')).toBe(1);
    expect(cell(1, 'no_creatinine', 'no_acr')).toBe(1);
    expect(cell(0, 'under_18', 'no_acr')).toBe(1);
    expect(Array.from(sums.kidney).reduce((a, b) => a + b, 0)).toBe(4);
    const slot = (g: number, key: string, s: number): number => {
      const h = VALUE_HISTOGRAMS.findIndex((x) => x.key === key);
      return sums.values[
        g * layout.valuesPerGroup + (layout.valueOffsets[h] as number) + s
      ] as number;
    };
    expect(slot(1, 'hba1c', 2 + 28)).toBe(1); // 20 + 28 = 48
    expect(slot(1, 'hba1c', 0)).toBe(2); // not recorded
    expect(slot(1, 'cholesterol', 2 + 20)).toBe(1); // 1 + 20 × 0.2 = 5.0
    expect(slot(1, 'egfr', 2 + 18)).toBe(1); // 91.7 in 90 ≤ eGFR < 95
    expect(slot(1, 'egfr', 0)).toBe(2);
  });

  it('skips practices without records and keeps arrays as narrow as their bounds', () => {
    const columns = toColumns([record({ practiceCode: 'P2' })], {
      practiceCodes: ['P1', 'P2'],
    });
    const all = sumsOfColumns(columns, set, quarter);
    expect([...all.keys()]).toEqual(['P2']);
    const sums = all.get('P2') as PracticeSums;
    expect(sums.cells).toBeInstanceOf(Uint8Array);
    expect(sums.strata.values).toBeInstanceOf(Uint8Array);
    expect(sums.practices).toBe(1);
    expect(sums.fingerprint).toBe(layout.fingerprint);
  });
});
