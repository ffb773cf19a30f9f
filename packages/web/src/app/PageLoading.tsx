import { Spinner } from '@blueprintjs/core';

/** While a page's code or first data loads. */
export function PageLoading() {
  return (
    <div className="cairn-page-loading">
      <Spinner size={32} aria-label="Loading the page" />
    </div>
  );
}
