import {
  Callout,
  Card,
  H2,
  H3,
  HTMLTable,
  Intent,
  NonIdealState,
  Spinner,
} from '@blueprintjs/core';
import { Link } from 'react-router-dom';
import type { Me, Quarter, Submission } from '../lib/api/types';
import { formatCount } from '../lib/format';
import { roleLabels } from '../lib/roles';
import { useMe } from '../lib/session';
import {
  useCoverage,
  useHistory,
  useQuarters,
  useUploadOptions,
} from '../features/extracts/api/extracts';
import { Figure } from '../features/extracts/components/Figure';
import { formatDate } from '../features/extracts/components/format';
import { LinkButton } from '../features/extracts/components/LinkButton';
import { CoverageTag, StatusTag } from '../features/extracts/components/StatusTag';
import { Landing } from '../features/landing/routes/Landing';
import '../features/extracts/routes/Extracts.css';
import './Home.css';

/**
 * `/`: the landing page when signed out; when signed in, where the person
 * stands this audit quarter and the next thing to do. The clinical caution
 * is in the footer of every screen (AppLayout).
 */
export function Home() {
  const me = useMe();
  if (me.isPending) return null;
  if (me.isError) {
    return (
      <NonIdealState
        icon="error"
        title="Cairn could not check your sign-in"
        description={me.error.message}
      />
    );
  }
  if (!me.data) return <Landing />;
  const user = me.data;
  return (
    <div className="cairn-home">
      <H2>Welcome, {user.displayName}</H2>
      <p>
        You are signed in as <strong>{roleLabels[user.role]}</strong> for {user.regionName}.
      </p>
      {user.role === 'practice_lead' ? (
        <PracticeLeadHome user={user} />
      ) : (
        <RegionHome user={user} />
      )}
    </div>
  );
}

/** The audit quarter that is open for extracts, else the latest one. */
function quarterNow(quarters: Quarter[] | undefined): Quarter | null {
  const list = quarters ?? [];
  return list.find((q) => q.status === 'open') ?? list[0] ?? null;
}

function QuarterLine({ quarter }: { quarter: Quarter }) {
  return (
    <p className="cairn-muted">
      {quarter.status === 'open'
        ? `Extracts for ${quarter.label} are due by ${formatDate(quarter.submissionDeadline)}.`
        : `${quarter.label} is closed; no audit quarter is open for extracts.`}
    </p>
  );
}

function PracticeLeadHome({ user }: { user: Me }) {
  const quarters = useQuarters();
  const quarter = quarterNow(quarters.data);
  if (user.practices.length === 0) {
    return (
      <Callout intent={Intent.WARNING} icon="info-sign" title="No practice yet">
        You are not assigned to a practice yet. Ask your regional lead to add your practice to your
        account.
      </Callout>
    );
  }
  return (
    <section aria-labelledby="home-practices">
      <H3 id="home-practices">Your practices{quarter ? ` this quarter (${quarter.label})` : ''}</H3>
      {quarter ? <QuarterLine quarter={quarter} /> : null}
      <Card className="cairn-home-card">
        <HTMLTable compact striped className="cairn-home-table">
          <thead>
            <tr>
              <th>Practice</th>
              <th>Code</th>
              <th>{quarter ? quarter.label : 'Audit quarter'}</th>
              <th>Next step</th>
            </tr>
          </thead>
          <tbody>
            {user.practices.map((practice) => (
              <PracticeRow key={practice.id} practice={practice} quarter={quarter} />
            ))}
          </tbody>
        </HTMLTable>
      </Card>
    </section>
  );
}

function PracticeRow({
  practice,
  quarter,
}: {
  practice: Me['practices'][number];
  quarter: Quarter | null;
}) {
  const history = useHistory(practice.id);
  const entry = history.data?.quarters.find((q) => q.quarter.id === quarter?.id);
  const current = entry?.submissions.find((s) => s.id === entry.currentSubmissionId) ?? null;
  // The newest extract still being read or waiting for its sender's decision.
  const open = entry?.submissions.find(
    (s: Submission) => s.status === 'processing' || s.status === 'awaiting_confirmation',
  );
  // The API's upload action for this practice in this quarter.
  const upload =
    quarter && entry?.actions.upload
      ? `/extracts/upload?practice=${practice.id}&quarter=${quarter.id}`
      : null;
  return (
    <tr data-practice={practice.code}>
      <td>{practice.name}</td>
      <td>{practice.code}</td>
      <td>
        {history.isPending ? (
          <Spinner size={14} aria-label={`Reading ${practice.code}'s submissions`} />
        ) : history.isError ? (
          <span className="cairn-muted">Could not read submissions</span>
        ) : open ? (
          <Link to={`/practices/${practice.id}/submissions/${open.id}`}>
            <StatusTag status={open.status} /> <span>Submission {open.id}</span>
          </Link>
        ) : current ? (
          <span>
            <CoverageTag state="current" />{' '}
            {current.counts ? `${formatCount(current.counts.rowsAccepted)} records` : null}
          </span>
        ) : (
          <CoverageTag state="none" />
        )}
      </td>
      <td className="cairn-home-actions">
        {open?.status === 'awaiting_confirmation' ? (
          <LinkButton
            small
            intent={Intent.PRIMARY}
            icon="eye-open"
            to={`/practices/${practice.id}/submissions/${open.id}`}
            text="Read the report and confirm"
          />
        ) : upload && !current && !open ? (
          <LinkButton
            small
            intent={Intent.PRIMARY}
            icon="upload"
            to={upload}
            text="Upload extract"
          />
        ) : upload && !open ? (
          <LinkButton small icon="upload" to={upload} text="Send a corrected extract" />
        ) : null}
        {current && quarter ? (
          <LinkButton
            small
            intent={open ? Intent.NONE : Intent.PRIMARY}
            icon="timeline-bar-chart"
            to={`/practices/${practice.id}/results?quarter=${quarter.id}`}
            text="Results"
          />
        ) : null}
        <LinkButton
          small
          variant="minimal"
          icon="list-columns"
          to={`/practices/${practice.id}/submissions`}
          text="Submissions"
        />
      </td>
    </tr>
  );
}

/** Regional lead and auditor: the region's coverage of the quarter at a glance. */
function RegionHome({ user }: { user: Me }) {
  const quarters = useQuarters();
  const quarter = quarterNow(quarters.data);
  const coverage = useCoverage(quarter?.id ?? null);
  // The API's upload action: offered when there is a practice the person may send for.
  const uploads = useUploadOptions();
  const mayUpload = (uploads.data?.practices.length ?? 0) > 0;
  const totals = coverage.data?.totals;
  const coverageLink = (state?: string) =>
    `/coverage?quarter=${quarter?.id ?? ''}${state ? `&state=${state}` : ''}`;
  return (
    <section aria-labelledby="home-region">
      <H3 id="home-region">{quarter ? `The region in ${quarter.label}` : 'The region'}</H3>
      {user.role === 'auditor' ? (
        <p>You can read every practice of the region; you cannot change anything.</p>
      ) : null}
      {quarter ? <QuarterLine quarter={quarter} /> : null}
      {quarters.isPending || (quarter && coverage.isPending) ? (
        <Spinner size={20} aria-label="Reading the quarter's coverage" />
      ) : null}
      {!quarters.isPending && !quarter ? (
        <NonIdealState icon="calendar" title="No audit quarters yet" />
      ) : null}
      {coverage.isError ? (
        <Callout intent={Intent.DANGER} title="Cairn could not read the coverage">
          {coverage.error.message}
        </Callout>
      ) : null}
      {totals ? (
        <>
          <div className="cairn-figures" role="list" aria-label="Coverage">
            {(
              [
                ['Practices', totals.practices, null],
                [<CoverageTag key="c" state="current" />, totals.current, 'current'],
                [
                  <CoverageTag key="a" state="awaiting_confirmation" />,
                  totals.awaitingConfirmation,
                  'awaiting_confirmation',
                ],
                [<CoverageTag key="n" state="none" />, totals.none, 'none'],
              ] as const
            ).map(([label, value, state], i) => (
              <div role="listitem" key={i}>
                {state && value > 0 ? (
                  <Link className="cairn-home-figure-link" to={coverageLink(state)}>
                    <Figure label={label} value={value} />
                  </Link>
                ) : (
                  <Figure label={label} value={value} />
                )}
              </div>
            ))}
          </div>
          <p>
            {totals.none === 0
              ? 'Every practice has sent an extract for this quarter.'
              : `${formatCount(totals.none)} of ${formatCount(totals.practices)} practices ${totals.none === 1 ? 'has' : 'have'} no current submission yet.`}{' '}
            {formatCount(totals.records)} records are in current submissions.
          </p>
          <div className="cairn-home-actions">
            <LinkButton
              intent={Intent.PRIMARY}
              icon="grid-view"
              to={coverageLink()}
              text="Open coverage"
            />
            {mayUpload ? (
              <LinkButton icon="upload" to="/extracts/upload" text="Upload for a practice" />
            ) : null}
            {user.role === 'regional_lead' ? (
              <LinkButton variant="minimal" icon="people" to="/users" text="Users" />
            ) : null}
            <LinkButton variant="minimal" icon="history" to="/audit-trail" text="Audit trail" />
          </div>
        </>
      ) : null}
    </section>
  );
}
