import { assertEventsOfN, assertProbability } from './assert.js';
import { funnelLimits } from './funnel-limits.js';
import type { Interval } from './interval.js';
import { overdispersedLimits, type OverdispersionMethod } from './overdispersed-limits.js';
import type { Overdispersion } from './overdispersion.js';

/**
 * A unit's position on the funnel plot (Spiegelhalter, Stat Med 2005;24:1185–202): beyond the
 * 95 % limits "notable", beyond the 99.8 % limits "outlier", on either side. A rate on a limit
 * counts as within it. `assessment` reads the side through the measure's direction, so that a
 * high rate of a higher-is-better measure is shown as good news.
 */
export type FunnelBand = 'within' | 'notable' | 'outlier';
export type Direction = 'higher' | 'lower';

/** The inner (95 %) and outer (99.8 %) funnel levels. */
export const FUNNEL_INNER = 0.95;
export const FUNNEL_OUTER = 0.998;

export interface FunnelFlag {
  /** events / n; null when n = 0. */
  rate: number | null;
  /** null when n = 0 (nothing to place on the funnel). */
  band: FunnelBand | null;
  /** Which side of the limits the rate lies beyond; null when within or n = 0. */
  side: 'above' | 'below' | null;
  /** 'better' or 'worse' than expected given the direction; null when within or n = 0. */
  assessment: 'better' | 'worse' | null;
  inner: Interval;
  outer: Interval;
}

export interface FunnelFlagOptions {
  /** Whether a higher rate is better (default 'higher'). */
  direction?: Direction;
  /** Over-dispersion estimate: when given and present, limits are widened by it. */
  overdispersion?: Pick<Overdispersion, 'phi' | 'tau2' | 'present'> | null;
  /** Additive (default) or multiplicative widening. */
  method?: OverdispersionMethod;
  /** Levels (defaults 0.95 and 0.998). */
  innerConfidence?: number;
  outerConfidence?: number;
}

export function funnelFlag(
  unit: { events: number; n: number },
  theta0: number,
  options: FunnelFlagOptions = {},
): FunnelFlag {
  assertEventsOfN(unit.events, unit.n);
  assertProbability(theta0, 'theta0');
  const direction = options.direction ?? 'higher';
  if (direction !== 'higher' && direction !== 'lower') {
    throw new RangeError(`direction must be 'higher' or 'lower' (got ${String(direction)})`);
  }
  const innerLevel = options.innerConfidence ?? FUNNEL_INNER;
  const outerLevel = options.outerConfidence ?? FUNNEL_OUTER;
  const limits = (confidence: number): Interval =>
    options.overdispersion
      ? overdispersedLimits(theta0, unit.n, confidence, options.overdispersion, {
          method: options.method ?? 'additive',
        })
      : funnelLimits(theta0, unit.n, confidence);
  const inner = limits(innerLevel);
  const outer = limits(outerLevel);
  if (unit.n === 0 || inner.lower === null || outer.lower === null) {
    return { rate: null, band: null, side: null, assessment: null, inner, outer };
  }
  const rate = unit.events / unit.n;
  let band: FunnelBand = 'within';
  let side: 'above' | 'below' | null = null;
  if (rate > outer.upper || rate < outer.lower) band = 'outlier';
  else if (rate > inner.upper || rate < inner.lower) band = 'notable';
  if (band !== 'within') side = rate > inner.upper ? 'above' : 'below';
  const assessment =
    side === null ? null : (side === 'above') === (direction === 'higher') ? 'better' : 'worse';
  return { rate, band, side, assessment, inner, outer };
}
