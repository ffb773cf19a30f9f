/**
 * What may be done with an audit quarter: the one place the rule lives. The
 * service's checks and the actions sent with every quarter (the quarters
 * page shows buttons from them) both call it; a table of cases is in
 * quarter-policy.spec.ts.
 *
 * - A regional lead (or Cairn itself, seeding the demo) opens quarters,
 *   closes an open one, reopens a closed one and moves its deadline.
 * - The measure-set version of a quarter may change only while the quarter
 *   is open and no report has been published from it: a published report
 *   names the version its figures were computed with, and that stays true.
 *   The quarter's results are recomputed under the new version when next
 *   read; the submissions themselves do not change.
 * - Everyone else reads.
 */
import type { Actor } from '../auth/actor.js';
import type { QuarterActionsDto, QuarterStatus } from './dto/quarter.dto.js';

type Who = Pick<Actor, 'role'>;

export const mayManageQuarters = (actor: Who): boolean =>
  actor.role === 'regional_lead' || actor.role === 'system';

export interface QuarterFacts {
  status: QuarterStatus;
  /** Whether a report has been published from the quarter (withdrawn or not) */
  hasReport: boolean;
}

export function quarterActions(actor: Who, quarter: QuarterFacts): QuarterActionsDto {
  const manage = mayManageQuarters(actor);
  return {
    close: manage && quarter.status === 'open',
    reopen: manage && quarter.status === 'closed',
    changeDeadline: manage,
    changeMeasureSet: manage && quarter.status === 'open' && !quarter.hasReport,
  };
}
