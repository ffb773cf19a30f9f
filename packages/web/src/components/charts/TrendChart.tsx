import { HTMLTable } from '@blueprintjs/core';
import { line, scaleLinear, scalePoint } from 'd3';
import { formatCount, formatPercent } from '../../lib/format';
import { type SignalsLike, signalSentences, signalledPoints } from './run-signals';

export interface TrendChartPoint {
  /** The quarter, e.g. "2026 Q2" */
  label: string;
  /** null for a gap (no figures that quarter): never drawn as 0 */
  rate: number | null;
  events: number;
  n: number;
  /** Why there is a gap, in words, when there is one */
  gap?: string;
}

export interface TrendChartProps {
  /** What is drawn, e.g. "HbA1c, the region" */
  title: string;
  points: TrendChartPoint[];
  signals: SignalsLike;
  width?: number;
  height?: number;
}

/** The chart in words: first and last figure and every run-chart signal. */
export function trendChartText({ points, signals }: TrendChartProps): string {
  const values = points.filter((p) => p.rate != null);
  if (values.length === 0) return 'No figures in any quarter.';
  const first = values[0]!;
  const last = values.at(-1)!;
  const said = signalSentences(
    signals,
    points.map((p) => p.label),
  );
  return `${values.length} quarters with figures, ${first.label} ${formatPercent(first.rate)} to ${last.label} ${formatPercent(last.rate)}. ${said.length > 0 ? `${said.join('. ')}.` : 'No run-chart signal.'}`;
}

/**
 * A run chart with axes: the rate per quarter joined by a line (gaps left open), the median
 * dashed, quarters in a shift or a trend drawn as filled squares, the others as open circles
 * (shape, not colour alone). The rate axis covers every point and the median, with round ticks.
 * The signals are the API's (run-chart rules: R. J. Perla, L. P. Provost & S. K. Murray, BMJ Qual
 * Saf 2011;20:46–51); the chart only draws them.
 */
export function TrendChart(props: TrendChartProps) {
  const { title, points, signals, width = 640, height = 220 } = props;
  const margin = { top: 12, right: 16, bottom: 34, left: 48 };
  const rates = points.flatMap((p) => (p.rate == null ? [] : [p.rate]));
  const values = [...rates, ...(signals.median != null ? [signals.median] : [])];
  const lo = values.length ? Math.max(0, Math.min(...values) - 0.02) : 0;
  const hi = values.length ? Math.min(1, Math.max(...values) + 0.02) : 1;
  const x = scalePoint<number>()
    .domain(points.map((_, i) => i))
    .range([margin.left + 12, width - margin.right - 12]);
  const y = scaleLinear()
    .domain(lo < hi ? [lo, hi] : [Math.max(0, lo - 0.05), Math.min(1, hi + 0.05)])
    .nice(5)
    .range([height - margin.bottom, margin.top]);
  const path = line<TrendChartPoint>()
    .defined((p) => p.rate != null)
    .x((_, i) => x(i) ?? 0)
    .y((p) => y(p.rate ?? 0))(points);
  const marked = signalledPoints(signals);
  return (
    <svg
      className="cairn-trend-chart"
      width={width}
      height={height}
      role="img"
      aria-label={`${title}: ${trendChartText(props)}`}
    >
      <g className="cairn-chart-axis" aria-hidden="true">
        {y.ticks(5).map((t) => (
          <g key={t} transform={`translate(${margin.left},${y(t)})`}>
            <line x2={width - margin.left - margin.right} className="cairn-chart-grid" />
            <text x={-6} dy="0.32em" textAnchor="end">
              {formatPercent(t, 0)}
            </text>
          </g>
        ))}
        {points.map((p, i) => (
          <text key={p.label} x={x(i)} y={height - margin.bottom + 16} textAnchor="middle">
            {p.label}
          </text>
        ))}
      </g>
      {signals.median != null && rates.length > 0 ? (
        <line
          x1={margin.left}
          x2={width - margin.right}
          y1={y(signals.median)}
          y2={y(signals.median)}
          className="cairn-chart-median-line"
        />
      ) : null}
      {path ? <path d={path} className="cairn-trend-line" /> : null}
      {points.map((p, i) =>
        p.rate == null ? null : marked.has(i) ? (
          <rect
            key={i}
            x={(x(i) ?? 0) - 4.5}
            y={y(p.rate) - 4.5}
            width={9}
            height={9}
            className="cairn-trend-signal"
          />
        ) : (
          <circle key={i} cx={x(i)} cy={y(p.rate)} r={4} className="cairn-trend-point" />
        ),
      )}
    </svg>
  );
}

/** The run chart's figures, a quarter a row, with the signals under the table. */
export function TrendChartTable(props: TrendChartProps) {
  const marked = signalledPoints(props.signals);
  return (
    <>
      <HTMLTable compact striped aria-label={`${props.title}: figures`}>
        <thead>
          <tr>
            <th scope="col">Quarter</th>
            <th scope="col">Rate</th>
            <th scope="col">Events</th>
            <th scope="col">Denominator</th>
            <th scope="col">Run-chart signal</th>
          </tr>
        </thead>
        <tbody>
          {props.points.map((p, i) => (
            <tr key={p.label}>
              <th scope="row">{p.label}</th>
              <td>{p.rate == null ? (p.gap ?? 'no figure') : formatPercent(p.rate)}</td>
              <td>{p.rate == null ? '—' : formatCount(p.events)}</td>
              <td>{p.rate == null ? '—' : formatCount(p.n)}</td>
              <td>{marked.has(i) ? 'Part of a shift or trend' : '—'}</td>
            </tr>
          ))}
        </tbody>
      </HTMLTable>
      <p className="cairn-small">{trendChartText(props)}</p>
    </>
  );
}
