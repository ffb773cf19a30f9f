import { HTMLTable, Intent, Spinner } from '@blueprintjs/core';
import { Link } from 'react-router-dom';
import type { Practice, PracticeRef, Quarter, Submission } from '../../../lib/api/types';
import { formatCount, formatDateTime } from '../../../lib/format';
import { useHistory } from '../api/extracts';
import { LinkButton } from './LinkButton';
import { OlderWaiting } from './OlderWaiting';
import { CurrentTag, StatusTag } from './StatusTag';
import { uploadLink } from './upload-link';
import { quarterState } from './waiting';

/**
 * One practice in one audit quarter, for its lead's home: the current submission and every
 * extract still waiting, each with its figures, so that the choice between them is seen whole.
 * Deciding (compare, then confirm or cancel) happens on the waiting submission's own page.
 */
export function PracticeQuarter({
  practice,
  quarter,
}: {
  practice: PracticeRef | Practice;
  quarter: Quarter;
}) {
  const history = useHistory(practice.id);
  const entry = history.data?.quarters.find((q) => q.quarter.id === quarter.id);
  const { current, waiting, newest, older } = quarterState(entry);
  const link = (s: Submission) => `/practices/${practice.id}/submissions/${s.id}`;
  const mayUpload = entry?.actions.upload ?? false;
  const headingId = `home-practice-${practice.id}`;
  const awaiting = waiting.filter((s) => s.status === 'awaiting_confirmation');

  return (
    <section
      className="cairn-practice-quarter"
      aria-labelledby={headingId}
      data-practice={practice.code}
    >
      <PracticeHeading practice={practice} id={headingId} />
      {history.isPending ? (
        <Spinner size={16} aria-label={`Reading ${practice.code}'s submissions`} />
      ) : history.isError ? (
        <p className="cairn-muted">Cairn could not read this practice&apos;s submissions.</p>
      ) : (
        <>
          <p className="cairn-practice-quarter-summary">
            {current
              ? `Current submission for ${quarter.label}: submission ${current.id}, ${formatCount(current.counts?.rowsAccepted ?? 0)} records.`
              : `No current submission for ${quarter.label} yet.`}{' '}
            {awaiting.length === 0
              ? waiting.length > 0
                ? 'An extract is being checked.'
                : ''
              : `${awaiting.length} ${awaiting.length === 1 ? 'extract waits' : 'extracts wait'} for a decision: compare, then confirm or cancel.`}
          </p>
          {current || waiting.length > 0 ? (
            <HTMLTable compact className="cairn-practice-quarter-table">
              <thead>
                <tr>
                  <th scope="col">Submission</th>
                  <th scope="col">Status</th>
                  <th scope="col" className="cairn-number">
                    Rows accepted
                  </th>
                  <th scope="col" className="cairn-number">
                    Rows refused
                  </th>
                  <th scope="col">Uploaded</th>
                  <th scope="col">
                    <span className="visually-hidden">Next step</span>
                  </th>
                </tr>
              </thead>
              <tbody>
                {[...(current ? [current] : []), ...waiting].map((s) => {
                  const refused = s.counts?.rowsRejected ?? 0;
                  return (
                    <tr key={s.id} data-submission={s.id}>
                      <td>
                        <Link to={link(s)}>Submission {s.id}</Link>
                      </td>
                      <td>
                        <span className="cairn-tags">
                          <StatusTag status={s.status} />
                          {s.id === current?.id ? <CurrentTag /> : null}
                        </span>
                      </td>
                      <td className="cairn-number">{formatCount(s.counts?.rowsAccepted)}</td>
                      <td className="cairn-number">
                        {s.counts ? (
                          <span className={refused > 0 ? 'cairn-refused-count' : undefined}>
                            {formatCount(refused)}
                            {refused > 0 ? ` of ${formatCount(s.counts.rowsRead)}` : ''}
                          </span>
                        ) : (
                          '—'
                        )}
                      </td>
                      <td>
                        {formatDateTime(s.uploadedAt)}
                        <span className="cairn-muted"> by {s.uploadedBy}</span>
                      </td>
                      <td>
                        {s.status === 'awaiting_confirmation' && s.actions.confirm ? (
                          <LinkButton
                            small
                            intent={s === newest ? Intent.PRIMARY : Intent.NONE}
                            icon="comparison"
                            to={link(s)}
                            text={current ? 'Compare and decide' : 'Read the report and decide'}
                          />
                        ) : s.status === 'processing' ? (
                          <Link to={link(s)}>Follow its check</Link>
                        ) : (
                          <Link to={link(s)}>Read the report</Link>
                        )}
                      </td>
                    </tr>
                  );
                })}
              </tbody>
            </HTMLTable>
          ) : null}
          <OlderWaiting
            practiceId={practice.id}
            quarterLabel={quarter.label}
            older={older}
            newer={newest ?? current}
          />
          {mayUpload || current ? (
            <div className="cairn-home-actions">
              {current ? (
                <LinkButton
                  small
                  intent={waiting.length === 0 ? Intent.PRIMARY : Intent.NONE}
                  icon="timeline-bar-chart"
                  to={`/practices/${practice.id}/results?quarter=${quarter.id}`}
                  text="Results"
                />
              ) : null}
              {mayUpload ? (
                <LinkButton
                  small
                  intent={!current && waiting.length === 0 ? Intent.PRIMARY : Intent.NONE}
                  icon="upload"
                  to={uploadLink(practice.id, quarter.id)}
                  text={
                    current || waiting.length > 0 ? 'Send a corrected extract' : 'Upload extract'
                  }
                />
              ) : null}
            </div>
          ) : null}
        </>
      )}
    </section>
  );
}

/** A practice's name and code as a section heading, with the way to all its submissions. */
export function PracticeHeading({
  practice,
  id,
}: {
  practice: PracticeRef | Practice;
  id?: string;
}) {
  return (
    <div className="cairn-practice-quarter-head">
      <h3 id={id} className="bp6-heading">
        {practice.name} <span className="cairn-muted">({practice.code})</span>
      </h3>
      <LinkButton
        small
        variant="minimal"
        icon="list-columns"
        to={`/practices/${practice.id}/submissions`}
        text="All submissions"
      />
    </div>
  );
}
