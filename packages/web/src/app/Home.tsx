import { Callout, Card, H2, HTMLTable, Intent, NonIdealState } from '@blueprintjs/core';
import { ClinicalCaution } from '../components/ClinicalCaution';
import { Landing } from '../features/landing/routes/Landing';
import { roleLabels, useMe } from '../features/session/api/me';

/** `/`: the landing page when signed out; the person's starting point when signed in. */
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
      {user.role === 'practice_lead' && user.practices.length === 0 ? (
        <Callout intent={Intent.WARNING} icon="info-sign" title="No practice yet">
          You are not assigned to a practice yet. Ask your regional lead to add your practice to
          your account.
        </Callout>
      ) : null}
      {user.role === 'auditor' ? (
        <p>You can read every practice of the region; you cannot change anything.</p>
      ) : null}
      {user.role === 'practice_lead' && user.practices.length > 0 ? (
        <Card>
          <HTMLTable compact striped>
            <thead>
              <tr>
                <th>Your practices</th>
                <th>Code</th>
              </tr>
            </thead>
            <tbody>
              {user.practices.map((practice) => (
                <tr key={practice.id}>
                  <td>{practice.name}</td>
                  <td>{practice.code}</td>
                </tr>
              ))}
            </tbody>
          </HTMLTable>
        </Card>
      ) : null}
      <ClinicalCaution />
    </div>
  );
}
