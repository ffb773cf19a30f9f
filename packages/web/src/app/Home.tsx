import { Card, H1, H2, Intent, Spinner } from '@blueprintjs/core';
import { Link } from 'react-router-dom';
import { EmptyState, Notice } from '../components/Notice';
import type { Me, Quarter } from '../lib/api/types';
import { formatCount } from '../lib/format';
import { usePageTitle } from '../lib/page-title';
import { roleLabels } from '../lib/roles';
import { useMe } from '../lib/session';
import { useCoverage, useUploadOptions } from '../features/extracts/api/extracts';
import { Figure } from '../features/extracts/components/Figure';
import { formatDate } from '../features/extracts/components/format';
import { LinkButton } from '../features/extracts/components/LinkButton';
import { PracticeHeading, PracticeQuarter } from '../features/extracts/components/PracticeQuarter';
import { CoverageTag } from '../features/extracts/components/StatusTag';
import { Landing } from '../features/landing/routes/Landing';
import { useQuarterList } from '../lib/quarter-list';
import '../features/extracts/routes/Extracts.css';
import './Home.css';

/**
 * `/`: the landing page when signed out; when signed in, where the person
 * stands this audit quarter and the next thing to do.
 */
export function Home() {
  const me = useMe();
  // The front page is "Cairn" alone; signed in, it is the person's home.
  usePageTitle(me.data ? 'Home' : null);
  if (me.isPending) return null;
  if (me.isError) {
    return (
      <EmptyState
        icon="error"
        title="Cairn could not check your sign-in"
        headingLevel={1}
        description={me.error.message}
      />
    );
  }
  if (!me.data) return <Landing />;
  const user = me.data;
  return (
    <div className="cairn-home">
      <H1 className="cairn-page-title">Welcome, {user.displayName}</H1>
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
  const quarters = useQuarterList();
  const quarter = quarterNow(quarters.data);
  if (user.practices.length === 0) {
    return (
      <Notice intent={Intent.WARNING} icon="info-sign" title="No practice yet">
        You are not assigned to a practice yet. Ask your regional lead to add your practice to your
        account.
      </Notice>
    );
  }
  return (
    <section aria-labelledby="home-practices" className="cairn-home-practices">
      <H2 id="home-practices">
        {user.practices.length === 1 ? 'Your practice' : 'Your practices'}
        {quarter ? ` this quarter (${quarter.label})` : ''}
      </H2>
      {quarter ? <QuarterLine quarter={quarter} /> : null}
      {quarters.isPending ? <Spinner size={20} aria-label="Reading the audit quarters" /> : null}
      {!quarters.isPending && !quarter ? (
        <p className="cairn-muted">No audit quarter is open for extracts yet.</p>
      ) : null}
      {user.practices.map((practice) => (
        <Card key={practice.id} className="cairn-home-card">
          {quarter ? (
            <PracticeQuarter practice={practice} quarter={quarter} />
          ) : (
            <PracticeHeading practice={practice} />
          )}
        </Card>
      ))}
    </section>
  );
}

/** Regional lead and auditor: the region's coverage of the quarter at a glance. */
function RegionHome({ user }: { user: Me }) {
  const quarters = useQuarterList();
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
      <H2 id="home-region">{quarter ? `The region in ${quarter.label}` : 'The region'}</H2>
      {user.role === 'auditor' ? (
        <p>You can read every practice of the region; you cannot change anything.</p>
      ) : null}
      {quarter ? <QuarterLine quarter={quarter} /> : null}
      {quarters.isPending || (quarter && coverage.isPending) ? (
        <Spinner size={20} aria-label="Reading the quarter's coverage" />
      ) : null}
      {!quarters.isPending && !quarter ? (
        <EmptyState icon="calendar" title="No audit quarters yet" />
      ) : null}
      {coverage.isError ? (
        <Notice intent={Intent.DANGER} title="Cairn could not read the coverage">
          {coverage.error.message}
        </Notice>
      ) : null}
      {totals ? (
        <>
          <div className="cairn-figures" role="list" aria-label="Coverage">
            {(
              [
                ['Practices', totals.practices, null, undefined],
                [
                  <CoverageTag key="c" state="current" />,
                  totals.current,
                  'current',
                  totals.currentWithWaiting > 0
                    ? `${formatCount(totals.currentWithWaiting)} with another extract waiting`
                    : undefined,
                ],
                [
                  <CoverageTag key="a" state="awaiting_confirmation" />,
                  totals.awaitingConfirmation,
                  'awaiting_confirmation',
                  'no current one yet',
                ],
                [<CoverageTag key="n" state="none" />, totals.none, 'none', undefined],
              ] as const
            ).map(([label, value, state, note], i) => (
              <div role="listitem" key={i}>
                {state && value > 0 ? (
                  <Link className="cairn-home-figure-link" to={coverageLink(state)}>
                    <Figure label={label} value={value} note={note} />
                  </Link>
                ) : (
                  <Figure label={label} value={value} note={note} />
                )}
              </div>
            ))}
          </div>
          <p>
            {totals.none === 0
              ? 'Every practice has sent an extract for this quarter.'
              : `${formatCount(totals.none)} of ${formatCount(totals.practices)} practices ${totals.none === 1 ? 'has' : 'have'} neither a current submission nor an extract waiting.`}{' '}
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
