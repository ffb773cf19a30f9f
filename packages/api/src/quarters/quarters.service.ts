/**
 * Audit quarters (product.md flow 1): a region's regional lead opens a
 * quarter, choosing the measure set and the submission deadline; practices
 * upload extracts to it; after the deadline it is closed. The review window
 * is derived (docs/methods.md §1, reviewWindow in @cairn/metrics).
 */
import { HttpStatus, Inject, Injectable } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { formatQuarter, reviewWindow } from '@cairn/metrics';
import { QueryTypes, type Transaction } from 'sequelize';
import { Sequelize } from 'sequelize-typescript';
import { AuditTrailService } from '../audit-trail/audit-trail.service.js';
import type { Actor } from '../auth/actor.js';
import { ProblemException } from '../common/problem.js';
import { selectRows } from '../database/raw-select.js';
import type { CairnConfig } from '../config/config.schema.js';
import type {
  QuarterActionsDto,
  QuarterDto,
  QuarterReportDto,
  QuarterStatus,
} from './dto/quarter.dto.js';
import type { MeasureSetUseDto } from '../measure-sets/dto/measure-set.dto.js';
import { MeasureSetUsage } from '../measure-sets/measure-set-usage.js';
import { MeasureSetsService } from '../measure-sets/measure-sets.service.js';
import { deadlineProblem, defaultDeadline } from './deadline.js';
import { type QuarterFacts, quarterActions } from './quarter-policy.js';
import { QuarterReports } from './quarter-reports.js';

export { defaultDeadline } from './deadline.js';
import { QuarterEvents } from './quarter-events.js';

interface DbQuarter {
  id: number;
  region_id: number;
  year: number;
  quarter: number;
  window_start: string;
  window_end: string;
  measure_set_id: string;
  submission_deadline: string | Date;
  status: QuarterStatus;
  opened_at: Date;
  closed_at: Date | null;
}

/** What a person may do with a quarter, and the reports published from it. */
export interface QuarterStanding {
  actions: QuarterActionsDto;
  reports: QuarterReportDto[];
}

const dateOnly = (value: string | Date) =>
  typeof value === 'string' ? value.slice(0, 10) : value.toISOString().slice(0, 10);

function toQuarter(row: DbQuarter): QuarterDto {
  const quarter = row.quarter as 1 | 2 | 3 | 4;
  return {
    id: row.id,
    regionId: row.region_id,
    year: row.year,
    quarter,
    label: formatQuarter({ year: row.year, quarter }),
    windowStart: row.window_start,
    windowEnd: row.window_end,
    measureSetId: row.measure_set_id,
    submissionDeadline: dateOnly(row.submission_deadline),
    status: row.status,
    openedAt: new Date(row.opened_at).toISOString(),
    closedAt: row.closed_at ? new Date(row.closed_at).toISOString() : null,
  };
}

/** 404: the quarter is unknown, or of another region (the same answer for both). */
function notFound(id: number): ProblemException {
  return new ProblemException(
    HttpStatus.NOT_FOUND,
    'quarter-not-found',
    'No such audit quarter',
    `There is no audit quarter ${id} in your region.`,
    { quarterId: id },
  );
}

/** 422 problem details naming one field of the request. */
function fieldProblem(slug: string, title: string, field: string, message: string, detail: string) {
  return new ProblemException(HttpStatus.UNPROCESSABLE_ENTITY, slug, title, detail, {
    errors: [{ field, message }],
  });
}

function assertDeadline(year: number, quarter: number, deadline: string): void {
  const problem = deadlineProblem(year, quarter, deadline);
  if (problem) {
    throw fieldProblem(
      'deadline-too-early',
      'The deadline is too early',
      'submissionDeadline',
      problem,
      `The submission deadline ${deadline} ${problem}.`,
    );
  }
}

/** A quarter's columns as DbQuarter reads them, of the table under alias `q`. */
const columnsOf = (q: string) => `${q}.id AS id, ${q}.region_id AS region_id, ${q}.year AS year,
  ${q}.quarter AS quarter, ${q}.window_start AS window_start, ${q}.window_end AS window_end,
  ${q}.measure_set_id AS measure_set_id,
  DATE_FORMAT(${q}.submission_deadline, '%Y-%m-%d') AS submission_deadline, ${q}.status AS status,
  ${q}.opened_at AS opened_at, ${q}.closed_at AS closed_at`;

const SELECT = `SELECT ${columnsOf('audit_quarters')} FROM audit_quarters`;

/**
 * SQL expressions another module adds to a read of a region's quarters (their own tables, their
 * own SQL): `perQuarter` of a quarter's id, `perRegion` of the region's id (read once).
 */
export interface QuarterReadExtras {
  perQuarter?: Record<string, (quarterIdSql: string) => string>;
  perRegion?: Record<string, (regionIdSql: string) => string>;
}

/** A region's quarters, newest first, with the values of the extras asked for. */
export interface QuartersWith {
  quarters: QuarterDto[];
  /** By quarter id: each perQuarter extra's value */
  perQuarter: Map<number, Record<string, unknown>>;
  /** Each perRegion extra's value */
  perRegion: Record<string, unknown>;
}

@Injectable()
export class QuartersService {
  constructor(
    @Inject(Sequelize) private readonly sequelize: Sequelize,
    @Inject(ConfigService) private readonly config: ConfigService<CairnConfig, true>,
    @Inject(AuditTrailService) private readonly audit: AuditTrailService,
    @Inject(MeasureSetsService) private readonly measureSets: MeasureSetsService,
    @Inject(QuarterReports) private readonly reports: QuarterReports,
    @Inject(QuarterEvents) private readonly events: QuarterEvents,
    @Inject(MeasureSetUsage) usage: MeasureSetUsage,
  ) {
    usage.register({ usesOf: (regionId, ids) => this.measureSetUses(regionId, ids) });
  }

  /** The quarters of a region that use these measure-set versions (for the measure-set pages). */
  private async measureSetUses(
    regionId: number,
    ids: readonly string[],
  ): Promise<Map<string, MeasureSetUseDto[]>> {
    const uses = new Map<string, MeasureSetUseDto[]>();
    const rows = await this.sequelize.query<DbQuarter>(
      `${SELECT} WHERE region_id = ? AND measure_set_id IN (?) ORDER BY year DESC, quarter DESC`,
      { replacements: [regionId, ids], type: QueryTypes.SELECT },
    );
    for (const row of rows.map(toQuarter)) {
      const list = uses.get(row.measureSetId) ?? [];
      list.push({ kind: 'quarter', id: row.id, label: row.label, status: row.status });
      uses.set(row.measureSetId, list);
    }
    return uses;
  }

  /** What this person may do with each quarter (quarter-policy.ts), and its reports. */
  async standing(
    actor: Pick<Actor, 'role' | 'regionId'>,
    quarters: readonly QuarterDto[],
  ): Promise<Map<number, QuarterStanding>> {
    const reports = await this.reports.of(
      actor.regionId,
      quarters.map((q) => q.id),
    );
    return new Map(
      quarters.map((q) => {
        const published = reports.get(q.id) ?? [];
        const actions = quarterActions(actor, {
          status: q.status,
          hasReport: published.length > 0,
        });
        return [q.id, { actions, reports: published }];
      }),
    );
  }

  /** The facts the policy needs about one quarter. */
  private async facts(actor: Actor, quarter: QuarterDto): Promise<QuarterFacts> {
    const reports = (await this.reports.of(actor.regionId, [quarter.id])).get(quarter.id) ?? [];
    return { status: quarter.status, hasReport: reports.length > 0 };
  }

  /** A region's quarters, newest first (one SELECT on a pooled connection: read per request). */
  async list(regionId: number): Promise<QuarterDto[]> {
    const rows = await selectRows<DbQuarter>(
      this.sequelize,
      `${SELECT} WHERE region_id = ? ORDER BY year DESC, quarter DESC`,
      [regionId],
    );
    return rows.map(toQuarter);
  }

  /**
   * A region's quarters (as `list`) and, in the same SELECT, values other modules compute of
   * each quarter and of the region (`extras`): the one read a results route makes of what its
   * answer depends on. The region's values are computed once, in a derived row the quarters are
   * joined to (a region without quarters still has them).
   */
  async listWith(regionId: number, extras: QuarterReadExtras): Promise<QuartersWith> {
    const perQuarter = Object.entries(extras.perQuarter ?? {});
    const perRegion = Object.entries(extras.perRegion ?? {});
    const quarterValues = perQuarter.map(([, sql], i) => `, ${sql('q.id')} AS pq_${i}`).join('');
    const regionValues = perRegion.map(([, sql], i) => `, ${sql('x.region_id')} AS pr_${i}`);
    const rows = await selectRows<DbQuarter & Record<string, unknown>>(
      this.sequelize,
      `SELECT ${columnsOf('q')}${quarterValues}${perRegion.map((_, i) => `, r.pr_${i} AS pr_${i}`).join('')}
         FROM (SELECT x.region_id${regionValues.join('')} FROM (SELECT ? AS region_id) x) r
         LEFT JOIN audit_quarters q ON q.region_id = r.region_id
        ORDER BY q.year DESC, q.quarter DESC`,
      [regionId],
    );
    const first = rows[0] ?? {};
    return {
      quarters: rows.filter((r) => r.id !== null).map(toQuarter),
      perQuarter: new Map(
        rows
          .filter((r) => r.id !== null)
          .map((r) => [
            Number(r.id),
            Object.fromEntries(perQuarter.map(([name], i) => [name, r[`pq_${i}`]])),
          ]),
      ),
      perRegion: Object.fromEntries(
        perRegion.map(([name], i) => [name, (first as Record<string, unknown>)[`pr_${i}`]]),
      ),
    };
  }

  /** The quarter of these (a region's, read by `list` or `listWith`); 404 when not among them. */
  quarterAmong(quarters: readonly QuarterDto[], id: number): QuarterDto {
    const quarter = quarters.find((q) => q.id === id);
    if (!quarter) throw notFound(id);
    return quarter;
  }

  async find(id: number, transaction?: Transaction): Promise<QuarterDto | null> {
    const [row] = transaction
      ? await this.sequelize.query<DbQuarter>(`${SELECT} WHERE id = ?`, {
          replacements: [id],
          type: QueryTypes.SELECT,
          transaction,
        })
      : await selectRows<DbQuarter>(this.sequelize, `${SELECT} WHERE id = ?`, [id]);
    return row ? toQuarter(row) : null;
  }

  /** The quarter, if it is in the caller's region; 404 otherwise. */
  async get(actor: Pick<Actor, 'regionId'>, id: number): Promise<QuarterDto> {
    const quarter = Number.isSafeInteger(id) ? await this.find(id) : null;
    if (!quarter || quarter.regionId !== actor.regionId) {
      throw notFound(id);
    }
    return quarter;
  }

  /** Opens a quarter (regional lead, or the demo seeding as "system"). */
  async open(
    actor: Actor,
    input: {
      year: number;
      quarter: number;
      submissionDeadline?: string;
      measureSetId?: string;
      status?: QuarterStatus;
    },
  ): Promise<QuarterDto> {
    const { year, quarter } = input;
    const window = reviewWindow({ year, quarter: quarter as 1 | 2 | 3 | 4 });
    const settings = this.config.get('quarters', { infer: true });
    const deadline =
      input.submissionDeadline ??
      defaultDeadline(year, quarter, settings.deadlineDaysAfterQuarterEnd);
    const measureSetId = input.measureSetId ?? settings.defaultMeasureSetId;
    if (input.submissionDeadline !== undefined) assertDeadline(year, quarter, deadline);
    // An unknown version, or a draft, is refused before anything is written (422 naming the field).
    await this.measureSets.assertUsable(
      actor.regionId,
      measureSetId,
      'measureSetId',
      input.measureSetId !== undefined,
    );
    const label = formatQuarter({ year, quarter: quarter as 1 | 2 | 3 | 4 });
    return this.sequelize.transaction(async (transaction) => {
      const [existing] = await this.sequelize.query<{ id: number }>(
        'SELECT id FROM audit_quarters WHERE region_id = ? AND year = ? AND quarter = ? FOR UPDATE',
        { replacements: [actor.regionId, year, quarter], type: QueryTypes.SELECT, transaction },
      );
      if (existing) {
        throw new ProblemException(
          HttpStatus.CONFLICT,
          'quarter-exists',
          'This audit quarter already exists',
          `${label} is already open or closed in your region; it cannot be opened twice.`,
          { quarterId: existing.id },
        );
      }
      const status = input.status ?? 'open';
      const [id] = await this.sequelize.query(
        `INSERT INTO audit_quarters (region_id, year, quarter, window_start, window_end, measure_set_id,
           submission_deadline, status, opened_by_user_id, opened_at, closed_at)
         VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, NOW(3), ${status === 'closed' ? 'NOW(3)' : 'NULL'})`,
        {
          replacements: [
            actor.regionId,
            year,
            quarter,
            window.start,
            window.end,
            measureSetId,
            deadline,
            status,
            actor.id,
          ],
          type: QueryTypes.INSERT,
          transaction,
        },
      );
      await this.audit.append(
        {
          action: 'quarter.opened',
          summary: `${label} opened for submissions (review window ${window.start} to ${window.end}, deadline ${deadline}, measure set ${measureSetId})`,
          actor: { id: actor.id, label: actor.label },
          regionId: actor.regionId,
          subjectType: 'audit_quarter',
          subjectId: Number(id),
          detail: { year, quarter, deadline, measureSetId, status },
        },
        transaction,
      );
      const opened = (await this.find(Number(id), transaction))!;
      await this.events.opened(opened, actor, transaction);
      return opened;
    });
  }

  /** Every open quarter of every region (scheduled work: reminders before deadlines). */
  async openQuarters(): Promise<QuarterDto[]> {
    const rows = await this.sequelize.query<DbQuarter>(
      `${SELECT} WHERE status = 'open' ORDER BY region_id, submission_deadline`,
      { type: QueryTypes.SELECT },
    );
    return rows.map(toQuarter);
  }

  /**
   * Closes or reopens a quarter. Reopening may move the deadline (it is
   * checked like any deadline); closing an already closed quarter, or
   * reopening an open one, changes nothing.
   */
  async setStatus(
    actor: Actor,
    id: number,
    status: QuarterStatus,
    options: { submissionDeadline?: string } = {},
  ): Promise<QuarterDto> {
    const quarter = await this.get(actor, id);
    const deadline = options.submissionDeadline;
    if (deadline !== undefined) assertDeadline(quarter.year, quarter.quarter, deadline);
    const moved = deadline !== undefined && deadline !== quarter.submissionDeadline;
    if (quarter.status === status && !moved) return quarter;
    await this.sequelize.transaction(async (transaction) => {
      const [, changed] = (await this.sequelize.query(
        `UPDATE audit_quarters SET status = ?, closed_at = ${status === 'closed' ? 'COALESCE(closed_at, NOW(3))' : 'NULL'},
           submission_deadline = ? WHERE id = ? AND status = ?`,
        {
          replacements: [status, deadline ?? quarter.submissionDeadline, id, quarter.status],
          type: QueryTypes.UPDATE,
          transaction,
        },
      )) as unknown as [unknown, number];
      if (Number(changed) !== 1) throw this.changedMeanwhile(quarter);
      const word = status === 'closed' ? 'closed to practice uploads' : 'reopened for submissions';
      await this.audit.append(
        {
          action:
            quarter.status === status
              ? 'quarter.deadline_changed'
              : status === 'closed'
                ? 'quarter.closed'
                : 'quarter.reopened',
          summary:
            quarter.status === status
              ? `${quarter.label} deadline moved from ${quarter.submissionDeadline} to ${deadline}`
              : `${quarter.label} ${word}${moved ? ` (deadline ${deadline})` : ''}`,
          actor: { id: actor.id, label: actor.label },
          regionId: actor.regionId,
          subjectType: 'audit_quarter',
          subjectId: id,
          detail: moved ? { deadlineBefore: quarter.submissionDeadline, deadline } : null,
          requestId: actor.requestId,
          ipAddress: actor.ipAddress,
        },
        transaction,
      );
    });
    return (await this.find(id))!;
  }

  /**
   * Moves a quarter's deadline and, while it is open and no report has been
   * published from it (quarter-policy.ts), changes its measure-set version.
   * Both are checked before anything is written; both change in one
   * transaction with their audit events.
   */
  async update(
    actor: Actor,
    id: number,
    input: { submissionDeadline?: string; measureSetId?: string },
  ): Promise<QuarterDto> {
    const quarter = await this.get(actor, id);
    const actions = quarterActions(actor, await this.facts(actor, quarter));
    const deadline = input.submissionDeadline;
    const measureSetId = input.measureSetId;
    if (deadline === undefined && measureSetId === undefined) {
      throw fieldProblem(
        'nothing-to-change',
        'Nothing to change',
        'submissionDeadline',
        'give a new deadline, a measure set, or both',
        'The request named neither a new deadline nor a measure set.',
      );
    }
    if (deadline !== undefined) assertDeadline(quarter.year, quarter.quarter, deadline);
    const newSet = measureSetId !== undefined && measureSetId !== quarter.measureSetId;
    if (newSet) {
      if (!actions.changeMeasureSet) {
        const reported = quarter.status === 'open';
        throw new ProblemException(
          HttpStatus.CONFLICT,
          'quarter-measure-set-fixed',
          'The measure set of this quarter can no longer change',
          reported
            ? `A report has been published from ${quarter.label} with ${quarter.measureSetId}; its figures stay tied to that version.`
            : `${quarter.label} is closed. Reopen it to change its measure set.`,
          { quarterId: id, measureSetId: quarter.measureSetId },
        );
      }
      await this.measureSets.assertUsable(actor.regionId, measureSetId, 'measureSetId', true);
    }
    const moved = deadline !== undefined && deadline !== quarter.submissionDeadline;
    if (!newSet && !moved) return quarter;
    await this.sequelize.transaction(async (transaction) => {
      const [, changed] = (await this.sequelize.query(
        `UPDATE audit_quarters SET submission_deadline = ?, measure_set_id = ?
         WHERE id = ? AND status = ? AND measure_set_id = ?`,
        {
          replacements: [
            deadline ?? quarter.submissionDeadline,
            measureSetId ?? quarter.measureSetId,
            id,
            quarter.status,
            quarter.measureSetId,
          ],
          type: QueryTypes.UPDATE,
          transaction,
        },
      )) as unknown as [unknown, number];
      if (Number(changed) !== 1) throw this.changedMeanwhile(quarter);
      const base = {
        actor: { id: actor.id, label: actor.label },
        regionId: actor.regionId,
        subjectType: 'audit_quarter',
        subjectId: id,
        requestId: actor.requestId,
        ipAddress: actor.ipAddress,
      };
      if (moved) {
        await this.audit.append(
          {
            ...base,
            action: 'quarter.deadline_changed',
            summary: `${quarter.label} deadline moved from ${quarter.submissionDeadline} to ${deadline}`,
            detail: { deadlineBefore: quarter.submissionDeadline, deadline },
          },
          transaction,
        );
      }
      if (newSet) {
        await this.audit.append(
          {
            ...base,
            action: 'quarter.measure_set_changed',
            summary: `${quarter.label} now uses measure set ${measureSetId} (was ${quarter.measureSetId})`,
            detail: { measureSetBefore: quarter.measureSetId, measureSetId },
          },
          transaction,
        );
      }
    });
    return (await this.find(id))!;
  }

  private changedMeanwhile(quarter: QuarterDto): ProblemException {
    return new ProblemException(
      HttpStatus.CONFLICT,
      'quarter-changed',
      'The quarter changed meanwhile',
      `${quarter.label} was changed by someone else while you were changing it. Reload it and try again.`,
      { quarterId: quarter.id },
    );
  }
}
