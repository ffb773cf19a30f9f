import { scaleLinear } from 'd3';
import { formatCount, formatPercent } from '../../lib/format';
import { type FlagLike, flagKind, flagPaint, flagPath, flagShortText } from './flags';

export interface PeerStripProps {
  /** What the strip is about, e.g. "HbA1c" */
  title: string;
  /** The practice itself */
  own: { label: string; rate: number | null; flag: FlagLike };
  /** The other practices as unnamed points (rates, any order), and how many were withheld */
  peers: { rate: readonly number[]; withheld: number };
  /** The region median, drawn as a tick */
  median: number | null;
  width?: number;
  height?: number;
}

/** The strip in words: where the practice sits among the peers shown. */
export function peerStripText({ own, peers, median }: PeerStripProps): string {
  const shown = peers.rate.length;
  const withheld =
    peers.withheld > 0
      ? ` (${formatCount(peers.withheld)} more left out under disclosure control)`
      : '';
  if (own.rate == null)
    return `No rate for ${own.label}; ${formatCount(shown)} other practices shown${withheld}.`;
  const higher = peers.rate.filter((r) => r > own.rate!).length;
  const lower = peers.rate.filter((r) => r < own.rate!).length;
  return (
    `${own.label} ${formatPercent(own.rate)} (${flagShortText(own.flag).toLowerCase()}): ` +
    `of ${formatCount(shown)} other practices shown${withheld}, ${formatCount(higher)} higher and ${formatCount(lower)} lower` +
    (median != null ? `; region median ${formatPercent(median)}.` : '.')
  );
}

/**
 * One measure's rates across the region on a line: each other practice an unnamed open circle
 * (spread over a few rows so that close rates stay visible), the practice itself its flag's shape,
 * the region median a dashed tick. Only the peers the API disclosed are drawn.
 */
export function PeerStrip(props: PeerStripProps) {
  const { own, peers, median, width = 320, height = 54 } = props;
  const values = [
    ...peers.rate,
    ...(own.rate != null ? [own.rate] : []),
    ...(median != null ? [median] : []),
  ];
  const lo = values.length > 0 ? Math.max(0, Math.min(...values) - 0.02) : 0;
  const hi = values.length > 0 ? Math.min(1, Math.max(...values) + 0.02) : 1;
  const x = scaleLinear()
    .domain(lo < hi ? [lo, hi] : [Math.max(0, lo - 0.05), Math.min(1, hi + 0.05)])
    .nice(4)
    .range([12, width - 12]);
  const axisY = height - 14;
  const kind = flagKind(own.flag);
  const paint = flagPaint(kind);
  return (
    <svg
      className="cairn-peer-strip"
      width={width}
      height={height}
      role="img"
      aria-label={`${props.title}: ${peerStripText(props)}`}
    >
      <line x1={12} x2={width - 12} y1={axisY} y2={axisY} className="cairn-chart-grid" />
      {x.ticks(4).map((t) => (
        <text key={t} x={x(t)} y={height - 2} textAnchor="middle" className="cairn-peer-strip-tick">
          {formatPercent(t, 0)}
        </text>
      ))}
      {median != null ? (
        <line x1={x(median)} x2={x(median)} y1={4} y2={axisY} className="cairn-chart-median-line" />
      ) : null}
      {peers.rate.map((r, i) => (
        <circle key={i} cx={x(r)} cy={10 + (i % 3) * 9} r={3.2} className="cairn-peer-strip-peer" />
      ))}
      {own.rate != null ? (
        <path
          d={flagPath(kind, 13)}
          transform={`translate(${x(own.rate)},${19})`}
          fill={paint.fill}
          stroke={paint.stroke}
          strokeWidth={1.8}
          className="cairn-peer-strip-own"
        />
      ) : null}
    </svg>
  );
}
