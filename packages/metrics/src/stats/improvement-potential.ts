import { assertEventsOfN, assertProbability } from './assert.js';
import type { Direction } from './funnel-flag.js';
import { median } from './run-chart.js';

/**
 * Improvement potential: the number of records a unit would need to change to reach a
 * reference rate m (by default the regional median of unit rates): ⌈m·n − y⌉ for a measure
 * where higher is better and the unit is below m; ⌈y − m·n⌉ where lower is better and the unit
 * is above m; 0 at or beyond m; null when n = 0. A tolerance of 1e-9 absorbs the rounding of
 * m·n so that an exact whole number of records is not rounded up.
 */
export function improvementPotential(
  events: number,
  n: number,
  referenceRate: number,
  direction: Direction = 'higher',
): number | null {
  assertEventsOfN(events, n);
  assertProbability(referenceRate, 'referenceRate');
  if (n === 0) return null;
  const gap = direction === 'higher' ? referenceRate * n - events : events - referenceRate * n;
  if (gap <= 1e-9) return 0;
  return Math.ceil(gap - 1e-9);
}

/** The median of unit rates y/n over units with n > 0 (null when there are none). */
export function medianRate(units: readonly { events: number; n: number }[]): number | null {
  const rates: number[] = [];
  units.forEach((u, i) => {
    assertEventsOfN(u.events, u.n, `units[${i}].events`, `units[${i}].n`);
    if (u.n > 0) rates.push(u.events / u.n);
  });
  return median(rates);
}
