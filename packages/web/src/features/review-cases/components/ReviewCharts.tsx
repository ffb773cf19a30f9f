/**
 * The drill-down's small charts: d3 computes the scales, React draws the SVG;
 * each chart has its table beside it (a toggle), and the practice and the
 * region differ by shape and position as well as colour (practice: filled
 * bars and circles; region: open diamonds and a dashed line).
 */
import { Button, HTMLTable } from '@blueprintjs/core';
import { scaleBand, scaleLinear } from 'd3';
import { type ReactNode, useId, useState } from 'react';
import type { RateTrend, ValueHistogram } from '../../../lib/api/types';
import { formatPercent } from '../../../lib/format';

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

/** Shares of the practice's and the region's recorded values per bin. */
export function histogramShares(h: ValueHistogram, split: string) {
  const s = h.splits.find((x) => x.split === split) ?? h.splits[0];
  if (!s) return [];
  const share = (counts: typeof s.practice) => {
    const values = [counts.below, ...counts.bins, counts.above].map((c) => c.value);
    const total = values.reduce<number>((a, v) => a + (v ?? 0), 0);
    return values.map((v) => (v === null || total === 0 ? null : v / total));
  };
  const p = share(s.practice);
  const r = share(s.region);
  const e = h.edges;
  return p.map((practice, i) => ({
    label:
      i === 0
        ? `below ${e[0]}`
        : i === p.length - 1
          ? `${e[e.length - 1]} or above`
          : `${e[i - 1]}–${e[i]}`,
    practice,
    region: r[i] ?? null,
  }));
}

export function HistogramChart({
  rows,
  unit,
  width = 560,
}: {
  rows: { label: string; practice: number | null; region: number | null }[];
  unit: string;
  width?: number;
}) {
  const height = 170;
  const bottom = 24;
  const max = Math.max(0.01, ...rows.flatMap((r) => [r.practice ?? 0, r.region ?? 0]));
  const x = scaleBand<number>()
    .domain(rows.map((_, i) => i))
    .range([40, width - 8]);
  const y = scaleLinear()
    .domain([0, max])
    .range([height - bottom, 8]);
  const step = (r: (typeof rows)[number]) => r.region;
  const path = rows
    .map((r, i) => {
      const v = step(r);
      if (v === null) return '';
      const x0 = x(i) ?? 0;
      return `M${x0},${y(v)}h${x.bandwidth()}`;
    })
    .join('');
  const ticks = [
    0,
    Math.ceil(rows.length / 4),
    Math.ceil(rows.length / 2),
    Math.ceil((3 * rows.length) / 4),
    rows.length - 1,
  ];
  return (
    <svg width={width} height={height} role="img" aria-label={`Distribution of values (${unit})`}>
      <line
        x1={40}
        x2={width - 8}
        y1={height - bottom}
        y2={height - bottom}
        className="cairn-grid"
      />
      {rows.map((r, i) =>
        r.practice === null || r.practice === 0 ? null : (
          <rect
            key={i}
            x={x(i)}
            y={y(r.practice)}
            width={Math.max(1, x.bandwidth() - 1)}
            height={height - bottom - y(r.practice)}
            className="cairn-mark-practice"
          />
        ),
      )}
      <path d={path} className="cairn-mark-region-line" />
      {ticks.map((i) =>
        rows[i] ? (
          <text
            key={i}
            x={(x(i) ?? 0) + x.bandwidth() / 2}
            y={height - 6}
            textAnchor="middle"
            className="cairn-axis"
          >
            {rows[i]!.label}
          </text>
        ) : null,
      )}
      <text x={4} y={14} className="cairn-axis">
        {formatPercent(max, 0)}
      </text>
    </svg>
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
