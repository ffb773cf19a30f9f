/**
 * The regional lead's delivery page: per source (a quarter's opening message,
 * a quarter's reminders; later a report's digests) the messages' counts by
 * state, the failures with the server's reply, each message's recipient and
 * times; and sending failed messages again (an audit event each time).
 */
import { HttpStatus, Inject, Injectable } from '@nestjs/common';
import { AuditTrailService } from '../audit-trail/audit-trail.service.js';
import type { Actor } from '../auth/actor.js';
import { ProblemException } from '../common/problem.js';
import { OrganisationsService } from '../organisations/organisations.service.js';
import type { PracticeRefDto } from '../organisations/dto/practice.dto.js';
import type {
  DeliveryDetailDto,
  DeliveryMessageDto,
  DeliverySourceDto,
  DeliverySourceListDto,
  ResendResultDto,
} from './dto/mail.dto.js';
import { MailComposers } from './mail-composers.js';
import { isMailKind, type MailKind } from './mail-kinds.js';
import {
  type BatchSummary,
  OutboxRepository,
  type OutboxMessageRow,
  type SourceCounts,
} from './outbox.repository.js';
import { OutboxWorker } from './outbox-worker.service.js';

const iso = (value: Date | string | null) => (value ? new Date(value).toISOString() : null);

@Injectable()
export class DeliveriesService {
  constructor(
    @Inject(OutboxRepository) private readonly outbox: OutboxRepository,
    @Inject(MailComposers) private readonly composers: MailComposers,
    @Inject(OrganisationsService) private readonly organisations: OrganisationsService,
    @Inject(AuditTrailService) private readonly audit: AuditTrailService,
    @Inject(OutboxWorker) private readonly worker: OutboxWorker,
  ) {}

  async list(actor: Actor): Promise<DeliverySourceListDto> {
    const [counts, batches] = await Promise.all([
      this.outbox.sourceCounts(actor.regionId),
      this.outbox.batchSummaries(actor.regionId),
    ]);
    const key = (kind: string, sourceId: number) => `${kind}:${sourceId}`;
    const byKey = new Map(counts.map((c) => [key(c.kind, c.source_id), c]));
    // A source whose practices all had nobody to write to has batches but no messages.
    const sources = [
      ...counts.map((c) => ({ kind: c.kind, sourceId: c.source_id })),
      ...batches
        .filter((b) => !byKey.has(key(b.kind, b.source_id)))
        .map((b) => ({ kind: b.kind, sourceId: b.source_id })),
    ].filter((s): s is { kind: MailKind; sourceId: number } => isMailKind(s.kind));
    const dtos = await Promise.all(
      sources.map((s) =>
        this.sourceDto(
          actor.regionId,
          s.kind,
          s.sourceId,
          byKey.get(key(s.kind, s.sourceId)) ?? null,
          batches.find((b) => b.kind === s.kind && b.source_id === s.sourceId) ?? null,
        ),
      ),
    );
    return {
      sources: dtos.sort(
        (a, b) => b.firstQueuedAt.localeCompare(a.firstQueuedAt) || a.kind.localeCompare(b.kind),
      ),
    };
  }

  async detail(actor: Actor, kind: string, sourceId: number): Promise<DeliveryDetailDto> {
    if (!isMailKind(kind) || !Number.isSafeInteger(sourceId)) this.notFound(kind, sourceId);
    const only = { kind, sourceId };
    const [[counts], [batch]] = await Promise.all([
      this.outbox.sourceCounts(actor.regionId, only),
      this.outbox.batchSummaries(actor.regionId, only),
    ]);
    if (!counts && !batch) this.notFound(kind, sourceId);
    const [source, rows, without] = await Promise.all([
      this.sourceDto(actor.regionId, kind, sourceId, counts ?? null, batch ?? null),
      this.outbox.messagesOf(actor.regionId, kind, sourceId),
      this.outbox.practicesWithoutRecipients(actor.regionId, kind, sourceId),
    ]);
    const practices = new Map(
      (await this.organisations.practiceRefs([...rows.map((r) => r.practice_id), ...without])).map(
        (p) => [p.id, p],
      ),
    );
    return {
      source,
      messages: rows.map((row) => toMessageDto(row, practices)),
      practicesWithoutRecipients: without
        .map((id) => practices.get(id))
        .filter((p): p is PracticeRefDto => p !== undefined),
    };
  }

  /** Queues every failed message of a source again. */
  async resendFailed(actor: Actor, kind: string, sourceId: number): Promise<ResendResultDto> {
    const before = await this.detail(actor, kind, sourceId);
    const resent = await this.outbox.transaction(async (transaction) => {
      const n = await this.outbox.resendFailed(
        { regionId: actor.regionId, kind, sourceId },
        transaction,
      );
      if (n > 0) {
        await this.audit.append(
          {
            action: 'mail.resent',
            summary: `${actor.displayName} sent ${n} failed message${n === 1 ? '' : 's'} of the ${before.source.label} again`,
            actor: { id: actor.id, label: actor.label },
            regionId: actor.regionId,
            subjectType: 'mail_source',
            subjectId: `${kind}:${sourceId}`,
            detail: { kind, sourceId, messages: n },
            requestId: actor.requestId,
            ipAddress: actor.ipAddress,
          },
          transaction,
        );
      }
      return n;
    });
    if (resent === 0) {
      throw new ProblemException(
        HttpStatus.CONFLICT,
        'nothing-to-resend',
        'No failed messages',
        `The ${before.source.label} has no failed messages to send again.`,
      );
    }
    this.worker.kick();
    return { resent, delivery: await this.detail(actor, kind, sourceId) };
  }

  /** Queues one failed message again. */
  async resendMessage(actor: Actor, id: number): Promise<ResendResultDto> {
    const row = await this.outbox.find(id);
    if (!row || row.region_id !== actor.regionId || !isMailKind(row.kind)) {
      throw new ProblemException(
        HttpStatus.NOT_FOUND,
        'message-not-found',
        'No such message',
        `There is no message ${id} in your region's outbox.`,
      );
    }
    const label = await this.composers.get(row.kind).sourceLabel(row.source_id, row.region_id);
    const resent = await this.outbox.transaction(async (transaction) => {
      const n = await this.outbox.resendFailed({ regionId: actor.regionId, id }, transaction);
      if (n > 0) {
        await this.audit.append(
          {
            action: 'mail.resent',
            summary: `${actor.displayName} sent the failed ${label} to ${row.recipient_address} again`,
            actor: { id: actor.id, label: actor.label },
            regionId: actor.regionId,
            practiceId: row.practice_id,
            subjectType: 'outbox_message',
            subjectId: id,
            detail: { kind: row.kind, sourceId: row.source_id, recipient: row.recipient_address },
            requestId: actor.requestId,
            ipAddress: actor.ipAddress,
          },
          transaction,
        );
      }
      return n;
    });
    if (resent === 0) {
      throw new ProblemException(
        HttpStatus.CONFLICT,
        'message-not-failed',
        'Only failed messages can be sent again',
        `The message to ${row.recipient_address} is ${row.state}; only a failed message can be sent again.`,
        { state: row.state },
      );
    }
    this.worker.kick();
    return { resent, delivery: await this.detail(actor, row.kind, row.source_id) };
  }

  private notFound(kind: string, sourceId: number): never {
    throw new ProblemException(
      HttpStatus.NOT_FOUND,
      'delivery-not-found',
      'No such delivery',
      `Cairn has sent no ${isMailKind(kind) ? kind.replace('_', ' ') : `"${kind}"`} messages for ${sourceId} in your region.`,
    );
  }

  private async sourceDto(
    regionId: number,
    kind: MailKind,
    sourceId: number,
    counts: SourceCounts | null,
    batch: (BatchSummary & { first_at: Date }) | null,
  ): Promise<DeliverySourceDto> {
    const c = counts ?? { queued: 0, sending: 0, sent: 0, failed: 0 };
    const first = counts?.first_queued_at ?? batch?.first_at ?? new Date(0);
    return {
      kind,
      sourceId,
      label: await this.composers.get(kind).sourceLabel(sourceId, regionId),
      firstQueuedAt: new Date(first).toISOString(),
      lastActivityAt: new Date(counts?.last_activity_at ?? first).toISOString(),
      practices: batch?.practices ?? 0,
      practicesWithoutRecipients: batch?.practices_without_recipients ?? 0,
      counts: {
        queued: c.queued,
        sending: c.sending,
        sent: c.sent,
        failed: c.failed,
        total: c.queued + c.sending + c.sent + c.failed,
      },
      actions: { resendFailed: c.failed > 0 },
    };
  }
}

function toMessageDto(
  row: OutboxMessageRow,
  practices: Map<number, PracticeRefDto>,
): DeliveryMessageDto {
  return {
    id: Number(row.id),
    practice: practices.get(row.practice_id) ?? {
      id: row.practice_id,
      code: '',
      name: `Practice ${row.practice_id}`,
    },
    recipient: row.recipient_address,
    recipientName: row.recipient_name,
    state: row.state,
    attempts: row.attempts,
    resumed: row.resumed,
    queuedAt: iso(row.queued_at)!,
    nextAttemptAt: row.state === 'queued' ? iso(row.next_attempt_at) : null,
    lastAttemptAt: iso(row.last_attempt_at),
    sentAt: iso(row.sent_at),
    failedAt: iso(row.failed_at),
    lastError: row.last_error,
    lastReplyCode: row.last_reply_code,
    messageId: row.message_id,
    actions: { resend: row.state === 'failed' },
  };
}
