import {
  H1,
  HTMLSelect,
  HTMLTable,
  InputGroup,
  SegmentedControl,
  Spinner,
} from '@blueprintjs/core';
import { useDeferredValue, useState } from 'react';
import { Link, useSearchParams } from 'react-router-dom';
import { EmptyState } from '../../../components/Notice';
import { ProblemCallout } from '../../../components/ProblemCallout';
import { RequireRole } from '../../../components/RequireRole';
import type { CoverageState } from '../../../lib/api/types';
import { formatCount, formatDateTime } from '../../../lib/format';
import { usePageTitle } from '../../../lib/page-title';
import { useCoverage } from '../api/extracts';
import { formatDate, formatMonth } from '../components/format';
import { CoverageTag, coverageLook, StatusTag } from '../components/StatusTag';
import { Figure } from '../components/Figure';
import { useQuarterList } from '../../../lib/quarter-list';
import './Extracts.css';

/** `/coverage`: which practices have a current submission for an audit quarter. */
export function Coverage() {
  usePageTitle('Coverage');
  return (
    <RequireRole roles={['regional_lead', 'auditor']}>
      <CoverageScreen />
    </RequireRole>
  );
}

type StateFilter = CoverageState | 'all';

function CoverageScreen() {
  const [params, setParams] = useSearchParams();
  const quarters = useQuarterList();
  const [search, setSearch] = useState(params.get('search') ?? '');
  const deferred = useDeferredValue(search).trim().toLowerCase();
  const list = quarters.data ?? [];
  const asked = Number(params.get('quarter'));
  const quarter =
    list.find((q) => q.id === asked) ?? list.find((q) => q.status === 'open') ?? list[0] ?? null;
  const coverage = useCoverage(quarter?.id ?? null);
  const state = (params.get('state') ?? 'all') as StateFilter;

  const setParam = (key: string, value: string) => {
    const next = new URLSearchParams(params);
    if (value) next.set(key, value);
    else next.delete(key);
    setParams(next, { replace: true });
  };

  const data = coverage.data;
  // The states are a partition: each practice is in exactly one of them.
  const rows = (data?.practices ?? []).filter(
    (p) =>
      (state === 'all' || p.state === state) &&
      (!deferred ||
        `${p.practice.code} ${p.practice.name} ${p.practice.localityName ?? ''}`
          .toLowerCase()
          .includes(deferred)),
  );
  const totals = data?.totals;

  return (
    <div className="cairn-extracts cairn-coverage">
      <div className="cairn-page-head">
        <div>
          <H1 className="cairn-page-title">Coverage</H1>
          <p className="cairn-muted">
            Each practice once: with a confirmed, current submission for the audit quarter; with
            none yet but an extract awaiting confirmation; or with neither.
          </p>
        </div>
        <div className="cairn-head-actions">
          {quarters.isPending ? (
            <Spinner size={20} aria-label="Loading audit quarters" />
          ) : (
            <HTMLSelect
              aria-label="Audit quarter"
              value={quarter ? String(quarter.id) : ''}
              onChange={(e) => setParam('quarter', e.currentTarget.value)}
            >
              {list.map((q) => (
                <option key={q.id} value={q.id}>
                  {q.label} ({q.status === 'open' ? 'open' : 'closed'})
                </option>
              ))}
            </HTMLSelect>
          )}
        </div>
      </div>
      <ProblemCallout error={quarters.error ?? coverage.error} />
      {quarter ? (
        <p className="cairn-muted">
          {quarter.label}: review window {formatMonth(quarter.windowStart)} to{' '}
          {formatMonth(quarter.windowEnd)}; deadline {formatDate(quarter.submissionDeadline)};{' '}
          {quarter.status === 'open' ? 'open for extracts' : 'closed'}.
        </p>
      ) : null}

      {!quarters.isPending && list.length === 0 ? (
        <EmptyState icon="calendar" title="No audit quarters yet" />
      ) : null}

      {totals ? (
        <>
          <div
            className="cairn-figures cairn-coverage-totals"
            role="list"
            aria-label="Practices by state"
          >
            {(
              [
                ['Practices', totals.practices, undefined],
                [
                  <CoverageTag key="current" state="current" />,
                  totals.current,
                  totals.currentWithWaiting > 0
                    ? `${formatCount(totals.currentWithWaiting)} with another extract waiting`
                    : undefined,
                ],
                [
                  <CoverageTag key="awaiting" state="awaiting_confirmation" />,
                  totals.awaitingConfirmation,
                  'no current one yet',
                ],
                [<CoverageTag key="none" state="none" />, totals.none, undefined],
                ['Records in current submissions', totals.records, undefined],
              ] as const
            ).map(([label, value, note], i) => (
              <div role="listitem" key={i}>
                <Figure label={label} value={value} note={note} />
              </div>
            ))}
          </div>
          <p className="cairn-muted cairn-coverage-sum">
            {formatCount(totals.practices)} practices: {formatCount(totals.current)} with a current
            submission, {formatCount(totals.awaitingConfirmation)} awaiting confirmation of their
            first, {formatCount(totals.none)} with neither.
          </p>
        </>
      ) : null}

      {totals ? (
        <div className="cairn-filters" role="search">
          <SegmentedControl
            aria-label="Show practices"
            value={state}
            onValueChange={(value) => setParam('state', value === 'all' ? '' : value)}
            options={[
              { value: 'all', label: `All (${totals.practices})` },
              { value: 'current', label: `${coverageLook.current.label} (${totals.current})` },
              {
                value: 'awaiting_confirmation',
                label: `${coverageLook.awaiting_confirmation.label} (${totals.awaitingConfirmation})`,
              },
              { value: 'none', label: `${coverageLook.none.label} (${totals.none})` },
            ]}
          />
          <InputGroup
            leftIcon="search"
            placeholder="Practice, code or locality"
            aria-label="Search practice, code or locality"
            value={search}
            onValueChange={(value) => {
              setSearch(value);
              setParam('search', value.trim());
            }}
          />
          <span className="cairn-muted cairn-count" aria-live="polite">
            {rows.length} {rows.length === 1 ? 'practice' : 'practices'}
          </span>
        </div>
      ) : null}

      {coverage.isPending && quarter ? <Spinner aria-label="Loading coverage" /> : null}
      {data && rows.length === 0 ? (
        <EmptyState icon="filter" title="No practice matches" description="Change the filter." />
      ) : null}
      {data && rows.length > 0 ? (
        <HTMLTable compact striped className="cairn-coverage-table">
          <thead>
            <tr>
              <th>Practice</th>
              <th>Locality</th>
              <th>Coverage</th>
              <th>Current submission</th>
              <th>Waiting</th>
              <th>Last refused or failed</th>
            </tr>
          </thead>
          <tbody>
            {rows.map((p) => (
              <tr key={p.practice.id} data-practice={p.practice.code}>
                <td>
                  <Link to={`/practices/${p.practice.id}/submissions`}>
                    {p.practice.code} · {p.practice.name}
                  </Link>
                </td>
                <td>{p.practice.localityName ?? '—'}</td>
                <td>
                  <CoverageTag state={p.state} />
                </td>
                <td>
                  {p.current ? (
                    <>
                      <Link
                        to={`/practices/${p.practice.id}/submissions/${p.current.submissionId}`}
                      >
                        Submission {p.current.submissionId}
                      </Link>
                      <div className="cairn-muted cairn-small">
                        {formatCount(p.current.records)} records
                        {p.current.confirmedAt
                          ? `, confirmed ${formatDateTime(p.current.confirmedAt)}`
                          : ''}
                        {p.current.confirmedBy ? ` by ${p.current.confirmedBy}` : ''}
                      </div>
                    </>
                  ) : (
                    <span className="cairn-muted">None</span>
                  )}
                </td>
                <td>
                  {p.waiting.length === 0 ? (
                    <span className="cairn-muted">—</span>
                  ) : (
                    <ul className="cairn-line-list">
                      {p.waiting.map((w) => (
                        <li key={w.submissionId} className="cairn-waiting-line">
                          <Link to={`/practices/${p.practice.id}/submissions/${w.submissionId}`}>
                            Submission {w.submissionId}
                          </Link>{' '}
                          <StatusTag status={w.status} />
                        </li>
                      ))}
                    </ul>
                  )}
                </td>
                <td>
                  {p.lastProblem ? (
                    <div className="cairn-problem-line">
                      <Link
                        to={`/practices/${p.practice.id}/submissions/${p.lastProblem.submissionId}`}
                      >
                        Submission {p.lastProblem.submissionId}
                      </Link>{' '}
                      <StatusTag status={p.lastProblem.status} />
                      <div
                        className="cairn-small"
                        title={p.lastProblem.code ? `Code: ${p.lastProblem.code}` : undefined}
                      >
                        {p.lastProblem.reason}
                      </div>
                    </div>
                  ) : (
                    <span className="cairn-muted">—</span>
                  )}
                </td>
              </tr>
            ))}
          </tbody>
        </HTMLTable>
      ) : null}
    </div>
  );
}
