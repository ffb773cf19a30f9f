import {
  Button,
  FormGroup,
  H1,
  HTMLSelect,
  HTMLTable,
  InputGroup,
  Intent,
  Spinner,
  Tag,
} from '@blueprintjs/core';
import { type FormEvent, useState } from 'react';
import { fieldError, ProblemCallout } from '../../../components/ProblemCallout';
import { RequireRole } from '../../../components/RequireRole';
import { usePageTitle } from '../../../lib/page-title';
import { useChangeRecipients, useRecipients } from '../api/deliveries';
import { Trail } from './Trail';
import './mail.css';

/** `/mail-recipients`: who receives each practice's mail; the regional lead adds addresses. */
export function MailRecipients() {
  usePageTitle('Mail recipients');
  return (
    <RequireRole roles={['regional_lead']}>
      <MailRecipientsScreen />
    </RequireRole>
  );
}

const kindLabels: Record<string, string> = {
  quarter_opened: 'opening messages',
  deadline_reminder: 'reminders',
  review_case_question: 'review case questions',
  digest: 'digests',
};

function MailRecipientsScreen() {
  const recipients = useRecipients();
  const change = useChangeRecipients();
  const practices = recipients.data?.practices ?? [];
  const [practiceId, setPracticeId] = useState<number | ''>('');
  const [address, setAddress] = useState('');
  const [note, setNote] = useState('');

  const add = (event: FormEvent) => {
    event.preventDefault();
    if (practiceId === '') return;
    change.mutate(
      {
        kind: 'add',
        practiceId,
        recipient: { address, ...(note.trim() ? { note } : {}) },
      },
      {
        onSuccess: () => {
          setAddress('');
          setNote('');
        },
      },
    );
  };
  const addressError = fieldError(change.error, 'address');
  const noteError = fieldError(change.error, 'note');

  return (
    <div className="cairn-mail">
      <Trail here={'Mail recipients'} />
      <div className="cairn-page-head">
        <div>
          <H1 className="cairn-page-title">Mail recipients</H1>
          <p className="cairn-muted">
            Cairn writes to each practice&rsquo;s active practice leads, except for the kinds of
            e-mail they switched off on their profile, and to any extra address you add here (at
            most {recipients.data?.maxExtrasPerPractice ?? '…'} a practice).
          </p>
        </div>
      </div>

      <form className="cairn-mail-add" onSubmit={add} aria-label="Add an address">
        <FormGroup label="Practice" labelFor="recipient-practice">
          <HTMLSelect
            id="recipient-practice"
            value={practiceId}
            onChange={(e) =>
              setPracticeId(e.currentTarget.value ? Number(e.currentTarget.value) : '')
            }
          >
            <option value="">Choose a practice</option>
            {practices.map((p) => (
              <option key={p.practice.id} value={p.practice.id} disabled={!p.actions.addRecipient}>
                {p.practice.code} · {p.practice.name}
              </option>
            ))}
          </HTMLSelect>
        </FormGroup>
        <FormGroup
          label="E-mail address"
          labelFor="recipient-address"
          intent={addressError ? Intent.DANGER : Intent.NONE}
          helperText={addressError}
        >
          <InputGroup
            id="recipient-address"
            inputMode="email"
            autoComplete="off"
            value={address}
            intent={addressError ? Intent.DANGER : Intent.NONE}
            onValueChange={setAddress}
            placeholder="reception@practice.example"
          />
        </FormGroup>
        <FormGroup
          label="Who is this? (optional)"
          labelFor="recipient-note"
          intent={noteError ? Intent.DANGER : Intent.NONE}
          helperText={noteError}
        >
          <InputGroup
            id="recipient-note"
            value={note}
            onValueChange={setNote}
            placeholder="Practice manager"
          />
        </FormGroup>
        <Button
          type="submit"
          intent={Intent.PRIMARY}
          icon="add"
          loading={change.isPending}
          disabled={practiceId === '' || address.trim() === ''}
        >
          Add address
        </Button>
      </form>
      <ProblemCallout error={recipients.error ?? change.error} />

      {recipients.isPending ? (
        <Spinner aria-label="Loading the recipients" />
      ) : (
        <HTMLTable compact className="cairn-mail-table">
          <thead>
            <tr>
              <th scope="col">Practice</th>
              <th scope="col">Practice leads</th>
              <th scope="col">Extra addresses</th>
            </tr>
          </thead>
          <tbody>
            {practices.map((p) => (
              <tr key={p.practice.id}>
                <td>
                  {p.practice.code} · {p.practice.name}
                  {p.practice.localityName ? (
                    <div className="cairn-muted">{p.practice.localityName}</div>
                  ) : null}
                </td>
                <td>
                  {p.leads.length === 0 ? (
                    <span className="cairn-muted">No active lead</span>
                  ) : (
                    <ul className="cairn-mail-list">
                      {p.leads.map((l) => (
                        <li key={l.userId}>
                          {l.displayName} <span className="cairn-muted">{l.email}</span>
                          {l.optedOut.map((k) => (
                            <Tag key={k} minimal icon="disable" className="cairn-mail-optout">
                              no {kindLabels[k] ?? k}
                            </Tag>
                          ))}
                        </li>
                      ))}
                    </ul>
                  )}
                </td>
                <td>
                  {p.extras.length === 0 ? (
                    <span className="cairn-muted">None</span>
                  ) : (
                    <ul className="cairn-mail-list">
                      {p.extras.map((e) => (
                        <li key={e.id}>
                          {e.address}
                          {e.note ? <span className="cairn-muted"> ({e.note})</span> : null}{' '}
                          {e.actions.remove ? (
                            <Button
                              size="small"
                              variant="minimal"
                              icon="trash"
                              aria-label={`Remove ${e.address} from ${p.practice.code}`}
                              disabled={change.isPending}
                              onClick={() =>
                                change.mutate({
                                  kind: 'remove',
                                  practiceId: p.practice.id,
                                  recipientId: e.id,
                                })
                              }
                            />
                          ) : null}
                        </li>
                      ))}
                    </ul>
                  )}
                </td>
              </tr>
            ))}
          </tbody>
        </HTMLTable>
      )}
    </div>
  );
}
