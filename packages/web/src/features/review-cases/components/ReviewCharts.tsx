/**
 * The drill-down's small charts: d3 computes the scales, React draws the SVG;
 * each chart has its table beside it (a toggle), and the practice and the
 * region differ by shape and position as well as colour (practice: filled
 * bars and circles; region: open diamonds and a dashed line).
 */
import { Button, HTMLTable } from '@blueprintjs/core';
import { scaleBand, scaleLinear } from 'd3';
import { type ReactNode, useId, useState } from 'react';
import type { RateTrend } from '../../../lib/api/types';

/** A chart with its table alternative. */
export function ChartOrTable({
  title,
  chart,
  table,
}: {
  title: string;
  chart: ReactNode;
  table: ReactNode;
}) {
  const [asTable, setAsTable] = useState(false);
  const id = useId();
  return (
    <figure className="cairn-review-figure" aria-labelledby={id}>
      <figcaption id={id} className="cairn-review-figure-head">
        <strong>{title}</strong>
        <Button
          small
          minimal
          icon={asTable ? 'timeline-bar-chart' : 'th'}
          onClick={() => setAsTable((v) => !v)}
        >
          {asTable ? 'Show as chart' : 'Show as table'}
        </Button>
      </figcaption>
      {asTable ? table : chart}
    </figure>
  );
}

export interface RatePair {
  label: string;
  practice: number | null;
  practiceText: string;
  region: number | null;
  regionText: string;
}

/** Practice (bar) against region (diamond) per category, rates 0–100 %. */
export function PairedRates({ rows, width = 560 }: { rows: RatePair[]; width?: number }) {
  const rowH = 26;
  const left = 150;
  const height = rows.length * rowH + 24;
  const x = scaleLinear()
    .domain([0, 1])
    .range([left, width - 16]);
  const y = scaleBand<number>()
    .domain(rows.map((_, i) => i))
    .range([0, rows.length * rowH])
    .padding(0.3);
  return (
    <svg width={width} height={height} role="img" aria-label="Practice against region by category">
      {[0, 0.25, 0.5, 0.75, 1].map((t) => (
        <g key={t}>
          <line x1={x(t)} x2={x(t)} y1={0} y2={rows.length * rowH} className="cairn-grid" />
          <text x={x(t)} y={rows.length * rowH + 16} textAnchor="middle" className="cairn-axis">
            {t * 100} %
          </text>
        </g>
      ))}
      {rows.map((r, i) => {
        const top = y(i) ?? 0;
        const mid = top + y.bandwidth() / 2;
        return (
          <g key={r.label}>
            <text x={left - 8} y={mid + 4} textAnchor="end" className="cairn-axis">
              {r.label}
            </text>
            {r.practice !== null ? (
              <rect
                x={x(0)}
                y={top}
                width={x(r.practice) - x(0)}
                height={y.bandwidth()}
                className="cairn-mark-practice"
              />
            ) : null}
            {r.region !== null ? (
              <path
                d={`M${x(r.region)},${mid - 7}l7,7l-7,7l-7,-7z`}
                className="cairn-mark-region"
              />
            ) : null}
          </g>
        );
      })}
    </svg>
  );
}

export function PairedRatesTable({ rows, heading }: { rows: RatePair[]; heading: string }) {
  return (
    <HTMLTable compact striped>
      <thead>
        <tr>
          <th scope="col">{heading}</th>
          <th scope="col">Practice</th>
          <th scope="col">Region</th>
        </tr>
      </thead>
      <tbody>
        {rows.map((r) => (
          <tr key={r.label}>
            <th scope="row">{r.label}</th>
            <td>{r.practiceText}</td>
            <td>{r.regionText}</td>
          </tr>
        ))}
      </tbody>
    </HTMLTable>
  );
}

/** The practice's rates over quarters (circles), the region's (dashed), the median and signals. */
export function TrendChart({
  quarters,
  trend,
  region,
  width = 560,
}: {
  quarters: string[];
  trend: RateTrend;
  region: RateTrend;
  width?: number;
}) {
  const height = 180;
  const x = scaleBand<number>()
    .domain(quarters.map((_, i) => i))
    .range([44, width - 8]);
  const y = scaleLinear()
    .domain([0, 1])
    .range([height - 28, 8]);
  const cx = (i: number) => (x(i) ?? 0) + x.bandwidth() / 2;
  const signalled = new Set<number>();
  for (const s of [...trend.signals.shifts, ...trend.signals.trends])
    for (let i = s.start; i <= s.end; i++) signalled.add(i);
  const regionPath = region.points
    .map((p, i) => (p.rate === null ? null : `${cx(i)},${y(p.rate)}`))
    .filter(Boolean)
    .join('L');
  return (
    <svg width={width} height={height} role="img" aria-label="Rate by quarter, practice and region">
      {[0, 0.5, 1].map((t) => (
        <g key={t}>
          <line x1={44} x2={width - 8} y1={y(t)} y2={y(t)} className="cairn-grid" />
          <text x={40} y={y(t) + 4} textAnchor="end" className="cairn-axis">
            {t * 100} %
          </text>
        </g>
      ))}
      {trend.signals.median !== null ? (
        <line
          x1={44}
          x2={width - 8}
          y1={y(trend.signals.median)}
          y2={y(trend.signals.median)}
          className="cairn-mark-median"
        />
      ) : null}
      {regionPath ? <path d={`M${regionPath}`} className="cairn-mark-region-line" /> : null}
      {trend.points.map((p, i) =>
        p.rate === null ? null : signalled.has(i) ? (
          <path key={i} d={`M${cx(i)},${y(p.rate) - 7}l6,11h-12z`} className="cairn-mark-signal" />
        ) : (
          <circle key={i} cx={cx(i)} cy={y(p.rate)} r={4.5} className="cairn-mark-practice" />
        ),
      )}
      {quarters.map((q, i) => (
        <text key={q} x={cx(i)} y={height - 10} textAnchor="middle" className="cairn-axis">
          {q.replace(/^20(\d\d) /, '’$1 ')}
        </text>
      ))}
    </svg>
  );
}
