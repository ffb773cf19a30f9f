/**
 * Who receives a practice's mail: its active practice leads (the users module
 * says who they are), less those who chose not to receive that kind on their
 * profile, plus the extra addresses the regional lead added to the practice.
 * An address of a lead who opted out is never written to, even if it is also
 * listed as an extra. Adding and removing extra addresses: regional lead,
 * with an audit event each.
 */
import { HttpStatus, Inject, Injectable } from '@nestjs/common';
import { AuditTrailService } from '../audit-trail/audit-trail.service.js';
import type { Actor } from '../auth/actor.js';
import { ProblemException } from '../common/problem.js';
import { OrganisationsService } from '../organisations/organisations.service.js';
import { UsersService } from '../users/users.service.js';
import type {
  AddExtraRecipientDto,
  MailRecipientsDto,
  PracticeRecipientsDto,
} from './dto/mail.dto.js';
import { isMailKind } from './mail-kinds.js';
import { type ExtraRecipientRow, MailTablesRepository } from './mail-tables.repository.js';
import type { Recipient } from './outbox.repository.js';

export const MAX_EXTRAS_PER_PRACTICE = 20;

@Injectable()
export class RecipientsService {
  constructor(
    @Inject(UsersService) private readonly users: UsersService,
    @Inject(OrganisationsService) private readonly organisations: OrganisationsService,
    @Inject(MailTablesRepository) private readonly tables: MailTablesRepository,
    @Inject(AuditTrailService) private readonly audit: AuditTrailService,
  ) {}

  /** The recipients of a message of `kind` for each of these practices. */
  async forPractices(
    practiceIds: readonly number[],
    kind: string,
  ): Promise<Map<number, Recipient[]>> {
    const [leads, extras] = await Promise.all([
      this.users.practiceLeadsOf(practiceIds),
      this.tables.extraRecipients(practiceIds),
    ]);
    const optedOut = new Set(
      leads.filter((l) => l.mailOptOuts.includes(kind)).map((l) => l.email.toLowerCase()),
    );
    const result = new Map<number, Recipient[]>(practiceIds.map((id) => [id, []]));
    for (const lead of leads) {
      if (lead.mailOptOuts.includes(kind)) continue;
      result.get(lead.practiceId)?.push({
        address: lead.email.toLowerCase(),
        name: lead.displayName,
        userId: lead.userId,
      });
    }
    for (const extra of extras) {
      if (optedOut.has(extra.address)) continue;
      result.get(extra.practice_id)?.push({ address: extra.address, name: null, userId: null });
    }
    return result;
  }

  // ── the regional lead's recipients page ──

  async list(actor: Actor): Promise<MailRecipientsDto> {
    const practices = await this.organisations.regionPractices(actor.regionId, {
      activeOnly: true,
    });
    const ids = practices.map((p) => p.id);
    const [leads, extras] = await Promise.all([
      this.users.practiceLeadsOf(ids),
      this.tables.extraRecipients(ids),
    ]);
    return {
      practices: practices.map((p): PracticeRecipientsDto => {
        const own = extras.filter((e) => e.practice_id === p.id);
        return {
          practice: { id: p.id, code: p.code, name: p.name, localityName: p.localityName },
          leads: leads
            .filter((l) => l.practiceId === p.id)
            .map((l) => ({
              userId: l.userId,
              displayName: l.displayName,
              email: l.email,
              optedOut: l.mailOptOuts.filter(isMailKind),
            })),
          extras: own.map(toExtraDto),
          actions: { addRecipient: own.length < MAX_EXTRAS_PER_PRACTICE },
        };
      }),
      maxExtrasPerPractice: MAX_EXTRAS_PER_PRACTICE,
    };
  }

  /** One practice's recipients, as the recipients page shows them. */
  async ofPractice(actor: Actor, practiceId: number): Promise<PracticeRecipientsDto> {
    await this.practiceOf(actor, practiceId);
    const found = (await this.list(actor)).practices.find((p) => p.practice.id === practiceId);
    return found!;
  }

  private async practiceOf(actor: Actor, practiceId: number) {
    const practice = await this.organisations.practice(practiceId);
    if (!practice || practice.regionId !== actor.regionId) {
      throw new ProblemException(
        HttpStatus.NOT_FOUND,
        'practice-not-found',
        'No such practice',
        `There is no practice ${practiceId} in your region.`,
      );
    }
    if (!practice.active) {
      throw new ProblemException(
        HttpStatus.CONFLICT,
        'practice-inactive',
        'Practice no longer active',
        `${practice.name} (${practice.code}) is no longer active; Cairn sends it no mail.`,
      );
    }
    return practice;
  }

  async add(
    actor: Actor,
    practiceId: number,
    input: AddExtraRecipientDto,
  ): Promise<PracticeRecipientsDto> {
    const practice = await this.practiceOf(actor, practiceId);
    const address = input.address.trim().toLowerCase();
    const note = input.note?.trim() || null;
    const lead = (await this.users.practiceLeadsOf([practiceId])).find(
      (l) => l.email.toLowerCase() === address,
    );
    if (lead) {
      throw new ProblemException(
        HttpStatus.CONFLICT,
        'recipient-is-lead',
        'Already a recipient as practice lead',
        `${address} belongs to ${lead.displayName}, a lead of ${practice.name}, who receives its mail already (and chooses which kinds on their profile).`,
        { errors: [{ field: 'address', message: 'belongs to a lead of this practice' }] },
      );
    }
    await this.tables.transaction(async (transaction) => {
      const existing = await this.tables.lockedExtraRecipients(practiceId, transaction);
      if (existing.some((e) => e.address === address)) {
        throw new ProblemException(
          HttpStatus.CONFLICT,
          'recipient-exists',
          'Already a recipient',
          `${address} already receives ${practice.name}'s mail.`,
          { errors: [{ field: 'address', message: 'is already a recipient of this practice' }] },
        );
      }
      if (existing.length >= MAX_EXTRAS_PER_PRACTICE) {
        throw new ProblemException(
          HttpStatus.UNPROCESSABLE_ENTITY,
          'too-many-recipients',
          'Too many extra addresses',
          `${practice.name} has ${existing.length} extra addresses, the most a practice may have. Remove one first.`,
          {
            errors: [
              { field: 'address', message: `at most ${MAX_EXTRAS_PER_PRACTICE} per practice` },
            ],
          },
        );
      }
      const id = await this.tables.addExtraRecipient(
        { practiceId, address, note, addedBy: { id: actor.id, label: actor.label } },
        transaction,
      );
      await this.audit.append(
        {
          action: 'mail_recipient.added',
          summary: `${actor.displayName} added ${address} to the mail recipients of ${practice.name} (${practice.code})`,
          actor: { id: actor.id, label: actor.label },
          regionId: actor.regionId,
          practiceId,
          subjectType: 'mail_recipient',
          subjectId: id,
          detail: { address, note },
          requestId: actor.requestId,
          ipAddress: actor.ipAddress,
        },
        transaction,
      );
    });
    return this.ofPractice(actor, practiceId);
  }

  async remove(
    actor: Actor,
    practiceId: number,
    recipientId: number,
  ): Promise<PracticeRecipientsDto> {
    const practice = await this.practiceOf(actor, practiceId);
    await this.tables.transaction(async (transaction) => {
      const existing = await this.tables.lockedExtraRecipients(practiceId, transaction);
      const found = existing.find((e) => e.id === recipientId);
      if (!found) {
        throw new ProblemException(
          HttpStatus.NOT_FOUND,
          'recipient-not-found',
          'No such recipient',
          `${practice.name} has no extra mail recipient ${recipientId}.`,
        );
      }
      await this.tables.removeExtraRecipient(practiceId, recipientId, transaction);
      await this.audit.append(
        {
          action: 'mail_recipient.removed',
          summary: `${actor.displayName} removed ${found.address} from the mail recipients of ${practice.name} (${practice.code})`,
          actor: { id: actor.id, label: actor.label },
          regionId: actor.regionId,
          practiceId,
          subjectType: 'mail_recipient',
          subjectId: recipientId,
          detail: { address: found.address },
          requestId: actor.requestId,
          ipAddress: actor.ipAddress,
        },
        transaction,
      );
    });
    return this.ofPractice(actor, practiceId);
  }
}

function toExtraDto(row: ExtraRecipientRow) {
  return {
    id: row.id,
    address: row.address,
    note: row.note,
    addedBy: row.added_by_label,
    addedAt: new Date(row.created_at).toISOString(),
    actions: { remove: true },
  };
}
