/**
 * When a quarter's deadline reminder is due: from `days` days before the
 * submission deadline up to the deadline itself (dates are calendar days, UTC).
 * Before that it is too early; after the deadline a reminder would only scold.
 */
export function reminderDue(deadline: string, today: string, days: number): boolean {
  const from = addDays(deadline, -days);
  return today >= from && today <= deadline;
}

/** `date` (YYYY-MM-DD) moved by `days` calendar days. */
export function addDays(date: string, days: number): string {
  const ms = Date.parse(`${date}T00:00:00Z`) + days * 86_400_000;
  return new Date(ms).toISOString().slice(0, 10);
}

/** Today's date in UTC (YYYY-MM-DD). */
export function todayUtc(now = new Date()): string {
  return now.toISOString().slice(0, 10);
}
