import type { CareColumns } from '../records/columns.js';
import { categoryTables, type CategoryTables, MAX_AGE } from './category-tables.js';
import type { CompiledMeasureSet } from './compile.js';
import type { EvaluateOptions } from './evaluate-records.js';
import { interpretedLoop } from './interpreted-loop.js';
import {
  histogramLayout,
  type HistogramLayout,
  PACK_CELLS,
  PACK_CELLS_WITH_PRACTICE_BREAKDOWNS,
} from './layout.js';
import { resolveLocalities } from './localities.js';
import { type AuditQuarter, reviewWindow, type ReviewWindow } from './quarter.js';
import { generatedRecordKernel, type KernelArrays, type KernelShape } from './record-kernel.js';
import { type RollUpInput, rollUpPractice, storageShape } from './roll-up.js';

/**
 * The columnar path's record pass: practice sizes, the arrays the loop fills, the choice of
 * loop (generated for the measure set, record-kernel.ts, or interpreted, interpreted-loop.ts)
 * and the pass itself. With practice breakdowns and records grouped by practice, each
 * practice is rolled up into its locality right after its records (its block is in cache).
 * With strata, it also keeps each eligible record's case-mix stratum and pack cells, which
 * the case-mix pass and the benchmark sums read.
 */
export interface ColumnPass extends RollUpInput {
  window: ReviewWindow;
  tables: CategoryTables;
  practiceCodes: readonly string[];
  localityCodes: string[];
  practiceLocality: Int32Array;
  /** Region histograms per case-mix stratum (S × K), with strata. */
  strataCounts: Uint32Array | null;
  /** Stratum of each record (−1 when not eligible), with strata. */
  stratumOf: Int32Array | null;
  /** Cell of each record in each pack (record × packs), with strata; 0 when not eligible. */
  cellOf: Uint8Array | null;
}

export function runColumnPass(
  columns: CareColumns,
  compiled: CompiledMeasureSet,
  quarter: AuditQuarter,
  options: Omit<EvaluateOptions, 'practiceCodes' | 'caseMix'>,
  withStrata: boolean,
): ColumnPass {
  const w = reviewWindow(quarter, compiled.retinalWindowMonths);
  const practiceBreakdowns = options.practiceBreakdowns ?? false;
  const layout: HistogramLayout = histogramLayout(
    compiled,
    practiceBreakdowns ? PACK_CELLS_WITH_PRACTICE_BREAKDOWNS : PACK_CELLS,
  );
  const practices = columns.practiceCodes;
  const { localities, practiceLocality } = resolveLocalities(practices, options.localities);
  const P = practices.length;
  const L = localities.length;
  const U = P + L + 1;
  const C = compiled.categoryCount;
  const K = layout.cellsPerBlock;
  const N = columns.length;
  const practice = columns.practice;

  // Practice sizes; practice blocks are 16-bit when no practice has 65,536 records or more.
  const sizes = new Int32Array(P);
  const runStarts: number[] = [];
  for (let i = 0; i < N; i++) {
    const p = practice[i] as number;
    sizes[p] = (sizes[p] as number) + 1;
    if (i === 0 || p !== practice[i - 1]) runStarts.push(i);
  }
  let present = 0;
  let largest = 0;
  for (let p = 0; p < P; p++) {
    const size = sizes[p] as number;
    if (size > 0) present++;
    if (size > largest) largest = size;
  }
  const grouped = runStarts.length === present;
  const shape = storageShape(P, L, C, K, practiceBreakdowns);
  const counts =
    largest < 65536 ? new Uint16Array(shape.practiceSize) : new Uint32Array(shape.practiceSize);
  const rollupCounts = new Uint32Array(shape.rollupSize);
  const eligible = new Uint32Array(U * 2 * C);
  const records = new Uint32Array(U * 4);
  const S = compiled.strataCount;
  const strataCounts = withStrata ? new Uint32Array(S * K) : null;
  const stratumOf = withStrata ? new Int32Array(N).fill(-1) : null;
  const cellOf = withStrata ? new Uint8Array(N * layout.packs.length) : null;
  // Rollup unit of each practice's records: its locality, or the region (index L).
  const rollupUnit = new Int32Array(P);
  for (let p = 0; p < P; p++) {
    const loc = practiceLocality[p] as number;
    rollupUnit[p] = loc >= 0 ? loc : L;
  }

  const tables = categoryTables(compiled);
  const pass: ColumnPass = {
    compiled,
    layout,
    shape,
    practiceBreakdowns,
    practices: P,
    localities: L,
    sizes,
    rollupUnit,
    rolledUp: new Uint8Array(P),
    sexOffset: tables.sexOffset,
    counts,
    rollupCounts,
    eligible,
    records,
    expected: null,
    window: w,
    tables,
    practiceCodes: practices,
    localityCodes: localities,
    practiceLocality,
    strataCounts,
    stratumOf,
    cellOf,
  };
  const kernelShape: KernelShape = {
    categories: C,
    ageOffset: tables.ageOffset,
    sexOffset: tables.sexOffset,
    deprivationOffset: tables.deprivationOffset,
    durationOffset: tables.durationOffset,
    ageBands: tables.ageBands,
    durationBands: tables.durationBands,
    maxAge: MAX_AGE,
    practiceBreakdowns,
  };
  const generated =
    options.kernel === 'generic'
      ? null
      : generatedRecordKernel(compiled, layout, w, kernelShape, withStrata);

  if (generated !== null) {
    const arrays: KernelArrays = {
      practice,
      birthYear: columns.birthYear,
      diabetesType: columns.diabetesType,
      diagnosisYear: columns.diagnosisYear,
      sex: columns.sex,
      deprivation: columns.deprivation,
      months: columns.months,
      values: columns.values,
      flags: {
        onStatin: columns.onStatin,
        onInsulin: columns.onInsulin,
        cvdHistory: columns.cvdHistory,
      },
      ageBandOf: tables.ageBandOf,
      durationBandOf: tables.durationBandOf,
      rollupUnit,
      counts,
      rollupCounts,
      eligible,
      records,
      strataCounts,
      cellOf,
      stratumOf,
    };
    if (practiceBreakdowns && grouped) {
      for (let r = 0; r < runStarts.length; r++) {
        const from = runStarts[r] as number;
        const to = r + 1 < runStarts.length ? (runStarts[r + 1] as number) : N;
        generated(arrays, from, to);
        rollUpPractice(pass, practice[from] as number);
      }
    } else generated(arrays, 0, N);
  } else {
    interpretedLoop(compiled, layout, columns, w, tables, shape, rollupUnit, {
      counts,
      rollupCounts,
      eligible,
      records,
      strataCounts,
      cellOf,
      stratumOf,
    });
  }
  return pass;
}
