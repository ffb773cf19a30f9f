import { HttpStatus, Inject, Injectable } from '@nestjs/common';
import { InjectModel } from '@nestjs/sequelize';
import { Op, QueryTypes, type Transaction, type WhereOptions } from 'sequelize';
import { Sequelize } from 'sequelize-typescript';
import { ProblemException } from '../common/problem.js';
import { OrganisationsService } from '../organisations/organisations.service.js';
import { PeopleNames } from '../users/people-names.js';
import type {
  AuditActionDto,
  AuditEventPageDto,
  ListAuditEventsQuery,
} from './dto/audit-event.dto.js';
import { AuditEvent, type AuditOutcome } from './models/audit-event.model.js';
import { ACTION_GROUP_LABELS, actionLabel } from './action-labels.js';

export interface AuditEntry {
  action: string;
  summary: string;
  outcome?: AuditOutcome;
  actor?: { id: number | null; label: string } | null;
  regionId?: number | null;
  practiceId?: number | null;
  subjectType?: string | null;
  subjectId?: string | number | null;
  detail?: Record<string, unknown> | null;
  requestId?: string | null;
  ipAddress?: string | null;
}

/** The audit trail: append and read, nothing else (the table refuses UPDATE and DELETE). */
@Injectable()
export class AuditTrailService {
  constructor(
    @InjectModel(AuditEvent) private readonly events: typeof AuditEvent,
    @Inject(OrganisationsService) private readonly organisations: OrganisationsService,
    @Inject(PeopleNames) private readonly people: PeopleNames,
    // The app's own connection, not the model's (shared by every app made in one process).
    @Inject(Sequelize) private readonly sequelize: Sequelize,
  ) {}

  /** Appends one event; pass the caller's transaction so the event commits with the change it records. */
  async append(entry: AuditEntry, transaction?: Transaction): Promise<AuditEvent> {
    return this.events.create(
      {
        occurredAt: new Date(),
        action: entry.action,
        outcome: entry.outcome ?? 'success',
        actorUserId: entry.actor?.id ?? null,
        actorLabel: entry.actor?.label ?? 'system',
        regionId: entry.regionId ?? null,
        practiceId: entry.practiceId ?? null,
        subjectType: entry.subjectType ?? null,
        subjectId: entry.subjectId == null ? null : String(entry.subjectId),
        summary: entry.summary.slice(0, 500),
        detail: entry.detail ?? null,
        requestId: entry.requestId ?? null,
        ipAddress: entry.ipAddress ?? null,
      },
      { transaction },
    );
  }

  /** One page of a region's audit trail (plus events tied to no region), newest first. */
  async browse(regionId: number, query: ListAuditEventsQuery): Promise<AuditEventPageDto> {
    const limit = query.limit ?? 100;
    const and: WhereOptions[] = [{ [Op.or]: [{ regionId }, { regionId: null }] }];
    if (query.action) {
      and.push(
        query.action.endsWith('.')
          ? { action: { [Op.like]: `${query.action.replace(/_/g, '\\_')}%` } }
          : { action: query.action },
      );
    }
    if (query.outcome) and.push({ outcome: query.outcome });
    if (query.practiceId) and.push({ practiceId: query.practiceId });
    if (query.before) and.push({ id: { [Op.lt]: query.before } });
    const from = query.from ? new Date(query.from) : null;
    const to = query.to ? endOf(query.to) : null;
    if (from && to && from > to) {
      throw new ProblemException(
        HttpStatus.BAD_REQUEST,
        'validation',
        'The request is not valid',
        'from must not be after to.',
        { errors: [{ field: 'from', message: 'must not be after to' }] },
      );
    }
    if (from) and.push({ occurredAt: { [Op.gte]: from } });
    if (to) and.push({ occurredAt: { [Op.lte]: to } });
    if (query.search) {
      const like = `%${query.search.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
      and.push({
        [Op.or]: [{ actorLabel: { [Op.like]: like } }, { summary: { [Op.like]: like } }],
      });
    }
    const rows = await this.events.findAll({
      where: { [Op.and]: and },
      order: [['id', 'DESC']],
      limit: limit + 1,
    });
    const page = rows.slice(0, limit);
    const practiceIds = [
      ...new Set(page.map((e) => e.practiceId).filter((id): id is number => id !== null)),
    ];
    const practices = await this.organisations.practiceRefs(practiceIds);
    const names = await this.people.byEmail(
      regionId,
      page.map((e) => e.actorLabel),
    );
    return {
      events: page.map((e) => ({
        id: Number(e.id),
        occurredAt: new Date(e.occurredAt).toISOString(),
        action: e.action,
        actionLabel: actionLabel(e.action),
        outcome: e.outcome,
        actorUserId: e.actorUserId,
        actorLabel: e.actorLabel,
        actorName: names.get(e.actorLabel) ?? null,
        practice: practices.find((p) => Number(p.id) === e.practiceId) ?? null,
        subjectType: e.subjectType,
        subjectId: e.subjectId,
        summary: e.summary,
        detail:
          typeof e.detail === 'string'
            ? (JSON.parse(e.detail) as Record<string, unknown>)
            : e.detail,
        requestId: e.requestId,
        ipAddress: e.ipAddress,
      })),
      nextBefore: rows.length > limit ? Number(page[page.length - 1]!.id) : null,
    };
  }

  async actions(regionId: number): Promise<AuditActionDto[]> {
    const rows = await this.sequelize.query<{ action: string; count: number }>(
      `SELECT action, COUNT(*) AS count FROM audit_events
        WHERE region_id = ? OR region_id IS NULL GROUP BY action ORDER BY action`,
      { replacements: [regionId], type: QueryTypes.SELECT },
    );
    return rows.map((r) => {
      const group = `${r.action.split('.')[0]}.`;
      return {
        action: r.action,
        label: actionLabel(r.action),
        group,
        groupLabel: ACTION_GROUP_LABELS[group] ?? 'Other',
        count: Number(r.count),
      };
    });
  }
}

/** A date alone ("2026-09-30") means up to the end of that day (UTC). */
function endOf(value: string): Date {
  return /^\d{4}-\d{2}-\d{2}$/.test(value) ? new Date(`${value}T23:59:59.999Z`) : new Date(value);
}
