import { AnchorButton, Card, H1, Intent } from '@blueprintjs/core';
import { useSearchParams } from 'react-router-dom';
import { CairnMark } from '../../../components/CairnMark';
import { Notice } from '../../../components/Notice';
import { SupportCodes } from '../../../components/SupportCodes';
import { usePageTitle } from '../../../lib/page-title';
import { roleLabels } from '../../../lib/roles';
import { useSession } from '../../../lib/session';
import { refusalText } from '../refusal-texts';
import './SignIn.css';

const endedTexts: Record<string, string> = {
  idle: 'Your session ended after a while without activity. Sign in again to carry on.',
  absolute: 'Your session reached its maximum length. Sign in again to carry on.',
  deactivated: 'Your Cairn account has been deactivated, so your session was ended.',
  removed: 'Your Cairn account no longer exists, so your session was ended.',
};

/** `/sign-in`: Cairn's own sign-in page. Sign-in itself happens at the organisation's single sign-on. */
export function SignIn() {
  const [params] = useSearchParams();
  const session = useSession();
  const refused = params.get('refused');
  const ended = params.get('ended') ?? session.data?.sessionEnded ?? null;
  // Without a page asked for, sign-in comes back to /start, which decides where the person lands.
  const returnTo = params.get('returnTo') ?? '/start';
  const loginHref = `/api/auth/saml/login?returnTo=${encodeURIComponent(returnTo)}`;
  const user = session.data?.user;
  const refusal = refused ? refusalText(refused) : null;
  usePageTitle('Sign in');

  return (
    <div className="cairn-sign-in">
      <Card className="cairn-sign-in-card" elevation={1}>
        <div className="cairn-sign-in-head">
          <CairnMark size={44} title="Cairn mark" />
          <H1 className="cairn-sign-in-title">Sign in to Cairn</H1>
        </div>
        {refusal ? (
          <Notice
            intent={Intent.DANGER}
            icon="blocked-person"
            title={refusal.title}
            className="cairn-sign-in-callout"
          >
            <p>{refusal.detail}</p>
            <SupportCodes label="Reference" codes={[refused ?? '']} />
          </Notice>
        ) : null}
        {params.get('signedOut') ? (
          <Notice
            intent={Intent.SUCCESS}
            icon="tick-circle"
            title="You have signed out of Cairn"
            className="cairn-sign-in-callout"
          >
            Close the browser too if others use this computer.
          </Notice>
        ) : null}
        {ended && endedTexts[ended] && !refusal ? (
          <Notice
            intent={Intent.WARNING}
            icon="time"
            title="Signed out"
            className="cairn-sign-in-callout"
          >
            {endedTexts[ended]}
          </Notice>
        ) : null}
        {user ? (
          <>
            <p>
              You are signed in as <strong>{user.displayName}</strong> (
              {roleLabels[user.role].toLowerCase()}).
            </p>
            <div className="cairn-sign-in-actions">
              <AnchorButton href="/" intent={Intent.PRIMARY} icon="home">
                Go to the start page
              </AnchorButton>
              <AnchorButton href="/sign-out" variant="minimal" icon="log-out">
                Sign out
              </AnchorButton>
            </div>
          </>
        ) : (
          <>
            {refusal ? null : (
              <p>
                You sign in with your organisation&apos;s account (single sign-on). Cairn then shows
                you what your role lets you see: your own practices as a practice lead, the whole
                region as a regional lead or auditor.
              </p>
            )}
            <div className="cairn-sign-in-actions">
              <AnchorButton href={loginHref} intent={Intent.PRIMARY} icon="log-in" large>
                {refusal ? 'Sign in again' : "Continue to your organisation's sign-in"}
              </AnchorButton>
            </div>
            {session.data?.localSignIn ? (
              <Notice icon="lab-test" className="cairn-sign-in-local" title="Local setup">
                This Cairn runs on this machine: the next page is its local test sign-in with demo
                people, standing in for your organisation&apos;s single sign-on.
              </Notice>
            ) : null}
          </>
        )}
      </Card>
    </div>
  );
}
