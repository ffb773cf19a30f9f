import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { defaultMeasureSet, defaultMeasureSetJson } from '../../test/measure-set.js';
import { record } from '../../test/records.js';
import { arbitraryRecords } from '../../test/sums-reference.js';
import { evaluateRecords } from '../measures/evaluate-records.js';
import { aggregateAt, categoryIndex } from '../measures/result.js';
import { parseMeasureSet } from '../measures/schema.js';
import { insulinProgression } from '../progression/insulin.js';
import { toColumns } from '../records/columns.js';
import { kaplanMeier } from '../stats/kaplan-meier.js';
import { wilsonInterval } from '../stats/wilson-interval.js';
import { mergeSums } from '../sums/merge-sums.js';
import type { PracticeSums } from '../sums/practice-sums.js';
import { sumsOfColumns } from '../sums/sums-of-columns.js';
import { practiceDetail } from './practice-detail.js';

/**
 * A practice's page from its sums and the region's merged sums, against the plain reference:
 * every measure in every breakdown category for the practice and the region as
 * `evaluateRecords` aggregates them, and the time to insulin as progression/insulin.ts gives it.
 */
const set = defaultMeasureSet();
const quarter = { year: 2026, quarter: 3 } as const;

describe('practiceDetail', () => {
  it('has the practice’s and the region’s breakdowns of evaluateRecords (property)', () => {
    fc.assert(
      fc.property(arbitraryRecords(4, { minLength: 1 }), (records) => {
        const all = sumsOfColumns(toColumns(records), set, quarter);
        const region = mergeSums([...all.values()]);
        const { result } = evaluateRecords(records, set, quarter, { practiceBreakdowns: true });
        const regionUnit = result.practices.length + result.localities.length;
        const code = result.practices[0] as string;
        const detail = practiceDetail(all.get(code) as PracticeSums, region, set);
        detail.measures.forEach((measure, m) => {
          for (const s of measure.splits) {
            const check = (c: number, cell: (typeof s)['everyone']): void => {
              const ours = aggregateAt(result, 0, s.split, c, m);
              const theirs = aggregateAt(result, regionUnit, s.split, c, m);
              expect(cell.practice).toEqual({
                ...ours,
                interval: wilsonInterval(ours.events, ours.n),
              });
              expect(cell.region).toEqual(theirs);
            };
            check(0, s.everyone);
            for (const d of detail.dimensions) {
              d.categories.forEach((category, i) => {
                check(categoryIndex(result, d.key, category.key), s.categories[d.key][i]!);
              });
            }
          }
        });
        // Time to insulin: the practice's and the region's Kaplan–Meier estimates.
        const progression = insulinProgression(records, quarter);
        const own = progression.practices.find((p) => p.code === code)!;
        expect([detail.progression.practice.n, detail.progression.practice.median]).toEqual([
          own?.n ?? 0,
          own?.median ?? null,
        ]);
        expect({ ...detail.progression.region, excluded: 0 }).toEqual({
          ...progression.region,
          excluded: 0,
        });
        expect(detail.progression.region.excluded).toBe(progression.excluded);
        // Grids and histograms count every eligible record once per split.
        const eligible = (split: number): number =>
          (detail.kidney.splits[split]!.practice.flat() as number[]).reduce((a, b) => a + b, 0);
        expect(eligible(0)).toBe(eligible(1) + eligible(2));
        expect(eligible(0)).toBe(result.records[1]);
        for (const v of detail.values) {
          const h = v.splits[0]!.practice;
          expect(h.notRecorded + h.below + h.above + h.bins.reduce((a, b) => a + b, 0)).toBe(
            result.records[1],
          );
          expect(v.edges).toHaveLength(h.bins.length + 1);
        }
      }),
      { numRuns: 40 },
    );
  });

  it('matches kaplanMeier on a worked life table', () => {
    const records = [2010, 2012, 2018, 2000].map((diagnosisYear, i) =>
      record({
        recordKey: `r${i}`,
        diagnosisYear,
        onInsulin: i % 2 === 0,
        insulinStartYear: i % 2 === 0 ? diagnosisYear + 3 + i : null,
      }),
    );
    const sums = sumsOfColumns(toColumns(records), set, quarter).get('P1') as PracticeSums;
    const detail = practiceDetail(sums, sums, set);
    // Times: 3 (event), 14 (censored), 5 (event), 26 (censored).
    expect({ ...detail.progression.practice, excluded: 0 }).toEqual({
      ...kaplanMeier([3, 14, 5, 26], [1, 0, 1, 0]),
      excluded: 0,
    });
  });

  it('refuses sums of another measure set or quarter', () => {
    const one = [...sumsOfColumns(toColumns([record()]), set, quarter).values()][0] as PracticeSums;
    const json = defaultMeasureSetJson();
    json.id = 'cairn-default-2026.2';
    expect(() => practiceDetail(one, one, parseMeasureSet(json))).toThrow(
      /practice's sums were made under measure set cairn-default-2026\.1/,
    );
    const later = { ...one, quarter: { year: 2026, quarter: 4 as const } };
    expect(() => practiceDetail(one, later, set)).toThrow(/region's sums are for 2026 Q4/);
  });
});
