import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { defaultMeasureSet } from '../../test/measure-set.js';
import { arbitraryRecords } from '../../test/sums-reference.js';
import { toColumns } from '../records/columns.js';
import type { CareRecord } from '../records/record.js';
import { decodeSums } from '../sums/decode-sums.js';
import { encodeSums } from '../sums/encode-sums.js';
import { sumsOfColumns } from '../sums/sums-of-columns.js';
import { mergeSums } from '../sums/merge-sums.js';
import {
  benchmarkMeasure,
  benchmarkMeasureAt,
  benchmarkPractice,
  benchmarkTable,
} from './benchmark-views.js';
import { buildBenchmark, buildBenchmarkOfParts } from './build-benchmark.js';

/**
 * The exactness guarantee: a benchmark built incrementally (each practice's sums computed from
 * its own records alone, stored as bytes, read back) equals the one built by a full recompute
 * (the sums of every record in one call), every floating-point value included. Both are built
 * from the same integer sums in the same practice order, so they agree bit for bit; the test
 * compares the objects and their JSON text (which carries every float64 column byte for byte).
 */
const set = defaultMeasureSet();
const quarters = fc.constantFrom(
  { year: 2026, quarter: 3 as const },
  { year: 2025, quarter: 4 as const },
);
const localityOf = fc.func(fc.constantFrom<string | null>('L1', 'L2', 'L3', null));

describe('incremental and full benchmarks agree exactly (property)', () => {
  it('from random records over random practices', () => {
    fc.assert(
      fc.property(
        arbitraryRecords(8, { maxLength: 160 }),
        quarters,
        localityOf,
        (records: CareRecord[], quarter, locality) => {
          const full = sumsOfColumns(toColumns(records), set, quarter);
          const codes = [...full.keys()];
          const fullBenchmark = buildBenchmark({
            practices: codes.map((code) => ({
              code,
              locality: locality(code),
              sums: full.get(code)!,
            })),
            measureSet: set,
            quarter,
          });
          const incremental = buildBenchmark({
            practices: codes.map((code) => {
              const own = sumsOfColumns(
                toColumns(records.filter((r) => r.practiceCode === code)),
                set,
                quarter,
              ).get(code)!;
              return { code, locality: locality(code), sums: decodeSums(encodeSums(own), set) };
            }),
            measureSet: set,
            quarter,
          });
          expect(incremental).toEqual(fullBenchmark);
          expect(JSON.stringify(incremental)).toBe(JSON.stringify(fullBenchmark));
          // And so do the views, which recompute limits, intervals and ratios.
          for (const measure of ['hba1c_le_53', 'statin_40_75', 'all_processes']) {
            expect(benchmarkMeasure(incremental, measure, 'type1')).toEqual(
              benchmarkMeasure(fullBenchmark, measure, 'type1'),
            );
          }
          if (codes.length > 0) {
            expect(benchmarkPractice(incremental, codes[0]!)).toEqual(
              benchmarkPractice(fullBenchmark, codes[0]!),
            );
          }
          expect(benchmarkTable(incremental, 'all', 'locality')).toEqual(
            benchmarkTable(fullBenchmark, 'all', 'locality'),
          );
        },
      ),
      { numRuns: 60 },
    );
  });

  it('from the practices’ parts and the region’s life table (the rebuild after a confirm)', () => {
    fc.assert(
      fc.property(
        arbitraryRecords(8, { maxLength: 160 }),
        quarters,
        localityOf,
        fc.array(fc.nat(), { maxLength: 6 }),
        (records: CareRecord[], quarter, locality, picks) => {
          const sums = sumsOfColumns(toColumns(records), set, quarter);
          const codes = [...sums.keys()].sort();
          const whole = buildBenchmark({
            practices: codes.map((code) => ({
              code,
              locality: locality(code),
              sums: sums.get(code)!,
            })),
            measureSet: set,
            quarter,
          });
          const region = codes.length > 0 ? mergeSums(codes.map((c) => sums.get(c)!)) : null;
          const parts = buildBenchmarkOfParts({
            practices: codes.map((code) => {
              const own = sums.get(code)!;
              // Copies: what a rebuild keeps of a practice, apart from its full sums.
              return {
                code,
                locality: locality(code),
                parts: {
                  tallies: own.tallies.slice(),
                  records: own.records.slice(),
                  strata: { ids: own.strata.ids.slice(), values: own.strata.values.slice() },
                },
              };
            }),
            insulin: region ? [region.insulin] : [],
            measureSet: set,
            quarter,
          });
          expect(JSON.stringify(parts)).toBe(JSON.stringify(whole));
          // Some practices' units only (a page of the table): those of the whole measure.
          const indices = [...new Set(picks.map((x) => (codes.length ? x % codes.length : 0)))]
            .filter(() => codes.length > 0)
            .sort((a, b) => a - b);
          for (const measure of ['hba1c_le_53', 'all_processes']) {
            const all = benchmarkMeasure(whole, measure, 'all').units;
            expect(benchmarkMeasureAt(whole, measure, 'all', indices)).toEqual(
              indices.map((i) => all[i]),
            );
          }
        },
      ),
      { numRuns: 60 },
    );
  });
});
