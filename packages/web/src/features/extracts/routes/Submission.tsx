import { AnchorButton, H1, Intent, Spinner } from '@blueprintjs/core';
import { Link, useParams, useSearchParams } from 'react-router-dom';
import { ClinicalCaution } from '../../../components/ClinicalCaution';
import { EmptyState, Notice } from '../../../components/Notice';
import { ProblemCallout } from '../../../components/ProblemCallout';
import { RequireRole } from '../../../components/RequireRole';
import type { IssueSort, Submission as SubmissionView } from '../../../lib/api/types';
import { formatCount, formatDateTime } from '../../../lib/format';
import { usePageTitle } from '../../../lib/page-title';
import { downloadLinks, type IssueFilters, useHistory, useSubmission } from '../api/extracts';
import { uploadLink } from '../components/upload-link';
import { formatBytes, formatMonth } from '../components/format';
import { ISSUE_PAGE, IssuesTable } from '../components/IssuesTable';
import { LinkButton } from '../components/LinkButton';
import { RefusalCallout } from '../components/RefusalCallout';
import { ReportSummary } from '../components/ReportSummary';
import { CompareWithCurrent } from '../components/CompareWithCurrent';
import { OlderWaiting } from '../components/OlderWaiting';
import { CurrentTag, StatusTag } from '../components/StatusTag';
import { quarterState } from '../components/waiting';
import { SubmissionDecisions } from '../components/SubmissionDecisions';
import { SubmissionProgress } from '../components/SubmissionProgress';
import './Extracts.css';

/** `/practices/:practiceId/submissions/:submissionId`: progress, then the validation report. */
export function Submission() {
  const { submissionId } = useParams();
  usePageTitle(`Submission ${submissionId ?? ''}`.trim());
  return (
    <RequireRole roles={['practice_lead', 'regional_lead', 'auditor']}>
      <SubmissionScreen />
    </RequireRole>
  );
}

const dateConventionText: Record<string, string> = {
  day_first: 'day first (DD/MM/YYYY)',
  month_first: 'month first (MM/DD/YYYY)',
};

function SubmissionScreen() {
  const params = useParams();
  const practiceId = Number(params.practiceId);
  const submissionId = Number(params.submissionId);
  const submission = useSubmission(practiceId, submissionId);
  const history = useHistory(Number.isSafeInteger(practiceId) ? practiceId : null);
  const [search, setSearch] = useSearchParams();

  if (!Number.isSafeInteger(practiceId) || !Number.isSafeInteger(submissionId)) {
    return <EmptyState icon="path-search" title="This page does not exist" headingLevel={1} />;
  }
  if (submission.isPending) return <Spinner aria-label="Loading the submission" />;
  if (submission.isError) {
    return (
      <div className="cairn-extracts">
        <H1 className="cairn-page-title">Submission {submissionId}</H1>
        <ProblemCallout error={submission.error} />
        <Link to={`/practices/${practiceId}/submissions`}>See the practice&apos;s submissions</Link>
      </div>
    );
  }
  const s = submission.data;

  const filters: IssueFilters = {
    severity: (search.get('severity') ?? '') as IssueFilters['severity'],
    code: search.get('code') ?? '',
    column: search.get('column') ?? '',
    sort: (search.get('sort') ?? 'row') as IssueSort,
    offset: Number(search.get('offset') ?? 0) || 0,
    limit: ISSUE_PAGE,
  };
  const setFilters = (next: IssueFilters) => {
    const out = new URLSearchParams();
    if (next.severity) out.set('severity', next.severity);
    if (next.code) out.set('code', next.code);
    if (next.column) out.set('column', next.column);
    if (next.sort && next.sort !== 'row') out.set('sort', next.sort);
    if (next.offset) out.set('offset', String(next.offset));
    setSearch(out, { replace: true });
  };

  const quarterEntry = history.data?.quarters.find((q) => q.quarter.id === s.quarter.id);
  const state = quarterState(quarterEntry);
  const current: SubmissionView | null =
    state.current && state.current.id !== s.id ? state.current : null;
  // Extracts waiting behind this one (newer, or now current), offered for cancelling.
  const olderThanThis = state.older.filter((x) => x.id < s.id && x.id !== s.id);
  const offerOlder =
    (s.status === 'awaiting_confirmation' && state.newest?.id === s.id) || s.isCurrent
      ? olderThanThis
      : [];
  // The API's upload action: a new extract for the same practice and audit quarter.
  const mayUpload = s.actions.upload;
  const uploadTo = mayUpload ? uploadLink(s.practice.id, s.quarter.id) : null;
  const links = downloadLinks(s.practice.id, s.id);
  const reported = s.status !== 'processing' && s.status !== 'cancelled' && s.status !== 'failed';
  const hasRows = s.counts !== null;
  const hasFlags = (s.counts?.flags ?? 0) > 0;

  return (
    <div className="cairn-extracts cairn-submission">
      <nav className="cairn-back" aria-label="Breadcrumb">
        <Link to={`/practices/${s.practice.id}/submissions`}>
          ← Submissions of {s.practice.name}
        </Link>
      </nav>
      <div className="cairn-page-head">
        <div>
          <H1 className="cairn-page-title cairn-title-with-tags">
            Submission {s.id} <StatusTag status={s.status} large />
            {s.isCurrent ? <CurrentTag /> : null}
          </H1>
          <p className="cairn-muted">
            {s.practice.name} ({s.practice.code}) · audit quarter {s.quarter.label} · review window{' '}
            {formatMonth(s.quarter.windowStart)} to {formatMonth(s.quarter.windowEnd)}
          </p>
        </div>
      </div>

      <dl className="cairn-facts">
        <dt>File</dt>
        <dd>
          {s.file.name}{' '}
          <span className="cairn-muted">
            ({formatBytes(s.file.sizeBytes)}
            {s.file.kind ? `, ${s.file.kind.toUpperCase()}` : ''}
            {s.file.sheetName ? `, sheet “${s.file.sheetName}”` : ''})
          </span>
        </dd>
        <dt>Uploaded</dt>
        <dd>
          {formatDateTime(s.uploadedAt)} by {s.uploadedBy}
        </dd>
        {s.file.dateConvention ? (
          <>
            <dt>Text dates read</dt>
            <dd>{dateConventionText[s.file.dateConvention] ?? s.file.dateConvention}</dd>
          </>
        ) : null}
        {s.confirmedAt ? (
          <>
            <dt>Confirmed</dt>
            <dd>
              {formatDateTime(s.confirmedAt)}
              {s.confirmedBy ? ` by ${s.confirmedBy}` : ''}
            </dd>
          </>
        ) : null}
        {s.file.sha256 ? (
          <>
            <dt>SHA-256</dt>
            <dd>
              <code title={s.file.sha256} className="cairn-hash">
                {s.file.sha256.slice(0, 16)}…
              </code>
            </dd>
          </>
        ) : null}
      </dl>

      {s.status === 'processing' ? <SubmissionProgress submission={s} /> : null}

      {s.status === 'rejected' ? <RefusalCallout submission={s} uploadTo={uploadTo} /> : null}

      {s.status === 'failed' && s.failure ? (
        <Notice
          intent={Intent.WARNING}
          icon="error"
          title="Cairn could not finish checking this extract"
          className="cairn-state-callout"
          role="alert"
        >
          <p>{s.failure.message || 'The check stopped unexpectedly.'}</p>
          <p className="cairn-muted">
            {s.failure.attempts} {s.failure.attempts === 1 ? 'attempt' : 'attempts'} so far.{' '}
            {s.failure.canRetry
              ? s.actions.retry
                ? 'The file is still kept: choose Check again to try once more.'
                : 'The file is still kept; a practice lead or regional lead can check it again.'
              : 'The file is no longer kept: upload it again.'}
          </p>
          {!s.failure.canRetry && uploadTo ? (
            <LinkButton to={uploadTo} icon="upload">
              Upload the file again
            </LinkButton>
          ) : null}
        </Notice>
      ) : null}

      {s.status === 'awaiting_confirmation' ? (
        <Notice
          intent={Intent.WARNING}
          icon="time"
          title="Checked: read the report, then confirm"
          className="cairn-state-callout"
        >
          This submission is not used until it is confirmed.{' '}
          {current
            ? `Confirming it replaces submission ${current.id}, the current one for ${s.quarter.label}.`
            : `${s.practice.name} has no current submission for ${s.quarter.label} yet.`}
          {s.counts && s.counts.rowsRejected > 0
            ? ` Its ${formatCount(s.counts.rowsRejected)} refused ${s.counts.rowsRejected === 1 ? 'row is' : 'rows are'} left out${mayUpload ? '; you can fix them and upload the whole extract again instead' : ''}.`
            : ''}
        </Notice>
      ) : null}

      {s.status === 'accepted' ? (
        <Notice
          intent={Intent.SUCCESS}
          icon="tick-circle"
          title={`Current submission for ${s.quarter.label}`}
          className="cairn-state-callout"
        >
          Its {formatCount(s.counts?.rowsAccepted ?? 0)} accepted rows are the practice&apos;s care
          records for this audit quarter.
          {mayUpload ? ' To change them, upload a new extract and confirm it.' : ''}
          <p>
            <Link to={`/practices/${s.practice.id}/results?quarter=${s.quarter.id}`}>
              Read the practice&apos;s results for {s.quarter.label}
            </Link>
          </p>
        </Notice>
      ) : null}

      {s.status === 'superseded' ? (
        <Notice icon="history" title="Superseded" className="cairn-state-callout">
          Replaced {s.supersededAt ? `on ${formatDateTime(s.supersededAt)} ` : ''}
          {s.supersededBySubmissionId ? (
            <>
              by{' '}
              <Link to={`/practices/${s.practice.id}/submissions/${s.supersededBySubmissionId}`}>
                submission {s.supersededBySubmissionId}
              </Link>
            </>
          ) : null}
          ; it is no longer used.
        </Notice>
      ) : null}

      {s.status === 'cancelled' ? (
        <Notice icon="disable" title="Cancelled" className="cairn-state-callout">
          Cancelled {s.cancelledAt ? `on ${formatDateTime(s.cancelledAt)}` : ''}
          {s.cancelledBy ? ` by ${s.cancelledBy}` : ''}. Nothing from this file is used.
        </Notice>
      ) : null}

      {s.status === 'awaiting_confirmation' && current ? (
        <CompareWithCurrent candidate={s} current={current} />
      ) : null}

      <SubmissionDecisions submission={s} current={current} />

      <OlderWaiting
        practiceId={s.practice.id}
        quarterLabel={s.quarter.label}
        older={offerOlder}
        newer={s}
      />

      {reported && hasRows ? (
        <ReportSummary
          submission={s}
          activeCode={filters.code}
          onPickCode={(code) => setFilters({ ...filters, code, offset: 0 })}
        />
      ) : null}

      {s.columnsIgnored.length > 0 ? (
        <p className="cairn-muted">
          Columns not in Cairn&apos;s format, ignored: {s.columnsIgnored.join(', ')}.
        </p>
      ) : null}

      {hasFlags ? (
        <div className="cairn-flags-caution">
          <p>
            Data-quality flags point at values that look unusual for how diabetes care is usually
            recorded. They are checks on the data, not findings about a person&apos;s care.
          </p>
          <ClinicalCaution />
        </div>
      ) : null}

      {reported ? (
        <div className="cairn-downloads">
          <h2 className="bp6-heading">Downloads</h2>
          <div className="cairn-button-row">
            {(s.counts?.rowsRejected ?? 0) > 0 ? (
              <AnchorButton href={links.rejectedRowsXlsx} download icon="th-disconnect">
                Refused rows (XLSX)
              </AnchorButton>
            ) : null}
            <AnchorButton href={links.reportJson} download icon="code-block">
              Full report (JSON)
            </AnchorButton>
          </div>
          {(s.counts?.rowsRejected ?? 0) > 0 ? (
            <p className="cairn-muted">
              The refused rows as they were sent, with a column saying what to fix
              {mayUpload
                ? '; correct them in your extract, then upload the whole extract again.'
                : '.'}
            </p>
          ) : null}
        </div>
      ) : null}

      {reported && (hasRows || s.issuesByCode.length > 0) ? (
        <IssuesTable submission={s} filters={filters} onChange={setFilters} />
      ) : null}
    </div>
  );
}
