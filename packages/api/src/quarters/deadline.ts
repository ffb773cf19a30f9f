/**
 * The submission deadline of an audit quarter: a calendar date after the
 * quarter's last day (extracts describe a review window that ends with the
 * quarter, so they cannot be complete before it ends). Dates are ISO
 * (YYYY-MM-DD) in the API; the web reads and writes them in the region's
 * format.
 */

/** The last day of a quarter, YYYY-MM-DD. */
export function quarterEnd(year: number, quarter: number): string {
  return new Date(Date.UTC(year, quarter * 3, 0)).toISOString().slice(0, 10);
}

/** The default deadline: a number of days after the last day of the quarter. */
export function defaultDeadline(year: number, quarter: number, days: number): string {
  const end = Date.UTC(year, quarter * 3, 0);
  return new Date(end + days * 86_400_000).toISOString().slice(0, 10);
}

/** "30 September 2026" */
export function dateInWords(iso: string): string {
  return new Date(`${iso}T12:00:00Z`).toLocaleDateString('en-GB', {
    day: 'numeric',
    month: 'long',
    year: 'numeric',
    timeZone: 'UTC',
  });
}

/** Why a deadline cannot be used for this quarter, or null when it can. */
export function deadlineProblem(year: number, quarter: number, deadline: string): string | null {
  const end = quarterEnd(year, quarter);
  if (deadline <= end) {
    return `must fall after the quarter ends: ${year} Q${quarter} ends on ${dateInWords(end)}, and its extracts cannot be complete before then`;
  }
  return null;
}
