import { Button, H1, HTMLTable, Spinner, Tag } from '@blueprintjs/core';
import { keepPreviousData, useQuery } from '@tanstack/react-query';
import { useState } from 'react';
import { Link, useNavigate, useParams } from 'react-router-dom';
import { ClinicalCaution } from '../../../components/ClinicalCaution';
import {
  ValueHistogram,
  type ValueHistogramProps,
  ValueHistogramTable,
} from '../../../components/charts/ValueHistogram';
import { EmptyState } from '../../../components/Notice';
import { ProblemCallout } from '../../../components/ProblemCallout';
import { RequireRole } from '../../../components/RequireRole';
import type { DrillDown as DrillDownData } from '../../../lib/api/types';
import { formatPercent } from '../../../lib/format';
import { usePageTitle } from '../../../lib/page-title';
import {
  drillPath,
  drillQueryOptions,
  RECORDS_PAGE_SIZE,
  recordsQueryOptions,
  useOpenCase,
} from '../api/review-cases';
import {
  ChartOrTable,
  PairedRates,
  PairedRatesTable,
  type RatePair,
  TrendChart,
} from '../components/ReviewCharts';
import '../../../components/charts/charts.css';
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
        <p>
          <a
            href={`${drillPath(d.quarter.id, d.practice.id, d.measure.key)}/evidence.xlsx`}
            download
          >
            Download the evidence (XLSX: figures, breakdowns, trend, data-quality flags and the
            records, pseudonyms only)
          </a>
        </p>
      </section>
      <ByType d={d} />
      <Breakdowns d={d} />
      <Histogram d={d} />
      <Trend d={d} />
      <Records d={d} />
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

const TYPE_WORDS: Record<string, string> = {
  type1: 'Type 1',
  type2: 'Type 2',
  other: 'Other',
  unknown: 'Not recorded',
};

const OUTCOME_WORDS: Record<string, string> = {
  met: 'met',
  not_met: 'not met',
  unknown: 'not recorded',
};

/** The records behind the result, a page at a time, under pseudonyms only. */
function Records({ d }: { d: DrillDownData }) {
  const [page, setPage] = useState(1);
  const records = useQuery({
    ...recordsQueryOptions(d.quarter.id, d.practice.id, d.measure.key, page),
    placeholderData: keepPreviousData,
  });
  const r = records.data;
  const pages = r ? Math.max(1, Math.ceil(r.total / r.pageSize)) : 1;
  const first = r && r.total > 0 ? (r.page - 1) * r.pageSize + 1 : 0;
  const last = r ? Math.min(r.total, r.page * r.pageSize) : 0;
  return (
    <section className="cairn-review-section" aria-labelledby="drill-records">
      <h2 id="drill-records">The records behind it</h2>
      <p className="cairn-muted">
        Records in the measure’s denominator, shown under pseudonyms only (never the practice’s own
        references).
      </p>
      <ProblemCallout error={records.error} />
      {records.isPending ? <Spinner size={20} aria-label="Loading the records" /> : null}
      {r && r.total === 0 ? <p>No record is in this measure’s denominator.</p> : null}
      {r && r.total > 0 ? (
        <>
          <p aria-live="polite">
            Records {first}–{last} of {r.total}
          </p>
          <HTMLTable compact striped className="cairn-review-table">
            <thead>
              <tr>
                <th scope="col">Pseudonym</th>
                <th scope="col">Age</th>
                <th scope="col">Sex</th>
                <th scope="col">Diabetes type</th>
                <th scope="col">Deprivation quintile</th>
                <th scope="col">Outcome</th>
                <th scope="col">Readings</th>
              </tr>
            </thead>
            <tbody>
              {r.records.map((x) => (
                <tr key={x.pseudonym}>
                  <th scope="row">{x.pseudonym}</th>
                  <td>{x.age}</td>
                  <td>{x.sex}</td>
                  <td>{TYPE_WORDS[x.diabetesType] ?? x.diabetesType}</td>
                  <td>{x.deprivationQuintile ?? '—'}</td>
                  <td>{OUTCOME_WORDS[x.outcome] ?? x.outcome}</td>
                  <td className="cairn-small">{x.readings}</td>
                </tr>
              ))}
            </tbody>
          </HTMLTable>
          <div className="cairn-review-pager">
            <Button
              small
              icon="chevron-left"
              disabled={page <= 1}
              onClick={() => setPage(page - 1)}
            >
              Previous {RECORDS_PAGE_SIZE}
            </Button>{' '}
            <span>
              Page {r.page} of {pages}
            </span>{' '}
            <Button
              small
              rightIcon="chevron-right"
              disabled={page >= pages}
              onClick={() => setPage(page + 1)}
            >
              Next {RECORDS_PAGE_SIZE}
            </Button>
          </div>
        </>
      ) : null}
    </section>
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
  const h = d.histogram;
  const counts = h?.splits.find((s) => s.split === 'all') ?? h?.splits[0];
  if (!h || !counts) return null;
  const props: ValueHistogramProps = {
    label: h.label,
    unit: h.unit,
    edges: h.edges,
    practice: counts.practice,
    region: counts.region,
    practiceLabel: d.practice.code,
  };
  return (
    <section className="cairn-review-section">
      <h2>
        {h.label} ({h.unit}): the practice’s values against the region’s
      </h2>
      <ChartOrTable
        title={`Share of recorded values: ${d.practice.code} (bars), region (dashed outline)`}
        chart={<ValueHistogram {...props} />}
        table={<ValueHistogramTable {...props} />}
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
