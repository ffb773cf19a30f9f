/**
 * What may be done with published reports: the one place the rule lives. The
 * service's checks (`assertMayPublish`, the withdraw check) and the actions
 * sent with the report list and every report (the reports pages and the
 * benchmark page show buttons from them) all call it; a table of cases is in
 * report-policy.spec.ts.
 *
 * - A regional lead (or Cairn itself, e.g. a benchmark run) publishes a
 *   quarter's benchmark as a new report, in open and closed quarters.
 * - A regional lead withdraws a report that is not withdrawn already.
 * - Regional leads and auditors read the region's part of a report that is
 *   not withdrawn; practice leads read their own practices' parts.
 */
import { HttpStatus } from '@nestjs/common';
import type { Actor } from '../auth/actor.js';
import { ProblemException } from '../common/problem.js';
import type { ReportActionsDto, ReportListActionsDto, ReportStatus } from './dto/report.dto.js';

type Who = Pick<Actor, 'role'>;

export const mayPublish = (actor: Who): boolean =>
  actor.role === 'regional_lead' || actor.role === 'system';

export const mayWithdraw = (actor: Who): boolean => actor.role === 'regional_lead';

export const mayReadRegion = (actor: Who): boolean =>
  actor.role === 'regional_lead' || actor.role === 'auditor';

/** The actions of a quarter's report list (`quarterId` null: the list of every quarter). */
export function reportListActions(actor: Who, quarterId: number | null): ReportListActionsDto {
  return { publish: quarterId !== null && mayPublish(actor) };
}

export function reportActions(actor: Who, status: ReportStatus): ReportActionsDto {
  return {
    withdraw: mayWithdraw(actor) && status !== 'withdrawn',
    region: mayReadRegion(actor) && status !== 'withdrawn',
  };
}

export function assertMayPublish(actor: Who): void {
  if (mayPublish(actor)) return;
  throw new ProblemException(
    HttpStatus.FORBIDDEN,
    'role-not-allowed',
    'You may not publish reports',
    'Only the regional lead publishes a quarter’s benchmark as a report.',
  );
}

export function assertMayWithdraw(actor: Who): void {
  if (mayWithdraw(actor)) return;
  throw new ProblemException(
    HttpStatus.FORBIDDEN,
    'role-not-allowed',
    'You may not withdraw reports',
    'Only the regional lead withdraws a published report.',
  );
}
