import { describe, expect, it } from 'vitest';
import { defaultMeasureSet } from '../../test/measure-set.js';
import { complete, record } from '../../test/records.js';
import { toColumns } from '../records/columns.js';
import type { CareRecord } from '../records/record.js';
import type { Outcome, TypeSplit } from './compile.js';
import { evaluateColumns } from './evaluate-columns.js';
import { evaluateRecord, evaluateRecords } from './evaluate-records.js';
import { aggregate, caseMixRatios, eligibleCount, recordCounts, unitAggregates } from './result.js';

/**
 * Hand-built records for 2026 Q3 (review window 2025-10 … 2026-09, ages and durations counted to
 * 2026) whose every outcome is worked out by hand below, from the rules of docs/methods.md §1–3.
 */
const quarter = { year: 2026, quarter: 3 } as const;
const set = defaultMeasureSet();
const localities = { P1: 'L1', P2: 'L1' }; // P3 has no locality

const records: CareRecord[] = [
  // r1: everything done in 2026-03; HbA1c 50, BP 128/76, cholesterol 4.2, on a statin; 66.
  complete('2026-03', {
    recordKey: 'r1',
    practiceCode: 'P1',
    birthYear: 1960,
    diagnosisYear: 2015,
  }),
  // r2: type 1, 26; HbA1c 48 on the window's first month; BP one month before it; retinal
  // screening 21 months ago; not on a statin; nothing else.
  record({
    recordKey: 'r2',
    practiceCode: 'P1',
    diabetesType: 'type1',
    birthYear: 2000,
    sex: 'M',
    diagnosisYear: 2025,
    deprivationQuintile: null,
    hba1c: { month: '2025-10', mmolMol: 48 },
    bloodPressure: { month: '2025-09', systolic: 120, diastolic: 70 },
    retinalScreening: { month: '2024-12' },
    onStatin: false,
  }),
  // r3: type 2, 86, sex X, diagnosis year unknown; BP 145/85 in the window's last month (target
  // from 80: below 150/90); HbA1c 80; cholesterol exactly 5.0; statin not recorded.
  record({
    recordKey: 'r3',
    practiceCode: 'P2',
    birthYear: 1940,
    sex: 'X',
    diagnosisYear: null,
    deprivationQuintile: 1,
    bloodPressure: { month: '2026-09', systolic: 145, diastolic: 85 },
    hba1c: { month: '2026-09', mmolMol: 80 },
    cholesterol: { month: '2026-01', totalMmolL: 5.0 },
  }),
  // r4: other type, 75 (in the statin population), sex not recorded, 15 years since diagnosis;
  // BP 139/89 (below 140/90); on a statin; nothing else.
  record({
    recordKey: 'r4',
    practiceCode: 'P2',
    diabetesType: 'other',
    birthYear: 1951,
    sex: 'U',
    diagnosisYear: 2011,
    deprivationQuintile: 5,
    bloodPressure: { month: '2026-06', systolic: 139, diastolic: 89 },
    onStatin: true,
  }),
  // r5: 11 years old at the end of the window: not eligible.
  record({ recordKey: 'r5', practiceCode: 'P3', birthYear: 2015, diagnosisYear: 2020 }),
  // r6: diabetes type not recorded: not eligible.
  record({ recordKey: 'r6', practiceCode: 'P3', diabetesType: null }),
  // r7: type 2, 40 (in the statin population), not on a statin; BP recorded after the window;
  // HbA1c 40; cholesterol 6.
  record({
    recordKey: 'r7',
    practiceCode: 'P3',
    birthYear: 1986,
    sex: 'M',
    diagnosisYear: 2024,
    deprivationQuintile: 2,
    bloodPressure: { month: '2026-10', systolic: 150, diastolic: 95 },
    hba1c: { month: '2025-11', mmolMol: 40 },
    cholesterol: { month: '2026-02', totalMmolL: 6 },
    onStatin: false,
  }),
  // r8: everything done in 2026-09; 76 (outside the statin population); on a statin.
  complete('2026-09', {
    recordKey: 'r8',
    practiceCode: 'P1',
    birthYear: 1950,
    diagnosisYear: 2020,
    deprivationQuintile: 4,
  }),
];

const M: Outcome = 'met';
const N: Outcome = 'not_met';
const U: Outcome = 'unknown';
const X: Outcome = 'excluded';
const allDone: Outcome[] = [M, M, M, M, M, M, M, M, M, M];
// Outcomes in measure-set order: 9 care processes, all_processes, then the ten targets
// (≤48, ≤53, ≤58, >75, bp_target, bp_130_80, cholesterol_lt_5, statin_40_75, lipid_managed,
// targets_composite).
const expected: Record<string, Outcome[] | null> = {
  r1: [...allDone, N, M, M, N, M, M, M, M, M, M],
  r2: [M, N, N, N, N, N, N, N, N, N, M, M, M, N, U, U, U, X, U, U],
  r3: [M, M, M, N, N, N, N, N, N, N, N, N, N, M, M, N, N, X, U, N],
  r4: [N, M, N, N, N, N, N, N, N, N, U, U, U, U, M, N, U, M, M, U],
  r5: null,
  r6: null,
  r7: [M, N, M, N, N, N, N, N, N, N, M, M, M, N, U, U, N, N, N, N],
  r8: [...allDone, N, M, M, N, M, M, M, X, M, M],
};
const categoriesOf: Record<
  string,
  { ageBand: string; sex: string; deprivation: string; duration: string }
> = {
  r1: { ageBand: '65-79', sex: 'F', deprivation: '3', duration: '7-14' },
  r2: { ageBand: '12-39', sex: 'M', deprivation: 'unknown', duration: 'lt2' },
  r3: { ageBand: '80+', sex: 'X', deprivation: '1', duration: 'unknown' },
  r4: { ageBand: '65-79', sex: 'U', deprivation: '5', duration: 'ge15' },
  r7: { ageBand: '40-64', sex: 'M', deprivation: '2', duration: '2-6' },
  r8: { ageBand: '65-79', sex: 'F', deprivation: '4', duration: '2-6' },
};

describe('per-record outcomes (plain evaluation)', () => {
  const { outcomes } = evaluateRecords(records, set, quarter, { localities });
  const keys = set.careProcesses.map((p) => p.key).concat(set.targets.map((t) => t.key));

  it.each(records.map((r, i) => [r.recordKey, i] as const))(
    '%s: every outcome as worked by hand',
    (key, i) => {
      const outcome = outcomes[i]!;
      const want = expected[key];
      if (want === null || want === undefined) {
        expect(outcome.eligible).toBe(false);
        expect(outcome.outcomes).toEqual({});
      } else {
        expect(outcome.eligible).toBe(true);
        expect(keys.map((k) => outcome.outcomes[k])).toEqual(want);
        expect(outcome.categories).toEqual(categoriesOf[key]);
      }
    },
  );

  it('gives the reason a record is not eligible', () => {
    expect(outcomes[4]?.exclusion).toBe('under_age');
    expect(outcomes[5]?.exclusion).toBe('unknown_type');
    expect(outcomes[4]?.age).toBe(11);
  });

  it('counts retinal screening over the measure set’s retinal window (24 months here)', () => {
    const twoYearly = { ...set, id: 'test-retinal-2026.1', retinalWindowMonths: 24 };
    expect(evaluateRecord(records[1]!, twoYearly, quarter).outcomes.retinal_screening).toBe('met');
    expect(evaluateRecord(records[1]!, set, quarter).outcomes.retinal_screening).toBe('not_met');
  });
});

type Unit = { level: 'practice' | 'locality' | 'region'; unit?: string; members: string[] };
const units: Unit[] = [
  { level: 'practice', unit: 'P1', members: ['P1'] },
  { level: 'practice', unit: 'P2', members: ['P2'] },
  { level: 'practice', unit: 'P3', members: ['P3'] },
  { level: 'locality', unit: 'L1', members: ['P1', 'P2'] },
  { level: 'region', members: ['P1', 'P2', 'P3'] },
];
const splits: TypeSplit[] = ['all', 'type1', 'type2_other'];
const inSplit = (r: CareRecord, split: TypeSplit): boolean =>
  split === 'all' || (split === 'type1') === (r.diabetesType === 'type1');

/** The aggregate counted directly from the hand-worked outcomes. */
function counted(unit: Unit, split: TypeSplit, measure: number, filter: (key: string) => boolean) {
  let events = 0;
  let measured = 0;
  let denominator = 0;
  for (const r of records) {
    const want = expected[r.recordKey];
    if (
      !want ||
      !unit.members.includes(r.practiceCode) ||
      !inSplit(r, split) ||
      !filter(r.recordKey)
    ) {
      continue;
    }
    const o = want[measure];
    if (o === 'excluded') continue;
    denominator++;
    if (o !== 'unknown') measured++;
    if (o === 'met') events++;
  }
  return { events, measured, denominator };
}

describe.each([
  ['plain', false],
  ['columnar (generated)', false],
  ['columnar (generic)', false],
  ['plain with practice breakdowns', true],
  ['columnar with practice breakdowns', true],
] as const)('aggregates, %s', (path, practiceBreakdowns) => {
  const result = path.startsWith('plain')
    ? evaluateRecords(records, set, quarter, { localities, practiceBreakdowns }).result
    : evaluateColumns(toColumns(records), set, quarter, {
        localities,
        practiceBreakdowns,
        kernel: path.includes('generic') ? 'generic' : 'generated',
      });
  const keys = result.measures.map((m) => m.key);

  it('agree with counts of the hand-worked outcomes for every unit, split and measure', () => {
    for (const unit of units) {
      for (const split of splits) {
        keys.forEach((measure, m) => {
          const a = aggregate(result, { level: unit.level, unit: unit.unit, split, measure });
          const want = counted(unit, split, m, () => true);
          expect({ measure, unit: unit.unit, split, ...pick(a) }).toEqual({
            measure,
            unit: unit.unit,
            split,
            ...want,
          });
        });
      }
    }
  });

  it('agree for every breakdown category of localities and the region (and practices when kept)', () => {
    for (const unit of units) {
      if (unit.level === 'practice' && !practiceBreakdowns) continue;
      for (const d of result.dimensions) {
        const field = d.key === 'age_band' ? 'ageBand' : d.key;
        for (const c of d.categories) {
          keys.forEach((measure, m) => {
            const a = aggregate(result, {
              level: unit.level,
              unit: unit.unit,
              dimension: d.key,
              category: c.key,
              measure,
            });
            const want = counted(
              unit,
              'all',
              m,
              (key) => categoriesOf[key]?.[field as 'sex'] === c.key,
            );
            expect({ d: d.key, c: c.key, measure, ...pick(a) }).toEqual({
              d: d.key,
              c: c.key,
              measure,
              ...want,
            });
          });
        }
      }
    }
  });

  it('match a few figures worked by hand', () => {
    // HbA1c above 75 counts among those measured: r3 of r1, r2, r3, r7, r8.
    expect(aggregate(result, { measure: 'hba1c_gt_75' })).toEqual({
      events: 1,
      denominator: 6,
      measured: 5,
      n: 5,
      rate: 0.2,
    });
    // On a statin among those aged 40–75: r1 and r4 of r1, r4, r7.
    expect(aggregate(result, { measure: 'statin_40_75' }).rate).toBeCloseTo(2 / 3, 15);
    // Locality L1, blood pressure target: r1, r3, r4, r8 of five (r2 unknown counts as not met).
    expect(aggregate(result, { level: 'locality', unit: 'L1', measure: 'bp_target' }).rate).toBe(
      0.8,
    );
    expect(
      aggregate(result, { level: 'practice', unit: 'P1', split: 'type1', measure: 'hba1c' }),
    ).toMatchObject({
      events: 1,
      denominator: 1,
    });
    expect(recordCounts(result, 'practice', 'P3')).toEqual({
      total: 3,
      eligible: 1,
      unknownType: 1,
      underAge: 1,
    });
    expect(recordCounts(result)).toEqual({ total: 8, eligible: 6, unknownType: 1, underAge: 1 });
    const femaleP1 = { level: 'practice', unit: 'P1', dimension: 'sex', category: 'F' } as const;
    if (practiceBreakdowns) expect(eligibleCount(result, femaleP1)).toBe(2);
    else expect(() => eligibleCount(result, femaleP1)).toThrow(/practiceBreakdowns/);
    expect(eligibleCount(result, { level: 'practice', unit: 'P1' })).toBe(3);
    expect(eligibleCount(result, { dimension: 'age_band', category: '65-79' })).toBe(3);
    expect(eligibleCount(result, { level: 'locality', unit: 'L1', split: 'type2_other' })).toBe(4);
    expect(unitAggregates(result, 'all_processes').map((u) => [u.code, u.events, u.n])).toEqual([
      ['P1', 2, 3],
      ['P2', 0, 2],
      ['P3', 0, 1],
    ]);
  });

  it('keeps Σ O = Σ E over the region for the case-mix ratios', () => {
    for (const measure of keys) {
      const rows = caseMixRatios(result, measure);
      const o = rows.reduce((s, r) => s + r.observed, 0);
      const e = rows.reduce((s, r) => s + r.expected, 0);
      expect(e).toBeCloseTo(o, 10);
    }
  });

  it(
    practiceBreakdowns
      ? 'keeps practice breakdowns'
      : 'refuses practice breakdowns it did not compute',
    () => {
      const query = {
        level: 'practice',
        unit: 'P1',
        dimension: 'sex',
        category: 'F',
        measure: 'hba1c',
      } as const;
      if (practiceBreakdowns) expect(aggregate(result, query).events).toBe(2);
      else expect(() => aggregate(result, query)).toThrow(/practiceBreakdowns/);
    },
  );
});

function pick(a: { events: number; measured: number; denominator: number }) {
  return { events: a.events, measured: a.measured, denominator: a.denominator };
}

describe('query errors name the problem', () => {
  const { result } = evaluateRecords(records, set, quarter, { localities });
  it('for an unknown measure, unit, split or category', () => {
    expect(() => aggregate(result, { measure: 'eyes' })).toThrow(/measure "eyes"/);
    expect(() => aggregate(result, { level: 'practice', unit: 'P9', measure: 'hba1c' })).toThrow(
      /P9/,
    );
    expect(() => aggregate(result, { split: 'type3' as 'all', measure: 'hba1c' })).toThrow(/split/);
    expect(() => aggregate(result, { dimension: 'sex', category: 'Z', measure: 'hba1c' })).toThrow(
      /category "Z"/,
    );
  });
});
