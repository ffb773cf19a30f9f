import { assertEventsOfN } from './assert.js';
import { funnelFlag, type Direction, type FunnelFlag } from './funnel-flag.js';
import type { Interval } from './interval.js';
import type { OverdispersionMethod } from './overdispersed-limits.js';
import { overdispersion as estimateOverdispersion, type Overdispersion } from './overdispersion.js';
import { wilsonInterval } from './wilson-interval.js';

/**
 * Peer comparison of units (practices or localities) on one measure: the target θ₀ (by default
 * the pooled proportion Σy/Σn, Spiegelhalter 2005), the over-dispersion estimate, and each
 * unit's rate, Wilson interval and funnel flag. This is the composition the benchmark pages
 * use; each step is its own function.
 */
export interface CompareUnitsInput {
  key: string;
  events: number;
  n: number;
}

export interface CompareUnitsOptions {
  direction?: Direction;
  /** Target; default the pooled proportion of the units. */
  theta0?: number;
  /** 'none' uses the exact binomial limits; otherwise widen when over-dispersion is present. */
  adjustment?: 'none' | OverdispersionMethod;
  /** Interval level for each unit's own rate (default 0.95). */
  confidence?: number;
}

export interface ComparedUnit extends CompareUnitsInput {
  rate: number | null;
  interval: Interval;
  flag: FunnelFlag;
}

export interface UnitComparison {
  theta0: number | null;
  overdispersion: Overdispersion | null;
  units: ComparedUnit[];
}

export function compareUnits(
  units: readonly CompareUnitsInput[],
  options: CompareUnitsOptions = {},
): UnitComparison {
  let events = 0;
  let n = 0;
  units.forEach((u, i) => {
    assertEventsOfN(u.events, u.n, `units[${i}].events`, `units[${i}].n`);
    events += u.events;
    n += u.n;
  });
  const theta0 = options.theta0 ?? (n > 0 ? events / n : null);
  const adjustment = options.adjustment ?? 'additive';
  if (theta0 === null) {
    return {
      theta0: null,
      overdispersion: null,
      units: units.map((u) => ({
        ...u,
        rate: null,
        interval: wilsonInterval(u.events, u.n, options.confidence ?? 0.95),
        flag: funnelFlag(u, 0, { direction: options.direction ?? 'higher' }),
      })),
    };
  }
  const od = adjustment === 'none' ? null : estimateOverdispersion(units, theta0);
  return {
    theta0,
    overdispersion: od,
    units: units.map((u) => ({
      ...u,
      rate: u.n > 0 ? u.events / u.n : null,
      interval: wilsonInterval(u.events, u.n, options.confidence ?? 0.95),
      flag: funnelFlag(u, theta0, {
        direction: options.direction ?? 'higher',
        overdispersion: od,
        method: adjustment === 'none' ? 'additive' : adjustment,
      }),
    })),
  };
}
