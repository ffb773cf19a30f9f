/**
 * Which records a recall list names: exactly the records that count against
 * the practice on the measure, so that the list's length is the gap the
 * practice's own figures show.
 *
 *   higher is better: in the measure's denominator and not met — a care
 *     process not recorded in its window; a target not met, or (denominator
 *     "eligible") not measured in the review window;
 *   lower is better: the records the measure counts (e.g. an HbA1c above 75).
 *
 * Records outside the measure's population, and unknowns of a "measured"
 * denominator, are in neither count and on no list.
 */
import type { Outcome } from '@cairn/metrics';
import type { MeasureView } from '../../measure-sets/describe.js';

export const RECALL_REASONS = [
  'not_recorded',
  'not_measured',
  'not_met',
  'adverse_result',
] as const;
export type RecallReason = (typeof RECALL_REASONS)[number];

type RuleMeasure = Pick<MeasureView, 'kind' | 'direction' | 'denominator'>;

/** Why a record with this outcome is on the measure's recall list, or null when it is not. */
export function recallReason(
  measure: RuleMeasure,
  outcome: Outcome | undefined,
): RecallReason | null {
  if (outcome === undefined || outcome === 'excluded') return null;
  if (measure.direction === 'lower') return outcome === 'met' ? 'adverse_result' : null;
  switch (outcome) {
    case 'met':
      return null;
    case 'unknown':
      if (measure.denominator === 'measured') return null;
      return measure.kind === 'care_process' ? 'not_recorded' : 'not_measured';
    case 'not_met':
      return measure.kind === 'care_process' ? 'not_recorded' : 'not_met';
  }
}

/** Whether a record with this outcome is in the measure's denominator (n). */
export function inDenominator(
  measure: Pick<MeasureView, 'denominator'>,
  outcome: Outcome | undefined,
): boolean {
  if (outcome === undefined || outcome === 'excluded') return false;
  return measure.denominator === 'eligible' || outcome !== 'unknown';
}

/** The reason in words. */
export function reasonText(
  measure: Pick<MeasureView, 'composite' | 'reads'>,
  reason: RecallReason,
): string {
  switch (reason) {
    case 'not_recorded':
      if (measure.composite) return 'Not every care process recorded in its window';
      return measure.reads[0]?.window === 'retinal'
        ? 'Not recorded in the retinal window'
        : 'Not recorded in the review window';
    case 'not_measured':
      return measure.reads.every((r) => r.window === null)
        ? 'Not recorded'
        : 'No result in the review window';
    case 'not_met':
      return measure.composite
        ? 'Not every part of the target met'
        : 'Latest result does not meet the target';
    case 'adverse_result':
      return 'Latest result is in the range this measure counts (lower is better)';
  }
}
