import { line, curveStepAfter, scaleLinear } from 'd3';
import { formatPercent } from '../../lib/format';

export interface SurvivalPoint {
  /** Whole years since diagnosis */
  time: number;
  /** Proportion not yet on insulin; null when withheld */
  survival: number | null;
}

export interface SurvivalSeries {
  label: string;
  steps: SurvivalPoint[];
  median: number | null;
}

export interface SurvivalChartProps {
  practice: SurvivalSeries;
  region: SurvivalSeries;
  /** A labelled reference line (years), e.g. the common rule of thumb */
  ruleOfThumbYears: number | null;
  width?: number;
  height?: number;
}

const margin = { top: 16, right: 20, bottom: 42, left: 52 };

function stepPoints(steps: SurvivalPoint[]): [number, number][] {
  const out: [number, number][] = [[0, 1]];
  for (const s of steps) if (s.survival != null) out.push([s.time, s.survival]);
  return out;
}

export function survivalText({ practice, region, ruleOfThumbYears }: SurvivalChartProps): string {
  const median = (s: SurvivalSeries) => (s.median == null ? 'not reached' : `${s.median} years`);
  return `Time from diagnosis to insulin, type 2: ${practice.label} median ${median(practice)}; ${region.label} median ${median(region)}${ruleOfThumbYears != null ? `; rule of thumb about ${ruleOfThumbYears} years` : ''}.`;
}

/**
 * Kaplan–Meier curves (Kaplan & Meier, JASA 1958;53:457–81) of the share not
 * yet on insulin by years since diagnosis: the practice solid with circles,
 * the region dashed with squares, each median marked, and a reference line.
 */
export function SurvivalChart(props: SurvivalChartProps) {
  const { practice, region, ruleOfThumbYears, width = 640, height = 320 } = props;
  const p = stepPoints(practice.steps);
  const r = stepPoints(region.steps);
  const maxT = Math.max(10, ...p.map((d) => d[0]), ...r.map((d) => d[0]), ruleOfThumbYears ?? 0);
  const x = scaleLinear()
    .domain([0, maxT])
    .range([margin.left, width - margin.right]);
  const y = scaleLinear()
    .domain([0, 1])
    .range([height - margin.bottom, margin.top]);
  const path = line<[number, number]>()
    .x((d) => x(d[0]))
    .y((d) => y(d[1]))
    .curve(curveStepAfter);
  const vline = (t: number, cls: string, label: string, dy: number) => (
    <g className={cls} transform={`translate(${x(t)},0)`}>
      <line y1={margin.top} y2={height - margin.bottom} />
      <text x={4} y={margin.top + dy}>
        {label}
      </text>
    </g>
  );
  return (
    <svg
      className="cairn-survival"
      width={width}
      height={height}
      role="img"
      aria-label={survivalText(props)}
    >
      <g className="cairn-chart-axis">
        {x.ticks(Math.min(12, maxT)).map((t) => (
          <g key={`x${t}`} transform={`translate(${x(t)},${height - margin.bottom})`}>
            <line y2={5} />
            <text y={18} textAnchor="middle">
              {t}
            </text>
          </g>
        ))}
        {y.ticks(5).map((t) => (
          <g key={`y${t}`} transform={`translate(${margin.left},${y(t)})`}>
            <line x2={width - margin.left - margin.right} className="cairn-chart-grid" />
            <text x={-8} dy="0.32em" textAnchor="end">
              {formatPercent(t, 0)}
            </text>
          </g>
        ))}
        <text x={(margin.left + width - margin.right) / 2} y={height - 6} textAnchor="middle">
          Years since diagnosis
        </text>
        <text
          transform={`translate(14,${(margin.top + height - margin.bottom) / 2}) rotate(-90)`}
          textAnchor="middle"
        >
          Not yet on insulin
        </text>
      </g>
      {ruleOfThumbYears != null
        ? vline(
            ruleOfThumbYears,
            'cairn-survival-reference',
            `Rule of thumb: about ${ruleOfThumbYears} years`,
            10,
          )
        : null}
      {region.median != null
        ? vline(
            region.median,
            'cairn-survival-median-region',
            `${region.label} median ${region.median} y`,
            26,
          )
        : null}
      {practice.median != null
        ? vline(
            practice.median,
            'cairn-survival-median-practice',
            `${practice.label} median ${practice.median} y`,
            42,
          )
        : null}
      <path d={path(r) ?? ''} className="cairn-survival-region" />
      <path d={path(p) ?? ''} className="cairn-survival-practice" />
      {/* A step's drop repeats its time: points are keyed by position. */}
      {r.map(([t, s], i) => (
        <rect
          key={`r${i}`}
          x={x(t) - 3}
          y={y(s) - 3}
          width={6}
          height={6}
          className="cairn-survival-region-mark"
        />
      ))}
      {p.map(([t, s], i) => (
        <circle
          key={`p${i}`}
          cx={x(t)}
          cy={y(s)}
          r={3.2}
          className="cairn-survival-practice-mark"
        />
      ))}
    </svg>
  );
}
