import { HTMLTable } from '@blueprintjs/core';
import { scaleLinear } from 'd3';
import { formatPercent } from '../../lib/format';

/** A count as the API discloses it: its value (null when withheld or "< 5") and how it reads. */
export interface ShownCount {
  value: number | null;
  display: string;
}

export interface HistogramCounts {
  notRecorded: ShownCount;
  below: ShownCount;
  bins: ShownCount[];
  above: ShownCount;
}

export interface ValueHistogramProps {
  /** e.g. "HbA1c" */
  label: string;
  /** e.g. "mmol/mol" */
  unit: string;
  /** Bin i runs from edges[i] (included) to edges[i + 1] */
  edges: readonly number[];
  practice: HistogramCounts;
  region: HistogramCounts;
  /** e.g. "OV102" */
  practiceLabel: string;
  width?: number;
  height?: number;
}

/** The bins in order, with their range in words: below the first edge, each bin, at or above the last. */
export function histogramRows(props: ValueHistogramProps) {
  const { edges, practice, region, unit } = props;
  const first = edges[0];
  const last = edges.at(-1);
  return [
    { range: `below ${first} ${unit}`, practice: practice.below, region: region.below },
    ...practice.bins.map((count, i) => ({
      range: `${edges[i]} to under ${edges[i + 1]} ${unit}`,
      practice: count,
      region: region.bins[i] ?? { value: null, display: 'withheld' },
    })),
    { range: `${last} ${unit} or more`, practice: practice.above, region: region.above },
  ];
}

/** Each count as a share of the values recorded (counts withheld are left out of the total). */
function shares(counts: ShownCount[]): (number | null)[] {
  const total = counts.reduce((sum, c) => sum + (c.value ?? 0), 0);
  return counts.map((c) => (c.value == null || total === 0 ? null : c.value / total));
}

/**
 * The spread of a value (HbA1c, blood pressure…) in the practice against the region, each as the
 * share of its recorded values in each bin: the practice as filled bars, the region as a dashed
 * outline (shape, not colour alone). Bins the API withheld are not drawn; the table says so.
 */
export function ValueHistogram(props: ValueHistogramProps) {
  const { label, unit, edges, practiceLabel, width = 560, height = 170 } = props;
  const rows = histogramRows(props);
  const own = shares(rows.map((r) => r.practice));
  const region = shares(rows.map((r) => r.region));
  // Leave out empty tails: from the first to the last bin with a value in either.
  const used = rows.map((_, i) => (own[i] ?? 0) > 0 || (region[i] ?? 0) > 0);
  const from = Math.max(0, used.indexOf(true));
  const to = Math.max(from, used.lastIndexOf(true));
  const margin = { top: 8, right: 8, bottom: 30, left: 40 };
  const x = scaleLinear()
    .domain([from, to + 1])
    .range([margin.left, width - margin.right]);
  const top = Math.max(0.01, ...own.map((v) => v ?? 0), ...region.map((v) => v ?? 0));
  const y = scaleLinear()
    .domain([0, top])
    .nice(4)
    .range([height - margin.bottom, margin.top]);
  const edgeAt = (i: number) =>
    i === 0 ? `< ${edges[0]}` : i === rows.length - 1 ? `≥ ${edges.at(-1)}` : String(edges[i - 1]);
  const step = Math.max(1, Math.ceil((to - from + 1) / 10));
  let outline = '';
  for (let i = from; i <= to; i++) {
    const v = region[i];
    if (v == null) continue;
    outline += `M ${x(i)} ${y(v)} L ${x(i + 1)} ${y(v)} `;
  }
  const summary = `${label}: share of recorded values by ${unit}, ${practiceLabel} as bars, the region as a dashed outline.`;
  return (
    <svg className="cairn-histogram" width={width} height={height} role="img" aria-label={summary}>
      <g className="cairn-chart-axis" aria-hidden="true">
        {y.ticks(4).map((t) => (
          <g key={t} transform={`translate(${margin.left},${y(t)})`}>
            <line x2={width - margin.left - margin.right} className="cairn-chart-grid" />
            <text x={-6} dy="0.32em" textAnchor="end">
              {formatPercent(t, 0)}
            </text>
          </g>
        ))}
        {rows.map((_, i) =>
          i < from || i > to || (i - from) % step !== 0 ? null : (
            <text key={i} x={x(i)} y={height - margin.bottom + 14} textAnchor="start">
              {edgeAt(i)}
            </text>
          ),
        )}
        <text x={width - margin.right} y={height - 2} textAnchor="end">
          {unit}
        </text>
      </g>
      {own.map((v, i) =>
        v == null || i < from || i > to ? null : (
          <rect
            key={i}
            x={x(i) + 0.5}
            y={y(v)}
            width={Math.max(1, x(i + 1) - x(i) - 1)}
            height={y(0) - y(v)}
            className="cairn-histogram-practice"
          />
        ),
      )}
      <path d={outline} className="cairn-histogram-region" />
    </svg>
  );
}

/** The histogram's figures: every bin with the practice's and the region's counts as disclosed. */
export function ValueHistogramTable(props: ValueHistogramProps) {
  const rows = histogramRows(props);
  const own = shares(rows.map((r) => r.practice));
  const region = shares(rows.map((r) => r.region));
  return (
    <HTMLTable
      compact
      striped
      className="cairn-histogram-table"
      aria-label={`${props.label}: figures`}
    >
      <thead>
        <tr>
          <th scope="col">{props.label}</th>
          <th scope="col">{props.practiceLabel}</th>
          <th scope="col">Share</th>
          <th scope="col">Region</th>
          <th scope="col">Share</th>
        </tr>
      </thead>
      <tbody>
        {rows.map((row, i) =>
          (row.practice.value ?? 1) === 0 && (row.region.value ?? 1) === 0 ? null : (
            <tr key={row.range}>
              <th scope="row">{row.range}</th>
              <td>{row.practice.display}</td>
              <td>{own[i] == null ? '—' : formatPercent(own[i])}</td>
              <td>{row.region.display}</td>
              <td>{region[i] == null ? '—' : formatPercent(region[i])}</td>
            </tr>
          ),
        )}
        <tr>
          <th scope="row">Not recorded</th>
          <td>{props.practice.notRecorded.display}</td>
          <td>—</td>
          <td>{props.region.notRecorded.display}</td>
          <td>—</td>
        </tr>
      </tbody>
    </HTMLTable>
  );
}
