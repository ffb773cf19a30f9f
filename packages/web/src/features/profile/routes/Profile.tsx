import { Callout, Card, H1, H2, Intent, Spinner, Switch, Tag } from '@blueprintjs/core';
import { ProblemCallout } from '../../../components/ProblemCallout';
import { RequireRole } from '../../../components/RequireRole';
import { roleValues, type MailKind, type MailPreference } from '../../../lib/api/types';
import { usePageTitle } from '../../../lib/page-title';
import { roleLabels } from '../../../lib/roles';
import { useMe } from '../../../lib/session';
import { useMailPreferences, useSetMailPreferences } from '../api/mail-preferences';
import './Profile.css';

/** `/profile`: every signed-in person's own page: who Cairn knows them as, and their mail. */
export function Profile() {
  usePageTitle('Your profile');
  return (
    <RequireRole roles={roleValues}>
      <ProfileScreen />
    </RequireRole>
  );
}

function ProfileScreen() {
  const me = useMe().data!;
  const preferences = useMailPreferences();
  const save = useSetMailPreferences();

  const toggle = (all: MailPreference[], kind: MailKind, receive: boolean) => {
    const optedOut = all
      .filter((p) => (p.kind === kind ? !receive : !p.receive))
      .map((p) => p.kind);
    save.mutate(optedOut);
  };

  return (
    <div className="cairn-profile">
      <div className="cairn-page-head">
        <div>
          <H1 className="cairn-page-title">Your profile</H1>
          <p className="cairn-muted">
            Who Cairn knows you as, and which e-mails it sends you. Your name, role and practices
            are kept by the regional lead.
          </p>
        </div>
      </div>
      <Card className="cairn-profile-card">
        <dl className="cairn-profile-facts">
          <dt>Name</dt>
          <dd>{me.displayName}</dd>
          <dt>E-mail address</dt>
          <dd>{me.email}</dd>
          <dt>Role</dt>
          <dd>
            <Tag minimal>{roleLabels[me.role]}</Tag>
          </dd>
          <dt>Region</dt>
          <dd>{me.regionName}</dd>
          <dt>Practices</dt>
          <dd>
            {me.practices.length === 0 ? (
              <span className="cairn-muted">
                {me.role === 'practice_lead' ? 'None yet' : 'Every practice of the region'}
              </span>
            ) : (
              <ul className="cairn-profile-practices">
                {me.practices.map((p) => (
                  <li key={p.id}>
                    {p.code} · {p.name}
                  </li>
                ))}
              </ul>
            )}
          </dd>
        </dl>
      </Card>

      <section id="mail" aria-labelledby="mail-heading" className="cairn-profile-mail">
        <H2 id="mail-heading">E-mail from Cairn</H2>
        <p className="cairn-muted">
          Cairn writes to {me.email}. Switch off what you do not want; the change counts from the
          next message.
        </p>
        <ProblemCallout error={preferences.error ?? save.error} />
        {preferences.isPending ? (
          <Spinner aria-label="Loading your mail preferences" />
        ) : preferences.data ? (
          <ul className="cairn-profile-preferences">
            {preferences.data.preferences.map((p) => (
              <li key={p.kind}>
                <Switch
                  large
                  checked={p.receive}
                  disabled={save.isPending}
                  label={p.label}
                  onChange={(e) =>
                    toggle(preferences.data.preferences, p.kind, e.currentTarget.checked)
                  }
                />
                <p className="cairn-profile-description">{p.description}</p>
                {!p.appliesToYou ? (
                  <p className="cairn-muted cairn-profile-note">
                    Sent to {p.sentTo.map((r) => roleLabels[r].toLowerCase() + 's').join(' and ')};
                    as {roleLabels[me.role].toLowerCase()} you are not sent it.
                  </p>
                ) : null}
              </li>
            ))}
          </ul>
        ) : null}
        {save.isSuccess ? (
          <Callout intent={Intent.SUCCESS} icon="tick" role="status">
            Saved.
          </Callout>
        ) : null}
      </section>
    </div>
  );
}
