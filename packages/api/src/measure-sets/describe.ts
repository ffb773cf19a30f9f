/**
 * A measure set as people read it: for every measure its kind, its definition
 * in words, its population and denominator in words, the record fields it
 * reads and, for a composite, the measures it combines. Pure: built once per
 * measure-set version from the validated definition (parseMeasureSet) and
 * cached with it.
 */
import type {
  CareProcessField,
  DiabetesType,
  FlagField,
  MeasureSet,
  Population,
  TargetCondition,
} from '@cairn/metrics';

export const MEASURE_KINDS = ['care_process', 'treatment_target'] as const;
export type MeasureKind = (typeof MEASURE_KINDS)[number];

/** Record fields a measure can read: the care processes and the yes/no facts. */
export const READING_FIELDS = [
  'hba1c',
  'bloodPressure',
  'cholesterol',
  'serumCreatinine',
  'urineAlbumin',
  'footSurveillance',
  'bmi',
  'smoking',
  'retinalScreening',
  'onStatin',
  'onInsulin',
  'cvdHistory',
] as const satisfies readonly (CareProcessField | FlagField)[];
export type ReadingField = (typeof READING_FIELDS)[number];

export const READING_LABELS: Record<ReadingField, string> = {
  hba1c: 'HbA1c',
  bloodPressure: 'Blood pressure',
  cholesterol: 'Total cholesterol',
  serumCreatinine: 'Serum creatinine',
  urineAlbumin: 'Urine albumin:creatinine ratio',
  footSurveillance: 'Foot risk assessment',
  bmi: 'BMI',
  smoking: 'Smoking status',
  retinalScreening: 'Retinal screening',
  onStatin: 'On a statin',
  onInsulin: 'On insulin',
  cvdHistory: 'Cardiovascular disease history',
};

/** A field a measure reads, and the window its month must lie in (null for yes/no facts). */
export interface MeasureReading {
  field: ReadingField;
  window: 'review' | 'retinal' | null;
}

export interface MeasureView {
  index: number;
  key: string;
  label: string;
  kind: MeasureKind;
  composite: boolean;
  /** What meets the measure, in words */
  definition: string;
  denominator: 'eligible' | 'measured';
  denominatorText: string;
  direction: 'higher' | 'lower';
  population: Population;
  populationText: string;
  /** The guideline or rule the measure comes from */
  source: string;
  note: string | null;
  /** Fields of the record the measure reads, in the order of its definition */
  reads: MeasureReading[];
  /** Keys of the measures a composite combines (empty otherwise) */
  components: string[];
}

type Measurement = Extract<TargetCondition, { rule: 'value' }>['measurement'];

const MEASUREMENT: Record<Measurement, { words: string; unit: string; field: ReadingField }> = {
  hba1c: { words: 'HbA1c', unit: 'mmol/mol', field: 'hba1c' },
  systolic: { words: 'systolic blood pressure', unit: 'mmHg', field: 'bloodPressure' },
  diastolic: { words: 'diastolic blood pressure', unit: 'mmHg', field: 'bloodPressure' },
  cholesterol: { words: 'total cholesterol', unit: 'mmol/L', field: 'cholesterol' },
  serumCreatinine: { words: 'serum creatinine', unit: 'µmol/L', field: 'serumCreatinine' },
  urineAlbumin: {
    words: 'urine albumin:creatinine ratio',
    unit: 'mg/mmol',
    field: 'urineAlbumin',
  },
  bmi: { words: 'BMI', unit: 'kg/m²', field: 'bmi' },
};

const COMPARATOR: Record<'lt' | 'le' | 'gt' | 'ge', (value: string) => string> = {
  lt: (v) => `below ${v}`,
  le: (v) => `${v} or below`,
  gt: (v) => `above ${v}`,
  ge: (v) => `${v} or above`,
};

const FLAG_WORDS: Record<FlagField, { yes: string; no: string }> = {
  onStatin: { yes: 'recorded as on a statin', no: 'recorded as not on a statin' },
  onInsulin: { yes: 'recorded as on insulin', no: 'recorded as not on insulin' },
  cvdHistory: {
    yes: 'recorded as having a history of cardiovascular disease',
    no: 'recorded as having no history of cardiovascular disease',
  },
};

const TYPE_WORDS: Record<DiabetesType, string> = {
  type1: 'type 1',
  type2: 'type 2',
  other: 'another type of',
};

const capitalise = (text: string) => text.charAt(0).toUpperCase() + text.slice(1);

function list(words: string[]): string {
  if (words.length <= 1) return words.join('');
  return `${words.slice(0, -1).join(', ')} or ${words[words.length - 1]}`;
}

/** "Eligible people with type 1 diabetes, aged 40–75" and the like. */
export function populationText(population: Population): string {
  const types = population.types;
  const who =
    types.length === 3
      ? 'Eligible people with any type of diabetes'
      : `Eligible people with ${list(types.map((t) => TYPE_WORDS[t]))} diabetes`;
  const { minAge, maxAge } = population;
  const age =
    minAge !== null && maxAge !== null
      ? `, aged ${minAge}–${maxAge}`
      : minAge !== null
        ? `, aged ${minAge} or over`
        : maxAge !== null
          ? `, aged ${maxAge} or under`
          : '';
  return who + age;
}

export function denominatorText(denominator: 'eligible' | 'measured'): string {
  return denominator === 'eligible'
    ? 'Counted among everyone in the population: no result in the review window counts against the measure'
    : 'Counted among the people of the population with a result in the review window';
}

function bandsText(bands: { minAge: number; systolicBelow: number; diastolicBelow: number }[]) {
  return bands
    .map((b, i) => {
      const limit = `below ${b.systolicBelow}/${b.diastolicBelow} mmHg`;
      return i === 0 ? limit : `from age ${b.minAge}, ${limit}`;
    })
    .join('; ');
}

function fieldWindow(window: 'review' | 'retinal', retinalMonths: number): string {
  return window === 'retinal'
    ? `in the retinal window (the ${retinalMonths} months ending with the quarter)`
    : 'in the review window';
}

const escapeRegExp = (text: string) => text.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');

/**
 * A composite's text as people read it: wherever it names one of the measures it combines by
 * key (a definition file may write "Cairn composite of hba1c_le_53, bp_target and
 * lipid_managed"), the measure's own label, in quotes, stands instead. Only the composite's own
 * parts are replaced, and only as whole words (a key is letters, digits and underscores), so an
 * ordinary word that happens to be a key elsewhere in the set stays as written. Used wherever
 * a measure is described (describeMeasures) and on reading a frozen report (reports/snapshot.ts),
 * so every page, download and e-mail reads the same words.
 */
export function nameComponents(
  text: string,
  components: readonly string[],
  labelOf: (key: string) => string | undefined,
): string {
  let out = text;
  for (const key of [...components].sort((a, b) => b.length - a.length)) {
    const label = labelOf(key);
    if (label === undefined) continue;
    out = out.replace(
      new RegExp(`(?<![A-Za-z0-9_])${escapeRegExp(key)}(?![A-Za-z0-9_])`, 'g'),
      () => `“${label}”`,
    );
  }
  return out;
}

/** Every measure of a validated measure set, described. */
export function describeMeasures(set: MeasureSet): MeasureView[] {
  const processes = new Map(set.careProcesses.map((p) => [p.key, p]));
  const views: MeasureView[] = [];

  const addReading = (reads: MeasureReading[], reading: MeasureReading) => {
    if (!reads.some((r) => r.field === reading.field)) reads.push(reading);
  };

  /** Words and fields of one target condition. */
  const condition = (c: TargetCondition, reads: MeasureReading[]): string => {
    switch (c.rule) {
      case 'value': {
        const m = MEASUREMENT[c.measurement];
        addReading(reads, { field: m.field, window: 'review' });
        return `latest ${m.words} in the review window ${COMPARATOR[c.comparator](`${c.threshold} ${m.unit}`)}`;
      }
      case 'bloodPressure':
        addReading(reads, { field: 'bloodPressure', window: 'review' });
        return `latest blood pressure in the review window ${bandsText(c.bands)}`;
      case 'flag':
        addReading(reads, { field: c.flag, window: null });
        return c.equals ? FLAG_WORDS[c.flag].yes : FLAG_WORDS[c.flag].no;
      case 'target': {
        const target = views.find((v) => v.key === c.key);
        for (const r of target?.reads ?? []) addReading(reads, r);
        return `“${target?.label ?? c.key}” met`;
      }
    }
  };

  for (const p of set.careProcesses) {
    const reads: MeasureReading[] = [];
    let definition: string;
    let components: string[] = [];
    if (p.rule === 'recorded') {
      addReading(reads, { field: p.field as ReadingField, window: p.window });
      definition = `${READING_LABELS[p.field as ReadingField]} recorded ${fieldWindow(p.window, set.retinalWindowMonths)}`;
    } else {
      components = [...p.of];
      const parts = p.of.map((key) => {
        const part = processes.get(key);
        if (part?.rule === 'recorded') {
          addReading(reads, { field: part.field as ReadingField, window: part.window });
        }
        return part?.label ?? key;
      });
      definition = `Every one of these recorded, each in its window: ${parts.join('; ')}`;
    }
    views.push(
      view(p, views.length, 'care_process', p.rule === 'allOf', definition, reads, components),
    );
  }

  for (const t of set.targets) {
    const reads: MeasureReading[] = [];
    let definition: string;
    let components: string[] = [];
    if (t.rule === 'anyOf' || t.rule === 'allOf') {
      components = t.of.filter((c) => c.rule === 'target').map((c) => c.key);
      const parts = t.of.map((c) => condition(c, reads));
      definition = `${t.rule === 'anyOf' ? 'At least one of' : 'All of'}: ${parts.join('; ')}`;
    } else {
      definition = capitalise(condition(t, reads));
    }
    views.push(
      view(
        t,
        views.length,
        'treatment_target',
        t.rule === 'anyOf' || t.rule === 'allOf',
        definition,
        reads,
        components,
      ),
    );
  }
  const labels = new Map(views.map((v) => [v.key, v.label]));
  for (const v of views) {
    if (v.components.length === 0) continue;
    v.source = nameComponents(v.source, v.components, (key) => labels.get(key));
    if (v.note !== null) v.note = nameComponents(v.note, v.components, (key) => labels.get(key));
  }
  return views;
}

function view(
  m: MeasureSet['careProcesses'][number] | MeasureSet['targets'][number],
  index: number,
  kind: MeasureKind,
  composite: boolean,
  definition: string,
  reads: MeasureReading[],
  components: string[],
): MeasureView {
  return {
    index,
    key: m.key,
    label: m.label,
    kind,
    composite,
    definition,
    denominator: m.denominator,
    denominatorText: denominatorText(m.denominator),
    direction: m.direction,
    population: m.population,
    populationText: populationText(m.population),
    source: m.source,
    note: m.note ?? null,
    reads,
    components,
  };
}
