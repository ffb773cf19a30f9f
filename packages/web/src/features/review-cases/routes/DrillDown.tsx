import { Button, H1, HTMLTable, Spinner, Tag } from '@blueprintjs/core';
import { useQuery } from '@tanstack/react-query';
import { Link, useNavigate, useParams } from 'react-router-dom';
import { ClinicalCaution } from '../../../components/ClinicalCaution';
import { EmptyState } from '../../../components/Notice';
import { ProblemCallout } from '../../../components/ProblemCallout';
import { RequireRole } from '../../../components/RequireRole';
import type { DrillDown as DrillDownData } from '../../../lib/api/types';
import { formatPercent } from '../../../lib/format';
import { usePageTitle } from '../../../lib/page-title';
import { drillQueryOptions, useOpenCase } from '../api/review-cases';
import {
  ChartOrTable,
  HistogramChart,
  histogramShares,
  PairedRates,
  PairedRatesTable,
  type RatePair,
  TrendChart,
} from '../components/ReviewCharts';
import '../review.css';

const SPLIT_LABELS: Record<string, string> = {
  all: 'All types',
  type1: 'Type 1',
  type2_other: 'Type 2 and other',
};

/** `/outliers/:quarterId/practices/:practiceId/measures/:measureKey`: why one result stands out. */
export function DrillDown() {
  usePageTitle('Drill-down');
  return (
    <RequireRole roles={['auditor', 'regional_lead']}>
      <DrillDownScreen />
    </RequireRole>
  );
}

function DrillDownScreen() {
  const { quarterId, practiceId, measureKey } = useParams();
  const drill = useQuery(
    drillQueryOptions(Number(quarterId), Number(practiceId), measureKey ?? '', 'all'),
  );
  const d = drill.data;
  usePageTitle(d ? `${d.practice.code} · ${d.measure.label}` : 'Drill-down');
  if (drill.isPending) return <Spinner aria-label="Loading the drill-down" />;
  if (!d) return <ProblemCallout error={drill.error} />;
  return (
    <div className="cairn-review">
      <p>
        <Link to={`/outliers?quarter=${d.quarter.id}`}>← Outlier list</Link>
      </p>
      <div className="cairn-page-head">
        <div>
          <H1 className="cairn-page-title">
            {d.practice.code} {d.practice.name}: {d.measure.label}
          </H1>
          <p className="cairn-muted">
            {d.quarter.label} · {d.practice.localityName} · guideline: {d.measure.source}
          </p>
        </div>
        <OpenCaseButton d={d} />
      </div>
      <ClinicalCaution compact />
      <section className="cairn-review-section">
        <h2>Why it stands out</h2>
        <p>{d.evidence.reason}</p>
      </section>
      <ByType d={d} />
      <Breakdowns d={d} />
      <Histogram d={d} />
      <Trend d={d} />
      <section className="cairn-review-section">
        <h2>Data-quality flags of its current submission</h2>
        {d.dataQuality.filter((f) => f.count > 0).length === 0 ? (
          <p className="cairn-muted">No record of this submission was flagged.</p>
        ) : (
          <ul>
            {d.dataQuality
              .filter((f) => f.count > 0)
              .map((f) => (
                <li key={f.code}>
                  {f.title}: {f.count} records
                </li>
              ))}
          </ul>
        )}
      </section>
    </div>
  );
}

function OpenCaseButton({ d }: { d: DrillDownData }) {
  const open = useOpenCase();
  const navigate = useNavigate();
  if (d.openCases[0])
    return <Link to={`/review-cases/${d.openCases[0].id}`}>Review case {d.openCases[0].id}</Link>;
  if (!d.mayOpenCase) return null;
  return (
    <div>
      <Button
        intent="primary"
        icon="add"
        loading={open.isPending}
        onClick={() =>
          open.mutate(
            {
              quarterId: d.quarter.id,
              practiceId: d.practice.id,
              measureKey: d.measure.key,
              split: 'all',
            },
            { onSuccess: (c) => navigate(`/review-cases/${c.id}`) },
          )
        }
      >
        Open a review case
      </Button>
      <ProblemCallout error={open.error} />
    </div>
  );
}

const count = (events: number, n: number) => `${events} of ${n}`;

function ByType({ d }: { d: DrillDownData }) {
  const rows: RatePair[] = d.splits.map((s) => ({
    label: SPLIT_LABELS[s.split] ?? s.split,
    practice: s.own.rate,
    practiceText: `${formatPercent(s.own.rate)} (${count(s.own.events, s.own.n)})`,
    region: s.region.rate,
    regionText: formatPercent(s.region.rate),
  }));
  return (
    <section className="cairn-review-section">
      <h2>By diabetes type</h2>
      <ChartOrTable
        title="Practice (bars) against the region (diamonds)"
        chart={<PairedRates rows={rows} />}
        table={<PairedRatesTable rows={rows} heading="Diabetes type" />}
      />
    </section>
  );
}

function Breakdowns({ d }: { d: DrillDownData }) {
  if (d.breakdowns.length === 0) return null;
  return (
    <section className="cairn-review-section">
      <h2>Which groups drive the gap</h2>
      <div className="cairn-review-grid">
        {d.breakdowns.map((b) => {
          const rows: RatePair[] = b.cells.cells.map((c, i) => ({
            label: b.breakdown.categories[i]?.label ?? c.category,
            practice: c.practice.rate,
            practiceText: `${formatPercent(c.practice.rate)} (${count(c.practice.events, c.practice.n)})`,
            region: c.region.rate,
            regionText: `${formatPercent(c.region.rate)} (${c.region.events.display} of ${c.region.n.display})`,
          }));
          return (
            <ChartOrTable
              key={b.breakdown.key}
              title={b.breakdown.label}
              chart={<PairedRates rows={rows} width={440} />}
              table={<PairedRatesTable rows={rows} heading={b.breakdown.label} />}
            />
          );
        })}
      </div>
    </section>
  );
}

function Histogram({ d }: { d: DrillDownData }) {
  if (!d.histogram) return null;
  const rows = histogramShares(d.histogram, 'all');
  return (
    <section className="cairn-review-section">
      <h2>
        {d.histogram.label} ({d.histogram.unit}): the practice’s values against the region’s
      </h2>
      <ChartOrTable
        title="Share of recorded values: practice (bars), region (line)"
        chart={<HistogramChart rows={rows} unit={d.histogram.unit} />}
        table={
          <HTMLTable compact striped>
            <thead>
              <tr>
                <th scope="col">{d.histogram.unit}</th>
                <th scope="col">Practice</th>
                <th scope="col">Region</th>
              </tr>
            </thead>
            <tbody>
              {rows
                .filter((r) => (r.practice ?? 0) > 0 || (r.region ?? 0) > 0)
                .map((r) => (
                  <tr key={r.label}>
                    <th scope="row">{r.label}</th>
                    <td>{formatPercent(r.practice)}</td>
                    <td>{formatPercent(r.region)}</td>
                  </tr>
                ))}
            </tbody>
          </HTMLTable>
        }
      />
    </section>
  );
}

function Trend({ d }: { d: DrillDownData }) {
  const all = d.splits.find((s) => s.split === 'all');
  if (!all) return null;
  const s = all.trend.signals;
  const words = [
    ...s.shifts.map((x) => `a shift ${x.side} the median (${x.end - x.start + 1} quarters)`),
    ...s.trends.map((x) => `a trend ${x.direction} (${x.end - x.start + 1} quarters)`),
    ...(s.tooFewRuns ? ['too few runs'] : []),
    ...(s.tooManyRuns ? ['too many runs'] : []),
  ];
  return (
    <section className="cairn-review-section">
      <h2>Over time</h2>
      <p>
        Run-chart signals: {words.length === 0 ? 'none' : words.join('; ')}.{' '}
        <Tag minimal>triangles mark points in a signal</Tag>
      </p>
      <ChartOrTable
        title="Practice (points), region (dashed line), practice median (dotted line)"
        chart={<TrendChart quarters={d.trendQuarters} trend={all.trend} region={all.regionTrend} />}
        table={
          <HTMLTable compact striped>
            <thead>
              <tr>
                <th scope="col">Quarter</th>
                <th scope="col">Practice</th>
                <th scope="col">Region</th>
              </tr>
            </thead>
            <tbody>
              {d.trendQuarters.map((q, i) => {
                const p = all.trend.points[i];
                const r = all.regionTrend.points[i];
                return (
                  <tr key={q}>
                    <th scope="row">{q}</th>
                    <td>
                      {p?.rate === null || !p
                        ? 'no figures'
                        : `${formatPercent(p.rate)} (${count(p.events, p.n)})`}
                    </td>
                    <td>{r?.rate === null || !r ? '—' : formatPercent(r.rate)}</td>
                  </tr>
                );
              })}
            </tbody>
          </HTMLTable>
        }
      />
      {d.splits.length === 0 ? <EmptyState title="No figures" /> : null}
    </section>
  );
}
