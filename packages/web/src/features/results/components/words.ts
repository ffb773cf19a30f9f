/** Words of the results page: splits, changes, improvement potential. */
import type { Measure, PracticeSplitResult, TypeSplit } from '../../../lib/api/types';
import { formatCount, formatPercent } from '../../../lib/format';

export const splitLabels: Record<TypeSplit, string> = {
  all: 'All types',
  type1: 'Type 1',
  type2_other: 'Type 2 and other',
};

/** "+3.2 points since 2026 Q2 (better)" — the difference the API sent, in words. */
export function changeText(result: PracticeSplitResult, measure: Measure): string {
  const change = result.change;
  if (!change) return 'No rate for the previous quarter';
  const points = change.difference * 100;
  if (Math.abs(points) < 0.05) return `No change since ${change.previousQuarterLabel}`;
  const up = points > 0;
  const better = measure.direction === 'higher' ? up : !up;
  return `${up ? '+' : '−'}${Math.abs(points).toFixed(1)} points since ${change.previousQuarterLabel} (${better ? 'better' : 'worse'})`;
}

/** The improvement potential as a sentence ("k more people … region median"). */
export function improvementText(result: PracticeSplitResult, measure: Measure): string {
  const { records, median } = result.improvement;
  if (median == null) return 'The region median is withheld for this group.';
  if (records == null || records <= 0) {
    return `At or beyond the region median (${formatPercent(median)}).`;
  }
  const people = records === 1 ? 'person' : 'people';
  const n = formatCount(records);
  const sentence =
    measure.direction === 'lower'
      ? `${n} fewer ${people} counted here`
      : measure.kind === 'care_process'
        ? `${n} more ${people} with this care process done`
        : `${n} more ${people} meeting this target`;
  return `${sentence} would bring the practice to the region median (${formatPercent(median)}).`;
}
