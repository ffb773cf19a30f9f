import { Alert, Button, H2, HTMLTable, Intent, NonIdealState, Spinner } from '@blueprintjs/core';
import { useState } from 'react';
import { Link } from 'react-router-dom';
import { ProblemCallout } from '../../../components/ProblemCallout';
import type { AuditQuarter } from '../../../lib/api/types';
import { formatCount, formatDateTime } from '../../../lib/format';
import { usePageTitle } from '../../../lib/page-title';
import { formatRegionDate, formatRegionMonth } from '../../../lib/region-dates';
import { useChangeQuarter, useQuarterOverview } from '../api/quarters';
import { ChangeQuarterDialog } from '../components/ChangeQuarterDialog';
import { OpenQuarterDialog } from '../components/OpenQuarterDialog';
import { QuarterStatusTag } from '../components/QuarterStatusTag';
import './Quarters.css';

type Editing = { kind: 'change' | 'reopen'; row: AuditQuarter } | { kind: 'open' } | null;

/**
 * `/quarters`: the region's audit quarters with their deadline, measure set,
 * coverage and published reports. The regional lead opens the next quarter,
 * moves deadlines, closes and reopens quarters; everyone else reads. Buttons
 * follow the actions the API sends.
 */
export function Quarters() {
  usePageTitle('Audit quarters');
  const overview = useQuarterOverview();
  const close = useChangeQuarter();
  const [editing, setEditing] = useState<Editing>(null);
  const [closing, setClosing] = useState<AuditQuarter | null>(null);
  const data = overview.data;
  const seesCoverage = data?.quarters.some((q) => q.coverage !== null) ?? false;

  return (
    <div className="cairn-quarters">
      <div className="cairn-page-head">
        <div>
          <H2>Audit quarters</H2>
          <p className="cairn-muted">
            Each quarter practices send one extract for its review window. Until its deadline a
            quarter is open for extracts; its results are measured by the measure set it names.
          </p>
        </div>
        {data?.actions.open ? (
          <Button
            intent={Intent.PRIMARY}
            icon="add"
            onClick={() => setEditing({ kind: 'open' })}
            disabled={data.measureSets.length === 0}
          >
            Open {data.next.label}
          </Button>
        ) : null}
      </div>

      <ProblemCallout error={overview.error} />
      {close.error ? <ProblemCallout error={close.error} /> : null}
      {overview.isPending ? <Spinner aria-label="Loading audit quarters" /> : null}

      {data && data.quarters.length === 0 ? (
        <NonIdealState
          icon="calendar"
          title="No audit quarters yet"
          description={
            data.actions.open
              ? `Open ${data.next.label} to let practices send their extracts.`
              : 'Your regional lead opens the first audit quarter.'
          }
        />
      ) : null}

      {data && data.quarters.length > 0 ? (
        <HTMLTable compact striped className="cairn-quarters-table">
          <thead>
            <tr>
              <th scope="col">Quarter</th>
              <th scope="col">Status</th>
              <th scope="col">Deadline</th>
              <th scope="col">Measure set</th>
              {seesCoverage ? <th scope="col">Coverage</th> : null}
              <th scope="col">Reports</th>
              {data.actions.open ? <th scope="col">Actions</th> : null}
            </tr>
          </thead>
          <tbody>
            {data.quarters.map((row) => (
              <QuarterRow
                key={row.quarter.id}
                row={row}
                seesCoverage={seesCoverage}
                showActions={data.actions.open}
                onChange={() => setEditing({ kind: 'change', row })}
                onReopen={() => setEditing({ kind: 'reopen', row })}
                onClose={() => setClosing(row)}
              />
            ))}
          </tbody>
        </HTMLTable>
      ) : null}

      {data && editing?.kind === 'open' ? (
        <OpenQuarterDialog
          next={data.next}
          measureSets={data.measureSets}
          onClose={() => setEditing(null)}
        />
      ) : null}
      {data && (editing?.kind === 'change' || editing?.kind === 'reopen') ? (
        <ChangeQuarterDialog
          row={editing.row}
          measureSets={data.measureSets}
          reopen={editing.kind === 'reopen'}
          onClose={() => setEditing(null)}
        />
      ) : null}
      <Alert
        isOpen={closing !== null}
        icon="lock"
        intent={Intent.PRIMARY}
        cancelButtonText="Cancel"
        confirmButtonText={closing ? `Close ${closing.quarter.label}` : 'Close'}
        loading={close.isPending}
        onCancel={() => setClosing(null)}
        onConfirm={() => {
          if (!closing) return;
          close.mutate(
            { kind: 'close', quarterId: closing.quarter.id },
            { onSettled: () => setClosing(null) },
          );
        }}
      >
        {closing ? (
          <p>
            Close {closing.quarter.label} to practice uploads? Practice leads can no longer send or
            confirm extracts for it. You can still correct it for them, and reopen it later.
          </p>
        ) : null}
      </Alert>
    </div>
  );
}

function QuarterRow({
  row,
  seesCoverage,
  showActions,
  onChange,
  onReopen,
  onClose,
}: {
  row: AuditQuarter;
  seesCoverage: boolean;
  showActions: boolean;
  onChange: () => void;
  onReopen: () => void;
  onClose: () => void;
}) {
  const { quarter, coverage, reports, actions, measureSet } = row;
  return (
    <tr data-quarter={quarter.label}>
      <th scope="row">
        <span className="cairn-quarter-label">{quarter.label}</span>
        <div className="cairn-muted cairn-small">
          Review window {formatRegionMonth(quarter.windowStart)} –{' '}
          {formatRegionMonth(quarter.windowEnd)}
        </div>
      </th>
      <td>
        <QuarterStatusTag status={quarter.status} />
        {quarter.closedAt ? (
          <div className="cairn-muted cairn-small">since {formatDateTime(quarter.closedAt)}</div>
        ) : null}
      </td>
      <td className="cairn-nowrap">{formatRegionDate(quarter.submissionDeadline)}</td>
      <td>
        <Link to={`/measure-sets/${encodeURIComponent(measureSet.id)}`}>{measureSet.label}</Link>
        <div className="cairn-muted cairn-small">{measureSet.id}</div>
      </td>
      {seesCoverage ? (
        <td>
          {coverage ? (
            <Link
              to={`/coverage?quarter=${quarter.id}`}
              className="cairn-coverage-line"
              aria-label={`Coverage of ${quarter.label}: ${coverage.current} of ${coverage.practices} practices with a current submission, ${coverage.awaitingConfirmation} awaiting confirmation, ${coverage.none} with none`}
            >
              <span>
                <strong>{formatCount(coverage.current)}</strong> of{' '}
                {formatCount(coverage.practices)} current
              </span>
              <span>{formatCount(coverage.awaitingConfirmation)} awaiting confirmation</span>
              <span>{formatCount(coverage.none)} none</span>
            </Link>
          ) : (
            '—'
          )}
        </td>
      ) : null}
      <td>
        {reports.length === 0 ? (
          <span className="cairn-muted">No report published yet</span>
        ) : (
          <ul className="cairn-report-list">
            {reports.map((r) => (
              <li key={r.id}>
                {r.label}{' '}
                <span className="cairn-muted cairn-small">
                  ({r.status}, {formatDateTime(r.publishedAt)})
                </span>
              </li>
            ))}
          </ul>
        )}
      </td>
      {showActions ? (
        <td className="cairn-quarter-actions">
          {actions.changeDeadline ? (
            <Button small icon="edit" onClick={onChange} aria-label={`Change ${quarter.label}`}>
              Change
            </Button>
          ) : null}
          {actions.close ? (
            <Button small icon="lock" onClick={onClose} aria-label={`Close ${quarter.label}`}>
              Close
            </Button>
          ) : null}
          {actions.reopen ? (
            <Button small icon="unlock" onClick={onReopen} aria-label={`Reopen ${quarter.label}`}>
              Reopen
            </Button>
          ) : null}
        </td>
      ) : null}
    </tr>
  );
}
