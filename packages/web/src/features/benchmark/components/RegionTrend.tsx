import { H2, Spinner } from '@blueprintjs/core';
import { ChartOrTable } from '../../../components/charts/ChartOrTable';
import {
  TrendChart,
  type TrendChartPoint,
  TrendChartTable,
} from '../../../components/charts/TrendChart';
import { ProblemCallout } from '../../../components/ProblemCallout';
import type { BenchmarkTrend, TypeSplit } from '../../../lib/api/types';
import { useBenchmarkTrend } from '../api/benchmark';

const gapWords: Record<string, string> = {
  'no-submission': 'no current submission',
  'not-in-measure-set': 'not in that quarter’s measure set',
};

/** The region's pooled rate per quarter as run-chart points (gaps kept as gaps). */
export function regionTrendPoints(trend: BenchmarkTrend): TrendChartPoint[] {
  return trend.region.points.map((p, i) => ({
    label: trend.quarters[i]?.quarterLabel ?? `Quarter ${i + 1}`,
    rate: p.state === 'value' ? p.rate : null,
    events: p.events,
    n: p.n,
    gap: p.state === 'value' ? undefined : gapWords[p.state],
  }));
}

/** `/benchmark`'s section on the region over time, for the measure shown in the funnel. */
export function RegionTrend({
  quarterId,
  measure,
  split,
}: {
  quarterId: number | null;
  measure: string | null;
  split: TypeSplit;
}) {
  const trend = useBenchmarkTrend(quarterId, measure, split);
  const data = trend.data;
  const title = data ? `${data.measure.label}, the region by quarter` : 'The region by quarter';
  return (
    <section aria-labelledby="bench-trend" className="cairn-bench-section">
      <H2 id="bench-trend">The region over time</H2>
      <ProblemCallout error={trend.error} />
      {trend.isPending && measure ? (
        <Spinner size={20} aria-label="Reading the region's trend" />
      ) : null}
      {data ? (
        <>
          <p className="cairn-small">
            The region&apos;s pooled rate of {data.measure.label} in each audit quarter up to{' '}
            {data.quarter.label}. The dashed line is its median; filled squares mark quarters in a
            run-chart shift (6 or more in a row on one side of the median) or trend (5 or more in a
            row rising or falling).
          </p>
          <ChartOrTable
            label="Region trend"
            chart={
              <TrendChart
                title={title}
                points={regionTrendPoints(data)}
                signals={data.region.signals}
              />
            }
            table={
              <TrendChartTable
                title={title}
                points={regionTrendPoints(data)}
                signals={data.region.signals}
              />
            }
          />
        </>
      ) : null}
    </section>
  );
}
