import { Injectable } from '@nestjs/common';
import { InjectModel } from '@nestjs/sequelize';
import type { Transaction } from 'sequelize';
import { AuditEvent, type AuditOutcome } from './models/audit-event.model.js';

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
  constructor(@InjectModel(AuditEvent) private readonly events: typeof AuditEvent) {}

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
}
