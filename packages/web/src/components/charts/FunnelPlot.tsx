import { line, scaleLinear } from 'd3';
import { useState } from 'react';
import { formatCount, formatPercent } from '../../lib/format';
import { type FlagLike, flagKind, flagPaint, flagPath, flagText } from './flags';

export interface FunnelPointData {
  id: number;
  /** e.g. "OV102 Harrowmere Surgery" */
  label: string;
  n: number;
  events: number;
  /** The rate plotted (crude or case-mix adjusted) */
  rate: number | null;
  flag: FlagLike;
  /** Extra lines for the card (interval, O/E…) */
  details?: string[];
}

export interface FunnelLimits {
  innerLower: number[];
  innerUpper: number[];
  outerLower: number[];
  outerUpper: number[];
}

export interface FunnelPlotProps {
  title: string;
  points: FunnelPointData[];
  /** The denominators at which the limit curves were computed */
  curveN: number[];
  limits: FunnelLimits;
  /** The region's pooled rate (θ0) */
  target: number | null;
  width?: number;
  height?: number;
  onSelect?: (id: number) => void;
}

const margin = { top: 14, right: 18, bottom: 42, left: 54 };

/**
 * The rate axis of a funnel plot: every plotted rate, the region's rate and the 99.8 % limits
 * across the denominators the practices span fit inside it, widened to round ticks (so the lowest
 * and highest points sit between labelled ticks, never beyond the last one) and kept within
 * 0–100 %.
 */
export function funnelRateDomain(
  points: readonly { n: number; rate: number }[],
  curveN: readonly number[],
  limits: FunnelLimits,
  target: number | null,
): [number, number] {
  const ns = points.map((p) => p.n);
  const fromN = ns.length > 0 ? Math.min(...ns) : 0;
  const toN = ns.length > 0 ? Math.max(...ns) : Infinity;
  const inRange = (values: readonly number[]) =>
    values.filter((_, i) => (curveN[i] ?? 0) >= fromN && (curveN[i] ?? 0) <= toN);
  const values = [
    ...points.map((p) => p.rate),
    ...inRange(limits.outerLower),
    ...inRange(limits.outerUpper),
    ...(target != null ? [target] : []),
  ].filter((v) => Number.isFinite(v));
  if (values.length === 0) return [0, 1];
  const min = Math.max(0, Math.min(...values) - 0.02);
  const max = Math.min(1, Math.max(...values) + 0.02);
  const [lo, hi] = scaleLinear()
    .domain(min === max ? [Math.max(0, min - 0.05), Math.min(1, max + 0.05)] : [min, max])
    .nice(6)
    .domain() as [number, number];
  return [Math.max(0, lo), Math.min(1, hi)];
}

/**
 * Funnel plot (Spiegelhalter, Stat Med 2005;24:1185–202): each practice's
 * rate against its denominator, the region's rate as a line, the 95 % and
 * 99.8 % limits as curves. Points are shaped by their flag; each point can be
 * focused with the keyboard and shows its card; Enter or a click selects it.
 */
export function FunnelPlot(props: FunnelPlotProps) {
  const { title, points, curveN, limits, target, width = 860, height = 420, onSelect } = props;
  const [active, setActive] = useState<number | null>(null);
  const plotted = points.filter((p) => p.rate != null && p.n > 0);
  const maxN = Math.max(10, ...plotted.map((p) => p.n), ...(curveN.length ? [curveN.at(-1)!] : []));
  const x = scaleLinear()
    .domain([0, maxN * 1.04])
    .range([margin.left, width - margin.right]);
  const [lo, hi] = funnelRateDomain(
    plotted.map((p) => ({ n: p.n, rate: p.rate! })),
    curveN,
    limits,
    target,
  );
  const y = scaleLinear()
    .domain([lo, hi])
    .range([height - margin.bottom, margin.top]);
  const curve = (values: number[]) =>
    line<number>()
      .defined((v, i) => Number.isFinite(v) && (curveN[i] ?? 0) > 0)
      .x((_, i) => x(curveN[i] ?? 0))
      .y((v) => y(Math.min(hi, Math.max(lo, v))))(values) ?? '';
  const active_ = plotted.find((p) => p.id === active) ?? null;
  const xTicks = x.ticks(6);
  const yTicks = y.ticks(6);
  return (
    <figure className="cairn-funnel" aria-label={title}>
      <div className="cairn-funnel-canvas" style={{ width, height }}>
        <svg width={width} height={height} role="group" aria-label={`${title}: funnel plot`}>
          <g className="cairn-chart-axis" aria-hidden="true">
            {xTicks.map((t) => (
              <g key={`x${t}`} transform={`translate(${x(t)},${height - margin.bottom})`}>
                <line y2={5} />
                <text y={18} textAnchor="middle">
                  {formatCount(t)}
                </text>
              </g>
            ))}
            {yTicks.map((t) => (
              <g key={`y${t}`} transform={`translate(${margin.left},${y(t)})`}>
                <line x2={width - margin.left - margin.right} className="cairn-chart-grid" />
                <text x={-8} dy="0.32em" textAnchor="end">
                  {formatPercent(t, 0)}
                </text>
              </g>
            ))}
            <text x={(margin.left + width - margin.right) / 2} y={height - 6} textAnchor="middle">
              People in the denominator
            </text>
            <text
              transform={`translate(14,${(margin.top + height - margin.bottom) / 2}) rotate(-90)`}
              textAnchor="middle"
            >
              Rate
            </text>
          </g>
          <g className="cairn-funnel-limits" aria-hidden="true">
            <path d={curve(limits.outerLower)} className="cairn-limit-outer" />
            <path d={curve(limits.outerUpper)} className="cairn-limit-outer" />
            <path d={curve(limits.innerLower)} className="cairn-limit-inner" />
            <path d={curve(limits.innerUpper)} className="cairn-limit-inner" />
            {target != null ? (
              <line
                x1={margin.left}
                x2={width - margin.right}
                y1={y(target)}
                y2={y(target)}
                className="cairn-limit-target"
              />
            ) : null}
          </g>
          <g className="cairn-funnel-points">
            {plotted.map((p) => {
              const kind = flagKind(p.flag);
              const paint = flagPaint(kind);
              return (
                <g
                  key={p.id}
                  className={`cairn-funnel-point${active === p.id ? ' active' : ''}`}
                  data-practice={p.id}
                  transform={`translate(${x(p.n)},${y(p.rate!)})`}
                  tabIndex={0}
                  role="button"
                  aria-label={`${p.label}: ${formatPercent(p.rate)}, ${formatCount(p.events)} of ${formatCount(p.n)}; ${flagText(p.flag)}`}
                  onMouseEnter={() => setActive(p.id)}
                  onMouseLeave={() => setActive((a) => (a === p.id ? null : a))}
                  onFocus={() => setActive(p.id)}
                  onBlur={() => setActive((a) => (a === p.id ? null : a))}
                  onClick={() => onSelect?.(p.id)}
                  onKeyDown={(e) => {
                    if (e.key === 'Enter' || e.key === ' ') {
                      e.preventDefault();
                      onSelect?.(p.id);
                    }
                  }}
                >
                  <circle r={9} className="cairn-funnel-hit" />
                  <path
                    d={flagPath(kind, 11)}
                    fill={paint.fill}
                    stroke={paint.stroke}
                    strokeWidth={1.8}
                  />
                </g>
              );
            })}
          </g>
        </svg>
        {active_ ? (
          <div
            className="cairn-funnel-card"
            role="status"
            style={{
              left: Math.min(x(active_.n) + 12, width - 250),
              top: Math.max(0, y(active_.rate!) - 20),
            }}
          >
            <strong>{active_.label}</strong>
            <div>
              {formatPercent(active_.rate)} · {formatCount(active_.events)} of{' '}
              {formatCount(active_.n)}
            </div>
            <div>{flagText(active_.flag)}</div>
            {active_.details?.map((d) => (
              <div key={d}>{d}</div>
            ))}
            {onSelect ? <div className="cairn-muted">Click or press Enter to open</div> : null}
          </div>
        ) : null}
      </div>
      <figcaption className="cairn-funnel-key">
        <span>
          <svg width={28} height={10} aria-hidden="true">
            <line x1={0} x2={28} y1={5} y2={5} className="cairn-limit-target" />
          </svg>{' '}
          Region rate {target != null ? formatPercent(target) : ''}
        </span>
        <span>
          <svg width={28} height={10} aria-hidden="true">
            <line x1={0} x2={28} y1={5} y2={5} className="cairn-limit-inner" />
          </svg>{' '}
          95 % limits
        </span>
        <span>
          <svg width={28} height={10} aria-hidden="true">
            <line x1={0} x2={28} y1={5} y2={5} className="cairn-limit-outer" />
          </svg>{' '}
          99.8 % limits
        </span>
      </figcaption>
    </figure>
  );
}
