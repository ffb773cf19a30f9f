import {
  Button,
  H1,
  HTMLSelect,
  HTMLTable,
  InputGroup,
  Intent,
  Spinner,
  Tag,
} from '@blueprintjs/core';
import { Fragment, useDeferredValue, useState } from 'react';
import { useSearchParams } from 'react-router-dom';
import { DateFilter } from '../../../components/DateFilter';
import { EmptyState } from '../../../components/Notice';
import { ProblemCallout } from '../../../components/ProblemCallout';
import { SupportCodes } from '../../../components/SupportCodes';
import { formatDateTime } from '../../../lib/format';
import { usePageTitle } from '../../../lib/page-title';
import { RequireRole } from '../../../components/RequireRole';
import type { AuditEvent, AuditOutcome } from '../../../lib/api/types';
import { type AuditFilters, useAuditActions, useAuditEvents } from '../api/audit-events';
import './AuditTrail.css';

/** `/audit-trail`: the regional lead browses what happened, who did it, and refused sign-ins. */
export function AuditTrail() {
  usePageTitle('Audit trail');
  return (
    <RequireRole roles={['regional_lead', 'auditor']}>
      <AuditTrailScreen />
    </RequireRole>
  );
}

const outcomeTag: Record<
  AuditOutcome,
  { intent: Intent; icon: 'tick' | 'blocked-person' | 'error'; label: string }
> = {
  success: { intent: Intent.NONE, icon: 'tick', label: 'Done' },
  refused: { intent: Intent.WARNING, icon: 'blocked-person', label: 'Refused' },
  failed: { intent: Intent.DANGER, icon: 'error', label: 'Failed' },
};

function AuditTrailScreen() {
  const [params, setParams] = useSearchParams();
  const [search, setSearch] = useState(params.get('search') ?? '');
  const deferredSearch = useDeferredValue(search);
  const filters: AuditFilters = {
    action: params.get('action') ?? '',
    outcome: (params.get('outcome') ?? '') as AuditOutcome | '',
    search: deferredSearch,
    from: params.get('from') ?? '',
    to: params.get('to') ?? '',
  };
  const events = useAuditEvents(filters);
  const actions = useAuditActions();
  const [expanded, setExpanded] = useState<number | null>(null);

  const setFilter = (key: string, value: string) => {
    const next = new URLSearchParams(params);
    if (value) next.set(key, value);
    else next.delete(key);
    setParams(next, { replace: true });
  };
  const rows: AuditEvent[] = events.data?.pages.flatMap((p) => p.events) ?? [];
  // The groups of actions recorded so far, in the API's words (each a filter prefix).
  const groups = [
    ...new Map((actions.data ?? []).map((a) => [a.group, a.groupLabel])).entries(),
  ].map(([value, label]) => ({ value, label: `${label} (all)` }));

  return (
    <div className="cairn-audit">
      <div className="cairn-page-head">
        <div>
          <H1 className="cairn-page-title">Audit trail</H1>
          <p className="cairn-muted">
            What happened in the region, newest first: sign-ins and refused sign-ins, changes to
            people and their practices, audit quarters, and every extract and submission (uploaded,
            checked, refused, confirmed, cancelled). Entries cannot be changed or deleted.
          </p>
        </div>
      </div>
      <div className="cairn-filters" role="search">
        <HTMLSelect
          aria-label="Code"
          value={filters.action}
          onChange={(e) => setFilter('action', e.currentTarget.value)}
        >
          <option value="">All actions</option>
          <optgroup label="Groups">
            {groups.map((g) => (
              <option key={g.value} value={g.value}>
                {g.label}
              </option>
            ))}
          </optgroup>
          <optgroup label="Actions">
            {(actions.data ?? []).map((a) => (
              <option key={a.action} value={a.action}>
                {a.label} ({a.count})
              </option>
            ))}
          </optgroup>
        </HTMLSelect>
        <HTMLSelect
          aria-label="Outcome"
          value={filters.outcome}
          onChange={(e) => setFilter('outcome', e.currentTarget.value)}
        >
          <option value="">Any outcome</option>
          <option value="success">Done</option>
          <option value="refused">Refused</option>
          <option value="failed">Failed</option>
        </HTMLSelect>
        <InputGroup
          leftIcon="search"
          placeholder="Who, or words in the summary"
          aria-label="Search who or summary"
          value={search}
          onValueChange={(value) => {
            setSearch(value);
            setFilter('search', value.trim());
          }}
        />
        <DateFilter
          label="From"
          value={filters.from ?? ''}
          onChange={(iso) => setFilter('from', iso)}
        />
        <DateFilter label="To" value={filters.to ?? ''} onChange={(iso) => setFilter('to', iso)} />
      </div>
      <ProblemCallout error={events.error} />
      {events.isPending ? (
        <Spinner aria-label="Loading the audit trail" />
      ) : rows.length === 0 ? (
        <EmptyState
          icon="history"
          title="No entries match"
          description="Change or clear the filters."
        />
      ) : (
        <HTMLTable compact striped className="cairn-audit-table">
          <thead>
            <tr>
              <th>When</th>
              <th>Outcome</th>
              <th>Action</th>
              <th>Who</th>
              <th>What happened</th>
              <th>Practice</th>
              <th>
                <span className="visually-hidden">Details</span>
              </th>
            </tr>
          </thead>
          <tbody>
            {rows.map((event) => {
              const tag = outcomeTag[event.outcome];
              const open = expanded === event.id;
              return (
                <Fragment key={event.id}>
                  <tr>
                    <td className="cairn-nowrap">{formatDateTime(event.occurredAt)}</td>
                    <td>
                      <Tag minimal intent={tag.intent} icon={tag.icon}>
                        {tag.label}
                      </Tag>
                    </td>
                    <td title={`Action: ${event.action}`}>{event.actionLabel}</td>
                    <td>{event.actorLabel}</td>
                    <td>{event.summary}</td>
                    <td>{event.practice?.code ?? ''}</td>
                    <td>
                      <Button
                        size="small"
                        variant="minimal"
                        icon={open ? 'chevron-up' : 'chevron-down'}
                        aria-expanded={open}
                        aria-label={open ? 'Hide details' : 'Show details'}
                        onClick={() => setExpanded(open ? null : event.id)}
                      />
                    </td>
                  </tr>
                  {open ? (
                    <tr className="cairn-audit-detail">
                      <td colSpan={7}>
                        <dl>
                          {event.subjectType ? (
                            <>
                              <dt>About</dt>
                              <dd>
                                {event.subjectType} {event.subjectId}
                              </dd>
                            </>
                          ) : null}
                          <dt>From</dt>
                          <dd>{event.ipAddress ?? '—'}</dd>
                          <dt>Request</dt>
                          <dd>
                            <code>{event.requestId ?? '—'}</code>
                          </dd>
                        </dl>
                        <SupportCodes
                          label="Code"
                          codes={[
                            event.action,
                            ...(event.detail?.reason ? [String(event.detail.reason)] : []),
                          ]}
                        />
                        {event.detail ? <pre>{JSON.stringify(event.detail, null, 2)}</pre> : null}
                      </td>
                    </tr>
                  ) : null}
                </Fragment>
              );
            })}
          </tbody>
        </HTMLTable>
      )}
      {events.hasNextPage ? (
        <Button
          className="cairn-more"
          icon="history"
          loading={events.isFetchingNextPage}
          onClick={() => void events.fetchNextPage()}
        >
          Show older entries
        </Button>
      ) : null}
    </div>
  );
}
