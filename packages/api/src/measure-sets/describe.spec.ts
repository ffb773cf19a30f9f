import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { parseMeasureSet, type MeasureSet } from '@cairn/metrics';
import { findRepoRoot } from '../config/load-config.js';
import {
  denominatorText,
  describeMeasures,
  type MeasureView,
  nameComponents,
  populationText,
} from './describe.js';
import { decodeMeasureSet, MEASURE_SET_FOLDER } from './measure-sets.service.js';

const file = join(findRepoRoot(), MEASURE_SET_FOLDER, 'cairn-default-2026.1.json');
const shipped = readFileSync(file, 'utf8');
const views = describeMeasures(parseMeasureSet(JSON.parse(shipped)));
const byKey = new Map(views.map((v) => [v.key, v]));

describe('describeMeasures (the shipped measure set)', () => {
  it.each([
    ['hba1c', 'care_process', 'HbA1c recorded in the review window', [['hba1c', 'review']]],
    [
      'retinal_screening',
      'care_process',
      'Retinal screening recorded in the retinal window (the 12 months ending with the quarter)',
      [['retinalScreening', 'retinal']],
    ],
    [
      'hba1c_le_53',
      'treatment_target',
      'Latest HbA1c in the review window 53 mmol/mol or below',
      [['hba1c', 'review']],
    ],
    [
      'hba1c_gt_75',
      'treatment_target',
      'Latest HbA1c in the review window above 75 mmol/mol',
      [['hba1c', 'review']],
    ],
    [
      'cholesterol_lt_5',
      'treatment_target',
      'Latest total cholesterol in the review window below 5 mmol/L',
      [['cholesterol', 'review']],
    ],
    [
      'bp_target',
      'treatment_target',
      'Latest blood pressure in the review window below 140/90 mmHg; from age 80, below 150/90 mmHg',
      [['bloodPressure', 'review']],
    ],
    ['statin_40_75', 'treatment_target', 'Recorded as on a statin', [['onStatin', null]]],
    [
      'lipid_managed',
      'treatment_target',
      'At least one of: recorded as on a statin; latest total cholesterol in the review window below 5 mmol/L',
      [
        ['onStatin', null],
        ['cholesterol', 'review'],
      ],
    ],
    [
      'targets_composite',
      'treatment_target',
      'All of: “HbA1c 53 mmol/mol (7.0 %) or below” met; “Blood pressure below 140/90 mmHg (below 150/90 mmHg from age 80)” met; “On a statin or total cholesterol below 5.0 mmol/L” met',
      [
        ['hba1c', 'review'],
        ['bloodPressure', 'review'],
        ['onStatin', null],
        ['cholesterol', 'review'],
      ],
    ],
  ])('%s: %s, “%s”', (key, kind, definition, reads) => {
    const view = byKey.get(key)!;
    expect(view.kind).toBe(kind);
    expect(view.definition).toBe(definition);
    expect(view.reads.map((r) => [r.field, r.window])).toEqual(reads);
  });

  it('lists a composite care process’s parts, and reads every field they read', () => {
    const all = byKey.get('all_processes')!;
    expect(all.composite).toBe(true);
    expect(all.components).toEqual([
      'hba1c',
      'blood_pressure',
      'cholesterol',
      'serum_creatinine',
      'urine_albumin',
      'foot_surveillance',
      'bmi',
      'smoking',
      'retinal_screening',
    ]);
    expect(all.reads).toHaveLength(9);
    expect(all.definition).toMatch(
      /^Every one of these recorded, each in its window: HbA1c recorded; /,
    );
    expect(byKey.get('targets_composite')!.components).toEqual([
      'hba1c_le_53',
      'bp_target',
      'lipid_managed',
    ]);
    expect(byKey.get('lipid_managed')!.components).toEqual([]);
  });

  it('keeps the compiled order: care processes first, then targets, index by index', () => {
    expect(views.map((v) => v.index)).toEqual(views.map((_, i) => i));
    expect(views.findIndex((v) => v.kind === 'treatment_target')).toBe(10);
    expect(views).toHaveLength(20);
  });

  it.each([
    [
      { types: ['type1', 'type2', 'other'], minAge: null, maxAge: null },
      'Eligible people with any type of diabetes',
    ],
    [
      { types: ['type1', 'type2', 'other'], minAge: 40, maxAge: 75 },
      'Eligible people with any type of diabetes, aged 40–75',
    ],
    [
      { types: ['type1'], minAge: 18, maxAge: null },
      'Eligible people with type 1 diabetes, aged 18 or over',
    ],
    [
      { types: ['type2', 'other'], minAge: null, maxAge: 39 },
      'Eligible people with type 2 or another type of diabetes, aged 39 or under',
    ],
  ] as const)('population %j reads “%s”', (population, text) => {
    expect(populationText({ ...population, types: [...population.types] })).toBe(text);
  });

  it('says what each denominator counts', () => {
    expect(denominatorText('eligible')).toMatch(/everyone in the population/);
    expect(denominatorText('measured')).toMatch(/with a result in the review window/);
  });

  it.each([
    ['lt', 'below 7 mmol/L'],
    ['le', '7 mmol/L or below'],
    ['gt', 'above 7 mmol/L'],
    ['ge', '7 mmol/L or above'],
  ] as const)('comparator %s reads “%s”', (comparator, words) => {
    const set = JSON.parse(shipped) as MeasureSet;
    const target = set.targets.find((t) => t.key === 'cholesterol_lt_5') as Extract<
      MeasureSet['targets'][number],
      { rule: 'value' }
    >;
    target.comparator = comparator;
    target.threshold = 7;
    const view = describeMeasures(parseMeasureSet(set)).find((v) => v.key === 'cholesterol_lt_5')!;
    expect(view.definition).toBe(`Latest total cholesterol in the review window ${words}`);
  });
});

/** Every text of a measure that people read. */
const wordsOf = (v: MeasureView) => [
  v.label,
  v.definition,
  v.denominatorText,
  v.populationText,
  v.source,
  v.note ?? '',
];
/**
 * Keys that no sentence would hold by chance (an underscore or a digit in them); a key that is an
 * ordinary word ("cholesterol", "smoking") may well appear in a sentence as that word.
 */
const codeKeys = views.map((v) => v.key).filter((key) => /[_0-9]/.test(key));
/** A measure key as a whole word (keys are letters, digits and underscores). */
const keyIn = (text: string, key: string) =>
  new RegExp(`(?<![A-Za-z0-9_])${key}(?![A-Za-z0-9_])`).test(text);

describe('measure texts name measures by their labels, never by key', () => {
  it('checks every key that looks like code', () => {
    expect(codeKeys).toEqual(expect.arrayContaining(['hba1c', 'hba1c_le_53', 'bp_target']));
  });

  it('reads the composite target’s guideline in its parts’ labels', () => {
    expect(byKey.get('targets_composite')!.source).toBe(
      'Cairn composite of “HbA1c 53 mmol/mol (7.0 %) or below”, “Blood pressure below 140/90 mmHg (below 150/90 mmHg from age 80)” and “On a statin or total cholesterol below 5.0 mmol/L”',
    );
  });

  it.each(views.map((v) => [v.key, v] as const))(
    '%s: no text of it holds a measure key',
    (_key, view) => {
      for (const text of wordsOf(view)) {
        for (const key of codeKeys) expect([key, keyIn(text, key)]).toEqual([key, false]);
      }
    },
  );

  it.each([
    ['the parts named by key', 'Of a_b and c', ['a_b', 'c'], 'Of “A B” and “C”'],
    ['a longer key first', 'a_b_c then a_b', ['a_b', 'a_b_c'], '“A B C” then “A B”'],
    ['only whole words', 'a_bc, xa_b, a_b2 and a_b.', ['a_b'], 'a_bc, xa_b, a_b2 and “A B”.'],
    ['a key without a label kept', 'Of a_b and zz', ['a_b', 'zz'], 'Of “A B” and zz'],
    ['keys that are not parts kept', 'Of c', ['a_b'], 'Of c'],
    ['characters special to patterns', 'Of a.b', ['a.b'], 'Of “A dot B”'],
  ])('nameComponents: %s', (_case, text, components, expected) => {
    const labels: Record<string, string> = { a_b: 'A B', a_b_c: 'A B C', c: 'C', 'a.b': 'A dot B' };
    expect(nameComponents(text, components, (key) => labels[key])).toBe(expected);
  });
});

describe('decodeMeasureSet', () => {
  it('decodes, compiles and describes the shipped file', () => {
    const version = decodeMeasureSet(file, shipped);
    expect(version.id).toBe('cairn-default-2026.1');
    expect(version.compiled.measures.map((m) => m.key)).toEqual(version.measures.map((m) => m.key));
  });

  it('names the file and the problem for invalid JSON', () => {
    expect(() => decodeMeasureSet('/x/cairn-default-2026.1.json', '{')).toThrow(
      /^measure set cairn-default-2026\.1\.json is not valid JSON: /,
    );
  });

  it('names the file, the path and the problem of an invalid measure set', () => {
    const set = JSON.parse(shipped) as { targets: { threshold?: unknown }[] };
    set.targets[0]!.threshold = 'high';
    expect(() => decodeMeasureSet('cairn-default-2026.1.json', JSON.stringify(set))).toThrow(
      'measure set cairn-default-2026.1.json: invalid measure set: targets[0].threshold: expected a number, got a string',
    );
  });

  it('refuses a file not named after the id it declares', () => {
    expect(() => decodeMeasureSet('cairn-default-2026.2.json', shipped)).toThrow(
      'measure set cairn-default-2026.2.json declares the id "cairn-default-2026.1"; the file must be named cairn-default-2026.1.json',
    );
  });
});
