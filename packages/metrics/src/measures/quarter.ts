import { monthFromIndex } from '../records/month.js';
import type { Month } from '../records/record.js';

/**
 * Audit quarter and review window (methods §1): the review window of quarter Q is the 12
 * calendar months ending on the last day of Q (2025-10 … 2026-09 for 2026 Q3). The retinal window
 * is the measure set's retinal window (default 12 months) ending at the same month.
 */
export interface AuditQuarter {
  year: number;
  quarter: 1 | 2 | 3 | 4;
}

export interface ReviewWindow {
  quarter: AuditQuarter;
  /** First and last month of the review window. */
  start: Month;
  end: Month;
  startIndex: number;
  endIndex: number;
  /** First month of the retinal window (same end). */
  retinalStart: Month;
  retinalStartIndex: number;
  /** Calendar year of the window's last month: ages and durations are counted to it. */
  endYear: number;
}

export function assertQuarter(quarter: AuditQuarter): void {
  if (
    quarter === null ||
    typeof quarter !== 'object' ||
    !Number.isInteger(quarter.year) ||
    quarter.year < 1900 ||
    quarter.year > 2700
  ) {
    throw new RangeError(`quarter.year must be a year 1900…2700 (got ${String(quarter?.year)})`);
  }
  if (![1, 2, 3, 4].includes(quarter.quarter)) {
    throw new RangeError(`quarter.quarter must be 1, 2, 3 or 4 (got ${String(quarter.quarter)})`);
  }
}

export function reviewWindow(quarter: AuditQuarter, retinalWindowMonths = 12): ReviewWindow {
  assertQuarter(quarter);
  if (!Number.isInteger(retinalWindowMonths) || retinalWindowMonths < 1) {
    throw new RangeError(
      `retinalWindowMonths must be a positive integer (got ${retinalWindowMonths})`,
    );
  }
  const endIndex = quarter.year * 12 + quarter.quarter * 3 - 1;
  const startIndex = endIndex - 11;
  const retinalStartIndex = endIndex - (retinalWindowMonths - 1);
  return {
    quarter: { year: quarter.year, quarter: quarter.quarter },
    start: monthFromIndex(startIndex),
    end: monthFromIndex(endIndex),
    startIndex,
    endIndex,
    retinalStart: monthFromIndex(retinalStartIndex),
    retinalStartIndex,
    endYear: quarter.year,
  };
}

/** A quarter as text, e.g. '2026 Q3'. */
export function formatQuarter(quarter: AuditQuarter): string {
  return `${quarter.year} Q${quarter.quarter}`;
}
