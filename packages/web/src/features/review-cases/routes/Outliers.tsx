import {
  Button,
  Callout,
  H1,
  HTMLSelect,
  HTMLTable,
  Spinner,
  Switch,
  Tag,
} from '@blueprintjs/core';
import { useQuery } from '@tanstack/react-query';
import { useState } from 'react';
import { Link, useNavigate, useSearchParams } from 'react-router-dom';
import { ClinicalCaution } from '../../../components/ClinicalCaution';
import { EmptyState } from '../../../components/Notice';
import { ProblemCallout } from '../../../components/ProblemCallout';
import { RequireRole } from '../../../components/RequireRole';
import type { OutlierRow } from '../../../lib/api/types';
import { formatDateTime, formatPercent } from '../../../lib/format';
import { usePageTitle } from '../../../lib/page-title';
import { type OutlierFilters, outliersQueryOptions, useOpenCase } from '../api/review-cases';
import { useQuarterList } from '../../../lib/quarter-list';
import '../review.css';

/** `/outliers`: the quarter's practices × measures beyond the limits, strongest evidence first. */
export function Outliers() {
  usePageTitle('Outlier list');
  return (
    <RequireRole roles={['auditor', 'regional_lead']}>
      <OutliersScreen />
    </RequireRole>
  );
}

function OutliersScreen() {
  const [params, setParams] = useSearchParams();
  const quarters = useQuarterList();
  const list = quarters.data ?? [];
  const quarterId = Number(params.get('quarter')) || list[0]?.id || 0;
  const filters: OutlierFilters = {
    level: params.get('level') === 'inner' ? 'inner' : 'outer',
    caseMix: params.get('caseMix') === 'true',
    measure: params.get('measure') ?? '',
    locality: params.get('locality') ?? '',
  };
  const set = (key: string, value: string) => {
    const next = new URLSearchParams(params);
    if (value) next.set(key, value);
    else next.delete(key);
    setParams(next, { replace: true });
  };
  const outliers = useQuery({
    ...outliersQueryOptions(quarterId, filters),
    enabled: quarterId > 0,
  });
  const data = outliers.data;
  const worse = (data?.rows ?? []).filter((r) => r.assessment === 'worse');
  const better = (data?.rows ?? []).filter((r) => r.assessment === 'better');
  return (
    <div className="cairn-review">
      <div className="cairn-page-head">
        <div>
          <H1 className="cairn-page-title">Outlier list</H1>
          <p className="cairn-muted">
            Practices whose rate on a measure lies beyond the funnel limits after allowing for
            over-dispersion, strongest evidence first. Open a row to see why, or open a review case.
          </p>
        </div>
        <Link to="/review-cases">Review cases</Link>
      </div>
      <ClinicalCaution compact />
      <form
        className="cairn-review-filters"
        aria-label="Filters"
        onSubmit={(e) => e.preventDefault()}
      >
        <label>
          Audit quarter
          <HTMLSelect
            value={quarterId || ''}
            onChange={(e) => set('quarter', e.currentTarget.value)}
            options={list.map((q) => ({ value: q.id, label: q.label }))}
          />
        </label>
        <label>
          Limits
          <HTMLSelect
            value={filters.level}
            onChange={(e) => set('level', e.currentTarget.value === 'inner' ? 'inner' : '')}
            options={[
              { value: 'outer', label: 'Beyond 99.8 %' },
              { value: 'inner', label: 'Beyond 95 % too' },
            ]}
          />
        </label>
        <label>
          Measure
          <HTMLSelect
            value={filters.measure}
            onChange={(e) => set('measure', e.currentTarget.value)}
            options={[
              { value: '', label: 'Every measure' },
              ...(data?.measures ?? []).map((m) => ({ value: m.key, label: m.label })),
            ]}
          />
        </label>
        <label>
          Locality
          <HTMLSelect
            value={filters.locality}
            onChange={(e) => set('locality', e.currentTarget.value)}
            options={[
              { value: '', label: 'Every locality' },
              ...(data?.localities ?? []).map((l) => ({ value: l.code, label: l.name })),
            ]}
          />
        </label>
        <Switch
          checked={filters.caseMix}
          label="Adjust for case mix"
          onChange={(e) => set('caseMix', e.currentTarget.checked ? 'true' : '')}
        />
      </form>
      <ProblemCallout error={quarters.error ?? outliers.error} />
      {outliers.isPending && quarterId > 0 ? (
        <Spinner aria-label="Loading the outlier list" />
      ) : null}
      {data?.state === 'no-accepted-submissions' ? (
        <EmptyState
          icon="search"
          title="Nothing to judge yet"
          description={`${data.quarter.label} has no accepted submissions.`}
        />
      ) : null}
      {data?.state === 'results' ? (
        <>
          <p className="cairn-muted">
            {data.practices} practices judged, read from the{' '}
            {data.basis?.origin === 'report' ? 'published report' : 'draft benchmark'} built{' '}
            {data.basis ? formatDateTime(data.basis.builtAt) : ''}.
          </p>
          <OutlierTable
            title={`Worse than expected (${worse.length})`}
            rows={worse}
            quarterId={quarterId}
            caseMix={filters.caseMix}
            mayOpen={data.mayOpenCases}
          />
          <OutlierTable
            title={`Better than expected (${better.length})`}
            rows={better}
            quarterId={quarterId}
            caseMix={filters.caseMix}
            mayOpen={data.mayOpenCases}
          />
        </>
      ) : null}
    </div>
  );
}

function OutlierTable({
  title,
  rows,
  quarterId,
  caseMix,
  mayOpen,
}: {
  title: string;
  rows: OutlierRow[];
  quarterId: number;
  caseMix: boolean;
  mayOpen: boolean;
}) {
  const open = useOpenCase();
  const navigate = useNavigate();
  const [opening, setOpening] = useState<string | null>(null);
  return (
    <section className="cairn-review-section">
      <h2>{title}</h2>
      {rows.length === 0 ? (
        <p className="cairn-muted">None.</p>
      ) : (
        <HTMLTable compact striped className="cairn-review-table">
          <thead>
            <tr>
              <th scope="col">Practice</th>
              <th scope="col">Measure</th>
              <th scope="col">Rate</th>
              <th scope="col">Evidence (z)</th>
              <th scope="col">Why</th>
              <th scope="col">Flagged</th>
              <th scope="col">Review case</th>
            </tr>
          </thead>
          <tbody>
            {rows.map((r) => {
              const key = `${r.practice.id}/${r.measure.key}`;
              return (
                <tr key={key}>
                  <th scope="row">
                    <Link
                      to={`/outliers/${quarterId}/practices/${r.practice.id}/measures/${r.measure.key}`}
                    >
                      {r.practice.code} {r.practice.name}
                    </Link>
                    <div className="cairn-muted">{r.practice.localityName}</div>
                  </th>
                  <td>
                    {r.measure.label}
                    <div className="cairn-small">Guideline: {r.measure.source}</div>
                  </td>
                  <td className="cairn-nowrap">
                    {formatPercent(r.rate)}{' '}
                    <Tag minimal>{r.band === 'outlier' ? 'beyond 99.8 %' : 'beyond 95 %'}</Tag>
                  </td>
                  <td>{r.z.toFixed(1).replace('-', '−')}</td>
                  <td className="cairn-review-reason">{r.evidence.reason}</td>
                  <td>
                    {r.flaggedQuarters === 1
                      ? 'this quarter'
                      : `${r.flaggedQuarters} quarters in a row`}
                  </td>
                  <td>
                    {r.openCase ? (
                      <Link to={`/review-cases/${r.openCase.id}`}>Case {r.openCase.id}</Link>
                    ) : mayOpen ? (
                      <Button
                        small
                        icon="add"
                        loading={open.isPending && opening === key}
                        onClick={() => {
                          setOpening(key);
                          open.mutate(
                            {
                              quarterId,
                              practiceId: r.practice.id,
                              measureKey: r.measure.key,
                              split: 'all',
                              caseMix,
                            },
                            { onSuccess: (c) => navigate(`/review-cases/${c.id}`) },
                          );
                        }}
                      >
                        Open case
                      </Button>
                    ) : (
                      <span className="cairn-muted">none</span>
                    )}
                  </td>
                </tr>
              );
            })}
          </tbody>
        </HTMLTable>
      )}
      {open.error ? (
        <Callout intent="danger">
          <ProblemCallout error={open.error} />
        </Callout>
      ) : null}
    </section>
  );
}
