/**
 * @cairn/metrics: Cairn's metrics engine. Pure TypeScript with no I/O: nothing here reads
 * files, the network or the clock, and nothing imports platform modules, so the same build
 * serves the API and the browser.
 */
export const METRICS_PACKAGE = '@cairn/metrics';

// Records
export * from './records/record.js';
export * from './records/month.js';
export * from './records/columns.js';

// Measure sets and evaluation
export * from './measures/schema.js';
export * from './measures/threshold-ranges.js';
export * from './measures/quarter.js';
export * from './measures/compile.js';
export type { HistogramLayout, HistogramPack } from './measures/layout.js';
export * from './measures/localities.js';
export * from './measures/result.js';
export * from './measures/evaluate-records.js';
export * from './measures/evaluate-columns.js';

// Statistics
export * from './stats/interval.js';
export { normalQuantile, zForConfidence } from './stats/normal-quantile.js';
export { normalCdf, erfc } from './stats/normal-cdf.js';
export { logGamma } from './stats/log-gamma.js';
export { binomialPmf } from './stats/binomial-pmf.js';
export { binomialCdf } from './stats/binomial-cdf.js';
export { binomialQuantile } from './stats/binomial-quantile.js';
export { gammaQuantile } from './stats/gamma-quantile.js';
export { chiSquareQuantile } from './stats/chisquare-quantile.js';
export { wilsonInterval } from './stats/wilson-interval.js';
export { funnelLimits } from './stats/funnel-limits.js';
export * from './stats/overdispersion.js';
export * from './stats/overdispersed-limits.js';
export * from './stats/funnel-flag.js';
export * from './stats/compare-units.js';
export { poissonInterval } from './stats/poisson-interval.js';
export * from './stats/indirect-standardise.js';
export { runsLimits } from './stats/runs-limits.js';
export * from './stats/run-chart.js';
export * from './stats/kaplan-meier.js';
export * from './stats/improvement-potential.js';

// Units and kidney
export * from './units/hba1c.js';
export * from './units/glucose.js';
export * from './units/cholesterol.js';
export * from './units/creatinine.js';
export * from './units/acr.js';
export * from './kidney/egfr-ckd-epi-2021.js';
export * from './kidney/kdigo.js';

// Disclosure control and pseudonyms
export * from './disclosure/disclosure-control.js';
export {
  protectTable,
  type ProtectedTable,
  type PublishedTotals,
  type TableProtectionOptions,
} from './disclosure/protect-table.js';
export { revealedCounts, type TablePosition } from './disclosure/audit-suppression.js';
export {
  recordPseudonym,
  createPseudonymiser,
  pseudonymMessage,
  PSEUDONYM_LENGTH,
} from './disclosure/pseudonym.js';
export { sha256, hmacSha256, toHex } from './disclosure/sha256.js';
export * from './progression/insulin.js';

// Benchmark sums: per-practice counts that add up, their stored form and merging
export type { PracticeSums, Counts } from './sums/practice-sums.js';
export { SumsMismatchError } from './sums/practice-sums.js';
export { sumsLayout, SUMS_FORMAT_VERSION, type SumsLayout } from './sums/sums-layout.js';
export { sumsOfColumns, type SumsOptions } from './sums/sums-of-columns.js';
export { encodeSums } from './sums/encode-sums.js';
export { decodeSums, SumsDecodeError, type SumsDecodeProblem } from './sums/decode-sums.js';
export { addSums, mergeSums, replaceSums } from './sums/merge-sums.js';
export {
  VALUE_HISTOGRAMS,
  binEdges,
  type ValueHistogramKey,
  type ValueHistogramSpec,
} from './sums/value-bins.js';
export {
  KIDNEY_COLUMNS,
  KIDNEY_ROWS,
  type KidneyColumn,
  type KidneyRow,
} from './sums/kidney-grid.js';

// Benchmarks built from sums
export * from './benchmark/benchmark.js';
export {
  buildBenchmark,
  buildBenchmarkOfParts,
  type BenchmarkParts,
  type BenchmarkPartsInput,
  type BenchmarkPracticeInput,
  type BuildBenchmarkInput,
} from './benchmark/build-benchmark.js';
export * from './benchmark/benchmark-views.js';
export * from './benchmark/practice-detail.js';
export * from './benchmark/rate-trend.js';
