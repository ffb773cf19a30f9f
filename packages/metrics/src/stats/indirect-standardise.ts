import { assertConfidence, assertEventsOfN } from './assert.js';
import { NO_INTERVAL, type Interval } from './interval.js';
import { poissonInterval } from './poisson-interval.js';

/**
 * Indirect standardisation (case-mix adjustment): regional stratum rates r_s = Σ_i y_is / Σ_i n_is;
 * each unit's expected count E_i = Σ_s n_is · r_s; the ratio O/E with the exact Poisson
 * (Garwood, Biometrika 1936) interval of O divided by E; the adjusted rate (O/E) · θ₀ with θ₀ the
 * pooled rate. Over the whole region Σ O = Σ E, and equal stratum rates everywhere give
 * O/E = 1 for every unit. A unit with E = 0 has no ratio (null fields).
 */
export interface StratumCell {
  unit: string;
  stratum: string | number;
  events: number;
  n: number;
}

export interface StandardisedUnit {
  unit: string;
  observed: number;
  expected: number;
  n: number;
  crudeRate: number | null;
  ratio: number | null;
  interval: Interval;
  adjustedRate: number | null;
}

export interface Standardisation {
  theta0: number | null;
  strata: { stratum: string | number; events: number; n: number; rate: number | null }[];
  units: StandardisedUnit[];
}

export interface StandardiseOptions {
  confidence?: number;
  /** Reference stratum rates to use instead of the pooled ones (missing strata count 0). */
  referenceRates?: ReadonlyMap<string | number, number>;
  /** Reference overall rate for the adjusted rate (default the pooled rate of the cells). */
  theta0?: number;
}

/** O/E, its Garwood interval and (O/E)·θ₀ for one unit. */
export function standardisedRatio(
  observed: number,
  expected: number,
  theta0: number | null,
  confidence = 0.95,
): { ratio: number | null; interval: Interval; adjustedRate: number | null } {
  if (!(expected > 0)) return { ratio: null, interval: NO_INTERVAL, adjustedRate: null };
  const ratio = observed / expected;
  const count = poissonInterval(observed, confidence);
  return {
    ratio,
    interval: { lower: count.lower / expected, upper: count.upper / expected },
    adjustedRate: theta0 === null ? null : ratio * theta0,
  };
}

export function indirectStandardise(
  cells: readonly StratumCell[],
  options: StandardiseOptions = {},
): Standardisation {
  const confidence = options.confidence ?? 0.95;
  assertConfidence(confidence);
  const strata = new Map<string | number, { events: number; n: number }>();
  const units = new Map<string, { observed: number; n: number }>();
  let events = 0;
  let n = 0;
  cells.forEach((c, i) => {
    assertEventsOfN(c.events, c.n, `cells[${i}].events`, `cells[${i}].n`);
    const s = strata.get(c.stratum) ?? { events: 0, n: 0 };
    s.events += c.events;
    s.n += c.n;
    strata.set(c.stratum, s);
    const u = units.get(c.unit) ?? { observed: 0, n: 0 };
    u.observed += c.events;
    u.n += c.n;
    units.set(c.unit, u);
    events += c.events;
    n += c.n;
  });
  const rate = (stratum: string | number): number => {
    if (options.referenceRates) return options.referenceRates.get(stratum) ?? 0;
    const s = strata.get(stratum);
    return s && s.n > 0 ? s.events / s.n : 0;
  };
  const expected = new Map<string, number>();
  for (const c of cells) expected.set(c.unit, (expected.get(c.unit) ?? 0) + c.n * rate(c.stratum));
  const theta0 = options.theta0 ?? (n > 0 ? events / n : null);
  return {
    theta0,
    strata: [...strata].map(([stratum, s]) => ({
      stratum,
      events: s.events,
      n: s.n,
      rate: s.n > 0 ? s.events / s.n : null,
    })),
    units: [...units].map(([unit, u]) => {
      const e = expected.get(unit) ?? 0;
      return {
        unit,
        observed: u.observed,
        expected: e,
        n: u.n,
        crudeRate: u.n > 0 ? u.observed / u.n : null,
        ...standardisedRatio(u.observed, e, theta0, confidence),
      };
    }),
  };
}
