import { assertConfidence, assertEventsOfN } from './assert.js';
import { NO_INTERVAL, type Interval } from './interval.js';
import { zForConfidence } from './normal-quantile.js';

/**
 * Wilson score interval for a proportion (E. B. Wilson, JASA 1927;22:209–12):
 * (p̂ + z²/2n ± z √(p̂(1 − p̂)/n + z²/4n²)) / (1 + z²/n), z the two-sided normal critical value.
 * Check values: Newcombe, Stat Med 1998;17:857–72, Table I. n = 0 gives the empty interval;
 * events = 0 gives lower 0 and events = n gives upper 1 exactly.
 */
export function wilsonInterval(events: number, n: number, confidence = 0.95): Interval {
  assertEventsOfN(events, n);
  assertConfidence(confidence);
  if (n === 0) return NO_INTERVAL;
  const z = zForConfidence(confidence);
  const p = events / n;
  const z2 = z * z;
  const centre = p + z2 / (2 * n);
  const half = z * Math.sqrt((p * (1 - p)) / n + z2 / (4 * n * n));
  const scale = 1 + z2 / n;
  return {
    lower: events === 0 ? 0 : Math.max(0, (centre - half) / scale),
    upper: events === n ? 1 : Math.min(1, (centre + half) / scale),
  };
}
