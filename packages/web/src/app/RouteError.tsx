import { AnchorButton } from '@blueprintjs/core';
import { isRouteErrorResponse, useRouteError } from 'react-router-dom';
import { EmptyState } from '../components/Notice';
import { ApiError } from '../lib/api-client';
import { usePageTitle } from '../lib/page-title';
import { NotFound } from './NotFound';

/** Error boundary for every route: a plain explanation, never a stack trace. */
export function RouteError() {
  const error = useRouteError();
  usePageTitle('Something went wrong');
  if (isRouteErrorResponse(error) && error.status === 404) return <NotFound />;
  const message =
    error instanceof ApiError
      ? error.message
      : 'Part of this page failed to load. Nothing you entered has been sent twice; reload to try again.';
  if (!(error instanceof ApiError)) console.warn('Route error', error);
  return (
    <main className="cairn-main">
      <EmptyState
        icon="warning-sign"
        title="Something went wrong"
        headingLevel={1}
        description={message}
        action={
          <AnchorButton
            href={typeof window !== 'undefined' ? window.location.pathname : '/'}
            icon="refresh"
          >
            Reload
          </AnchorButton>
        }
      />
    </main>
  );
}
