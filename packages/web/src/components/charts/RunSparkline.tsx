import { line, scaleLinear, scalePoint } from 'd3';
import { formatPercent } from '../../lib/format';
import { type SignalsLike, signalSentences, signalledPoints } from './run-signals';

export interface RunPoint {
  label: string;
  /** null for a gap (no submission, or not in that quarter's measure set): never drawn as 0 */
  rate: number | null;
}

export interface RunSparklineProps {
  points: RunPoint[];
  signals: SignalsLike;
  width?: number;
  height?: number;
}

export function sparklineText({ points, signals }: RunSparklineProps): string {
  const values = points.filter((p) => p.rate != null);
  if (values.length === 0) return 'No earlier quarters';
  const first = values[0]!;
  const last = values[values.length - 1]!;
  const head = `${values.length} quarters, ${first.label} ${formatPercent(first.rate)} to ${last.label} ${formatPercent(last.rate)}`;
  const said = signalSentences(
    signals,
    points.map((p) => p.label),
  );
  return said.length > 0 ? `${head}. ${said.join('. ')}` : `${head}. No run-chart signal`;
}

/**
 * A small run chart: the rate per quarter, the median dashed, points that are
 * part of a shift or a trend drawn as larger filled squares (shape, not colour).
 */
export function RunSparkline(props: RunSparklineProps) {
  const { points, signals, width = 128, height = 34 } = props;
  const rates = points.flatMap((p) => (p.rate == null ? [] : [p.rate]));
  const lo = Math.min(...rates, signals.median ?? 1);
  const hi = Math.max(...rates, signals.median ?? 0);
  const pad = Math.max(0.02, (hi - lo) * 0.15);
  const x = scalePoint<number>()
    .domain(points.map((_, i) => i))
    .range([5, width - 5]);
  const y = scaleLinear()
    .domain([Math.max(0, lo - pad), Math.min(1, hi + pad)])
    .range([height - 5, 5]);
  const path = line<RunPoint>()
    .defined((p) => p.rate != null)
    .x((_, i) => x(i) ?? 0)
    .y((p) => y(p.rate ?? 0))(points);
  const marked = signalledPoints(signals);
  return (
    <svg
      className="cairn-sparkline"
      width={width}
      height={height}
      role="img"
      aria-label={sparklineText(props)}
    >
      {signals.median != null && rates.length > 0 ? (
        <line
          x1={5}
          x2={width - 5}
          y1={y(signals.median)}
          y2={y(signals.median)}
          className="cairn-chart-median-line"
        />
      ) : null}
      {path ? <path d={path} className="cairn-sparkline-line" /> : null}
      {points.map((p, i) =>
        p.rate == null ? null : marked.has(i) ? (
          <rect
            key={i}
            x={(x(i) ?? 0) - 3}
            y={y(p.rate) - 3}
            width={6}
            height={6}
            className="cairn-sparkline-signal"
          />
        ) : (
          <circle key={i} cx={x(i)} cy={y(p.rate)} r={2} className="cairn-sparkline-point" />
        ),
      )}
    </svg>
  );
}
