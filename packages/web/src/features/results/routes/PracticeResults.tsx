import {
  Button,
  FormGroup,
  H1,
  HTMLSelect,
  SegmentedControl,
  Spinner,
  Switch,
  Tab,
  Tabs,
} from '@blueprintjs/core';
import { useQueryClient } from '@tanstack/react-query';
import { type ReactNode, useId } from 'react';
import { Link, Navigate, useNavigate, useParams, useSearchParams } from 'react-router-dom';
import { FlagLegend } from '../../../components/charts/FlagMark';
import { EmptyState, Notice } from '../../../components/Notice';
import { ProblemCallout } from '../../../components/ProblemCallout';
import { RequireRole } from '../../../components/RequireRole';
import type {
  Me,
  PracticeResultsDetail,
  PracticeResults as Results,
  Quarter,
  TypeSplit,
} from '../../../lib/api/types';
import { formatCount, formatDateTime } from '../../../lib/format';
import { usePageTitle } from '../../../lib/page-title';
import { useMe } from '../../../lib/session';
import { practicesByCode } from '../../../lib/landing';
import { resultsKeys, usePracticeDetail, usePracticeResults } from '../api/results';
import { BreakdownsPanel } from '../components/BreakdownsPanel';
import { InsulinPanel } from '../components/InsulinPanel';
import { KidneyPanel } from '../components/KidneyPanel';
import { MeasuresTable } from '../components/MeasuresTable';
import { PeersPanel } from '../components/PeersPanel';
import { QualityPanel } from '../components/QualityPanel';
import { RecallPanel } from '../components/RecallPanel';
import { ValuesPanel } from '../components/ValuesPanel';
import { splitLabels } from '../components/words';
import { useQuarterList } from '../../../lib/quarter-list';
import '../../../components/charts/charts.css';
import './Results.css';

const splits: TypeSplit[] = ['all', 'type1', 'type2_other'];
const tabs = [
  'measures',
  'peers',
  'values',
  'breakdowns',
  'kidney',
  'insulin',
  'quality',
  'recall',
] as const;
type TabId = (typeof tabs)[number];
/** The tabs that show the practice's detail: it is read only while one of them is open. */
const detailTabs: ReadonlySet<TabId> = new Set(['values', 'breakdowns', 'kidney', 'insulin']);

/** `/results`: a practice lead's own results (the first practice by code); others go to the benchmark. */
export function MyResults() {
  const me = useMe();
  if (me.isPending) return <Spinner aria-label="Checking sign-in" />;
  const user = me.data;
  if (!user) return <Navigate to="/sign-in?returnTo=%2Fresults" replace />;
  if (user.role !== 'practice_lead') return <Navigate to="/benchmark" replace />;
  const first = practicesByCode(user)[0];
  if (!first) {
    return (
      <EmptyState
        icon="office"
        title="No practice yet"
        headingLevel={1}
        description="You are not assigned to a practice yet. Ask your regional lead to add your practice to your account."
      />
    );
  }
  return <Navigate to={`/practices/${first.id}/results`} replace />;
}

/** `/practices/:practiceId/results?quarter=&split=&tab=`: one practice's audit quarter. */
export function PracticeResults() {
  return (
    <RequireRole roles={['practice_lead', 'regional_lead', 'auditor']}>
      <PracticeResultsScreen />
    </RequireRole>
  );
}

function pickQuarter(list: Quarter[], asked: number): Quarter | null {
  return (
    list.find((q) => q.id === asked) ?? list.find((q) => q.status === 'open') ?? list[0] ?? null
  );
}

function PracticeResultsScreen() {
  const { practiceId: raw } = useParams();
  const practiceId = Number(raw);
  const [params, setParams] = useSearchParams();
  const navigate = useNavigate();
  const me = useMe();
  const quarters = useQuarterList();
  const quarter = pickQuarter(quarters.data ?? [], Number(params.get('quarter')));
  const results = usePracticeResults(
    Number.isInteger(practiceId) ? practiceId : null,
    quarter?.id ?? null,
  );
  const split = (splits as string[]).includes(params.get('split') ?? '')
    ? (params.get('split') as TypeSplit)
    : 'all';
  const tab = (tabs as readonly string[]).includes(params.get('tab') ?? '')
    ? (params.get('tab') as TabId)
    : 'measures';
  const quarterSelect = useId();
  const practiceSelect = useId();
  const data = results.data;
  usePageTitle(data ? `Results · ${data.practice.code}` : 'Results');

  const setParam = (key: string, value: string | null) => {
    const next = new URLSearchParams(params);
    if (value) next.set(key, value);
    else next.delete(key);
    setParams(next, { replace: true });
  };
  const own = me.data?.role === 'practice_lead' ? practicesByCode(me.data) : [];

  return (
    <div className="cairn-results">
      <div className="cairn-results-head">
        <div>
          <H1 className="cairn-page-title">
            {data ? `${data.practice.name} (${data.practice.code})` : 'Practice results'}
          </H1>
          <p className="cairn-muted">
            {data ? `${data.practice.localityName ?? 'No locality'} · ` : ''}
            {quarter ? `Audit quarter ${quarter.label}` : ''}
            {quarter
              ? `, review window ${quarter.windowStart.slice(0, 7)} to ${quarter.windowEnd.slice(0, 7)}`
              : ''}
          </p>
        </div>
        <div className="cairn-results-controls">
          {own.length > 1 ? (
            <FormGroup label="Practice" labelFor={practiceSelect} inline>
              <HTMLSelect
                id={practiceSelect}
                value={practiceId}
                onChange={(e) =>
                  void navigate(`/practices/${e.currentTarget.value}/results?${params.toString()}`)
                }
                options={own.map((p: Me['practices'][number]) => ({
                  value: p.id,
                  label: `${p.code} ${p.name}`,
                }))}
              />
            </FormGroup>
          ) : null}
          <FormGroup label="Audit quarter" labelFor={quarterSelect} inline>
            <HTMLSelect
              id={quarterSelect}
              value={quarter?.id ?? ''}
              onChange={(e) => setParam('quarter', e.currentTarget.value)}
              options={(quarters.data ?? []).map((q) => ({ value: q.id, label: q.label }))}
            />
          </FormGroup>
          {me.data && me.data.role !== 'practice_lead' ? (
            <Link to={`/benchmark${quarter ? `?quarter=${quarter.id}` : ''}`}>
              Region benchmark
            </Link>
          ) : null}
        </div>
      </div>
      {quarters.isPending || results.isPending ? (
        <Spinner size={24} aria-label="Reading the practice's results" />
      ) : null}
      <ProblemCallout error={quarters.error ?? results.error} />
      {data?.state === 'no-current-submission' ? <NoSubmission results={data} /> : null}
      {data?.state === 'results' ? (
        <ResultsBody
          results={data}
          split={split}
          tab={tab}
          onSplit={(s) => setParam('split', s === 'all' ? null : s)}
          onTab={(t) => setParam('tab', t === 'measures' ? null : t)}
          asTables={params.get('view') === 'tables'}
          onTables={(on) => setParam('view', on ? 'tables' : null)}
        />
      ) : null}
    </div>
  );
}

function NoSubmission({ results }: { results: Results }) {
  return (
    <EmptyState
      icon="document"
      title={`No current submission for ${results.quarter.label}`}
      headingLevel={2}
      description={
        results.message ??
        `${results.practice.name} has no accepted extract for this audit quarter, so there are no results to show.`
      }
      action={
        results.actions.upload && results.actions.uploadPath ? (
          <Link className="bp6-button bp6-intent-primary" to={results.actions.uploadPath}>
            Upload an extract
          </Link>
        ) : undefined
      }
    />
  );
}

function ResultsBody({
  results,
  split,
  tab,
  onSplit,
  onTab,
  asTables,
  onTables,
}: {
  results: Results;
  split: TypeSplit;
  tab: TabId;
  onSplit: (s: TypeSplit) => void;
  onTab: (t: TabId) => void;
  asTables: boolean;
  onTables: (on: boolean) => void;
}) {
  const processes = results.measures.filter((m) => m.measure.kind === 'care_process');
  const targets = results.measures.filter((m) => m.measure.kind === 'treatment_target');
  const quality = results.dataQuality.filter((f) => f.count > 0).length;
  const detail = usePracticeDetail(results.practice.id, results.quarter.id, detailTabs.has(tab));
  const withDetail = (panel: (detail: PracticeResultsDetail) => ReactNode) => (
    <DetailPanel results={results} query={detail} panel={panel} />
  );
  return (
    <>
      <Notice
        icon="info-sign"
        title="Audit and improvement support"
        className="cairn-results-caution"
      >
        {results.caution}
      </Notice>
      <p className="cairn-muted cairn-small" data-testid="built-from">
        {results.submission
          ? `From submission ${results.submission.id} (${formatCount(results.submission.records)} records, confirmed ${formatDateTime(results.submission.confirmedAt)}). `
          : ''}
        {results.builtFrom
          ? `Region figures from ${formatCount(results.builtFrom.submissions)} practices' current submissions, built ${formatDateTime(results.builtFrom.builtAt)}.`
          : ''}
        {results.disclosure === 'applied'
          ? ' Other practices appear only as region figures; counts from 1 to 4 show as “< 5” and small groups are withheld.'
          : ''}
      </p>
      <div className="cairn-results-controls">
        <SegmentedControl
          aria-label="Diabetes type"
          options={splits.map((s) => ({ value: s, label: splitLabels[s] }))}
          value={split}
          onValueChange={(v) => onSplit(v as TypeSplit)}
          small
        />
        <Switch
          checked={asTables}
          label="Show charts as tables"
          onChange={(e) => onTables(e.currentTarget.checked)}
        />
      </div>
      <Tabs
        id="results-tabs"
        selectedTabId={tab}
        onChange={(t) => onTab(t as TabId)}
        renderActiveTabPanelOnly
        large={false}
      >
        <Tab
          id="measures"
          title="Measures"
          panel={
            <>
              <FlagLegend />
              <p className="cairn-muted cairn-small">
                The bar is the 95 % interval of the practice&apos;s rate, the dot the rate, the
                diamond tick the region median. In the quarters chart, squares mark quarters in a
                run-chart shift or trend; the dashed line is the practice&apos;s median.
              </p>
              <MeasuresTable
                title="Care processes"
                results={results}
                measures={processes}
                split={split}
                asTables={asTables}
              />
              <MeasuresTable
                title="Treatment targets"
                results={results}
                measures={targets}
                split={split}
                asTables={asTables}
              />
            </>
          }
        />
        <Tab
          id="peers"
          title="Among peers"
          panel={<PeersPanel results={results} split={split} asTables={asTables} />}
        />
        <Tab
          id="values"
          title="Values"
          panel={withDetail((d) => (
            <ValuesPanel results={d} split={split} asTables={asTables} />
          ))}
        />
        <Tab
          id="breakdowns"
          title="Breakdowns"
          panel={withDetail((d) =>
            d.detail ? (
              <BreakdownsPanel
                measures={results.measures}
                detail={d.detail}
                split={split}
                asTables={asTables}
              />
            ) : null,
          )}
        />
        <Tab
          id="kidney"
          title="Kidney risk"
          panel={withDetail((d) =>
            d.detail ? <KidneyPanel detail={d.detail} split={split} /> : null,
          )}
        />
        <Tab
          id="insulin"
          title="Time to insulin"
          panel={withDetail((d) => (d.detail ? <InsulinPanel detail={d.detail} /> : null))}
        />
        <Tab
          id="quality"
          title={`Data quality${quality > 0 ? ` (${quality})` : ''}`}
          panel={<QualityPanel flags={results.dataQuality} />}
        />
        <Tab
          id="recall"
          title="Recall list"
          panel={<RecallPanel results={results} split={split} />}
        />
      </Tabs>
    </>
  );
}

/**
 * A tab that shows the practice's detail: read when the tab opens (its own request), shown once
 * it is of the same stored result as the results on the page.
 */
function DetailPanel({
  results,
  query,
  panel,
}: {
  results: Results;
  query: ReturnType<typeof usePracticeDetail>;
  panel: (detail: PracticeResultsDetail) => ReactNode;
}) {
  const queryClient = useQueryClient();
  if (query.error) return <ProblemCallout error={query.error} />;
  if (!query.data) {
    return <Spinner size={24} aria-label="Reading the practice's detail" />;
  }
  const data = query.data;
  if ((data.builtFrom?.resultId ?? null) !== (results.builtFrom?.resultId ?? null)) {
    // A submission was confirmed between the two reads: the figures would not agree.
    const again = () => {
      void queryClient.invalidateQueries({
        queryKey: resultsKeys.results(results.practice.id, results.quarter.id),
      });
      void queryClient.invalidateQueries({
        queryKey: resultsKeys.detail(results.practice.id, results.quarter.id),
      });
    };
    return (
      <Notice icon="refresh" title="The results have changed">
        <p>
          An extract was confirmed since these results were read, so this tab&apos;s figures would
          not match the rest of the page.
        </p>
        <Button text="Read the results again" onClick={again} />
      </Notice>
    );
  }
  if (!data.detail) {
    return (
      <EmptyState
        icon="th-disconnect"
        title="No detail for this quarter"
        description="The breakdowns, kidney grid, time to insulin and value histograms could not be built for this practice's submission."
      />
    );
  }
  return panel(data);
}
