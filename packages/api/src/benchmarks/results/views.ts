/**
 * @cairn/metrics' benchmark views as the API sends them (dto/): pure
 * functions from a unit's results, a region's comparison and run-chart
 * signals to the DTO shapes. Nothing is computed here that the metrics did
 * not; the shapes only name things.
 */
import {
  type Interval,
  type MeasureComparison,
  type OverdispersionSummary,
  type RateTrend,
  rateTrend,
  type UnitFlag,
  type UnitResult,
} from '@cairn/metrics';
import type { BenchmarkCellDto, RegionMeasureDto } from '../dto/benchmark.dto.js';
import type {
  CaseMixDto,
  FlagDto,
  FlagWithLimitsDto,
  IntervalDto,
  OverdispersionDto,
  RateTrendDto,
  TrendPointState,
} from '../dto/results-common.dto.js';
import type { QuarterResult } from '../benchmark-store.service.js';
import type { BuiltFromDto } from '../dto/results-common.dto.js';

export const interval = (i: Interval): IntervalDto => ({ lower: i.lower, upper: i.upper });

export const flag = (f: UnitFlag): FlagDto => ({
  band: f.band,
  side: f.side,
  assessment: f.assessment,
});

export const flagWithLimits = (f: UnitFlag): FlagWithLimitsDto => ({
  ...flag(f),
  inner: interval(f.inner),
  outer: interval(f.outer),
});

export const caseMix = (u: UnitResult): CaseMixDto => ({
  observed: u.caseMix.observed,
  expected: u.caseMix.expected,
  ratio: u.caseMix.ratio,
  interval: interval(u.caseMix.interval),
  adjustedRate: u.caseMix.adjustedRate,
});

export const overdispersion = (o: OverdispersionSummary | null): OverdispersionDto | null =>
  o === null
    ? null
    : {
        phi: o.phi,
        tau2: o.tau2,
        present: o.present,
        statistic: o.statistic,
        critical: o.critical,
      };

/** One practice on one measure, as a cell of the practices × measures table. */
export const cell = (measure: string, u: UnitResult): BenchmarkCellDto => ({
  measure,
  n: u.n,
  events: u.events,
  rate: u.rate,
  interval: interval(u.interval),
  exact: flag(u.exact),
  adjusted: flag(u.adjusted),
  caseMix: caseMix(u),
  improvementPotential: u.improvementPotential,
});

/** The region's figures on one measure and split. */
export const regionMeasure = (c: MeasureComparison): RegionMeasureDto => ({
  measure: c.measure,
  events: c.events,
  n: c.n,
  theta0: c.theta0,
  median: c.practice.median,
  practices: c.practice.units,
  overdispersion: overdispersion(c.practice.overdispersion),
});

export const builtFrom = (r: QuarterResult): BuiltFromDto => ({
  resultId: r.id,
  quarterId: r.quarterId,
  quarterLabel: r.quarterLabel,
  measureSetId: r.version.id,
  submissions: r.submissionCount,
  submissionsKey: r.key,
  builtAt: r.builtAt,
  buildMs: r.buildMs,
});

/** A point of a trend before the run chart: a quarter and its figures, or a gap. */
export interface TrendInput {
  at: { year: number; quarter: 1 | 2 | 3 | 4 };
  state: TrendPointState;
  events: number;
  n: number;
}

/** rateTrend's points and signals, with each point's quarter and state. */
export function rateTrendDto(inputs: readonly TrendInput[], trend: RateTrend): RateTrendDto {
  const s = trend.signals;
  return {
    points: inputs.map((p, i) => ({
      state: p.state,
      events: p.events,
      n: p.n,
      rate: p.state === 'value' ? (trend.points[i]?.rate ?? null) : null,
    })),
    signals: {
      median: s.median,
      usefulObservations: s.usefulObservations,
      runs: s.runs,
      runsLimits: s.runsLimits ? { lower: s.runsLimits.lower, upper: s.runsLimits.upper } : null,
      tooFewRuns: s.tooFewRuns,
      tooManyRuns: s.tooManyRuns,
      shifts: s.shifts.map((x) => ({
        start: x.start,
        end: x.end,
        length: x.length,
        side: x.side,
      })),
      trends: s.trends.map((x) => ({
        start: x.start,
        end: x.end,
        length: x.length,
        direction: x.direction,
      })),
    },
  };
}

/**
 * A series over quarters (oldest first) with its run-chart signals (rateTrend, docs/methods.md
 * §8): a gap (no submission, or a measure its quarter's measure set lacks) is a point without a
 * rate, which the run chart skips — never a zero.
 */
export function trendDto(inputs: readonly TrendInput[]): RateTrendDto {
  const trend = rateTrend(
    inputs.map((p) =>
      p.state === 'value'
        ? { quarter: p.at, events: p.events, n: p.n }
        : { quarter: p.at, events: 0, n: 0 },
    ),
  );
  return rateTrendDto(inputs, trend);
}
