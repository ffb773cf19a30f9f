import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { type CareRecord, evaluateRecord, type Outcome, reviewWindow } from '@cairn/metrics';
import { findRepoRoot } from '../../config/load-config.js';
import { decodeMeasureSet, MEASURE_SET_FOLDER } from '../../measure-sets/measure-sets.service.js';
import { formatNumber, readingOf } from './readings.js';
import { recallItem } from './recall-item.js';
import { inDenominator, reasonText, recallReason } from './recall-rule.js';
import { csvLine, recallCells, recallColumns } from './recall-sheet.js';

const version = decodeMeasureSet(
  'cairn-default-2026.1.json',
  readFileSync(join(findRepoRoot(), MEASURE_SET_FOLDER, 'cairn-default-2026.1.json'), 'utf8'),
);
const measure = (key: string) => version.measures.find((m) => m.key === key)!;
/** 2026 Q3: review window 2025-10 … 2026-09 */
const Q3 = { year: 2026, quarter: 3 } as const;
const window = reviewWindow(Q3, 12);

function record(overrides: Partial<CareRecord> = {}): CareRecord {
  return {
    practiceCode: 'OV102',
    recordKey: 'R-1',
    birthYear: 1961,
    sex: 'F',
    diabetesType: 'type2',
    diagnosisYear: 2012,
    deprivationQuintile: 3,
    hba1c: { month: '2026-03', mmolMol: 62 },
    bloodPressure: { month: '2026-03', systolic: 138, diastolic: 82 },
    cholesterol: { month: '2026-02', totalMmolL: 4.25 },
    serumCreatinine: { month: '2026-02', umolL: 88 },
    urineAlbumin: { month: '2026-02', acrMgMmol: 1.5 },
    footSurveillance: { month: '2025-11' },
    bmi: { month: '2026-03', kgM2: 29.46 },
    smoking: { month: '2026-03', status: 'ex' },
    retinalScreening: { month: '2025-12' },
    onStatin: true,
    onInsulin: false,
    insulinStartYear: null,
    cvdHistory: false,
    ...overrides,
  };
}

describe('recallReason: who is on a list', () => {
  it.each<[string, Outcome | undefined, string | null]>([
    // care processes (higher is better, eligible): not recorded in the window
    ['hba1c', 'not_met', 'not_recorded'],
    ['hba1c', 'met', null],
    ['hba1c', 'excluded', null],
    ['hba1c', undefined, null],
    // targets, higher is better, eligible: not met, or not measured
    ['hba1c_le_53', 'not_met', 'not_met'],
    ['hba1c_le_53', 'unknown', 'not_measured'],
    ['hba1c_le_53', 'met', null],
    ['statin_40_75', 'excluded', null],
    // lower is better, measured: the records counted; unknowns are in no count
    ['hba1c_gt_75', 'met', 'adverse_result'],
    ['hba1c_gt_75', 'not_met', null],
    ['hba1c_gt_75', 'unknown', null],
  ])('%s with outcome %s → %s', (key, outcome, reason) => {
    expect(recallReason(measure(key), outcome)).toBe(reason);
  });

  it.each<[string, Outcome, boolean]>([
    ['hba1c_le_53', 'unknown', true],
    ['hba1c_le_53', 'excluded', false],
    ['hba1c_gt_75', 'unknown', false],
    ['hba1c_gt_75', 'not_met', true],
    ['hba1c_gt_75', 'met', true],
  ])('%s with outcome %s is in the denominator: %s', (key, outcome, expected) => {
    expect(inDenominator(measure(key), outcome)).toBe(expected);
  });

  it.each([
    ['hba1c', 'not_recorded', 'Not recorded in the review window'],
    ['retinal_screening', 'not_recorded', 'Not recorded in the retinal window'],
    ['all_processes', 'not_recorded', 'Not every care process recorded in its window'],
    ['hba1c_le_53', 'not_measured', 'No result in the review window'],
    ['statin_40_75', 'not_measured', 'Not recorded'],
    ['hba1c_le_53', 'not_met', 'Latest result does not meet the target'],
    ['targets_composite', 'not_met', 'Not every part of the target met'],
    [
      'hba1c_gt_75',
      'adverse_result',
      'Latest result is in the range this measure counts (lower is better)',
    ],
  ] as const)('%s, %s, reads “%s”', (key, reason, text) => {
    expect(reasonText(measure(key), reason)).toBe(text);
  });
});

describe('readingOf: what a record holds for a field', () => {
  it.each([
    [
      'hba1c',
      'review',
      {},
      {
        month: '2026-03',
        counts: true,
        value: '62 mmol/mol',
        numbers: [62],
        text: '62 mmol/mol in 2026-03',
      },
    ],
    [
      'hba1c',
      'review',
      { hba1c: { month: '2025-09', mmolMol: 58 } },
      {
        month: '2025-09',
        counts: false,
        value: '58 mmol/mol',
        text: '58 mmol/mol in 2025-09, before the review window',
      },
    ],
    [
      'hba1c',
      'review',
      { hba1c: null },
      { month: null, counts: false, value: null, numbers: [], text: 'Not recorded' },
    ],
    ['bloodPressure', 'review', {}, { value: '138/82 mmHg', numbers: [138, 82] }],
    ['cholesterol', 'review', {}, { value: '4.3 mmol/L' }],
    ['bmi', 'review', {}, { value: '29.5 kg/m²' }],
    ['smoking', 'review', {}, { value: 'ex-smoker', text: 'ex-smoker in 2026-03' }],
    [
      'footSurveillance',
      'review',
      { footSurveillance: { month: '2024-02' } },
      { value: null, counts: false, text: 'Recorded in 2024-02, before the review window' },
    ],
    ['retinalScreening', 'retinal', {}, { counts: true, text: 'Recorded in 2025-12' }],
    ['onStatin', null, {}, { month: null, counts: true, value: 'yes', text: 'yes' }],
    ['onStatin', null, { onStatin: null }, { counts: false, value: null, text: 'Not recorded' }],
    ['cvdHistory', null, {}, { value: 'no' }],
  ] as const)('%s (%s window) of %j', (field, w, overrides, expected) => {
    const reading = readingOf(
      record(overrides as Partial<CareRecord>),
      { field, window: w },
      window,
    );
    expect(reading).toMatchObject(expected);
  });

  it('counts a retinal screening within a longer retinal window', () => {
    const old = record({ retinalScreening: { month: '2025-01' } });
    const in24 = readingOf(
      old,
      { field: 'retinalScreening', window: 'retinal' },
      reviewWindow(Q3, 24),
    );
    const in12 = readingOf(old, { field: 'retinalScreening', window: 'retinal' }, window);
    expect([in24.counts, in12.counts]).toEqual([true, false]);
    expect(in12.text).toBe('Recorded in 2025-01, before the retinal window');
  });

  it.each([
    [62, '62'],
    [53.0047, '53'],
    [4.25, '4.3'],
    [29.46, '29.5'],
    [0.04, '0'],
  ])('formats %s as %s', (value, text) => expect(formatNumber(value)).toBe(text));
});

describe('recallItem: one line', () => {
  const context = (key: string, showRecordRefs = true) => ({
    measure: measure(key),
    measures: new Map(version.measures.map((m) => [m.key, m])),
    window,
    ageBands: new Map([
      ['40-64', '40–64'],
      ['65-79', '65–79'],
    ]),
    showRecordRefs,
  });
  const line = (key: string, r: CareRecord, showRecordRefs = true) => {
    const outcome = evaluateRecord(r, version.compiled, Q3);
    const reason = recallReason(measure(key), outcome.outcomes[key])!;
    return recallItem(
      { row: 7, recordRef: r.recordKey, pseudonym: 'a1b2c3d4e5f6', record: r },
      outcome,
      reason,
      context(key, showRecordRefs),
    );
  };

  it('gives a failed target its failing value and month', () => {
    expect(line('hba1c_le_53', record())).toMatchObject({
      row: 7,
      reference: 'R-1',
      birthYear: 1961,
      age: 65,
      ageBand: '65–79',
      sex: 'F',
      diabetesType: 'type2',
      reason: 'not_met',
      lastRecorded: '2026-03',
      value: '62 mmol/mol',
      missing: [],
      detail: 'HbA1c: 62 mmol/mol in 2026-03',
    });
  });

  it('says “not measured” for a target without a result in the window, with the last one', () => {
    const item = line('hba1c_le_53', record({ hba1c: { month: '2025-06', mmolMol: 50 } }));
    expect(item).toMatchObject({
      reason: 'not_measured',
      lastRecorded: '2025-06',
      value: 'not measured',
      detail: 'HbA1c: 50 mmol/mol in 2025-06, before the review window',
    });
  });

  it('shows the pseudonym to anyone but the practice’s leads', () => {
    expect(line('hba1c_le_53', record(), false).reference).toBe('a1b2c3d4e5f6');
  });

  it('names the fields a composite care process misses', () => {
    const item = line(
      'all_processes',
      record({ footSurveillance: null, bmi: { month: '2025-08', kgM2: 31 } }),
    );
    expect(item.reason).toBe('not_recorded');
    expect(item.missing.map((m) => m.key)).toEqual(['foot_surveillance', 'bmi']);
    expect(item.lastRecorded).toBeNull();
    expect(item.value).toBeNull();
    expect(item.detail).toBe(
      'Foot risk assessment: Not recorded; BMI: 31 kg/m² in 2025-08, before the review window',
    );
  });

  it('names the parts a composite target misses and shows every value', () => {
    const item = line('targets_composite', record({ bloodPressure: null, onStatin: false }));
    expect(item.reason).toBe('not_met');
    expect(item.missing.map((m) => m.key)).toEqual(['hba1c_le_53', 'bp_target']);
    expect(item.detail).toBe(
      'Not met: HbA1c 53 mmol/mol (7.0 %) or below, Blood pressure below 140/90 mmHg (below 150/90 mmHg from age 80); HbA1c: 62 mmol/mol in 2026-03; Blood pressure: Not recorded; On a statin: no; Total cholesterol: 4.3 mmol/L in 2026-02',
    );
  });
});

describe('recall sheet', () => {
  const item = {
    row: 4,
    reference: '=HYPERLINK("http://example.invalid")',
    birthYear: 1961,
    age: 65,
    ageBand: '65–79',
    sex: 'X' as const,
    diabetesType: 'other' as const,
    reason: 'not_met' as const,
    reasonText: 'Latest result does not meet the target',
    lastRecorded: '2026-03',
    value: '@62',
    missing: [],
    readings: [],
    detail: '−1, "quoted"',
  };

  it('heads the reference column by what it holds', () => {
    expect(recallColumns(true)[0]).toBe('Reference');
    expect(recallColumns(false)[0]).toBe('Pseudonym');
    expect(recallColumns(true)).toHaveLength(recallCells(item).length);
  });

  it('neutralises every text cell that could start a formula; numbers stay numbers', () => {
    expect(recallCells(item)).toEqual([
      '\'=HYPERLINK("http://example.invalid")',
      4,
      1961,
      '65–79',
      'Another or indeterminate',
      'Other',
      'Latest result does not meet the target',
      '2026-03',
      "'@62",
      '\'−1, "quoted"',
    ]);
  });

  it('quotes CSV fields that need it', () => {
    expect(csvLine(['a', 'b,c', 'say "hi"', null, 3, 'x\ny'])).toBe(
      'a,"b,c","say ""hi""",,3,"x\ny"\r\n',
    );
  });
});
