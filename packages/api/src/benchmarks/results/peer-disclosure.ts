/**
 * Disclosure control of what a practice's page shows of other practices
 * (docs/methods.md §9), with @cairn/metrics' rules: a count of 1–4 is shown
 * as "< 5", a rate whose denominator is under 10 is withheld.
 *
 * A region figure on a practice's page includes the practice's own, which
 * its reader knows; the rest of the region (region − own) is then known too.
 * So a region count is suppressed when either it or the rest of the region's
 * count is 1–4, and a region rate is withheld when its denominator is under
 * 10, or the rest of the region's denominator is 1–9 or its events 1–4. A
 * region figure made of this practice alone (the rest is 0) reveals nobody
 * else and is shown.
 *
 * Other practices as unnamed points: a point is shown only when its rate may
 * be (n ≥ 10) and its events are not 1–4 (events = rate × n would reveal them).
 *
 * `applied: false` (a reader who may see every practice) shows everything.
 */
import { discloseCount, discloseRate } from '@cairn/metrics';

export interface DisclosedCount {
  value: number | null;
  display: string;
}

const shown = (value: number): DisclosedCount => ({ value, display: String(value) });

const small = (count: number): boolean => discloseCount(count).suppression !== 'none';

/** A count of the region that includes `own` of the reader's practice. */
export function regionCount(region: number, own: number, applied: boolean): DisclosedCount {
  if (!applied) return shown(region);
  // Primary: the region's count itself is small ("< 5").
  if (small(region)) return { value: null, display: discloseCount(region).display };
  // Secondary: the count would give away the rest of the region's small count.
  if (small(region - own)) return { value: null, display: 'withheld' };
  return shown(region);
}

/** The region's rate events/n, of which `ownEvents`/`ownN` are the reader's practice's. */
export function regionRate(
  events: number,
  n: number,
  ownEvents: number,
  ownN: number,
  applied: boolean,
): number | null {
  if (n === 0) return null;
  if (!applied) return events / n;
  const restN = n - ownN;
  const restEvents = events - ownEvents;
  if (restN === 0) return events / n;
  if (discloseRate(events, n) === null || discloseRate(restEvents, restN) === null) return null;
  if (small(restEvents)) return null;
  return events / n;
}

/** Whether another practice may appear as an unnamed point with this n and these events. */
export function peerShown(events: number, n: number, applied: boolean): boolean {
  if (n === 0) return false;
  if (!applied) return true;
  return discloseRate(events, n) !== null && !small(events);
}
