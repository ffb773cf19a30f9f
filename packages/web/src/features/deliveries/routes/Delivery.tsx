import { Button, Callout, H1, HTMLTable, Intent, Spinner } from '@blueprintjs/core';
import { useParams } from 'react-router-dom';
import { ProblemCallout } from '../../../components/ProblemCallout';
import { RequireRole } from '../../../components/RequireRole';
import { outboxStateValues } from '../../../lib/api/types';
import { formatCount, formatDateTime } from '../../../lib/format';
import { usePageTitle } from '../../../lib/page-title';
import { useDelivery, useResend } from '../api/deliveries';
import { StateTag } from './StateTag';
import { Trail } from './Trail';
import './mail.css';
import { Notice } from '../../../components/Notice';

/** `/deliveries/:kind/:sourceId`: one source's messages, failures first, and sending them again. */
export function Delivery() {
  return (
    <RequireRole roles={['regional_lead']}>
      <DeliveryScreen />
    </RequireRole>
  );
}

function DeliveryScreen() {
  const { kind = '', sourceId = '' } = useParams();
  const delivery = useDelivery(kind, Number(sourceId));
  const resend = useResend();
  const source = delivery.data?.source;
  usePageTitle(source ? source.label : 'Mail delivery');

  return (
    <div className="cairn-mail">
      <Trail here={source?.label ?? '…'} />
      <div className="cairn-page-head">
        <div>
          <H1 className="cairn-page-title">{source?.label ?? 'Mail delivery'}</H1>
          {source ? (
            <p className="cairn-muted">
              For {formatCount(source.practices)} practices, first queued{' '}
              {formatDateTime(source.firstQueuedAt)}. A message is sent once: if Cairn stopped while
              sending one, it is sent again with the same Message-ID, so that mail systems can tell
              it is the same message.
            </p>
          ) : null}
        </div>
        {source?.actions.resendFailed ? (
          <Button
            intent={Intent.PRIMARY}
            icon="refresh"
            loading={resend.isPending}
            onClick={() => resend.mutate({ kind: source.kind, sourceId: source.sourceId })}
          >
            Send the {formatCount(source.counts.failed)} failed again
          </Button>
        ) : null}
      </div>
      <ProblemCallout error={delivery.error ?? resend.error} />
      {resend.isSuccess ? (
        <Callout intent={Intent.SUCCESS} icon="tick" role="status" className="cairn-mail-section">
          {formatCount(resend.data.resent)} message{resend.data.resent === 1 ? '' : 's'} queued
          again.
        </Callout>
      ) : null}
      {delivery.isPending ? (
        <Spinner aria-label="Loading the delivery" />
      ) : delivery.data && source ? (
        <>
          <p className="cairn-mail-counts" aria-label="Messages by state">
            {outboxStateValues.map((state) => (
              <StateTag key={state} state={state} count={source.counts[state]} />
            ))}
          </p>
          {delivery.data.practicesWithoutRecipients.length > 0 ? (
            <Notice
              intent={Intent.WARNING}
              icon="inbox"
              title={`${formatCount(delivery.data.practicesWithoutRecipients.length)} practices had nobody to write to`}
              className="cairn-mail-section"
            >
              No active practice lead who receives these messages, and no extra address:{' '}
              {delivery.data.practicesWithoutRecipients.map((p) => p.code).join(', ')}. Add
              addresses on the <a href="/mail-recipients">mail recipients</a> page; they receive the
              next messages.
            </Notice>
          ) : null}
          <HTMLTable compact className="cairn-mail-table">
            <thead>
              <tr>
                <th scope="col">Practice</th>
                <th scope="col">Recipient</th>
                <th scope="col">State</th>
                <th scope="col">Attempts</th>
                <th scope="col">Queued</th>
                <th scope="col">Sent, or next attempt</th>
                <th scope="col">Server’s reply</th>
                <th scope="col">
                  <span className="visually-hidden">Actions</span>
                </th>
              </tr>
            </thead>
            <tbody>
              {delivery.data.messages.map((m) => (
                <tr key={m.id}>
                  <td className="cairn-mail-nowrap">
                    {m.practice.code} · {m.practice.name}
                  </td>
                  <td>
                    {m.recipientName ? (
                      <>
                        {m.recipientName}
                        <br />
                      </>
                    ) : null}
                    <span className="cairn-muted">{m.recipient}</span>
                  </td>
                  <td>
                    <StateTag state={m.state} />
                  </td>
                  <td>
                    {m.attempts}
                    {m.resumed > 0 ? (
                      <span className="cairn-muted" title="Sent again after Cairn stopped mid-send">
                        {' '}
                        (resumed {m.resumed}×)
                      </span>
                    ) : null}
                  </td>
                  <td className="cairn-mail-nowrap">{formatDateTime(m.queuedAt)}</td>
                  <td className="cairn-mail-nowrap">
                    {m.sentAt
                      ? formatDateTime(m.sentAt)
                      : m.nextAttemptAt
                        ? `next ${formatDateTime(m.nextAttemptAt)}`
                        : m.failedAt
                          ? `failed ${formatDateTime(m.failedAt)}`
                          : '—'}
                  </td>
                  <td className="cairn-mail-error">{m.lastError ?? ''}</td>
                  <td>
                    {m.actions.resend ? (
                      <Button
                        size="small"
                        icon="refresh"
                        disabled={resend.isPending}
                        onClick={() => resend.mutate({ messageId: m.id })}
                        aria-label={`Send again: ${m.recipient}`}
                      >
                        Send again
                      </Button>
                    ) : null}
                  </td>
                </tr>
              ))}
            </tbody>
          </HTMLTable>
        </>
      ) : null}
    </div>
  );
}
