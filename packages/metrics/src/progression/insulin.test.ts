import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { syntheticColumns } from '../../bench/synthetic.js';
import { arbitraryRecord } from '../../test/arbitrary.js';
import { record } from '../../test/records.js';
import { recordAt, toColumns } from '../records/columns.js';
import { kaplanMeier } from '../stats/kaplan-meier.js';
import { insulinProgression, insulinProgressionColumns, progressionTime } from './insulin.js';

const quarter = { year: 2026, quarter: 3 } as const;

describe('progression to insulin (methods §5)', () => {
  it('takes whole years to the insulin start, or censors at the end of the window', () => {
    expect(
      progressionTime(
        record({ diagnosisYear: 2010, onInsulin: true, insulinStartYear: 2017 }),
        2026,
      ),
    ).toEqual({
      years: 7,
      event: true,
    });
    expect(progressionTime(record({ diagnosisYear: 2010, onInsulin: false }), 2026)).toEqual({
      years: 16,
      event: false,
    });
    expect(progressionTime(record({ onInsulin: null }), 2026)).toBe('excluded');
    expect(progressionTime(record({ onInsulin: true, insulinStartYear: null }), 2026)).toBe(
      'excluded',
    );
    expect(
      progressionTime(
        record({ diagnosisYear: 2015, onInsulin: true, insulinStartYear: 2014 }),
        2026,
      ),
    ).toBe('excluded');
    expect(progressionTime(record({ diabetesType: 'type1', onInsulin: true }), 2026)).toBeNull();
    expect(progressionTime(record({ birthYear: 2016, onInsulin: false }), 2026)).toBeNull();
  });

  it('estimates the region’s median like kaplanMeier on the same times', () => {
    const records = [
      record({ practiceCode: 'A', diagnosisYear: 2010, onInsulin: true, insulinStartYear: 2013 }),
      record({ practiceCode: 'A', diagnosisYear: 2018, onInsulin: false }),
      record({ practiceCode: 'B', diagnosisYear: 2000, onInsulin: true, insulinStartYear: 2009 }),
      record({ practiceCode: 'B', diagnosisYear: 2020, onInsulin: true, insulinStartYear: 2025 }),
      record({ practiceCode: 'B', diagnosisYear: 2012, onInsulin: false }),
    ];
    const result = insulinProgression(records, quarter);
    const km = kaplanMeier([3, 8, 9, 5, 14], [1, 0, 1, 1, 0]);
    expect(result.region).toEqual(km);
    expect(result.practices.map((p) => [p.code, p.n, p.events])).toEqual([
      ['A', 2, 1],
      ['B', 3, 2],
    ]);
  });

  it('gives the same result from columns as from records (property)', () => {
    fc.assert(
      fc.property(fc.array(arbitraryRecord, { maxLength: 60 }), (records) => {
        const fromRecords = insulinProgression(records, quarter);
        const fromColumns = insulinProgressionColumns(toColumns(records), quarter);
        expect(fromColumns).toEqual(fromRecords);
      }),
    );
  });

  // The rule of thumb that people with type 2 diabetes need insulin about seven years after
  // diagnosis on average is common practice in the field, with no single source; the synthetic
  // generator is tuned to land near it.
  it('lands near seven years on the synthetic region (common practice, no source)', () => {
    const columns = syntheticColumns({
      records: 20_000,
      practices: 40,
      seed: 7,
      endMonthIndex: 2026 * 12 + 8,
    });
    const result = insulinProgressionColumns(columns, quarter);
    expect(result.region.median).toBeGreaterThanOrEqual(5);
    expect(result.region.median).toBeLessThanOrEqual(9);
    const again = insulinProgression(
      Array.from({ length: 2000 }, (_, i) => recordAt(columns, i)),
      quarter,
    );
    expect(again.region.n).toBeGreaterThan(0);
  });
});
