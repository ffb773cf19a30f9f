import { Classes, H1, HTMLTable, Icon, Spinner } from '@blueprintjs/core';
import { Link } from 'react-router-dom';
import { ProblemCallout } from '../../../components/ProblemCallout';
import { RequireRole } from '../../../components/RequireRole';
import { outboxStateValues } from '../../../lib/api/types';
import { formatCount, formatDateTime } from '../../../lib/format';
import { usePageTitle } from '../../../lib/page-title';
import { useDeliveries } from '../api/deliveries';
import { StateTag } from './StateTag';
import './mail.css';
import { EmptyState } from '../../../components/Notice';

/** `/deliveries`: every source of the region's e-mail, with its messages' counts by state. */
export function Deliveries() {
  usePageTitle('Mail deliveries');
  return (
    <RequireRole roles={['regional_lead']}>
      <DeliveriesScreen />
    </RequireRole>
  );
}

function DeliveriesScreen() {
  const deliveries = useDeliveries();
  const sources = deliveries.data?.sources ?? [];
  return (
    <div className="cairn-mail">
      <div className="cairn-page-head">
        <div>
          <H1 className="cairn-page-title">Mail deliveries</H1>
          <p className="cairn-muted">
            What Cairn has e-mailed to practices, source by source: how many messages were sent, are
            waiting or failed, and why a failed one failed. Open a source to see each message.
          </p>
        </div>
        <div className="cairn-mail-links">
          <Link to="/digests" className={Classes.BUTTON}>
            <Icon icon="envelope" />
            <span className={Classes.BUTTON_TEXT}>Digests</span>
          </Link>
          <Link to="/mail-recipients" className={Classes.BUTTON}>
            <Icon icon="people" />
            <span className={Classes.BUTTON_TEXT}>Mail recipients</span>
          </Link>
        </div>
      </div>
      <ProblemCallout error={deliveries.error} />
      {deliveries.isPending ? (
        <Spinner aria-label="Loading the deliveries" />
      ) : sources.length === 0 ? (
        <EmptyState
          icon="envelope"
          title="No e-mail yet"
          description="Opening an audit quarter tells each practice its deadline; reminders follow before the deadline."
        />
      ) : (
        <HTMLTable compact className="cairn-mail-table">
          <thead>
            <tr>
              <th scope="col">Source</th>
              <th scope="col">First queued</th>
              <th scope="col">Practices</th>
              <th scope="col">Messages</th>
            </tr>
          </thead>
          <tbody>
            {sources.map((s) => (
              <tr key={`${s.kind}:${s.sourceId}`}>
                <td>
                  <Link to={`/deliveries/${s.kind}/${s.sourceId}`}>{s.label}</Link>
                </td>
                <td className="cairn-mail-nowrap">{formatDateTime(s.firstQueuedAt)}</td>
                <td>
                  {formatCount(s.practices)}
                  {s.practicesWithoutRecipients > 0 ? (
                    <span className="cairn-muted">
                      {' '}
                      ({formatCount(s.practicesWithoutRecipients)} with nobody to write to)
                    </span>
                  ) : null}
                </td>
                <td>
                  <span className="cairn-mail-counts">
                    {outboxStateValues
                      .filter((state) => s.counts[state] > 0)
                      .map((state) => (
                        <StateTag key={state} state={state} count={s.counts[state]} />
                      ))}
                    {s.counts.total === 0 ? <span className="cairn-muted">none</span> : null}
                  </span>
                </td>
              </tr>
            ))}
          </tbody>
        </HTMLTable>
      )}
    </div>
  );
}
