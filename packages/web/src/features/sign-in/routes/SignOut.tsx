import { Spinner } from '@blueprintjs/core';
import { useQueryClient } from '@tanstack/react-query';
import { useEffect, useRef, useState } from 'react';
import { apiFetch, ApiError } from '../../../lib/api-client';
import type { SignOut } from '../../../lib/api/types';
import { EmptyState } from '../../../components/Notice';
import { usePageTitle } from '../../../lib/page-title';
import { fetchSession } from '../../../lib/session';

/**
 * `/sign-out`: ends the Cairn session (a CSRF-protected POST), then follows
 * the API to the organisation's single logout, which returns to Cairn's
 * signed-out page — or straight there when the organisation offers none.
 */
export function SignOut() {
  const client = useQueryClient();
  const started = useRef(false);
  const [problem, setProblem] = useState<string | null>(null);
  usePageTitle('Sign out');

  useEffect(() => {
    if (started.current) return;
    started.current = true;
    void (async () => {
      try {
        const session = await fetchSession();
        if (!session.user) {
          window.location.assign('/sign-in?signedOut=1');
          return;
        }
        const { redirectUrl } = await apiFetch<SignOut>('/api/auth/sign-out', {
          method: 'POST',
        });
        client.clear();
        window.location.assign(redirectUrl);
      } catch (error) {
        setProblem(error instanceof ApiError ? error.message : 'Cairn could not be reached.');
      }
    })();
  }, [client]);

  if (problem) {
    return (
      <EmptyState
        icon="warning-sign"
        title="Signing out did not finish"
        headingLevel={1}
        description={`${problem} Reload this page to try again.`}
      />
    );
  }
  return <EmptyState icon={<Spinner size={32} />} title="Signing you out…" headingLevel={1} />;
}
