/**
 * The differences between two measure-set versions, field by field, in
 * words: what a regional lead reads before publishing a draft, and what the
 * audit trail records when they do. Measures are matched by key; a measure
 * that changed also gets its definition in words before and after.
 */
import type { MeasureSet } from '@cairn/metrics';
import { describeMeasures } from './describe.js';
import type { MeasureSetChangeDto } from './dto/measure-set.dto.js';

type Leaves = Map<string, string | null>;

const SET_FIELDS: [string, string, (s: MeasureSet) => unknown][] = [
  ['label', 'Label', (s) => s.label],
  ['description', 'Description', (s) => s.description],
  ['eligibility.minAge', 'Youngest age counted', (s) => s.eligibility.minAge],
  ['retinalWindowMonths', 'Retinal window (months)', (s) => s.retinalWindowMonths],
  ['breakdowns.ageBands', 'Age bands (from age)', (s) => s.breakdowns.ageBands],
  ['breakdowns.durationBands', 'Duration bands (from year)', (s) => s.breakdowns.durationBands],
];

const FIELD_LABELS: Record<string, string> = {
  label: 'Label',
  source: 'Guideline source',
  note: 'Note',
  denominator: 'Denominator',
  direction: 'Direction',
  'population.types': 'Diabetes types',
  'population.minAge': 'Youngest age',
  'population.maxAge': 'Oldest age',
  rule: 'Rule',
  field: 'Record field',
  window: 'Window',
  of: 'Combines',
  measurement: 'Measurement',
  comparator: 'Comparison',
  threshold: 'Threshold',
  flag: 'Recorded fact',
  equals: 'Met when recorded as',
  key: 'Target',
  minAge: 'from age',
  systolicBelow: 'systolic below (mmHg)',
  diastolicBelow: 'diastolic below (mmHg)',
  bands: 'Blood pressure bands',
};

const VALUE_WORDS: Record<string, Record<string, string>> = {
  denominator: {
    eligible: 'everyone in the population',
    measured: 'people with a result in the review window',
  },
  direction: { higher: 'higher is better', lower: 'lower is better' },
  comparator: { lt: 'below', le: 'at or below', gt: 'above', ge: 'at or above' },
  window: { review: 'review window', retinal: 'retinal window' },
};

const TYPE_WORDS: Record<string, string> = { type1: 'type 1', type2: 'type 2', other: 'other' };

/** "of[1].threshold" → "Part 2: threshold"; "bands[0].minAge" → "Band 1: from age". */
export function fieldLabel(path: string): string {
  const part = /^(of|bands)\[(\d+)\](?:\.(.+))?$/.exec(path);
  if (part) {
    const [, list, index, rest] = part;
    const name = `${list === 'of' ? 'Part' : 'Band'} ${Number(index) + 1}`;
    return rest ? `${name}: ${fieldLabel(rest).replace(/^[A-Z]/, (c) => c.toLowerCase())}` : name;
  }
  return FIELD_LABELS[path] ?? path;
}

function words(path: string, value: unknown): string | null {
  if (value === undefined) return null;
  const last = path
    .split('.')
    .pop()!
    .replace(/\[\d+\]$/, '');
  if (value === null) {
    return last === 'minAge' ? 'no lower bound' : last === 'maxAge' ? 'no upper bound' : null;
  }
  if (typeof value === 'boolean') return value ? 'yes' : 'no';
  if (Array.isArray(value)) {
    return path === 'population.types'
      ? value.map((t) => TYPE_WORDS[String(t)] ?? String(t)).join(', ')
      : value.map(String).join(', ');
  }
  const text = String(value);
  return VALUE_WORDS[last]?.[text] ?? text;
}

/** Every leaf of a measure (its key left out), by path. */
function leaves(measure: object): Leaves {
  const out: Leaves = new Map();
  const walk = (value: unknown, path: string) => {
    if (Array.isArray(value) && value.some((v) => v !== null && typeof v === 'object')) {
      value.forEach((v, i) => walk(v, `${path}[${i}]`));
      return;
    }
    if (value !== null && typeof value === 'object' && !Array.isArray(value)) {
      for (const [k, v] of Object.entries(value)) walk(v, path ? `${path}.${k}` : k);
      return;
    }
    out.set(path, words(path, value));
  };
  const { key: _key, ...rest } = measure as { key: string };
  walk(rest, '');
  return out;
}

type Measure = MeasureSet['careProcesses'][number] | MeasureSet['targets'][number];

const measuresOf = (s: MeasureSet): Measure[] => [...s.careProcesses, ...s.targets];

/** The changes from `from` to `to`, set fields first, then measures in `to`'s order. */
export function measureSetChanges(from: MeasureSet, to: MeasureSet): MeasureSetChangeDto[] {
  const changes: MeasureSetChangeDto[] = [];
  for (const [field, label, read] of SET_FIELDS) {
    const before = words(field, read(from));
    const after = words(field, read(to));
    if (before !== after) {
      changes.push({
        kind: 'changed',
        measureKey: null,
        measureLabel: null,
        field,
        fieldLabel: label,
        before,
        after,
      });
    }
  }
  const fromMeasures = new Map(measuresOf(from).map((m) => [m.key, m]));
  const toKeys = new Set(measuresOf(to).map((m) => m.key));
  const fromViews = new Map(describeMeasures(from).map((v) => [v.key, v]));
  const toViews = new Map(describeMeasures(to).map((v) => [v.key, v]));
  for (const m of measuresOf(to)) {
    const old = fromMeasures.get(m.key);
    if (!old) {
      changes.push({
        kind: 'added',
        measureKey: m.key,
        measureLabel: m.label,
        field: null,
        fieldLabel: 'Measure added',
        before: null,
        after: toViews.get(m.key)?.definition ?? null,
      });
      continue;
    }
    const a = leaves(old);
    const b = leaves(m);
    const paths = [...b.keys(), ...[...a.keys()].filter((p) => !b.has(p))];
    const found: MeasureSetChangeDto[] = [];
    for (const path of paths) {
      const before = a.get(path) ?? null;
      const after = b.get(path) ?? null;
      if (before === after) continue;
      found.push({
        kind: 'changed',
        measureKey: m.key,
        measureLabel: m.label,
        field: path,
        fieldLabel: fieldLabel(path),
        before,
        after,
      });
    }
    const before = fromViews.get(m.key)?.definition ?? null;
    const after = toViews.get(m.key)?.definition ?? null;
    if (before !== after) {
      found.push({
        kind: 'changed',
        measureKey: m.key,
        measureLabel: m.label,
        field: 'definition',
        fieldLabel: 'Definition in words',
        before,
        after,
      });
    }
    changes.push(...found);
  }
  for (const m of measuresOf(from)) {
    if (toKeys.has(m.key)) continue;
    changes.push({
      kind: 'removed',
      measureKey: m.key,
      measureLabel: m.label,
      field: null,
      fieldLabel: 'Measure removed',
      before: fromViews.get(m.key)?.definition ?? null,
      after: null,
    });
  }
  return changes;
}
