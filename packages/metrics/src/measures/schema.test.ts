import { describe, expect, it } from 'vitest';
import { defaultMeasureSet, defaultMeasureSetJson } from '../../test/measure-set.js';
import { compileMeasureSet } from './compile.js';
import { MeasureSetError, parseMeasureSet, safeParseMeasureSet } from './schema.js';

function broken(
  edit: (
    json: Record<string, unknown> & {
      targets: Record<string, unknown>[];
      careProcesses: Record<string, unknown>[];
    },
  ) => void,
): string[] {
  const json = defaultMeasureSetJson() as Parameters<typeof edit>[0];
  edit(json);
  const result = safeParseMeasureSet(json);
  if (result.ok) return [];
  return result.issues.map((i) => `${i.path}: ${i.message}`);
}

describe('the default measure set', () => {
  it('parses and holds the nine care processes, the composite and the targets of methods §2–3', () => {
    const set = defaultMeasureSet();
    expect(set.id).toBe('cairn-default-2026.1');
    expect(set.careProcesses.map((p) => p.key)).toEqual([
      'hba1c',
      'blood_pressure',
      'cholesterol',
      'serum_creatinine',
      'urine_albumin',
      'foot_surveillance',
      'bmi',
      'smoking',
      'retinal_screening',
      'all_processes',
    ]);
    expect(set.targets.map((t) => t.key)).toEqual([
      'hba1c_le_48',
      'hba1c_le_53',
      'hba1c_le_58',
      'hba1c_gt_75',
      'bp_target',
      'bp_130_80',
      'cholesterol_lt_5',
      'statin_40_75',
      'lipid_managed',
      'targets_composite',
    ]);
    expect(set.retinalWindowMonths).toBe(12);
    expect(set.eligibility.minAge).toBe(12);
    for (const m of [...set.careProcesses, ...set.targets]) {
      expect(m.source.length).toBeGreaterThan(3);
      expect(m.label.length).toBeGreaterThan(3);
    }
  });

  it('cites guidelines by name, number and year', () => {
    const set = defaultMeasureSet();
    const sources = [...set.careProcesses, ...set.targets].map((m) => m.source).join('\n');
    for (const citation of ['NICE NG28', 'NICE NG17', 'NICE NG19', 'NICE NG203', 'NICE NG136']) {
      expect(sources).toContain(citation);
    }
    expect(sources).toMatch(/ADA Standards of Care in Diabetes—2025/);
  });

  it('compiles to 20 measures with the thresholds as data', () => {
    const compiled = compileMeasureSet(defaultMeasureSet());
    expect(compiled.measures).toHaveLength(20);
    const le53 = defaultMeasureSet().targets.find((t) => t.key === 'hba1c_le_53');
    expect(le53).toMatchObject({ rule: 'value', comparator: 'le', threshold: 53 });
    expect(compiled.dimensions.map((d) => d.categories.map((c) => c.key))).toEqual([
      ['12-39', '40-64', '65-79', '80+'],
      ['F', 'M', 'X', 'U'],
      ['1', '2', '3', '4', '5', 'unknown'],
      ['lt2', '2-6', '7-14', 'ge15', 'unknown'],
    ]);
  });
});

describe('an invalid measure set is refused with the path and the problem', () => {
  it('names a threshold that is not a number', () => {
    expect(broken((j) => ((j.targets[3] as Record<string, unknown>).threshold = '75'))).toContain(
      'targets[3].threshold: expected a number, got a string',
    );
  });

  it('names missing fields, unknown fields and bad enum values', () => {
    expect(broken((j) => delete (j.careProcesses[0] as Record<string, unknown>).label)).toContain(
      'careProcesses[0].label: required (expected a string)',
    );
    expect(broken((j) => ((j.targets[0] as Record<string, unknown>).colour = 'red'))).toContain(
      'targets[0]: unknown field "colour"',
    );
    expect(broken((j) => ((j.targets[0] as Record<string, unknown>).direction = 'up'))).toContain(
      'targets[0].direction: expected one of "higher", "lower"',
    );
    expect(broken((j) => ((j.targets[0] as Record<string, unknown>).rule = 'magic'))).toContain(
      'targets[0].rule: expected one of "value", "bloodPressure", "flag", "anyOf", "allOf"',
    );
  });

  it('refuses duplicate keys, unknown references and a bad id', () => {
    expect(
      broken((j) => ((j.targets[1] as Record<string, unknown>).key = 'hba1c_le_48')),
    ).toContain('targets[1].key: duplicate key "hba1c_le_48" (also targets[0])');
    expect(broken((j) => ((j.careProcesses[9] as { of: string[] }).of[2] = 'eyes'))).toContain(
      'careProcesses[9].of[2]: "eyes" is not a recorded care process',
    );
    expect(
      broken((j) => ((j.targets[9] as { of: { key: string }[] }).of[0]!.key = 'targets_composite')),
    ).toContain(
      'targets[9].of[0].key: "targets_composite" is not a target defined before this one',
    );
    expect(broken((j) => (j.id = 'default'))).toEqual([
      "id: must be a versioned id such as 'cairn-default-2026.1'",
    ]);
  });

  it('refuses inconsistent bands and ranges', () => {
    expect(
      broken((j) => ((j.breakdowns as { ageBands: number[] }).ageBands = [12, 65, 40])),
    ).toContain('breakdowns.ageBands[2]: must be greater than the value before it');
    expect(
      broken((j) => ((j.targets[7] as { population: { maxAge: number } }).population.maxAge = 30)),
    ).toContain('targets[7].population.maxAge: must not be below minAge');
    expect(
      broken((j) => ((j.targets[4] as { bands: { minAge: number }[] }).bands[0]!.minAge = 18)),
    ).toContain('targets[4].bands[0].minAge: must be 0');
  });

  // The plausible ranges of methods §7 (common practice), in the canonical unit.
  it.each([
    [
      'an HbA1c threshold of 530 (53.0 mistyped)',
      (j: Parameters<Parameters<typeof broken>[0]>[0]) => (j.targets[1]!.threshold = 530),
      'targets[1].threshold: must be between 20 and 200 mmol/mol (the plausible range of HbA1c)',
    ],
    [
      'a cholesterol threshold of 0',
      (j: Parameters<Parameters<typeof broken>[0]>[0]) => (j.targets[6]!.threshold = 0),
      'targets[6].threshold: must be between 1 and 20 mmol/L (the plausible range of total cholesterol)',
    ],
    [
      'a threshold inside a composite',
      (j: Parameters<Parameters<typeof broken>[0]>[0]) =>
        ((j.targets[8] as { of: { threshold?: number }[] }).of[1]!.threshold = 50),
      'targets[8].of[1].threshold: must be between 1 and 20 mmol/L (the plausible range of total cholesterol)',
    ],
    [
      'a blood pressure band below 60 mmHg systolic',
      (j: Parameters<Parameters<typeof broken>[0]>[0]) =>
        ((j.targets[4] as { bands: { systolicBelow: number }[] }).bands[1]!.systolicBelow = 15),
      'targets[4].bands[1].systolicBelow: must be between 60 and 260 mmHg (the plausible range of systolic blood pressure)',
    ],
    [
      'a diastolic limit of 900',
      (j: Parameters<Parameters<typeof broken>[0]>[0]) =>
        ((j.targets[5] as { bands: { diastolicBelow: number }[] }).bands[0]!.diastolicBelow = 900),
      'targets[5].bands[0].diastolicBelow: must be between 30 and 160 mmHg (the plausible range of diastolic blood pressure)',
    ],
  ])('refuses %s', (_what, edit, message) => {
    expect(broken(edit)).toEqual([message]);
  });

  it('accepts thresholds on the edges of their range', () => {
    expect(broken((j) => (j.targets[1]!.threshold = 20))).toEqual([]);
    expect(broken((j) => (j.targets[1]!.threshold = 200))).toEqual([]);
  });

  it('refuses an empty composite and over-long text, naming the field', () => {
    expect(broken((j) => ((j.careProcesses[9] as { of: string[] }).of = []))).toEqual([
      'careProcesses[9].of: must have at least 1 item(s)',
    ]);
    expect(broken((j) => (j.targets[0]!.label = 'x'.repeat(201)))).toEqual([
      'targets[0].label: must be at most 200 characters long',
    ]);
  });

  it('throws a MeasureSetError whose message lists the issues', () => {
    const json = defaultMeasureSetJson();
    json.retinalWindowMonths = 0;
    expect(() => parseMeasureSet(json)).toThrow(MeasureSetError);
    expect(() => parseMeasureSet(json)).toThrow(/retinalWindowMonths: must be at least 1/);
    expect(() => parseMeasureSet(null)).toThrow(
      /\(root\): required \(expected an object\)|\(root\): expected an object/,
    );
  });
});
