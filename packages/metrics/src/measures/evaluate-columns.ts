import type { CareColumns } from '../records/columns.js';
import { caseMixExpected } from './case-mix-expected.js';
import { runColumnPass } from './column-pass.js';
import { compileMeasureSet, type CompiledMeasureSet } from './compile.js';
import type { EvaluateOptions } from './evaluate-records.js';
import type { AuditQuarter } from './quarter.js';
import { generatedExpectedKernel } from './record-kernel.js';
import type { EvaluationResult } from './result.js';
import { rollUp } from './roll-up.js';
import type { MeasureSet } from './schema.js';

export { storageShape } from './roll-up.js';

/**
 * The columnar fast path: the same result as `evaluateRecords` (property-tested), in one pass
 * over typed arrays, a block of records at a time (column-pass.ts):
 * 1. eligibility and breakdown categories of each record;
 * 2. each condition of the measure set, by a loop specialised to its rule, sets its bits in
 *    the records' outcome state (1 bit for a yes/no condition, 2 for met/not met/unknown;
 *    composites combine their inputs' bits with word operations);
 * 3. each eligible record adds one to a histogram cell per pack of measures (layout.ts) in
 *    four blocks of its practice and type group: its age band, sex, deprivation quintile and
 *    duration band. The "everyone" category is the sum of the four sex categories.
 * With case mix, a second light pass adds each record's regional stratum rate to its
 * practice's expected count, per measure (case-mix-expected.ts). Localities and the region are
 * sums of practices (roll-up.ts).
 */
export function evaluateColumns(
  columns: CareColumns,
  measureSet: MeasureSet | CompiledMeasureSet,
  quarter: AuditQuarter,
  options: Omit<EvaluateOptions, 'practiceCodes'> = {},
): EvaluationResult {
  const compiled = 'nodes' in measureSet ? measureSet : compileMeasureSet(measureSet);
  const caseMix = options.caseMix ?? true;
  const pass = runColumnPass(columns, compiled, quarter, options, caseMix);
  const P = pass.practices;
  const L = pass.localities;
  if (pass.strataCounts !== null && pass.stratumOf !== null && pass.cellOf !== null) {
    pass.expected = caseMixExpected(
      compiled,
      pass.layout,
      pass.strataCounts,
      pass.stratumOf,
      pass.cellOf,
      columns.practice,
      columns.diabetesType,
      P + L + 1,
      options.kernel === 'generic' ? null : generatedExpectedKernel(compiled, pass.layout),
    );
  }
  rollUp(pass);
  const w = pass.window;
  return {
    measureSetId: compiled.id,
    quarter: w.quarter,
    window: w,
    measures: compiled.measures,
    dimensions: compiled.dimensions,
    categoryCount: compiled.categoryCount,
    practices: pass.practiceCodes,
    localities: pass.localityCodes,
    practiceLocality: pass.practiceLocality,
    layout: pass.layout,
    practiceBreakdowns: pass.practiceBreakdowns,
    counts: pass.counts,
    rollupCounts: pass.rollupCounts,
    eligible: pass.eligible,
    records: pass.records,
    expected: pass.expected,
  };
}
