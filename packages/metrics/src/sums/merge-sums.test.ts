import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { defaultMeasureSet, defaultMeasureSetJson } from '../../test/measure-set.js';
import { record } from '../../test/records.js';
import { arbitraryRecords } from '../../test/sums-reference.js';
import { parseMeasureSet } from '../measures/schema.js';
import { toColumns } from '../records/columns.js';
import { addSums, mergeSums, replaceSums } from './merge-sums.js';
import { type PracticeSums, SumsMismatchError } from './practice-sums.js';
import { sumsOfColumns } from './sums-of-columns.js';

/**
 * Localities and the region are sums of practices: merging practices' sums gives exactly the
 * sums of all their records taken as one practice, in any grouping and order.
 */
const set = defaultMeasureSet();
const quarter = { year: 2026, quarter: 3 } as const;

function sumsOf(records: Parameters<typeof toColumns>[0]): PracticeSums[] {
  return [...sumsOfColumns(toColumns(records), set, quarter).values()];
}

describe('mergeSums', () => {
  it('equals the sums of every record taken as one practice (property)', () => {
    fc.assert(
      fc.property(arbitraryRecords(6, { minLength: 1 }), (records) => {
        const practices = sumsOf(records);
        const merged = mergeSums(practices);
        const whole = sumsOf(records.map((r) => ({ ...r, practiceCode: 'R' })))[0] as PracticeSums;
        expect({ ...merged, practices: 1 }).toEqual(whole);
        expect(merged.practices).toBe(practices.length);
      }),
      { numRuns: 60 },
    );
  });

  it('does not depend on grouping or order', () => {
    fc.assert(
      fc.property(arbitraryRecords(5, { minLength: 3 }), (records) => {
        const practices = sumsOf(records);
        if (practices.length < 3) return;
        const [a, b, c] = practices as [PracticeSums, PracticeSums, PracticeSums];
        expect(addSums(a, addSums(b, c))).toEqual(addSums(addSums(a, b), c));
        expect(mergeSums([c, a, b])).toEqual(mergeSums([a, b, c]));
        expect(mergeSums([a])).toEqual(a);
      }),
      { numRuns: 40 },
    );
  });

  it('replaceSums: the total minus the practices that left plus those that joined (property)', () => {
    fc.assert(
      fc.property(
        arbitraryRecords(7, { minLength: 1 }),
        arbitraryRecords(4, { minLength: 1 }),
        fc.array(fc.boolean(), { minLength: 7, maxLength: 7 }),
        (records, joining, leaves) => {
          const before = sumsOf(records);
          const joined = sumsOf(joining.map((r) => ({ ...r, practiceCode: `J${r.practiceCode}` })));
          const removed = before.filter((_, i) => leaves[i]);
          const kept = before.filter((_, i) => !leaves[i]);
          const replaced = replaceSums(mergeSums(before), removed, joined);
          const now = [...kept, ...joined];
          expect(replaced).toEqual(now.length === 0 ? null : mergeSums(now));
          // Everyone leaving: nothing is left.
          expect(replaceSums(mergeSums(before), before, [])).toBeNull();
        },
      ),
      { numRuns: 60 },
    );
  });

  it('replaceSums refuses to remove what the total does not hold', () => {
    const [a, b] = sumsOf([record({ practiceCode: 'A' }), record({ practiceCode: 'B' })]) as [
      PracticeSums,
      PracticeSums,
    ];
    expect(() => replaceSums(a, [a, b], [])).toThrow(/not part of the total/);
  });

  it('refuses sums of other quarters or measure sets, and an empty list', () => {
    const a = sumsOf([record()])[0] as PracticeSums;
    const other = [
      ...sumsOfColumns(toColumns([record()]), set, { year: 2026, quarter: 2 }).values(),
    ][0] as PracticeSums;
    expect(() => mergeSums([a, other])).toThrow(SumsMismatchError);
    expect(() => mergeSums([a, other])).toThrow(/sums\[1\] are for 2026 Q2, sums\[0\] for 2026 Q3/);
    const json = defaultMeasureSetJson();
    json.id = 'cairn-default-2026.2';
    const foreign = [
      ...sumsOfColumns(toColumns([record()]), parseMeasureSet(json), quarter).values(),
    ][0] as PracticeSums;
    expect(() => addSums(a, foreign)).toThrow(/measure set cairn-default-2026\.2/);
    expect(() => mergeSums([])).toThrow(/at least one/);
  });
});
