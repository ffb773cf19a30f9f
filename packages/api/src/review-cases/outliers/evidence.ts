/**
 * One practice's figures on one measure and split of a benchmark, with its
 * judgement and reason (outlier-rule.ts): what a review case freezes when it
 * opens, and what the outlier list shows per row.
 */
import { benchmarkPractice, type Benchmark, type TypeSplit, type UnitResult } from '@cairn/metrics';
import type { CaseEvidenceDto } from '../dto/review-case.dto.js';
import {
  judge,
  type Judgement,
  type MeasureContext,
  type OutlierChoice,
  reasonInWords,
} from './outlier-rule.js';
import type { OutlierBasis } from './outlier-source.js';

const SPLIT_INDEX: Record<TypeSplit, number> = { all: 0, type1: 1, type2_other: 2 };

/** The context of a measure and split in a benchmark (θ₀, direction, over-dispersion). */
export function measureContext(b: Benchmark, measureKey: string, split: TypeSplit): MeasureContext {
  const m = b.measures.findIndex((x) => x.key === measureKey);
  if (m < 0) throw new RangeError(`measure ${measureKey} is not in this benchmark`);
  const c = b.comparisons[m * 3 + SPLIT_INDEX[split]]!;
  const od = c.practice.overdispersion;
  return {
    theta0: c.theta0,
    direction: b.measures[m]!.direction,
    overdispersion:
      od && od.phi !== null && od.tau2 !== null
        ? { phi: od.phi, tau2: od.tau2, present: od.present }
        : null,
    method: b.options.overdispersion ?? 'additive',
  };
}

export function evidenceOf(
  basis: OutlierBasis,
  code: string,
  measureKey: string,
  split: TypeSplit,
  choice: OutlierChoice,
): { evidence: CaseEvidenceDto; judgement: Judgement | null; unit: UnitResult } {
  const view = benchmarkPractice(basis.benchmark, code);
  const r = view.results.find((x) => x.measure.key === measureKey && x.split === split);
  if (!r) throw new RangeError(`measure ${measureKey} is not in this benchmark`);
  return evidenceOfUnit(basis, r.unit, measureContext(basis.benchmark, measureKey, split), choice);
}

/** The same for a unit already read (the outlier list's pass over a measure). */
export function evidenceOfUnit(
  basis: OutlierBasis,
  u: UnitResult,
  context: MeasureContext,
  choice: OutlierChoice,
): { evidence: CaseEvidenceDto; judgement: Judgement | null; unit: UnitResult } {
  // The widest net: a case may be opened on a notable result too.
  const judgement = judge(u, context, { ...choice, level: 'inner' });
  const reason = judgement
    ? reasonInWords(u, judgement, context, choice)
    : `Within the 95 % limits${choice.caseMix ? ' after case-mix adjustment' : ''}: ${
        u.rate === null ? 'no rate' : `${(u.rate * 100).toFixed(1)} %`
      } (${u.events} of ${u.n}) against the region’s ${
        context.theta0 === null ? '—' : `${(context.theta0 * 100).toFixed(1)} %`
      }.`;
  return {
    unit: u,
    judgement,
    evidence: {
      origin: basis.origin,
      resultId: basis.resultId,
      key: basis.key,
      measureSetId: basis.measureSetId,
      builtAt: basis.builtAt,
      n: u.n,
      events: u.events,
      rate: u.rate,
      intervalLower: u.interval.lower,
      intervalUpper: u.interval.upper,
      theta0: context.theta0,
      innerLower: u.adjusted.inner.lower,
      innerUpper: u.adjusted.inner.upper,
      outerLower: u.adjusted.outer.lower,
      outerUpper: u.adjusted.outer.upper,
      band: judgement?.band ?? (u.adjusted.band === null ? null : 'within'),
      assessment: judgement?.assessment ?? null,
      z: judgement?.z ?? u.z,
      phi: context.overdispersion?.phi ?? null,
      tau2: context.overdispersion?.tau2 ?? null,
      observedExpected: u.caseMix.ratio,
      reason,
    },
  };
}
