/**
 * Audit quarters (product.md flow 1): a region's regional lead opens a
 * quarter, choosing the measure set and the submission deadline; practices
 * upload extracts to it; after the deadline it is closed. The review window
 * is derived (methods.md §1, reviewWindow in @cairn/metrics).
 */
import { HttpStatus, Inject, Injectable } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { formatQuarter, reviewWindow } from '@cairn/metrics';
import { QueryTypes, type Transaction } from 'sequelize';
import { Sequelize } from 'sequelize-typescript';
import { AuditTrailService } from '../audit-trail/audit-trail.service.js';
import type { Actor } from '../auth/actor.js';
import { ProblemException } from '../common/problem.js';
import type { CairnConfig } from '../config/config.schema.js';
import type { QuarterDto, QuarterStatus } from './dto/quarter.dto.js';
import { MeasureSetsService } from '../measure-sets/measure-sets.service.js';
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

/** The default deadline: a number of days after the last day of the quarter. */
export function defaultDeadline(year: number, quarter: number, days: number): string {
  const end = Date.UTC(year, quarter * 3, 0);
  return new Date(end + days * 86_400_000).toISOString().slice(0, 10);
}

const SELECT = `SELECT id, region_id, year, quarter, window_start, window_end, measure_set_id,
  DATE_FORMAT(submission_deadline, '%Y-%m-%d') AS submission_deadline, status, opened_at, closed_at
  FROM audit_quarters`;

@Injectable()
export class QuartersService {
  constructor(
    @Inject(Sequelize) private readonly sequelize: Sequelize,
    @Inject(ConfigService) private readonly config: ConfigService<CairnConfig, true>,
    @Inject(AuditTrailService) private readonly audit: AuditTrailService,
    @Inject(MeasureSetsService) private readonly measureSets: MeasureSetsService,
    @Inject(QuarterEvents) private readonly events: QuarterEvents,
  ) {}

  async list(regionId: number): Promise<QuarterDto[]> {
    const rows = await this.sequelize.query<DbQuarter>(
      `${SELECT} WHERE region_id = ? ORDER BY year DESC, quarter DESC`,
      { replacements: [regionId], type: QueryTypes.SELECT },
    );
    return rows.map(toQuarter);
  }

  async find(id: number, transaction?: Transaction): Promise<QuarterDto | null> {
    const [row] = await this.sequelize.query<DbQuarter>(`${SELECT} WHERE id = ?`, {
      replacements: [id],
      type: QueryTypes.SELECT,
      transaction,
    });
    return row ? toQuarter(row) : null;
  }

  /** The quarter, if it is in the caller's region; 404 otherwise. */
  async get(actor: Pick<Actor, 'regionId'>, id: number): Promise<QuarterDto> {
    const quarter = Number.isSafeInteger(id) ? await this.find(id) : null;
    if (!quarter || quarter.regionId !== actor.regionId) {
      throw new ProblemException(
        HttpStatus.NOT_FOUND,
        'quarter-not-found',
        'No such audit quarter',
        `There is no audit quarter ${id} in your region.`,
        { quarterId: id },
      );
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
    // An unknown version is refused before anything is written (422 naming the field).
    await this.measureSets.assertKnown(
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

  async setStatus(actor: Actor, id: number, status: QuarterStatus): Promise<QuarterDto> {
    const quarter = await this.get(actor, id);
    if (quarter.status === status) return quarter;
    await this.sequelize.transaction(async (transaction) => {
      await this.sequelize.query(
        `UPDATE audit_quarters SET status = ?, closed_at = ${status === 'closed' ? 'NOW(3)' : 'NULL'} WHERE id = ?`,
        { replacements: [status, id], type: QueryTypes.UPDATE, transaction },
      );
      await this.audit.append(
        {
          action: status === 'closed' ? 'quarter.closed' : 'quarter.reopened',
          summary: `${quarter.label} ${status === 'closed' ? 'closed to practice uploads' : 'reopened for submissions'}`,
          actor: { id: actor.id, label: actor.label },
          regionId: actor.regionId,
          subjectType: 'audit_quarter',
          subjectId: id,
        },
        transaction,
      );
    });
    return (await this.find(id))!;
  }
}
