import { AnchorButton, Spinner } from '@blueprintjs/core';
import type { ReactNode } from 'react';
import { Navigate, useLocation } from 'react-router-dom';
import type { Role } from '../lib/api/types';
import { roleLabels } from '../lib/roles';
import { useMe } from '../lib/session';
import { EmptyState } from './Notice';

/**
 * Shows its children only to signed-in people with one of these roles.
 * Signed out: to the sign-in page (coming back here afterwards). Other roles:
 * a plain explanation. The API enforces the same rule; this only avoids
 * showing a screen that would fail.
 */
export function RequireRole({ roles, children }: { roles: readonly Role[]; children: ReactNode }) {
  const me = useMe();
  const location = useLocation();
  if (me.isPending) return <Spinner aria-label="Checking sign-in" />;
  if (me.isError) {
    return (
      <EmptyState
        headingLevel={1}
        icon="error"
        title="Cairn could not check your sign-in"
        description={me.error.message}
      />
    );
  }
  if (!me.data) {
    const returnTo = `${location.pathname}${location.search}`;
    return <Navigate to={`/sign-in?returnTo=${encodeURIComponent(returnTo)}`} replace />;
  }
  if (!roles.includes(me.data.role)) {
    return (
      <EmptyState
        headingLevel={1}
        icon="lock"
        title="Not available for your role"
        description={`This page is for ${roles.map((r) => roleLabels[r].toLowerCase() + 's').join(' and ')}. You are signed in as ${roleLabels[me.data.role].toLowerCase()}.`}
        action={
          <AnchorButton href="/" icon="home">
            Go to the start page
          </AnchorButton>
        }
      />
    );
  }
  return <>{children}</>;
}
