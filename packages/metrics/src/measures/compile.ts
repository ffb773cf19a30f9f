import type { CareProcessField, DiabetesType, MeasurementField } from '../records/record.js';
import type { MeasureSet, Population, TargetCondition } from './schema.js';

/**
 * A validated measure set turned into what evaluation needs: the flat list of measures, the
 * condition graph (nodes, in evaluation order) and the breakdown categories.
 */

/** Outcome of one measure for one record. */
export type Outcome = 'excluded' | 'unknown' | 'not_met' | 'met';

/** Numeric outcome codes (the columnar path and the aggregate histograms use these). */
export const CODE_EXCLUDED = 0;
export const CODE_UNKNOWN = 1;
export const CODE_NOT_MET = 2;
export const CODE_MET = 3;
export const OUTCOMES: readonly Outcome[] = ['excluded', 'unknown', 'not_met', 'met'];

export type MeasureGroup = 'care_process' | 'target';

export interface MeasureInfo {
  index: number;
  key: string;
  label: string;
  source: string;
  note: string | null;
  group: MeasureGroup;
  /** True for composites (all_processes, anyOf/allOf targets). */
  composite: boolean;
  denominator: 'eligible' | 'measured';
  direction: 'higher' | 'lower';
  population: Population;
}

export type ConditionNode =
  | { op: 'recorded'; field: CareProcessField; window: 'review' | 'retinal' }
  | {
      op: 'value';
      measurement: MeasurementField;
      comparator: 'lt' | 'le' | 'gt' | 'ge';
      threshold: number;
    }
  | {
      op: 'bloodPressure';
      bands: { minAge: number; systolicBelow: number; diastolicBelow: number }[];
    }
  | { op: 'flag'; flag: 'onStatin' | 'onInsulin' | 'cvdHistory'; equals: boolean }
  | { op: 'all' | 'any'; inputs: number[] };

export type DimensionKey = 'age_band' | 'sex' | 'deprivation' | 'duration';

export interface BreakdownCategory {
  key: string;
  label: string;
}

export interface BreakdownDimension {
  key: DimensionKey;
  label: string;
  /** Index of the dimension's first category in the category axis (0 is "all"). */
  offset: number;
  categories: BreakdownCategory[];
}

export interface CompiledMeasureSet {
  id: string;
  label: string;
  eligibilityMinAge: number;
  retinalWindowMonths: number;
  measures: MeasureInfo[];
  nodes: ConditionNode[];
  /** nodes index of each measure's condition. */
  measureNode: number[];
  /** Lower bounds of age bands and duration bands. */
  ageBands: number[];
  durationBands: number[];
  dimensions: BreakdownDimension[];
  /** 1 ("all") + every dimension's categories. */
  categoryCount: number;
  /** Case-mix strata: type (3) × age band × sex (4) × deprivation (6) × duration (bands + 1). */
  strataCount: number;
}

/** The measurement's month field. */
export const MEASUREMENT_MONTH: Readonly<Record<MeasurementField, CareProcessField>> = {
  hba1c: 'hba1c',
  systolic: 'bloodPressure',
  diastolic: 'bloodPressure',
  cholesterol: 'cholesterol',
  serumCreatinine: 'serumCreatinine',
  urineAlbumin: 'urineAlbumin',
  bmi: 'bmi',
};

export const TYPE_SPLITS = ['all', 'type1', 'type2_other'] as const;
export type TypeSplit = (typeof TYPE_SPLITS)[number];

/** Type group of a diabetes type: 0 for type 1, 1 for type 2 and other. */
export function typeGroupOf(type: DiabetesType): 0 | 1 {
  return type === 'type1' ? 0 : 1;
}

function ageBandCategories(bounds: readonly number[]): BreakdownCategory[] {
  return bounds.map((lo, i) => {
    const next = bounds[i + 1];
    return next === undefined
      ? { key: `${lo}+`, label: `${lo}+` }
      : { key: `${lo}-${next - 1}`, label: `${lo}–${next - 1}` };
  });
}

function durationCategories(bounds: readonly number[]): BreakdownCategory[] {
  const out = bounds.map((lo, i) => {
    const next = bounds[i + 1];
    if (next === undefined) {
      return lo === 0
        ? { key: 'any', label: 'Any duration' }
        : { key: `ge${lo}`, label: `≥ ${lo} years` };
    }
    if (lo === 0) return { key: `lt${next}`, label: `< ${next} years` };
    return { key: `${lo}-${next - 1}`, label: `${lo}–${next - 1} years` };
  });
  out.push({ key: 'unknown', label: 'Not recorded' });
  return out;
}

export function compileMeasureSet(set: MeasureSet): CompiledMeasureSet {
  const nodes: ConditionNode[] = [];
  const measures: MeasureInfo[] = [];
  const measureNode: number[] = [];
  const nodeOfKey = new Map<string, number>();
  // Identical conditions (e.g. "on a statin" in two targets) share one node.
  const nodeOfText = new Map<string, number>();
  const add = (node: ConditionNode): number => {
    const text = JSON.stringify(node);
    const existing = nodeOfText.get(text);
    if (existing !== undefined) return existing;
    nodes.push(node);
    nodeOfText.set(text, nodes.length - 1);
    return nodes.length - 1;
  };
  const info = (
    m: MeasureSet['careProcesses'][number] | MeasureSet['targets'][number],
    group: MeasureGroup,
    composite: boolean,
  ): MeasureInfo => ({
    index: measures.length,
    key: m.key,
    label: m.label,
    source: m.source,
    note: m.note ?? null,
    group,
    composite,
    denominator: m.denominator,
    direction: m.direction,
    population: m.population,
  });

  for (const p of set.careProcesses) {
    if (p.rule !== 'recorded') continue;
    nodeOfKey.set(
      p.key,
      add({ op: 'recorded', field: p.field as CareProcessField, window: p.window }),
    );
  }
  for (const p of set.careProcesses) {
    let node: number;
    if (p.rule === 'recorded') node = nodeOfKey.get(p.key) as number;
    else {
      node = add({ op: 'all', inputs: p.of.map((k) => nodeOfKey.get(k) as number) });
      nodeOfKey.set(p.key, node);
    }
    measures.push(info(p, 'care_process', p.rule === 'allOf'));
    measureNode.push(node);
  }

  const condition = (c: TargetCondition): number => {
    switch (c.rule) {
      case 'value':
        return add({
          op: 'value',
          measurement: c.measurement,
          comparator: c.comparator,
          threshold: c.threshold,
        });
      case 'bloodPressure':
        return add({ op: 'bloodPressure', bands: c.bands.map((b) => ({ ...b })) });
      case 'flag':
        return add({ op: 'flag', flag: c.flag, equals: c.equals });
      case 'target':
        return nodeOfKey.get(c.key) as number;
    }
  };
  for (const t of set.targets) {
    let node: number;
    if (t.rule === 'anyOf' || t.rule === 'allOf') {
      const inputs = t.of.map(condition);
      node = add({ op: t.rule === 'anyOf' ? 'any' : 'all', inputs });
    } else node = condition(t);
    nodeOfKey.set(t.key, node);
    measures.push(info(t, 'target', t.rule === 'anyOf' || t.rule === 'allOf'));
    measureNode.push(node);
  }

  const ageBands = [...set.breakdowns.ageBands];
  const durationBands = [...set.breakdowns.durationBands];
  const dimensions: BreakdownDimension[] = [];
  let offset = 1;
  const dim = (key: DimensionKey, label: string, categories: BreakdownCategory[]): void => {
    dimensions.push({ key, label, offset, categories });
    offset += categories.length;
  };
  dim('age_band', 'Age band', ageBandCategories(ageBands));
  dim('sex', 'Sex', [
    { key: 'F', label: 'Female' },
    { key: 'M', label: 'Male' },
    { key: 'X', label: 'Another or indeterminate' },
    { key: 'U', label: 'Not recorded' },
  ]);
  dim('deprivation', 'Deprivation quintile', [
    { key: '1', label: '1 (most deprived)' },
    { key: '2', label: '2' },
    { key: '3', label: '3' },
    { key: '4', label: '4' },
    { key: '5', label: '5 (least deprived)' },
    { key: 'unknown', label: 'Not recorded' },
  ]);
  dim('duration', 'Duration since diagnosis', durationCategories(durationBands));
  return {
    id: set.id,
    label: set.label,
    eligibilityMinAge: set.eligibility.minAge,
    retinalWindowMonths: set.retinalWindowMonths,
    measures,
    nodes,
    measureNode,
    ageBands,
    durationBands,
    dimensions,
    categoryCount: offset,
    strataCount: 3 * ageBands.length * 4 * 6 * (durationBands.length + 1),
  };
}

/** Index of the age band of an age (the last band whose lower bound is ≤ age; 0 below all). */
export function ageBandIndex(ageBands: readonly number[], age: number): number {
  let band = 0;
  for (let b = 1; b < ageBands.length; b++) if (age >= (ageBands[b] as number)) band = b;
  return band;
}

/** Index of the duration band (durationBands.length for an unknown or negative duration). */
export function durationBandIndex(durationBands: readonly number[], years: number | null): number {
  if (years === null || years < 0) return durationBands.length;
  let band = 0;
  for (let b = 1; b < durationBands.length; b++)
    if (years >= (durationBands[b] as number)) band = b;
  return band;
}
