/**
 * Small-number disclosure control for anything seen beyond the practice itself (common practice
 * in official health statistics; thresholds configurable):
 * - counts 1 … minCount − 1 (default 1–4) are shown as "< 5" (primary suppression; 0 is shown);
 * - rates with a denominator under minDenominator (default 10) are withheld;
 * - secondary suppression in a group of cells whose total is shown: when the suppressed cells
 *   could be recovered from the total (exactly one suppressed cell, or suppressed cells summing
 *   to less than minCount), the smallest further non-zero cells are suppressed too; when that
 *   is impossible the total is withheld.
 */
export interface DisclosureOptions {
  /** Smallest count shown as itself (default 5). */
  minCount?: number;
  /** Smallest denominator for which a rate is shown (default 10). */
  minDenominator?: number;
}

export type Suppression = 'none' | 'primary' | 'secondary';

export interface DisclosedCell {
  /** The count when shown, null when suppressed. */
  value: number | null;
  /** Text to print: the count, "< 5", or "withheld". */
  display: string;
  suppression: Suppression;
}

function options(o: DisclosureOptions): { minCount: number; minDenominator: number } {
  const minCount = o.minCount ?? 5;
  const minDenominator = o.minDenominator ?? 10;
  if (!Number.isInteger(minCount) || minCount < 1) {
    throw new RangeError(`minCount must be a positive integer (got ${minCount})`);
  }
  if (!Number.isInteger(minDenominator) || minDenominator < 1) {
    throw new RangeError(`minDenominator must be a positive integer (got ${minDenominator})`);
  }
  return { minCount, minDenominator };
}

function assertCount(value: number, name: string): void {
  if (!Number.isInteger(value) || value < 0) {
    throw new RangeError(`${name} must be a non-negative integer (got ${value})`);
  }
}

/** One count on its own (primary suppression only). */
export function discloseCount(count: number, o: DisclosureOptions = {}): DisclosedCell {
  const { minCount } = options(o);
  assertCount(count, 'count');
  if (count > 0 && count < minCount) {
    return { value: null, display: `< ${minCount}`, suppression: 'primary' };
  }
  return { value: count, display: String(count), suppression: 'none' };
}

/** A rate events/denominator, or null when the denominator is under the threshold (or 0). */
export function discloseRate(
  events: number,
  denominator: number,
  o: DisclosureOptions = {},
): number | null {
  const { minDenominator } = options(o);
  assertCount(events, 'events');
  assertCount(denominator, 'denominator');
  if (events > denominator) {
    throw new RangeError(`events must not exceed denominator (got ${events} > ${denominator})`);
  }
  return denominator < minDenominator || denominator === 0 ? null : events / denominator;
}

/** A group of cells with its total: primary and secondary suppression together. */
export function protectGroup(
  counts: readonly number[],
  o: DisclosureOptions & { totalShown?: boolean } = {},
): { cells: DisclosedCell[]; total: DisclosedCell } {
  const { minCount } = options(o);
  counts.forEach((c, i) => assertCount(c, `counts[${i}]`));
  const totalValue = counts.reduce((a, b) => a + b, 0);
  const cells = counts.map((c) => discloseCount(c, { minCount }));
  let total = discloseCount(totalValue, { minCount });
  const totalShown = (o.totalShown ?? true) && total.suppression === 'none';
  if (totalShown) {
    const suppressedSum = (): number =>
      counts.reduce((s, c, i) => (cells[i]?.suppression !== 'none' ? s + c : s), 0);
    const suppressedCount = (): number => cells.filter((c) => c.suppression !== 'none').length;
    while (suppressedCount() > 0 && (suppressedCount() === 1 || suppressedSum() < minCount)) {
      let best = -1;
      counts.forEach((c, i) => {
        if (
          cells[i]?.suppression === 'none' &&
          c > 0 &&
          (best < 0 || c < (counts[best] as number))
        ) {
          best = i;
        }
      });
      if (best < 0) {
        total = { value: null, display: 'withheld', suppression: 'secondary' };
        break;
      }
      cells[best] = { value: null, display: 'withheld', suppression: 'secondary' };
    }
  }
  return { cells, total };
}
