import { monthIndex } from '../records/month.js';
import type { CareRecord, DiabetesType, MeasurementField } from '../records/record.js';
import {
  ageBandIndex,
  CODE_EXCLUDED,
  CODE_MET,
  CODE_NOT_MET,
  CODE_UNKNOWN,
  compileMeasureSet,
  type CompiledMeasureSet,
  type ConditionNode,
  durationBandIndex,
  type Outcome,
  OUTCOMES,
  typeGroupOf,
} from './compile.js';
import {
  histogramLayout,
  PACK_CELLS,
  PACK_CELLS_WITH_PRACTICE_BREAKDOWNS,
  packCells,
} from './layout.js';
import { type LocalityMap, resolveLocalities } from './localities.js';
import { type AuditQuarter, reviewWindow, type ReviewWindow } from './quarter.js';
import type { EvaluationResult } from './result.js';
import type { MeasureSet, Population } from './schema.js';

/**
 * The plain reference evaluation: one record object at a time, conditions interpreted from
 * the measure set as written. It defines what the columnar path (evaluate-columns.ts) must
 * reproduce, and gives the per-record outcomes (recall lists, record pages).
 */
export interface RecordOutcome {
  practiceCode: string;
  recordKey: string;
  eligible: boolean;
  /** Why a record is not eligible (methods §1), null when eligible. */
  exclusion: 'unknown_type' | 'under_age' | null;
  /** Age at the end of the review window (end year − birth year). */
  age: number;
  typeGroup: 'type1' | 'type2_other' | null;
  /** Breakdown category keys (null when not eligible). */
  categories: { ageBand: string; sex: string; deprivation: string; duration: string } | null;
  /** Outcome of every measure, by key (empty when not eligible). */
  outcomes: Record<string, Outcome>;
}

export interface EvaluateOptions {
  /** Practice → locality. */
  localities?: LocalityMap;
  /** Practices to list first, in this order (others follow in order of appearance). */
  practiceCodes?: readonly string[];
  /** Compute case-mix expected counts (default true). */
  caseMix?: boolean;
  /**
   * Also keep each practice's breakdowns (age band, sex, deprivation, duration) by measure
   * (default false: practices by type group only, breakdowns for localities and the region).
   * Costs about 33 MB and a third more time for 5,000 practices; for one practice's drill-down
   * evaluating its own records is cheaper.
   */
  practiceBreakdowns?: boolean;
  /**
   * Columnar path only: 'generated' (default) uses a loop generated for the measure set's
   * layout, 'generic' the table-driven loop (same result; used where generated code is not
   * allowed, and by the tests).
   */
  kernel?: 'generated' | 'generic';
}

type Tri = typeof CODE_UNKNOWN | typeof CODE_NOT_MET | typeof CODE_MET;

function measurementOf(
  r: CareRecord,
  m: MeasurementField,
): { month: string; value: number } | null {
  switch (m) {
    case 'hba1c':
      return r.hba1c && { month: r.hba1c.month, value: r.hba1c.mmolMol };
    case 'systolic':
      return r.bloodPressure && { month: r.bloodPressure.month, value: r.bloodPressure.systolic };
    case 'diastolic':
      return r.bloodPressure && { month: r.bloodPressure.month, value: r.bloodPressure.diastolic };
    case 'cholesterol':
      return r.cholesterol && { month: r.cholesterol.month, value: r.cholesterol.totalMmolL };
    case 'serumCreatinine':
      return (
        r.serumCreatinine && { month: r.serumCreatinine.month, value: r.serumCreatinine.umolL }
      );
    case 'urineAlbumin':
      return r.urineAlbumin && { month: r.urineAlbumin.month, value: r.urineAlbumin.acrMgMmol };
    case 'bmi':
      return r.bmi && { month: r.bmi.month, value: r.bmi.kgM2 };
  }
}

function within(month: string, from: number, to: number): boolean {
  const index = monthIndex(month);
  return index >= from && index <= to;
}

function evaluateNode(
  nodes: readonly ConditionNode[],
  index: number,
  r: CareRecord,
  age: number,
  w: ReviewWindow,
): Tri {
  const node = nodes[index] as ConditionNode;
  switch (node.op) {
    case 'recorded': {
      const entry = r[node.field];
      const from = node.window === 'retinal' ? w.retinalStartIndex : w.startIndex;
      return entry !== null && within(entry.month, from, w.endIndex) ? CODE_MET : CODE_NOT_MET;
    }
    case 'value': {
      const m = measurementOf(r, node.measurement);
      if (m === null || !within(m.month, w.startIndex, w.endIndex)) return CODE_UNKNOWN;
      const t = node.threshold;
      const met =
        node.comparator === 'lt'
          ? m.value < t
          : node.comparator === 'le'
            ? m.value <= t
            : node.comparator === 'gt'
              ? m.value > t
              : m.value >= t;
      return met ? CODE_MET : CODE_NOT_MET;
    }
    case 'bloodPressure': {
      const bp = r.bloodPressure;
      if (bp === null || !within(bp.month, w.startIndex, w.endIndex)) return CODE_UNKNOWN;
      const band = [...node.bands].reverse().find((b) => age >= b.minAge) ?? node.bands[0];
      if (band === undefined) return CODE_UNKNOWN;
      return bp.systolic < band.systolicBelow && bp.diastolic < band.diastolicBelow
        ? CODE_MET
        : CODE_NOT_MET;
    }
    case 'flag': {
      const value = r[node.flag];
      if (value === null) return CODE_UNKNOWN;
      return value === node.equals ? CODE_MET : CODE_NOT_MET;
    }
    case 'all': {
      const values = node.inputs.map((i) => evaluateNode(nodes, i, r, age, w));
      if (values.includes(CODE_NOT_MET)) return CODE_NOT_MET;
      return values.includes(CODE_UNKNOWN) ? CODE_UNKNOWN : CODE_MET;
    }
    case 'any': {
      const values = node.inputs.map((i) => evaluateNode(nodes, i, r, age, w));
      if (values.includes(CODE_MET)) return CODE_MET;
      return values.includes(CODE_UNKNOWN) ? CODE_UNKNOWN : CODE_NOT_MET;
    }
  }
}

function inPopulation(p: Population, type: DiabetesType, age: number): boolean {
  return (
    p.types.includes(type) &&
    (p.minAge === null || age >= p.minAge) &&
    (p.maxAge === null || age <= p.maxAge)
  );
}

/** Outcome codes of every measure for one record (all CODE_EXCLUDED when not eligible). */
function recordCodes(
  compiled: CompiledMeasureSet,
  r: CareRecord,
  w: ReviewWindow,
): { eligible: boolean; exclusion: RecordOutcome['exclusion']; age: number; codes: number[] } {
  const age = w.endYear - r.birthYear;
  if (r.diabetesType === null) {
    return { eligible: false, exclusion: 'unknown_type', age, codes: [] };
  }
  if (age < compiled.eligibilityMinAge) {
    return { eligible: false, exclusion: 'under_age', age, codes: [] };
  }
  const type = r.diabetesType;
  const codes = compiled.measures.map((m, i) =>
    inPopulation(m.population, type, age)
      ? evaluateNode(compiled.nodes, compiled.measureNode[i] as number, r, age, w)
      : CODE_EXCLUDED,
  );
  return { eligible: true, exclusion: null, age, codes };
}

const SEX_INDEX = { F: 0, M: 1, X: 2, U: 3 } as const;
const TYPE_INDEX = { type1: 0, type2: 1, other: 2 } as const;

function categoryIndices(
  compiled: CompiledMeasureSet,
  r: CareRecord,
  age: number,
  endYear: number,
): { categories: number[]; keys: NonNullable<RecordOutcome['categories']>; stratum: number } {
  const [ageDim, sexDim, deprivationDim, durationDim] = compiled.dimensions as [
    (typeof compiled.dimensions)[number],
    (typeof compiled.dimensions)[number],
    (typeof compiled.dimensions)[number],
    (typeof compiled.dimensions)[number],
  ];
  const a = ageBandIndex(compiled.ageBands, age);
  const s = SEX_INDEX[r.sex];
  const d = r.deprivationQuintile === null ? 5 : r.deprivationQuintile - 1;
  const duration = r.diagnosisYear === null ? null : endYear - r.diagnosisYear;
  const u = durationBandIndex(compiled.durationBands, duration);
  const t = TYPE_INDEX[r.diabetesType as DiabetesType];
  const A = compiled.ageBands.length;
  const D = compiled.durationBands.length + 1;
  return {
    categories: [
      0,
      ageDim.offset + a,
      sexDim.offset + s,
      deprivationDim.offset + d,
      durationDim.offset + u,
    ],
    keys: {
      ageBand: (ageDim.categories[a] as { key: string }).key,
      sex: (sexDim.categories[s] as { key: string }).key,
      deprivation: (deprivationDim.categories[d] as { key: string }).key,
      duration: (durationDim.categories[u] as { key: string }).key,
    },
    stratum: (((t * A + a) * 4 + s) * 6 + d) * D + u,
  };
}

/** Per-record outcomes of one record. */
export function evaluateRecord(
  record: CareRecord,
  measureSet: MeasureSet | CompiledMeasureSet,
  quarter: AuditQuarter,
): RecordOutcome {
  const compiled = 'nodes' in measureSet ? measureSet : compileMeasureSet(measureSet);
  const w = reviewWindow(quarter, compiled.retinalWindowMonths);
  return outcomeOf(compiled, record, w);
}

function outcomeOf(compiled: CompiledMeasureSet, r: CareRecord, w: ReviewWindow): RecordOutcome {
  const { eligible, exclusion, age, codes } = recordCodes(compiled, r, w);
  const outcomes: Record<string, Outcome> = {};
  if (eligible) {
    compiled.measures.forEach((m, i) => {
      outcomes[m.key] = OUTCOMES[codes[i] as number] as Outcome;
    });
  }
  return {
    practiceCode: r.practiceCode,
    recordKey: r.recordKey,
    eligible,
    exclusion,
    age,
    typeGroup: eligible ? (r.diabetesType === 'type1' ? 'type1' : 'type2_other') : null,
    categories: eligible ? categoryIndices(compiled, r, age, w.endYear).keys : null,
    outcomes,
  };
}

/**
 * The plain reference evaluation of records: per-record outcomes and the aggregates for every
 * measure, per practice, locality and region, by type group and breakdown category.
 */
export function evaluateRecords(
  records: readonly CareRecord[],
  measureSet: MeasureSet,
  quarter: AuditQuarter,
  options: EvaluateOptions = {},
): { result: EvaluationResult; outcomes: RecordOutcome[] } {
  const compiled = compileMeasureSet(measureSet);
  const w = reviewWindow(quarter, compiled.retinalWindowMonths);
  const practices: string[] = [];
  const practiceIndex = new Map<string, number>();
  const addPractice = (code: string): number => {
    let p = practiceIndex.get(code);
    if (p === undefined) {
      p = practices.length;
      practiceIndex.set(code, p);
      practices.push(code);
    }
    return p;
  };
  for (const code of options.practiceCodes ?? []) addPractice(code);
  for (const r of records) addPractice(r.practiceCode);
  const { localities, practiceLocality } = resolveLocalities(practices, options.localities);
  const P = practices.length;
  const L = localities.length;
  const U = P + L + 1;
  const C = compiled.categoryCount;
  const M = compiled.measures.length;
  const S = compiled.strataCount;
  const layout = histogramLayout(
    compiled,
    (options.practiceBreakdowns ?? false) ? PACK_CELLS_WITH_PRACTICE_BREAKDOWNS : PACK_CELLS,
  );
  const K = layout.cellsPerBlock;
  const practiceBreakdowns = options.practiceBreakdowns ?? false;
  const practiceSize = P * 2 * (practiceBreakdowns ? C - 1 : 1) * K;

  const counts = new Map<number, number>();
  const eligibleCells = new Map<number, number>();
  const recordCells = new Map<number, number>();
  const bump = (map: Map<number, number>, key: number): void => {
    map.set(key, (map.get(key) ?? 0) + 1);
  };
  const strataEvents = new Float64Array(S * M);
  const strataN = new Float64Array(S * M);
  const outcomes: RecordOutcome[] = [];
  const kept: { units: number[]; g: number; stratum: number; codes: number[] }[] = [];

  for (const r of records) {
    const p = practiceIndex.get(r.practiceCode) as number;
    const loc = practiceLocality[p] as number;
    const units = loc >= 0 ? [p, P + loc, P + L] : [p, P + L];
    const { eligible, exclusion, age, codes } = recordCodes(compiled, r, w);
    outcomes.push(outcomeOf(compiled, r, w));
    for (const u of units) {
      bump(recordCells, u * 4);
      bump(recordCells, u * 4 + (eligible ? 1 : exclusion === 'unknown_type' ? 2 : 3));
    }
    if (!eligible) continue;
    const g = typeGroupOf(r.diabetesType as DiabetesType);
    const { categories, stratum } = categoryIndices(compiled, r, age, w.endYear);
    const cells = packCells(layout, codes);
    for (const u of units) {
      for (const c of categories) {
        // Practices without breakdowns keep everyone only (result.ts).
        if (u >= P || practiceBreakdowns || c === 0) bump(eligibleCells, (u * 2 + g) * C + c);
        // Stored blocks (result.ts): practices keep everyone only, unless with practice
        // breakdowns; otherwise everyone is the sum of the sex categories and not stored.
        let base: number;
        if (u < P && !practiceBreakdowns) {
          if (c !== 0) continue;
          base = (u * 2 + g) * K;
        } else {
          if (c === 0) continue;
          base =
            u < P
              ? ((u * 2 + g) * (C - 1) + c - 1) * K
              : practiceSize + (((u - P) * 2 + g) * (C - 1) + c - 1) * K;
        }
        cells.forEach((cell, p) => bump(counts, base + (layout.packs[p]?.offset as number) + cell));
      }
    }
    codes.forEach((code, m) => {
      const kind = (compiled.measures[m] as { denominator: string }).denominator;
      const inDenominator = kind === 'eligible' ? code >= CODE_UNKNOWN : code >= CODE_NOT_MET;
      if (inDenominator) strataN[stratum * M + m] = (strataN[stratum * M + m] as number) + 1;
      if (code === CODE_MET) {
        strataEvents[stratum * M + m] = (strataEvents[stratum * M + m] as number) + 1;
      }
    });
    kept.push({ units, g, stratum, codes });
  }

  let expected: Float64Array | null = null;
  if (options.caseMix ?? true) {
    expected = new Float64Array(U * 2 * M);
    for (const { units, g, stratum, codes } of kept) {
      codes.forEach((code, m) => {
        const kind = (compiled.measures[m] as { denominator: string }).denominator;
        const inDenominator = kind === 'eligible' ? code >= CODE_UNKNOWN : code >= CODE_NOT_MET;
        if (!inDenominator) return;
        const n = strataN[stratum * M + m] as number;
        const rate = n > 0 ? (strataEvents[stratum * M + m] as number) / n : 0;
        for (const u of units) {
          const k = (u * 2 + g) * M + m;
          (expected as Float64Array)[k] = ((expected as Float64Array)[k] as number) + rate;
        }
      });
    }
  }

  const fill = (size: number, map: Map<number, number>): Uint32Array => {
    const array = new Uint32Array(size);
    for (const [k, v] of map) array[k] = v;
    return array;
  };
  const recordArray = fill(U * 4, recordCells);
  let largest = 0;
  for (let p = 0; p < P; p++) largest = Math.max(largest, recordArray[p * 4] as number);
  const practiceCounts =
    largest < 65536 ? new Uint16Array(practiceSize) : new Uint32Array(practiceSize);
  const rollupCounts = new Uint32Array((L + 1) * 2 * (C - 1) * K);
  for (const [k, v] of counts) {
    if (k < practiceSize) practiceCounts[k] = v;
    else rollupCounts[k - practiceSize] = v;
  }
  return {
    result: {
      measureSetId: compiled.id,
      quarter: w.quarter,
      window: w,
      measures: compiled.measures,
      dimensions: compiled.dimensions,
      categoryCount: C,
      practices,
      localities,
      practiceLocality,
      layout,
      practiceBreakdowns,
      counts: practiceCounts,
      rollupCounts,
      eligible: fill(U * 2 * C, eligibleCells),
      records: recordArray,
      expected,
    },
    outcomes,
  };
}
