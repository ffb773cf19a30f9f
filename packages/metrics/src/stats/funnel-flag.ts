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
  return { rate, ...classifyRate(rate, inner, outer, direction), inner, outer };
}

/**
 * The band and side of a rate against inner and outer limits as one number (the rule of
 * `funnelFlag`, without objects, for callers that flag thousands of units): 1 within,
 * 2 notable above, 3 notable below, 4 outlier above, 5 outlier below.
 */
export type BandCode = 1 | 2 | 3 | 4 | 5;

export function bandCode(
  rate: number,
  innerLower: number,
  innerUpper: number,
  outerLower: number,
  outerUpper: number,
): BandCode {
  if (rate > outerUpper || rate < outerLower) return rate > innerUpper ? 4 : 5;
  if (rate > innerUpper || rate < innerLower) return rate > innerUpper ? 2 : 3;
  return 1;
}

/** The band and side of a band code. */
export function bandOfCode(code: BandCode): {
  band: FunnelBand;
  side: 'above' | 'below' | null;
} {
  if (code === 1) return { band: 'within', side: null };
  return {
    band: code <= 3 ? 'notable' : 'outlier',
    side: code === 2 || code === 4 ? 'above' : 'below',
  };
}

/** Whether a side is better or worse than expected given the measure's direction. */
export function assessmentOf(
  side: 'above' | 'below' | null,
  direction: Direction,
): 'better' | 'worse' | null {
  return side === null
    ? null
    : (side === 'above') === (direction === 'higher')
      ? 'better'
      : 'worse';
}

/**
 * The band, side and assessment of a rate against given inner and outer limits (the rule of
 * `funnelFlag`, for callers that compute limits once per distinct n).
 */
export function classifyRate(
  rate: number,
  inner: { lower: number; upper: number },
  outer: { lower: number; upper: number },
  direction: Direction,
): Pick<FunnelFlag, 'band' | 'side' | 'assessment'> & { band: FunnelBand } {
  const { band, side } = bandOfCode(
    bandCode(rate, inner.lower, inner.upper, outer.lower, outer.upper),
  );
  return { band, side, assessment: assessmentOf(side, direction) };
}
