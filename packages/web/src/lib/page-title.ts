import { useEffect } from 'react';

/** The browser tab names the page: "Coverage · Cairn" (or "Cairn" alone for the front page). */
export function pageTitle(title: string | null | undefined): string {
  return title ? `${title} · Cairn` : 'Cairn';
}

/** Sets the document title while the page is shown. Every routed page calls it once. */
export function usePageTitle(title: string | null | undefined): void {
  useEffect(() => {
    document.title = pageTitle(title);
  }, [title]);
}
