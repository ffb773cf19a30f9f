import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { arbitraryRecord } from '../../test/arbitrary.js';
import { defaultMeasureSet, defaultMeasureSetJson } from '../../test/measure-set.js';
import { toColumns } from '../records/columns.js';
import { OUTCOMES } from './compile.js';
import { evaluateColumns } from './evaluate-columns.js';
import { evaluateRecords } from './evaluate-records.js';
import { aggregateAt, type EvaluationResult } from './result.js';
import { parseMeasureSet } from './schema.js';

/**
 * The columnar fast path (generated and table-driven loops, with and without practice
 * breakdowns) must give exactly the plain reference evaluation's histograms on random records;
 * and the region's everyone aggregates must equal a direct count of the plain per-record
 * outcomes (a third, independent reading).
 */
const quarters = fc.constantFrom(
  { year: 2026, quarter: 3 as const },
  { year: 2026, quarter: 1 as const },
  { year: 2025, quarter: 4 as const },
);
const localityMaps: fc.Arbitrary<Record<string, string>> = fc.constantFrom<Record<string, string>>(
  {},
  { P1: 'L1', P2: 'L1', P3: 'L2' },
  { P5: 'L9', P4: 'L1', P1: 'L2', P2: 'L2' },
);

/** A measure set that exercises every rule form: restricted processes, ≥/< comparators, flags
 * meeting on "no", three blood-pressure bands, a measured-denominator process, 24-month
 * retinal window, and a composite over restricted measures. */
function variedMeasureSet() {
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
  json.targets.push(
    {
      key: 'bmi_ge_30',
      label: 'BMI 30 or more',
      source: 'test',
      denominator: 'measured',
      direction: 'lower',
      population: { types: ['type2', 'other'], minAge: null, maxAge: 79 },
      rule: 'value',
      measurement: 'bmi',
      comparator: 'ge',
      threshold: 30,
    },
    {
      key: 'no_cvd',
      label: 'No CVD recorded',
      source: 'test',
      denominator: 'eligible',
      direction: 'higher',
      population: { types: ['type1', 'type2', 'other'], minAge: null, maxAge: null },
      rule: 'flag',
      flag: 'cvdHistory',
      equals: false,
    },
    {
      key: 'bp_three_bands',
      label: 'BP in three bands',
      source: 'test',
      denominator: 'measured',
      direction: 'higher',
      population: { types: ['type1', 'type2', 'other'], minAge: 30, maxAge: null },
      rule: 'bloodPressure',
      bands: [
        { minAge: 0, systolicBelow: 135, diastolicBelow: 85 },
        { minAge: 60, systolicBelow: 140, diastolicBelow: 90 },
        { minAge: 80, systolicBelow: 150, diastolicBelow: 90 },
      ],
    },
    {
      key: 'acr_lt_3_or_insulin',
      label: 'ACR below 3 or on insulin',
      source: 'test',
      denominator: 'eligible',
      direction: 'higher',
      population: { types: ['type1', 'type2'], minAge: null, maxAge: null },
      rule: 'anyOf',
      of: [
        { rule: 'value', measurement: 'urineAlbumin', comparator: 'lt', threshold: 3 },
        { rule: 'flag', flag: 'onInsulin', equals: true },
        { rule: 'target', key: 'statin_40_75' },
      ],
    },
    {
      key: 'all_restricted',
      label: 'Composite of restricted measures',
      source: 'test',
      denominator: 'measured',
      direction: 'higher',
      population: { types: ['type1', 'type2', 'other'], minAge: null, maxAge: null },
      rule: 'allOf',
      of: [
        { rule: 'target', key: 'statin_40_75' },
        { rule: 'target', key: 'bmi_ge_30' },
        { rule: 'value', measurement: 'serumCreatinine', comparator: 'gt', threshold: 100 },
      ],
    },
  );
  return parseMeasureSet(json);
}

const measureSets = [defaultMeasureSet(), variedMeasureSet()];

/** Indices where two arrays differ (empty when equal); fast on large typed arrays. */
function differences(a: ArrayLike<number>, b: ArrayLike<number>, tolerance = 0): number[] {
  const out: number[] = [];
  if (a.length !== b.length) return [-1];
  for (let i = 0; i < a.length && out.length < 5; i++) {
    const x = a[i] as number;
    const y = b[i] as number;
    if (tolerance === 0 ? x !== y : Math.abs(x - y) > tolerance * Math.max(1, Math.abs(y)))
      out.push(i);
  }
  return out;
}

function expectSame(fast: EvaluationResult, plain: EvaluationResult): void {
  expect(fast.practices).toEqual(plain.practices);
  expect(fast.localities).toEqual(plain.localities);
  expect(fast.layout.cellsPerBlock).toBe(plain.layout.cellsPerBlock);
  expect(differences(fast.counts, plain.counts)).toEqual([]);
  expect(differences(fast.rollupCounts, plain.rollupCounts)).toEqual([]);
  expect(differences(fast.eligible, plain.eligible)).toEqual([]);
  expect(differences(fast.records, plain.records)).toEqual([]);
  expect(differences(fast.expected as Float64Array, plain.expected as Float64Array, 1e-9)).toEqual(
    [],
  );
}

describe('columnar evaluation equals the plain reference (property)', () => {
  for (const [index, set] of measureSets.entries()) {
    for (const practiceBreakdowns of [false, true]) {
      it(`measure set ${index + 1}, practice breakdowns ${practiceBreakdowns}`, () => {
        fc.assert(
          fc.property(
            fc.array(arbitraryRecord, { maxLength: 120 }),
            quarters,
            localityMaps,
            (records, quarter, localities) => {
              const { result: plain, outcomes } = evaluateRecords(records, set, quarter, {
                localities,
                practiceBreakdowns,
              });
              const columns = toColumns(records);
              for (const kernel of ['generated', 'generic'] as const) {
                expectSame(
                  evaluateColumns(columns, set, quarter, {
                    localities,
                    practiceBreakdowns,
                    kernel,
                  }),
                  plain,
                );
              }
              // The region's everyone aggregates against a direct count of the outcomes.
              const region = plain.practices.length + plain.localities.length;
              plain.measures.forEach((m, k) => {
                let events = 0;
                let measured = 0;
                let denominator = 0;
                for (const o of outcomes) {
                  const v = o.outcomes[m.key];
                  if (v === undefined || v === 'excluded') continue;
                  denominator++;
                  if (v !== 'unknown') measured++;
                  if (v === 'met') events++;
                }
                const a = aggregateAt(plain, region, 'all', 0, k);
                expect([a.events, a.measured, a.denominator]).toEqual([
                  events,
                  measured,
                  denominator,
                ]);
              });
              expect(OUTCOMES).toHaveLength(4);
            },
          ),
          { numRuns: 150 },
        );
      });
    }
  }

  it('gives the same result for records in any order', () => {
    fc.assert(
      fc.property(
        fc.array(arbitraryRecord, { minLength: 1, maxLength: 80 }),
        fc.integer(),
        (records, seed) => {
          const set = measureSets[0]!;
          const quarter = { year: 2026, quarter: 3 as const };
          const practiceCodes = ['P1', 'P2', 'P3', 'P4', 'P5'];
          const shuffled = [...records].sort(
            (a, b) =>
              ((a.recordKey.length * 31 + seed) % 7) - ((b.recordKey.length * 31 + seed) % 7),
          );
          const a = evaluateColumns(toColumns(records, { practiceCodes }), set, quarter);
          const b = evaluateColumns(toColumns(shuffled, { practiceCodes }), set, quarter);
          expect(differences(a.counts, b.counts)).toEqual([]);
          expect(differences(a.rollupCounts, b.rollupCounts)).toEqual([]);
        },
      ),
      { numRuns: 40 },
    );
  });
});
