import { type CareColumns, TYPE_1, TYPE_2 } from '../records/columns.js';
import type { MeasurementField } from '../records/record.js';
import { runColumnPass } from '../measures/column-pass.js';
import { CODE_MET, type CompiledMeasureSet } from '../measures/compile.js';
import type { AuditQuarter } from '../measures/quarter.js';
import { rollUp } from '../measures/roll-up.js';
import type { MeasureSet } from '../measures/schema.js';
import { INSULIN_EXCLUDED, insulinTimeAt } from '../progression/insulin.js';
import { acrColumn, egfrOrReason, kidneyCell, kidneyRow } from './kidney-grid.js';
import { allocateSums, type PracticeSums, sectionLengths, sumsWidths } from './practice-sums.js';
import { sumsLayout, type SumsLayout } from './sums-layout.js';
import { everyoneTallies } from './sums-tallies.js';
import { VALUE_HISTOGRAMS, type ValueHistogramSpec, valueSlot } from './value-bins.js';

/**
 * The sums of every practice present in a set of records (practice-sums.ts), in two passes:
 * 1. the columnar evaluation's record pass with practice breakdowns and strata
 *    (measures/column-pass.ts): the outcome histograms per practice, type group and category,
 *    each eligible record's case-mix stratum and its cell in each pack of measures;
 * 2. a light pass over the records practice by practice that adds each eligible record to its
 *    stratum's counts (one increment per event and per own n, from a table of the pack cells),
 *    to the insulin life table (progression/insulin.ts), to the value histograms
 *    (value-bins.ts) and to the kidney grid (kidney-grid.ts).
 * The same function serves a full recompute (every record of the region) and one submission's
 * records; a practice's sums depend only on its own records, so both give equal sums.
 */
export interface SumsOptions {
  /** 'generic' forces the table-driven record loop (see EvaluateOptions.kernel). */
  kernel?: 'generated' | 'generic';
}

/** Measurement of each value histogram other than eGFR. */
const MEASUREMENT_OF: Partial<Record<string, MeasurementField>> = {
  hba1c: 'hba1c',
  systolic: 'systolic',
  diastolic: 'diastolic',
  cholesterol: 'cholesterol',
  bmi: 'bmi',
};

/** For each pack cell, the stratum slots a record in it adds one to (events, own n). */
function strataSlots(layout: SumsLayout): { start: Int32Array; slots: Int32Array } {
  const { histogram } = layout;
  const start = new Int32Array(histogram.cellsPerBlock + 1);
  const slots: number[] = [];
  for (const pack of histogram.packs) {
    for (let x = 0; x < pack.cells; x++) {
      start[pack.offset + x] = slots.length;
      for (const m of pack.measures) {
        const code = (histogram.cellCodes[m] as Uint8Array)[x] as number;
        if (code === CODE_MET) slots.push(1 + m);
        const n = layout.nSlot[m] as number;
        if (n > 0 && layout.inN(code, m)) slots.push(n);
      }
      start[pack.offset + x + 1] = slots.length;
    }
  }
  return { start, slots: Int32Array.from(slots) };
}

export function sumsOfColumns(
  columns: CareColumns,
  measureSet: MeasureSet | CompiledMeasureSet | SumsLayout,
  quarter: AuditQuarter,
  options: SumsOptions = {},
): Map<string, PracticeSums> {
  const layout = sumsLayout(measureSet);
  const compiled = layout.compiled;
  const pass = runColumnPass(
    columns,
    compiled,
    quarter,
    { practiceBreakdowns: true, kernel: options.kernel },
    true,
  );
  rollUp(pass);
  const w = pass.window;
  const stratumOf = pass.stratumOf as Int32Array;
  const cellOf = pass.cellOf as Uint8Array;
  const P = pass.practices;
  const N = columns.length;
  const V = layout.valuesPerStratum;
  const S = layout.strataCount;
  const packOffset = Int32Array.from(layout.histogram.packs.map((p) => p.offset));
  const { start: slotStart, slots } = strataSlots(layout);

  // Records practice by practice: as they come when grouped in order of first appearance (a
  // database load ordered by practice), else through a counting sort.
  const sizes = pass.sizes;
  const first = new Int32Array(P + 1);
  for (let p = 0; p < P; p++) first[p + 1] = (first[p] as number) + (sizes[p] as number);
  let inOrder = true;
  for (let i = 1; i < N && inOrder; i++) {
    if ((columns.practice[i] as number) < (columns.practice[i - 1] as number)) inOrder = false;
  }
  let order: Int32Array | null = null;
  if (!inOrder) {
    order = new Int32Array(N);
    const next = first.slice(0, P);
    for (let i = 0; i < N; i++) {
      const p = columns.practice[i] as number;
      order[next[p] as number] = i;
      next[p] = (next[p] as number) + 1;
    }
  }

  const endYear = w.endYear;
  const lo = w.startIndex;
  const span = w.endIndex - w.startIndex;
  const minAge = compiled.eligibilityMinAge;
  const VPG = layout.valuesPerGroup;
  const KPG = layout.kidneyPerGroup;
  const W = 2 * (layout.insulinMaxYears + 1);
  const plain = VALUE_HISTOGRAMS.flatMap((spec, h) => {
    const field = MEASUREMENT_OF[spec.key];
    if (field === undefined) return [];
    const monthField = field === 'systolic' || field === 'diastolic' ? 'bloodPressure' : field;
    return [
      {
        spec,
        offset: layout.valueOffsets[h] as number,
        months: columns.months[monthField],
        values: columns.values[field],
      },
    ];
  });
  const egfrIndex = VALUE_HISTOGRAMS.findIndex((s) => s.key === 'egfr');
  const egfr: Histogram = {
    spec: VALUE_HISTOGRAMS[egfrIndex] as ValueHistogramSpec,
    offset: layout.valueOffsets[egfrIndex] as number,
  };

  const strata = new Uint32Array(S * V);
  const touched = new Uint32Array(S);
  const mark = new Uint8Array(S);
  const insulin = new Uint32Array(W);
  const values = new Uint32Array(2 * VPG);
  const kidney = new Uint32Array(2 * KPG);
  const out = new Map<string, PracticeSums>();
  const run: Run = { first: 0, end: 0, order, stratumOf, diabetesType: columns.diabetesType };

  for (let p = 0; p < P; p++) {
    if (sizes[p] === 0) continue;
    run.first = first[p] as number;
    run.end = first[p + 1] as number;
    const nt = addStrata(run, cellOf, packOffset, slotStart, slots, V, strata, touched, mark);
    const excluded = addInsulin(run, columns, endYear, minAge, insulin);
    for (const h of plain) {
      addValues(run, h.months, h.values, lo, span, h.spec, h.offset, VPG, values);
    }
    addKidney(run, columns, lo, span, endYear, egfr, VPG, values, KPG, kidney);
    let insulinLength = W;
    while (insulinLength > 0 && insulin[insulinLength - 1] === 0) insulinLength--;
    if (insulinLength % 2 === 1) insulinLength++;
    out.set(
      pass.practiceCodes[p] as string,
      emit(layout, pass, p, w.quarter, {
        strata,
        touched: touched.subarray(0, nt),
        mark,
        insulin,
        insulinLength,
        excluded,
        values,
        kidney,
      }),
    );
  }
  return out;
}

/** The records of one practice: positions first … end − 1 (through `order` when given). */
interface Run {
  first: number;
  end: number;
  order: Int32Array | null;
  stratumOf: Int32Array;
  diabetesType: Uint8Array;
}

interface Histogram {
  spec: ValueHistogramSpec;
  offset: number;
}

/** Adds each eligible record to its stratum's counts; returns the number of strata touched. */
function addStrata(
  run: Run,
  cellOf: Uint8Array,
  packOffset: Int32Array,
  slotStart: Int32Array,
  slots: Int32Array,
  V: number,
  strata: Uint32Array,
  touched: Uint32Array,
  mark: Uint8Array,
): number {
  const { order, stratumOf } = run;
  const packCount = packOffset.length;
  let nt = 0;
  for (let j = run.first; j < run.end; j++) {
    const i = order === null ? j : (order[j] as number);
    const s = stratumOf[i] as number;
    if (s < 0) continue;
    if (mark[s] === 0) {
      mark[s] = 1;
      touched[nt++] = s;
    }
    const b = s * V;
    strata[b] = (strata[b] as number) + 1;
    const ci = i * packCount;
    for (let q = 0; q < packCount; q++) {
      const cell = (packOffset[q] as number) + (cellOf[ci + q] as number);
      const to = slotStart[cell + 1] as number;
      for (let k = slotStart[cell] as number; k < to; k++) {
        const x = b + (slots[k] as number);
        strata[x] = (strata[x] as number) + 1;
      }
    }
  }
  return nt;
}

/** Adds the eligible type 2 records to the insulin life table; returns the excluded count. */
function addInsulin(
  run: Run,
  columns: CareColumns,
  endYear: number,
  minAge: number,
  insulin: Uint32Array,
): number {
  const { order, stratumOf, diabetesType } = run;
  let excluded = 0;
  for (let j = run.first; j < run.end; j++) {
    const i = order === null ? j : (order[j] as number);
    if ((stratumOf[i] as number) < 0 || diabetesType[i] !== TYPE_2) continue;
    const time = insulinTimeAt(columns, i, endYear, minAge);
    if (time === INSULIN_EXCLUDED) excluded++;
    else if (time >= 0) insulin[time] = (insulin[time] as number) + 1;
  }
  return excluded;
}

/** Adds each eligible record's latest value in the window to a value histogram. */
function addValues(
  run: Run,
  months: Int16Array,
  values: Float64Array,
  lo: number,
  span: number,
  spec: ValueHistogramSpec,
  offset: number,
  perGroup: number,
  out: Uint32Array,
): void {
  const { order, stratumOf, diabetesType } = run;
  for (let j = run.first; j < run.end; j++) {
    const i = order === null ? j : (order[j] as number);
    if ((stratumOf[i] as number) < 0) continue;
    const v = values[i] as number;
    const slot = ((months[i] as number) - lo) >>> 0 <= span && v === v ? valueSlot(spec, v) : 0;
    const x = (diabetesType[i] === TYPE_1 ? 0 : perGroup) + offset + slot;
    out[x] = (out[x] as number) + 1;
  }
}

/** Adds each eligible record to the kidney grid and its eGFR to the eGFR histogram. */
function addKidney(
  run: Run,
  columns: CareColumns,
  lo: number,
  span: number,
  endYear: number,
  egfr: Histogram,
  perGroup: number,
  values: Uint32Array,
  kidneyPerGroup: number,
  kidney: Uint32Array,
): void {
  const { order, stratumOf, diabetesType } = run;
  const creatinineMonth = columns.months.serumCreatinine;
  const creatinine = columns.values.serumCreatinine;
  const acrMonth = columns.months.urineAlbumin;
  const acr = columns.values.urineAlbumin;
  const { sex, birthYear } = columns;
  for (let j = run.first; j < run.end; j++) {
    const i = order === null ? j : (order[j] as number);
    if ((stratumOf[i] as number) < 0) continue;
    const g = diabetesType[i] === TYPE_1 ? 0 : 1;
    const cv =
      ((creatinineMonth[i] as number) - lo) >>> 0 <= span ? (creatinine[i] as number) : NaN;
    const e = egfrOrReason(cv, sex[i] as number, endYear - (birthYear[i] as number));
    const vx = g * perGroup + egfr.offset + (e >= 0 ? valueSlot(egfr.spec, e) : 0);
    values[vx] = (values[vx] as number) + 1;
    const av = ((acrMonth[i] as number) - lo) >>> 0 <= span ? (acr[i] as number) : NaN;
    const kx = g * kidneyPerGroup + kidneyCell(kidneyRow(e), acrColumn(av));
    kidney[kx] = (kidney[kx] as number) + 1;
  }
}
interface Scratch {
  strata: Uint32Array;
  touched: Uint32Array;
  mark: Uint8Array;
  insulin: Uint32Array;
  insulinLength: number;
  excluded: number;
  values: Uint32Array;
  kidney: Uint32Array;
}

/** One practice's sums from the pass and the scratch counts, which it clears for the next. */
function emit(
  layout: SumsLayout,
  pass: ReturnType<typeof runColumnPass>,
  p: number,
  quarter: AuditQuarter,
  scratch: Scratch,
): PracticeSums {
  const V = layout.valuesPerStratum;
  const C = layout.categories;
  const ids = Uint32Array.from(scratch.touched).sort();
  const block = layout.cellCount;
  const cells = pass.counts.subarray(p * block, (p + 1) * block);
  const eligible = pass.eligible.subarray(p * 2 * C, (p + 1) * 2 * C);
  const insulin = scratch.insulin.subarray(0, scratch.insulinLength);
  let fullest = 0;
  for (const s of ids) fullest = Math.max(fullest, scratch.strata[s * V] as number);
  const lengths = sectionLengths(layout, ids.length, scratch.insulinLength);
  const a = allocateSums(
    lengths,
    ids.length,
    sumsWidths(pass.records[p * 4 + 1] as number, fullest),
  );
  a.records.set(pass.records.subarray(p * 4, p * 4 + 4));
  a.ids.set(ids);
  for (let j = 0; j < ids.length; j++) {
    const s = ids[j] as number;
    const b = s * V;
    a.strataValues.set(scratch.strata.subarray(b, b + V), j * V);
    scratch.strata.fill(0, b, b + V);
    scratch.mark[s] = 0;
  }
  a.insulin.set(insulin);
  insulin.fill(0);
  a.values.set(scratch.values);
  scratch.values.fill(0);
  a.kidney.set(scratch.kidney);
  scratch.kidney.fill(0);
  a.cells.set(cells);
  a.eligible.set(eligible);
  return {
    measureSetId: layout.compiled.id,
    fingerprint: layout.fingerprint,
    quarter: { year: quarter.year, quarter: quarter.quarter },
    practices: 1,
    records: a.records,
    cells: a.cells,
    eligible: a.eligible,
    strata: { ids: a.ids, values: a.strataValues },
    insulin: { counts: a.insulin, excluded: scratch.excluded },
    values: a.values,
    kidney: a.kidney,
    tallies: everyoneTallies(layout, a.cells),
  };
}
