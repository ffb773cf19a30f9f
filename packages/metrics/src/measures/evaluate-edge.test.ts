import { describe, expect, it } from 'vitest';
import { syntheticColumns } from '../../bench/synthetic.js';
import { defaultMeasureSet } from '../../test/measure-set.js';
import { createColumnBuilder, toColumns } from '../records/columns.js';
import { evaluateColumns } from './evaluate-columns.js';
import { evaluateRecords } from './evaluate-records.js';
import { aggregate, caseMixRatios, recordCounts } from './result.js';

const set = defaultMeasureSet();
const quarter = { year: 2026, quarter: 3 } as const;

describe('evaluation edge cases', () => {
  it('evaluates no records at all', () => {
    const empty = evaluateColumns(createColumnBuilder().finish(), set, quarter);
    expect(empty.practices).toEqual([]);
    expect(aggregate(empty, { measure: 'hba1c' })).toEqual({
      events: 0,
      denominator: 0,
      measured: 0,
      n: 0,
      rate: null,
    });
    expect(evaluateRecords([], set, quarter).result.records).toEqual(empty.records);
    expect(caseMixRatios(empty, 'hba1c')).toEqual([]);
  });

  it('keeps a practice with no records listed (preset practice codes) with empty aggregates', () => {
    const columns = toColumns([], { practiceCodes: ['P9'] });
    const result = evaluateColumns(columns, set, quarter);
    expect(
      aggregate(result, { level: 'practice', unit: 'P9', measure: 'bp_target' }).rate,
    ).toBeNull();
    expect(recordCounts(result, 'practice', 'P9').total).toBe(0);
  });

  it('switches practice histograms to 32 bits for a practice of 65,536 records or more', () => {
    const columns = syntheticColumns({
      records: 70_000,
      practices: 1,
      seed: 3,
      endMonthIndex: 2026 * 12 + 8,
    });
    const generated = evaluateColumns(columns, set, quarter, { caseMix: false });
    const generic = evaluateColumns(columns, set, quarter, { caseMix: false, kernel: 'generic' });
    expect(generated.counts).toBeInstanceOf(Uint32Array);
    expect(Array.from(generated.counts)).toEqual(Array.from(generic.counts));
    for (const m of generated.measures) {
      expect(aggregate(generated, { level: 'practice', unit: 'P00001', measure: m.key })).toEqual(
        aggregate(generated, { measure: m.key }),
      );
    }
    expect(recordCounts(generated).total).toBe(70_000);
  });

  it('counts records whose practices have no locality in the region only', () => {
    const columns = syntheticColumns({
      records: 2_000,
      practices: 4,
      seed: 5,
      endMonthIndex: 2026 * 12 + 8,
    });
    const result = evaluateColumns(columns, set, quarter, {
      localities: { P00001: 'L1', P00002: 'L1' },
    });
    const l1 = recordCounts(result, 'locality', 'L1').total;
    const p1 = recordCounts(result, 'practice', 'P00001').total;
    const p2 = recordCounts(result, 'practice', 'P00002').total;
    expect(l1).toBe(p1 + p2);
    expect(recordCounts(result).total).toBe(2_000);
  });
});
