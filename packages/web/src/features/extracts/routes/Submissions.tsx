import {
  Classes,
  H1,
  H2,
  HTMLSelect,
  HTMLTable,
  Intent,
  Section,
  SectionCard,
  Spinner,
  Tag,
} from '@blueprintjs/core';
import { Link, Navigate, useNavigate, useParams } from 'react-router-dom';
import { EmptyState } from '../../../components/Notice';
import { ProblemCallout } from '../../../components/ProblemCallout';
import { RequireRole } from '../../../components/RequireRole';
import type { SubmissionHistory } from '../../../lib/api/types';
import { formatCount, formatDateTime } from '../../../lib/format';
import { usePageTitle } from '../../../lib/page-title';
import { useMe } from '../../../lib/session';
import { useHistory } from '../api/extracts';
import { practiceLabel, usePracticeChoices } from '../api/practices';
import { uploadLink } from '../components/upload-link';
import { formatDate, formatMonth } from '../components/format';
import { LinkButton } from '../components/LinkButton';
import { CurrentTag, StatusTag } from '../components/StatusTag';
import './Extracts.css';

/**
 * `/submissions` and `/practices/:practiceId/submissions`: a practice's
 * submissions by audit quarter, latest first.
 */
export function Submissions() {
  usePageTitle('Submissions');
  return (
    <RequireRole roles={['practice_lead', 'regional_lead', 'auditor']}>
      <SubmissionsScreen />
    </RequireRole>
  );
}

function SubmissionsScreen() {
  const params = useParams();
  const me = useMe();
  const navigate = useNavigate();
  const choices = usePracticeChoices();
  const practiceId = params.practiceId ? Number(params.practiceId) : null;
  const history = useHistory(
    practiceId !== null && Number.isSafeInteger(practiceId) ? practiceId : null,
  );

  // `/submissions` of a practice lead: their (first) practice.
  if (practiceId === null && me.data?.role === 'practice_lead' && me.data.practices[0]) {
    return <Navigate to={`/practices/${me.data.practices[0].id}/submissions`} replace />;
  }

  const switcher =
    choices.practices.length > 1 ? (
      <HTMLSelect
        aria-label="Practice"
        value={practiceId ?? ''}
        onChange={(e) =>
          void navigate(
            e.currentTarget.value
              ? `/practices/${e.currentTarget.value}/submissions`
              : '/submissions',
          )
        }
      >
        <option value="">Choose a practice…</option>
        {choices.practices.map((p) => (
          <option key={p.id} value={p.id}>
            {practiceLabel(p, me.data?.role === 'regional_lead')}
          </option>
        ))}
      </HTMLSelect>
    ) : null;

  const data = history.data;
  // The API's upload action, for this practice in some audit quarter.
  const mayUpload = data?.quarters.some((q) => q.actions.upload) ?? false;

  return (
    <div className="cairn-extracts cairn-history">
      <div className="cairn-page-head">
        <div>
          <H1 className="cairn-page-title">Submissions</H1>
          <p className="cairn-muted">
            {data
              ? `Every extract sent for ${data.practice.name} (${data.practice.code}), by audit quarter, latest first.`
              : 'Every extract sent for a practice, by audit quarter, latest first.'}
          </p>
        </div>
        <div className="cairn-head-actions">
          {switcher}
          {mayUpload && practiceId !== null ? (
            <LinkButton to={uploadLink(practiceId)} intent={Intent.PRIMARY} icon="upload">
              Upload extract
            </LinkButton>
          ) : null}
        </div>
      </div>

      {practiceId === null ? (
        choices.isPending ? (
          <Spinner aria-label="Loading practices" />
        ) : (
          <EmptyState
            icon="office"
            title="Choose a practice"
            description={
              choices.practices.length > 0 ? (
                'Pick a practice above to see its submissions.'
              ) : me.data?.role === 'practice_lead' ? (
                'You are not assigned to a practice yet. Ask your regional lead to add your practice to your account.'
              ) : (
                // Auditors read every practice of the region: they start from the quarter's coverage.
                <>
                  Open a practice from <Link to="/coverage">Coverage</Link>, which lists every
                  practice of the region for the audit quarter, to see its submissions.
                </>
              )
            }
          />
        )
      ) : (
        <>
          <ProblemCallout error={history.error} />
          {history.isPending ? <Spinner aria-label="Loading submissions" /> : null}
          {data ? <HistoryList history={data} /> : null}
        </>
      )}
    </div>
  );
}

function HistoryList({ history }: { history: SubmissionHistory }) {
  const practiceId = history.practice.id;
  const withSubmissions = history.quarters.filter(
    (q) => q.submissions.length > 0 || q.quarter.status === 'open',
  );
  const empty = history.quarters.filter(
    (q) => q.submissions.length === 0 && q.quarter.status !== 'open',
  );
  if (history.quarters.length === 0) {
    return (
      <EmptyState
        icon="calendar"
        title="No audit quarters yet"
        description="Your regional lead opens each audit quarter for extracts."
      />
    );
  }
  return (
    <div className="cairn-history-list">
      {withSubmissions.map(({ quarter, currentSubmissionId, submissions, actions }) => (
        <Section
          key={quarter.id}
          className="cairn-quarter-section"
          title={`Audit quarter ${quarter.label}`}
          titleRenderer={H2}
          subtitle={`Review window ${formatMonth(quarter.windowStart)} to ${formatMonth(quarter.windowEnd)}`}
          rightElement={
            quarter.status === 'open' ? (
              <Tag minimal intent={Intent.PRIMARY} icon="unlock">
                Open · send by {formatDate(quarter.submissionDeadline)}
              </Tag>
            ) : (
              <Tag minimal icon="lock">
                Closed
              </Tag>
            )
          }
          compact
        >
          <SectionCard padded={submissions.length === 0}>
            {submissions.length === 0 ? (
              <p className="cairn-muted cairn-none">
                No extract sent yet for this quarter.
                {actions.upload ? (
                  <>
                    {' '}
                    <Link to={uploadLink(practiceId, quarter.id)}>Upload one</Link>.
                  </>
                ) : null}
              </p>
            ) : (
              <HTMLTable compact striped className="cairn-history-table">
                <colgroup>
                  <col className="cairn-col-id" />
                  <col className="cairn-col-status" />
                  <col />
                  <col className="cairn-col-count" />
                  <col className="cairn-col-count" />
                  <col className="cairn-col-count" />
                  <col className="cairn-col-count" />
                  <col className="cairn-col-who" />
                  <col className="cairn-col-when" />
                </colgroup>
                <thead>
                  <tr>
                    <th>Submission</th>
                    <th>Status</th>
                    <th>File</th>
                    <th className="cairn-number">Rows read</th>
                    <th className="cairn-number">Accepted</th>
                    <th className="cairn-number">Refused</th>
                    <th className="cairn-number">Warnings</th>
                    <th>Uploaded by</th>
                    <th>When</th>
                  </tr>
                </thead>
                <tbody>
                  {submissions.map((s) => (
                    <tr key={s.id} data-submission={s.id}>
                      <td>
                        <Link to={`/practices/${practiceId}/submissions/${s.id}`}>
                          Submission {s.id}
                        </Link>
                      </td>
                      <td className="cairn-tags">
                        <StatusTag status={s.status} />
                        {s.id === currentSubmissionId ? <CurrentTag /> : null}
                      </td>
                      <td className="cairn-file-cell" title={s.file.name}>
                        {s.file.name}
                      </td>
                      <td className="cairn-number">{formatCount(s.counts?.rowsRead)}</td>
                      <td className="cairn-number">{formatCount(s.counts?.rowsAccepted)}</td>
                      <td className="cairn-number">{formatCount(s.counts?.rowsRejected)}</td>
                      <td className="cairn-number">{formatCount(s.counts?.warnings)}</td>
                      <td className="cairn-file-cell" title={s.uploadedBy}>
                        {s.uploadedBy}
                      </td>
                      <td className="cairn-nowrap">{formatDateTime(s.uploadedAt)}</td>
                    </tr>
                  ))}
                </tbody>
              </HTMLTable>
            )}
          </SectionCard>
        </Section>
      ))}
      {empty.length > 0 ? (
        <p className={`${Classes.TEXT_MUTED} cairn-none`}>
          No extract was sent for {empty.map((q) => q.quarter.label).join(', ')}.
        </p>
      ) : null}
    </div>
  );
}
