import { AnchorButton } from '@blueprintjs/core';
import { useLocation } from 'react-router-dom';
import { EmptyState } from '../components/Notice';
import { usePageTitle } from '../lib/page-title';

export function NotFound() {
  const location = useLocation();
  usePageTitle('Page not found');
  return (
    <EmptyState
      icon="path-search"
      title="This page does not exist"
      headingLevel={1}
      description={
        <>
          Nothing in Cairn lives at <code>{location.pathname}</code>. The link may be old, or the
          address mistyped.
        </>
      }
      action={
        <AnchorButton href="/" icon="home" intent="primary">
          Go to the start page
        </AnchorButton>
      }
    />
  );
}
