import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { type MeasureSet, parseMeasureSet } from '@cairn/metrics';
import { findRepoRoot } from '../config/load-config.js';
import { fieldLabel, measureSetChanges } from './measure-set-changes.js';
import { MEASURE_SET_FOLDER } from './measure-sets.service.js';

const shipped = (): MeasureSet =>
  parseMeasureSet(
    JSON.parse(
      readFileSync(join(findRepoRoot(), MEASURE_SET_FOLDER, 'cairn-default-2026.1.json'), 'utf8'),
    ),
  );

type Edit = (s: MeasureSet & Record<string, unknown>) => void;
const target = (s: MeasureSet, key: string) =>
  s.targets.find((t) => t.key === key) as Record<string, unknown> & { population: object };

/** The changes after one edit, without the definition-in-words lines. */
function changed(edit: Edit) {
  const to = structuredClone(shipped()) as MeasureSet & Record<string, unknown>;
  edit(to);
  return measureSetChanges(shipped(), parseMeasureSet(to))
    .filter((c) => c.field !== 'definition')
    .map((c) => [c.kind, c.measureKey, c.fieldLabel, c.before, c.after]);
}

describe('the differences between two measure-set versions', () => {
  it('finds none between a version and itself', () => {
    expect(measureSetChanges(shipped(), shipped())).toEqual([]);
  });

  it.each<[string, Edit, unknown[][]]>([
    [
      'the retinal window',
      (s) => (s.retinalWindowMonths = 24),
      [['changed', null, 'Retinal window (months)', '12', '24']],
    ],
    [
      'a threshold',
      (s) => (target(s, 'cholesterol_lt_5').threshold = 4),
      [['changed', 'cholesterol_lt_5', 'Threshold', '5', '4']],
    ],
    [
      'a denominator kind, in words',
      (s) => (target(s, 'hba1c_le_48').denominator = 'measured'),
      [
        [
          'changed',
          'hba1c_le_48',
          'Denominator',
          'everyone in the population',
          'people with a result in the review window',
        ],
      ],
    ],
    [
      'population filters',
      (s) => {
        Object.assign(target(s, 'statin_40_75').population, { types: ['type2'], maxAge: null });
      },
      [
        ['changed', 'statin_40_75', 'Diabetes types', 'type 1, type 2, other', 'type 2'],
        ['changed', 'statin_40_75', 'Oldest age', '75', 'no upper bound'],
      ],
    ],
    [
      'a composite list',
      (s) => {
        const all = s.careProcesses[9] as { of: string[] };
        all.of = all.of.filter((k) => k !== 'bmi');
      },
      [
        [
          'changed',
          'all_processes',
          'Combines',
          'hba1c, blood_pressure, cholesterol, serum_creatinine, urine_albumin, foot_surveillance, bmi, smoking, retinal_screening',
          'hba1c, blood_pressure, cholesterol, serum_creatinine, urine_albumin, foot_surveillance, smoking, retinal_screening',
        ],
      ],
    ],
    [
      'a part of a composite target and a blood pressure band',
      (s) => {
        (target(s, 'lipid_managed').of as { threshold?: number }[])[1]!.threshold = 4.5;
        (target(s, 'bp_target').bands as { systolicBelow: number }[])[1]!.systolicBelow = 145;
      },
      [
        ['changed', 'bp_target', 'Band 2: systolic below (mmHg)', '150', '145'],
        ['changed', 'lipid_managed', 'Part 2: threshold', '5', '4.5'],
      ],
    ],
    [
      'a guideline source and a note',
      (s) => {
        target(s, 'cholesterol_lt_5').source = 'Regional lipid pathway 2026';
        target(s, 'cholesterol_lt_5').note = 'Local target.';
      },
      [
        [
          'changed',
          'cholesterol_lt_5',
          'Guideline source',
          'Common practice',
          'Regional lipid pathway 2026',
        ],
        ['changed', 'cholesterol_lt_5', 'Note', null, 'Local target.'],
      ],
    ],
    [
      'a measure removed and one added',
      (s) => {
        s.targets = s.targets.filter((t) => t.key !== 'bp_130_80');
        s.targets.push({
          ...target(s, 'cholesterol_lt_5'),
          key: 'cholesterol_lt_4',
          threshold: 4,
        } as never);
      },
      [
        [
          'added',
          'cholesterol_lt_4',
          'Measure added',
          null,
          'Latest total cholesterol in the review window below 4 mmol/L',
        ],
        [
          'removed',
          'bp_130_80',
          'Measure removed',
          'Latest blood pressure in the review window below 130/80 mmHg',
          null,
        ],
      ],
    ],
  ])('names %s', (_, edit, expected) => {
    expect(changed(edit)).toEqual(expected);
  });

  it('adds the definition in words before and after for a measure that changed', () => {
    const to = structuredClone(shipped());
    (to.targets[1] as { threshold: number }).threshold = 50;
    const words = measureSetChanges(shipped(), to).filter(
      (c) => c.measureKey === 'hba1c_le_53' && c.field === 'definition',
    );
    expect(words).toEqual([
      expect.objectContaining({
        before: 'Latest HbA1c in the review window 53 mmol/mol or below',
        after: 'Latest HbA1c in the review window 50 mmol/mol or below',
      }),
    ]);
  });

  it.each([
    ['threshold', 'Threshold'],
    ['population.minAge', 'Youngest age'],
    ['of[0].threshold', 'Part 1: threshold'],
    ['of[2].bands[1].diastolicBelow', 'Part 3: band 2: diastolic below (mmHg)'],
    ['bands[0].minAge', 'Band 1: from age'],
    ['somethingNew', 'somethingNew'],
  ])('labels the field %s as “%s”', (path, label) => {
    expect(fieldLabel(path)).toBe(label);
  });
});
