/**
 * Which practice × measure results are outliers, and why, in words
 * (docs/methods.md §8, Flags and Over-dispersion; §12 Outlier list).
 *
 * A result is judged against the over-dispersion-adjusted limits at its n
 * (the exact binomial limits when over-dispersion is not present: Spiegelhalter,
 * Stat Med 2005;24:1185–202), beyond the 99.8 % limits ("outlier") or, when
 * asked for, beyond the 95 % ones ("notable"). With case-mix adjustment chosen,
 * the rate judged is the indirectly standardised rate (O/E × θ₀) instead of the
 * crude rate, against the same limits. Strength of evidence is the z-score
 * after the same widening: (r − θ₀) ÷ √(θ₀(1 − θ₀)/n + τ²) for additive
 * widening, (r − θ₀) ÷ (√φ · √(θ₀(1 − θ₀)/n)) for multiplicative.
 */
import { assessmentOf, bandCode, bandOfCode, type UnitResult } from '@cairn/metrics';

export type OutlierLevel = 'outer' | 'inner';

export interface OutlierChoice {
  /** outer: beyond the 99.8 % limits only; inner: beyond the 95 % ones too */
  level: OutlierLevel;
  /** Judge the case-mix adjusted (indirectly standardised) rate */
  caseMix: boolean;
}

export interface MeasureContext {
  theta0: number | null;
  direction: 'higher' | 'lower';
  overdispersion: { phi: number; tau2: number; present: boolean } | null;
  method: 'additive' | 'multiplicative';
}

export interface Judgement {
  band: 'notable' | 'outlier';
  side: 'above' | 'below';
  assessment: 'better' | 'worse';
  /** The rate judged: crude, or case-mix adjusted */
  rate: number;
  /** The limit it lies beyond */
  limit: number;
  /** Whether the limits were widened for over-dispersion */
  widened: boolean;
  /** Strength of evidence: the z-score under the limits used */
  z: number;
}

/** A result's judgement; null when it is within the chosen limits or cannot be placed. */
export function judge(u: UnitResult, m: MeasureContext, choice: OutlierChoice): Judgement | null {
  const rate = choice.caseMix ? u.caseMix.adjustedRate : u.rate;
  if (rate === null || m.theta0 === null || u.n <= 0 || u.adjusted.band === null) return null;
  const { inner, outer } = u.adjusted;
  if (inner.lower === null || inner.upper === null || outer.lower === null || outer.upper === null)
    return null;
  const { band, side } = bandOfCode(
    bandCode(rate, inner.lower, inner.upper, outer.lower, outer.upper),
  );
  if (band === 'within' || side === null) return null;
  if (band === 'notable' && choice.level === 'outer') return null;
  const widened = m.overdispersion?.present ?? false;
  const s2 = (m.theta0 * (1 - m.theta0)) / u.n;
  const sd =
    !widened || !m.overdispersion
      ? Math.sqrt(s2)
      : m.method === 'multiplicative'
        ? Math.sqrt(m.overdispersion.phi * s2)
        : Math.sqrt(s2 + m.overdispersion.tau2);
  const z = sd > 0 ? (rate - m.theta0) / sd : side === 'above' ? Infinity : -Infinity;
  const limits = band === 'outlier' ? outer : inner;
  return {
    band,
    side,
    assessment: assessmentOf(side, m.direction) as 'better' | 'worse',
    rate,
    limit: (side === 'above' ? limits.upper : limits.lower) as number,
    widened,
    z,
  };
}

/** Whether an earlier quarter's stored flag code (adjusted limits) counts as flagged on this side. */
export function flaggedLike(code: number, side: 'above' | 'below', level: OutlierLevel): boolean {
  if (code < 2) return false;
  const { band, side: s } = bandOfCode(code as 2 | 3 | 4 | 5);
  return s === side && (band === 'outlier' || level === 'inner');
}

const pct = (x: number | null) => (x === null ? '—' : `${(x * 100).toFixed(1)} %`);
const num = (x: number | null, digits: number) =>
  x === null ? '—' : x.toFixed(digits).replace('-', '−');

/** Why a result is listed, in plain words. */
export function reasonInWords(
  u: UnitResult,
  j: Judgement,
  m: MeasureContext,
  choice: OutlierChoice,
): string {
  const parts: string[] = [];
  const basis = choice.caseMix
    ? `Case-mix adjusted rate ${pct(j.rate)} (crude ${u.rate === null ? '—' : pct(u.rate)}, ${u.events} of ${u.n})`
    : `${pct(j.rate)} (${u.events} of ${u.n}; 95 % interval ${pct(u.interval.lower)}–${pct(u.interval.upper)})`;
  parts.push(`${basis} against the region’s ${pct(m.theta0 ?? 0)}.`);
  parts.push(
    `${j.side === 'above' ? 'Above' : 'Below'} the ${j.band === 'outlier' ? '99.8' : '95'} % ${
      j.side === 'above' ? 'upper' : 'lower'
    } limit of ${pct(j.limit)} at this practice’s n, ${
      j.widened && m.overdispersion
        ? `limits widened for over-dispersion (φ = ${num(m.overdispersion.phi, 2)}, τ² = ${num(m.overdispersion.tau2, 4)})`
        : 'exact binomial limits (no over-dispersion found)'
    }.`,
  );
  parts.push(`z = ${num(j.z, 2)}.`);
  if (u.caseMix.ratio !== null) {
    parts.push(
      `Observed/expected for its case mix ${num(u.caseMix.ratio, 2)} (${num(u.caseMix.interval.lower, 2)}–${num(u.caseMix.interval.upper, 2)}).`,
    );
  }
  parts.push(
    `${j.assessment === 'better' ? 'Better' : 'Worse'} than expected: ${m.direction === 'higher' ? 'a higher' : 'a lower'} rate is better on this measure.`,
  );
  return parts.join(' ');
}
