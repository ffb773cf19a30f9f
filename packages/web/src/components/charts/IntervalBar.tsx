import { scaleLinear } from 'd3';
import { formatPercent } from '../../lib/format';

export interface IntervalBarProps {
  /** Proportions 0–1; null when there is nothing to show */
  rate: number | null;
  lower: number | null;
  upper: number | null;
  /** The region's median practice rate, marked as a tick */
  median: number | null;
  width?: number;
  height?: number;
  /** What the tick marks (default "region median") */
  markLabel?: string;
}

/** Words for the bar, also its accessible name. */
export function intervalText({
  rate,
  lower,
  upper,
  median,
  markLabel = 'region median',
}: IntervalBarProps): string {
  const parts = [
    rate == null
      ? 'No rate'
      : `${formatPercent(rate)} (95 % interval ${formatPercent(lower)} to ${formatPercent(upper)})`,
  ];
  parts.push(median == null ? `${markLabel} withheld` : `${markLabel} ${formatPercent(median)}`);
  return parts.join('; ');
}

/**
 * A rate on a 0–100 % line: the Wilson interval as a bar, the rate as a dot,
 * the region's median as a tall tick with a diamond head.
 */
export function IntervalBar(props: IntervalBarProps) {
  const { rate, lower, upper, median, width = 180, height = 26 } = props;
  const x = scaleLinear()
    .domain([0, 1])
    .range([6, width - 6]);
  const mid = height / 2 + 2;
  return (
    <svg
      className="cairn-interval-bar"
      width={width}
      height={height}
      role="img"
      aria-label={intervalText(props)}
    >
      <line x1={x(0)} x2={x(1)} y1={mid} y2={mid} className="cairn-chart-track" />
      {[0, 0.5, 1].map((t) => (
        <line key={t} x1={x(t)} x2={x(t)} y1={mid - 3} y2={mid + 3} className="cairn-chart-track" />
      ))}
      {lower != null && upper != null ? (
        <rect
          x={x(lower)}
          width={Math.max(1.5, x(upper) - x(lower))}
          y={mid - 3}
          height={6}
          rx={3}
          className="cairn-chart-interval"
        />
      ) : null}
      {median != null ? (
        <g className="cairn-chart-median" transform={`translate(${x(median)},0)`}>
          <line y1={4} y2={height - 1} />
          <path d="M 0 0 L 4 4 L 0 8 L -4 4 Z" />
        </g>
      ) : null}
      {rate != null ? <circle cx={x(rate)} cy={mid} r={4} className="cairn-chart-rate" /> : null}
    </svg>
  );
}
