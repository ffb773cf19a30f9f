import {
  Button,
  FormGroup,
  H1,
  H2,
  HTMLSelect,
  HTMLTable,
  SegmentedControl,
  Spinner,
  Switch,
} from '@blueprintjs/core';
import { useDeferredValue, useId, useMemo } from 'react';
import { Link, useNavigate, useSearchParams } from 'react-router-dom';
import { ChartOrTable } from '../../../components/charts/ChartOrTable';
import { FlagLegend, FlagMark } from '../../../components/charts/FlagMark';
import { FunnelPlot, type FunnelPointData } from '../../../components/charts/FunnelPlot';
import { EmptyState, Notice } from '../../../components/Notice';
import { ProblemCallout } from '../../../components/ProblemCallout';
import { RequireRole } from '../../../components/RequireRole';
import type {
  MeasureFunnel,
  Quarter,
  RegionBenchmark as Benchmark,
  TypeSplit,
} from '../../../lib/api/types';
import { formatCount, formatDateTime, formatPercent } from '../../../lib/format';
import { usePageTitle } from '../../../lib/page-title';
import { useFunnel, useRegionBenchmark } from '../api/benchmark';
import { PublishReport } from '../components/PublishReport';
import { PracticeTable } from '../components/PracticeTable';
import { RegionTrend } from '../components/RegionTrend';
import { type SortKey, sortRows, tableCsv, tableRows } from '../components/table-rows';
import { useQuarterList } from '../../../lib/quarter-list';
import '../../../components/charts/charts.css';
import './RegionBenchmark.css';

const splits: { value: TypeSplit; label: string }[] = [
  { value: 'all', label: 'All types' },
  { value: 'type1', label: 'Type 1' },
  { value: 'type2_other', label: 'Type 2 and other' },
];

/** `/benchmark?quarter=&measure=&split=&locality=&limits=&casemix=`: every practice against its peers. */
export function RegionBenchmark() {
  // Named for everyone, a role it is not for included (that page explains the refusal).
  usePageTitle('Region benchmark');
  return (
    <RequireRole roles={['regional_lead', 'auditor']}>
      <RegionBenchmarkScreen />
    </RequireRole>
  );
}

function pickQuarter(list: Quarter[], asked: number): Quarter | null {
  return (
    list.find((q) => q.id === asked) ?? list.find((q) => q.status === 'open') ?? list[0] ?? null
  );
}

function RegionBenchmarkScreen() {
  const [params, setParams] = useSearchParams();
  const navigate = useNavigate();
  const quarters = useQuarterList();
  const quarter = pickQuarter(quarters.data ?? [], Number(params.get('quarter')));
  const split = (
    splits.some((s) => s.value === params.get('split')) ? params.get('split') : 'all'
  ) as TypeSplit;
  const locality = params.get('locality') ?? '';
  // A quarter named in the address is read at once, without waiting for the quarter list.
  const asked = Number(params.get('quarter'));
  const quarterId = Number.isInteger(asked) && asked > 0 ? asked : (quarter?.id ?? null);
  const benchmark = useRegionBenchmark(quarterId, split, locality);
  const data = benchmark.data;
  const measureKey =
    data?.measures.find((m) => m.key === params.get('measure'))?.key ??
    data?.measures[0]?.key ??
    null;
  // The measure the address names is asked for at once; otherwise the benchmark's first.
  const funnel = useFunnel(
    data?.state === 'no-accepted-submissions' ? null : quarterId,
    params.get('measure') ?? measureKey,
    split,
  );
  // The table (every practice × every measure) renders after the funnel has been asked for.
  const deferred = useDeferredValue(data);
  const ids = { quarter: useId(), locality: useId(), measure: useId(), sort: useId() };

  const update = (changes: Record<string, string | null>) => {
    const next = new URLSearchParams(params);
    for (const [key, value] of Object.entries(changes)) {
      if (value) next.set(key, value);
      else next.delete(key);
    }
    setParams(next, { replace: true });
  };
  const setParam = (key: string, value: string | null) => update({ [key]: value });
  const open = (practiceId: number) =>
    void navigate(`/practices/${practiceId}/results?quarter=${quarter?.id ?? ''}`);

  return (
    <div className="cairn-bench">
      <H1 className="cairn-page-title">Region benchmark</H1>
      <div className="cairn-bench-controls">
        <FormGroup label="Audit quarter" labelFor={ids.quarter} inline>
          <HTMLSelect
            id={ids.quarter}
            value={quarter?.id ?? ''}
            onChange={(e) => setParam('quarter', e.currentTarget.value)}
            options={(quarters.data ?? []).map((q) => ({ value: q.id, label: q.label }))}
          />
        </FormGroup>
        <SegmentedControl
          aria-label="Diabetes type"
          options={splits}
          value={split}
          onValueChange={(v) => setParam('split', v === 'all' ? null : v)}
          small
        />
        <FormGroup label="Locality" labelFor={ids.locality} inline>
          <HTMLSelect
            id={ids.locality}
            value={locality}
            onChange={(e) => setParam('locality', e.currentTarget.value || null)}
            options={[
              { value: '', label: 'Every locality' },
              ...(data?.localities ?? []).map((l) => ({ value: l.code, label: l.name })),
            ]}
          />
        </FormGroup>
        <PublishReport
          quarterId={quarterId}
          quarterLabel={data?.quarter.label ?? quarter?.label ?? null}
        />
      </div>
      {quarters.isPending || benchmark.isPending ? (
        <Spinner size={24} aria-label="Reading the benchmark" />
      ) : null}
      <ProblemCallout error={quarters.error ?? benchmark.error} />
      {data?.state === 'no-accepted-submissions' ? (
        <EmptyState
          icon="inbox"
          title={`No accepted submissions for ${data.quarter.label}`}
          headingLevel={2}
          description="No practice has a current submission for this audit quarter yet, so there is nothing to compare. Coverage shows who has sent an extract."
          action={<Link to={`/coverage?quarter=${data.quarter.id}`}>Open coverage</Link>}
        />
      ) : null}
      {data?.state === 'results' ? (
        <>
          <Notice
            icon="info-sign"
            title="Audit and improvement support"
            className="cairn-bench-caution"
          >
            {data.caution}
          </Notice>
          <Coverage benchmark={data} />
          <section aria-labelledby="bench-funnel" className="cairn-bench-section">
            <H2 id="bench-funnel">Funnel plot</H2>
            <div className="cairn-bench-controls">
              <FormGroup label="Measure" labelFor={ids.measure} inline>
                <HTMLSelect
                  id={ids.measure}
                  value={measureKey ?? ''}
                  onChange={(e) => setParam('measure', e.currentTarget.value)}
                  options={data.measures.map((m) => ({
                    value: m.key,
                    label: `${m.label} (${m.kind === 'care_process' ? 'care process' : 'treatment target'})`,
                  }))}
                />
              </FormGroup>
              <Switch
                checked={params.get('limits') === 'adjusted'}
                label="Limits allowing for over-dispersion"
                onChange={(e) => setParam('limits', e.currentTarget.checked ? 'adjusted' : null)}
              />
              <Switch
                checked={params.get('casemix') === 'on'}
                label="Case-mix-adjusted rates"
                onChange={(e) => setParam('casemix', e.currentTarget.checked ? 'on' : null)}
              />
            </div>
            <ProblemCallout error={funnel.error} />
            {funnel.data && funnel.data.state === 'results' ? (
              <Funnel
                funnel={funnel.data}
                locality={locality}
                adjustedLimits={params.get('limits') === 'adjusted'}
                caseMix={params.get('casemix') === 'on'}
                onOpen={open}
              />
            ) : funnel.isPending && measureKey ? (
              <Spinner size={20} aria-label="Reading the funnel plot" />
            ) : null}
          </section>
          <RegionTrend quarterId={quarterId} measure={measureKey} split={split} />
          {deferred?.state === 'results' ? (
            <PracticesSection
              benchmark={deferred}
              params={params}
              update={update}
              onOpen={open}
              sortId={ids.sort}
            />
          ) : null}
        </>
      ) : null}
    </div>
  );
}

function Coverage({ benchmark }: { benchmark: Benchmark }) {
  const { coverage, builtFrom } = benchmark;
  return (
    <p className="cairn-muted cairn-small" data-testid="coverage">
      {formatCount(coverage.withSubmission)} of {formatCount(coverage.practices)} practices have a
      current submission.
      {coverage.missing.length > 0
        ? ` Missing (shown as missing, not as zero): ${coverage.missing.map((p) => `${p.code} ${p.name}`).join(', ')}.`
        : ''}
      {builtFrom
        ? ` Built from ${formatCount(builtFrom.submissions)} submissions at ${formatDateTime(builtFrom.builtAt)}, measure set ${builtFrom.measureSetId}.`
        : ''}
    </p>
  );
}

function Funnel({
  funnel,
  locality,
  adjustedLimits,
  caseMix,
  onOpen,
}: {
  funnel: MeasureFunnel;
  locality: string;
  adjustedLimits: boolean;
  caseMix: boolean;
  onOpen: (id: number) => void;
}) {
  const curves = funnel.curves;
  const limits = adjustedLimits && curves?.adjusted ? curves.adjusted : curves?.exact;
  const od = funnel.overdispersion;
  const shown = funnel.points.filter((p) => !locality || p.localityCode === locality);
  const points: FunnelPointData[] = shown.map((p) => ({
    id: p.practice.id,
    label: `${p.practice.code} ${p.practice.name}`,
    n: p.n,
    events: p.events,
    rate: caseMix ? p.caseMix.adjustedRate : p.rate,
    flag: adjustedLimits ? p.adjusted : p.exact,
    details: [
      `95 % interval ${formatPercent(p.interval.lower)} to ${formatPercent(p.interval.upper)}`,
      `Observed ${formatCount(p.caseMix.observed)}, expected ${p.caseMix.expected.toFixed(1)}, O/E ${p.caseMix.ratio?.toFixed(2) ?? '—'}`,
      caseMix
        ? `Crude rate ${formatPercent(p.rate)}`
        : `Case-mix-adjusted rate ${formatPercent(p.caseMix.adjustedRate)}`,
    ],
  }));
  const title = `${funnel.measure.label}, ${funnel.quarter.label}`;
  return (
    <div>
      <p className="cairn-small">
        {funnel.measure.definition}. Guideline: {funnel.measure.source}.{' '}
        {od
          ? od.present
            ? `Over-dispersion is present (φ = ${od.phi?.toFixed(2) ?? '—'}): the limits allowing for it are wider.`
            : `No over-dispersion beyond chance (φ = ${od.phi?.toFixed(2) ?? '—'}).`
          : ''}{' '}
        {adjustedLimits && !curves?.adjusted
          ? 'Exact limits shown: no adjusted limits were needed.'
          : ''}
        {caseMix
          ? ' Points show case-mix-adjusted rates (indirect standardisation); shapes keep the flag of the practice’s own rate.'
          : ''}
      </p>
      <FlagLegend />
      <ChartOrTable
        label="Funnel plot"
        chart={
          limits ? (
            <FunnelPlot
              title={title}
              points={points}
              curveN={curves?.n ?? []}
              limits={limits}
              target={funnel.region?.theta0 ?? null}
              onSelect={onOpen}
            />
          ) : null
        }
        table={
          <HTMLTable
            compact
            striped
            className="cairn-bench-funnel-table"
            aria-label={`${title}: figures`}
          >
            <thead>
              <tr>
                <th scope="col">Practice</th>
                <th scope="col">Denominator</th>
                <th scope="col">Events</th>
                <th scope="col">{caseMix ? 'Adjusted rate' : 'Rate'}</th>
                <th scope="col">95 % limits at n</th>
                <th scope="col">99.8 % limits at n</th>
                <th scope="col">Flag</th>
                <th scope="col">O/E</th>
              </tr>
            </thead>
            <tbody>
              {shown.map((p) => {
                const f = adjustedLimits ? p.adjusted : p.exact;
                return (
                  <tr key={p.practice.id}>
                    <th scope="row">
                      <Link to={`/practices/${p.practice.id}/results?quarter=${funnel.quarter.id}`}>
                        {p.practice.code} {p.practice.name}
                      </Link>
                    </th>
                    <td>{formatCount(p.n)}</td>
                    <td>{formatCount(p.events)}</td>
                    <td>{formatPercent(caseMix ? p.caseMix.adjustedRate : p.rate)}</td>
                    <td>
                      {formatPercent(f.inner.lower)} to {formatPercent(f.inner.upper)}
                    </td>
                    <td>
                      {formatPercent(f.outer.lower)} to {formatPercent(f.outer.upper)}
                    </td>
                    <td>
                      <FlagMark flag={f} />
                    </td>
                    <td>{p.caseMix.ratio?.toFixed(2) ?? '—'}</td>
                  </tr>
                );
              })}
            </tbody>
          </HTMLTable>
        }
      />
      {funnel.missing.length > 0 ? (
        <p className="cairn-muted cairn-small">
          Not on the plot (no current submission): {funnel.missing.map((p) => p.code).join(', ')}.
        </p>
      ) : null}
    </div>
  );
}

function PracticesSection({
  benchmark,
  params,
  update,
  onOpen,
  sortId,
}: {
  benchmark: Benchmark;
  params: URLSearchParams;
  update: (changes: Record<string, string | null>) => void;
  onOpen: (id: number) => void;
  sortId: string;
}) {
  const sortKeys: { value: SortKey; label: string }[] = [
    { value: 'practice', label: 'Practice code' },
    { value: 'quality', label: 'Data-quality flags' },
    ...benchmark.measures.map((m) => ({ value: `measure:${m.key}` as SortKey, label: m.label })),
  ];
  const sort = (sortKeys.find((k) => k.value === params.get('sort'))?.value ??
    'practice') as SortKey;
  const descending = params.get('order') === 'desc';
  const rows = useMemo(
    () => sortRows(tableRows(benchmark), benchmark, sort, descending),
    [benchmark, sort, descending],
  );
  const onSort = (key: SortKey, desc: boolean) => {
    update({ sort: key === 'practice' ? null : key, order: desc ? 'desc' : null });
  };
  const download = () => {
    const blob = new Blob([tableCsv(benchmark, rows)], { type: 'text/csv;charset=utf-8' });
    const url = URL.createObjectURL(blob);
    const a = document.createElement('a');
    a.href = url;
    a.download = `benchmark-${benchmark.quarter.label.replace(/\s+/g, '-')}-${benchmark.split}${benchmark.locality ? `-${benchmark.locality.code}` : ''}.csv`;
    document.body.append(a);
    a.click();
    a.remove();
    URL.revokeObjectURL(url);
  };
  return (
    <section aria-labelledby="bench-table" className="cairn-bench-section">
      <H2 id="bench-table">Practices by measure</H2>
      <div className="cairn-bench-controls">
        <FormGroup label="Sort by" labelFor={sortId} inline>
          <HTMLSelect
            id={sortId}
            value={sort}
            onChange={(e) => onSort(e.currentTarget.value as SortKey, descending)}
            options={sortKeys}
          />
        </FormGroup>
        <Button
          icon={descending ? 'sort-desc' : 'sort-asc'}
          onClick={() => onSort(sort, !descending)}
          aria-label={
            descending
              ? 'Sorted high to low; sort low to high'
              : 'Sorted low to high; sort high to low'
          }
        >
          {descending ? 'High to low' : 'Low to high'}
        </Button>
        <Button icon="download" onClick={download}>
          Download the table (CSV)
        </Button>
      </div>
      <p className="cairn-muted cairn-small">
        Each cell: the practice&apos;s rate, and its flag against the exact funnel limits as a shape
        and in words. Arrow keys move between cells; a column&apos;s header menu sorts it.
      </p>
      <PracticeTable
        benchmark={benchmark}
        rows={rows}
        sort={sort}
        descending={descending}
        onSort={onSort}
        onOpen={onOpen}
      />
      <details className="cairn-bench-sources">
        <summary>The guideline behind each measure</summary>
        <HTMLTable compact className="cairn-small">
          <thead>
            <tr>
              <th scope="col">Measure</th>
              <th scope="col">Guideline</th>
            </tr>
          </thead>
          <tbody>
            {benchmark.measures.map((m) => (
              <tr key={m.key}>
                <th scope="row">{m.label}</th>
                <td>{m.source}</td>
              </tr>
            ))}
          </tbody>
        </HTMLTable>
      </details>
    </section>
  );
}
