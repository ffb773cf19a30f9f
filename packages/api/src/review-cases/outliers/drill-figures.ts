/**
 * The figures of a drill-down (one practice × one measure), read from the stored quarter
 * results and nothing else: the practice's figures by diabetes type against the region, the
 * change since the previous quarter, the trends with run-chart signals (earlier quarters' stored
 * results), the breakdowns and the value histogram (the practice's stored
 * sums against the region's). Only the region's side reads these (auditors and regional leads),
 * so no count is under disclosure control; the helpers of the practice results page are called
 * with disclosure off, so both pages show the same numbers.
 */
import {
  benchmarkPractice,
  type Benchmark,
  type PracticeDetail,
  type PracticeSums,
  practiceDetail,
  type TypeSplit,
  TYPE_SPLITS,
} from '@cairn/metrics';
import { comparisonOf } from '../../benchmarks/benchmarks.service.js';
import type {
  DetailCellDto,
  ValueHistogramDto,
} from '../../benchmarks/dto/practice-results.dto.js';
import { regionCount, regionRate } from '../../benchmarks/results/peer-disclosure.js';
import {
  caseMix,
  flagWithLimits,
  interval,
  type TrendInput,
  trendDto,
} from '../../benchmarks/results/views.js';
import type { MeasureView } from '../../measure-sets/describe.js';
import type { MeasureSetVersion } from '../../measure-sets/measure-sets.service.js';
import type { QuarterDto } from '../../quarters/dto/quarter.dto.js';
import type { DrillBreakdownDto, DrillSplitDto } from '../dto/outliers.dto.js';

/** Disclosure control is never applied on the region's side. */
const APPLIED = false;

/** One quarter of the trend: its benchmark (null without one) and its measure keys. */
export interface DrillQuarter {
  quarter: QuarterDto;
  benchmark: Benchmark | null;
  measureKeys: ReadonlySet<string>;
}

type Figures = { events: number; n: number };

/** This practice's events and n on the measure in each split of one benchmark, or null. */
function ownFigures(
  b: Benchmark,
  code: string,
  measureKey: string,
): Map<TypeSplit, Figures> | null {
  if (!b.practices.includes(code) || !b.measures.some((m) => m.key === measureKey)) return null;
  const view = benchmarkPractice(b, code);
  return new Map(
    view.results
      .filter((r) => r.measure.key === measureKey)
      .map((r) => [r.split, { events: r.unit.events, n: r.unit.n }]),
  );
}

/** The practice's figures on the measure by diabetes type (all, type 1, type 2 and other). */
export function drillSplits(
  measure: MeasureView,
  code: string,
  series: readonly DrillQuarter[],
): DrillSplitDto[] {
  const current = series[series.length - 1]!;
  const b = current.benchmark!;
  const view = benchmarkPractice(b, code);
  const owns = series.map((s) =>
    s.benchmark && s.measureKeys.has(measure.key)
      ? ownFigures(s.benchmark, code, measure.key)
      : null,
  );
  const previous = series.length >= 2 ? series.length - 2 : -1;
  return TYPE_SPLITS.map((split): DrillSplitDto => {
    const r = view.results.find((x) => x.measure.key === measure.key && x.split === split)!;
    const u = r.unit;
    const c = comparisonOf(b, measure.key, split)!;
    const point = (s: DrillQuarter, figures: Figures | null): TrendInput => ({
      at: { year: s.quarter.year, quarter: s.quarter.quarter },
      state: !s.measureKeys.has(measure.key)
        ? 'not-in-measure-set'
        : figures === null
          ? 'no-submission'
          : 'value',
      events: figures?.events ?? 0,
      n: figures?.n ?? 0,
    });
    const trend = trendDto(series.map((s, i) => point(s, owns[i]?.get(split) ?? null)));
    const regionTrend = trendDto(
      series.map((s) => {
        const rc = s.benchmark ? comparisonOf(s.benchmark, measure.key, split) : null;
        return point(s, rc ? { events: rc.events, n: rc.n } : null);
      }),
    );
    const before = previous >= 0 ? owns[previous]?.get(split) : undefined;
    const change =
      previous >= 0 && before && before.n > 0 && u.rate !== null
        ? {
            previousQuarterId: series[previous]!.quarter.id,
            previousQuarterLabel: series[previous]!.quarter.label,
            previousRate: before.events / before.n,
            difference: u.rate - before.events / before.n,
          }
        : null;
    return {
      split,
      own: {
        n: u.n,
        events: u.events,
        rate: u.rate,
        interval: interval(u.interval),
        exact: flagWithLimits(u.exact),
        adjusted: flagWithLimits(u.adjusted),
        caseMix: caseMix(u),
      },
      region: {
        rate: regionRate(c.events, c.n, u.events, u.n, APPLIED),
        median: c.practice.median,
        events: regionCount(c.events, u.events, APPLIED),
        n: regionCount(c.n, u.n, APPLIED),
        practices: c.practice.units,
        overdispersion: c.practice.overdispersion?.present ?? false,
      },
      change,
      improvement: { records: u.improvementPotential, median: c.practice.median },
      trend,
      regionTrend,
    };
  });
}

type DetailCell = PracticeDetail['measures'][number]['splits'][number]['everyone'];

const cellOf = (category: string, c: DetailCell): DetailCellDto => ({
  category,
  practice: {
    events: c.practice.events,
    n: c.practice.n,
    rate: c.practice.rate,
    interval: interval(c.practice.interval),
  },
  region: {
    events: regionCount(c.region.events, c.practice.events, APPLIED),
    n: regionCount(c.region.n, c.practice.n, APPLIED),
    rate: regionRate(c.region.events, c.region.n, c.practice.events, c.practice.n, APPLIED),
  },
});

const shown = (value: number) => ({ value, display: String(value) });

/** The measure's everyone cell and breakdowns, and one value histogram, for one split. */
export function drillDetail(
  practice: PracticeSums,
  region: PracticeSums,
  version: MeasureSetVersion,
  measureKey: string,
  split: TypeSplit,
  histogramKey: string | null,
): {
  everyone: DetailCellDto | null;
  breakdowns: DrillBreakdownDto[];
  histogram: ValueHistogramDto | null;
} {
  const d = practiceDetail(practice, region, version.compiled);
  const s = d.measures.find((m) => m.key === measureKey)?.splits.find((x) => x.split === split);
  const v = histogramKey === null ? undefined : d.values.find((x) => x.key === histogramKey);
  return {
    everyone: s ? cellOf('everyone', s.everyone) : null,
    breakdowns: s
      ? d.dimensions.map((dim) => ({
          breakdown: {
            key: dim.key,
            label: dim.label,
            categories: dim.categories.map((c) => ({ key: c.key, label: c.label })),
          },
          cells: {
            breakdown: dim.key,
            cells: (s.categories[dim.key] ?? []).map((c, i) =>
              cellOf(dim.categories[i]?.key ?? String(i), c),
            ),
          },
        }))
      : [],
    histogram: v
      ? {
          key: v.key,
          label: v.label,
          unit: v.unit,
          edges: [...v.edges],
          splits: v.splits.map((x) => ({
            split: x.split,
            practice: {
              notRecorded: shown(x.practice.notRecorded),
              below: shown(x.practice.below),
              bins: x.practice.bins.map(shown),
              above: shown(x.practice.above),
            },
            region: {
              notRecorded: regionCount(x.region.notRecorded, x.practice.notRecorded, APPLIED),
              below: regionCount(x.region.below, x.practice.below, APPLIED),
              bins: x.region.bins.map((b, i) => regionCount(b, x.practice.bins[i] ?? 0, APPLIED)),
              above: regionCount(x.region.above, x.practice.above, APPLIED),
            },
          })),
        }
      : null,
  };
}
