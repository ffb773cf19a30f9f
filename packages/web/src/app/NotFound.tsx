import { AnchorButton, NonIdealState } from '@blueprintjs/core';
import { useLocation } from 'react-router-dom';

export function NotFound() {
  const location = useLocation();
  return (
    <NonIdealState
      icon="path-search"
      title="This page does not exist"
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
