/**
 * The audit quarter's messages to practices:
 *  - quarter_opened: when the regional lead opens a quarter, each active
 *    practice's recipients learn its deadline and where the extract template
 *    is. Queued in the transaction that opens the quarter (QuarterEvents), so
 *    an opened quarter always has its messages and a refused opening has none.
 *    A quarter opened closed, or with its deadline already past, sends none.
 *  - deadline_reminder: from mail.reminders.daysBeforeDeadline days before an
 *    open quarter's deadline, practices without a current submission are
 *    reminded, once per practice and quarter (the outbox's batch key). Checked
 *    on a schedule (mail.reminders.checkCron, @nestjs/schedule), at start, and
 *    after a quarter opens; the mail_schedule lease lets one process at a time
 *    run the check, and the batch key holds even if two did.
 * Neither message could steer care, so neither carries the clinical caution.
 */
import { randomBytes } from 'node:crypto';
import { hostname } from 'node:os';
import {
  Inject,
  Injectable,
  Logger,
  type OnApplicationBootstrap,
  type OnModuleInit,
} from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { SchedulerRegistry } from '@nestjs/schedule';
import { CronJob } from 'cron';
import type { Transaction } from 'sequelize';
import { AuditTrailService } from '../audit-trail/audit-trail.service.js';
import { type Actor, systemActor } from '../auth/actor.js';
import type { CairnConfig } from '../config/config.schema.js';
import { OrganisationsService } from '../organisations/organisations.service.js';
import type { QuarterDto } from '../quarters/dto/quarter.dto.js';
import { QuarterEvents } from '../quarters/quarter-events.js';
import { QuartersService } from '../quarters/quarters.service.js';
import { SubmissionsService } from '../submissions/submissions.service.js';
import { type ComposedMail, CompositionError, MailComposers } from './mail-composers.js';
import { type MailBlock, renderMail } from './mail-layout.js';
import { MAIL_KIND_INFO, type MailKind } from './mail-kinds.js';
import { MailTablesRepository } from './mail-tables.repository.js';
import type { OutboxMessageRow } from './outbox.repository.js';
import { OutboxService } from './outbox.service.js';
import { RecipientsService } from './recipients.service.js';
import { reminderDue, todayUtc } from './reminder-rule.js';

export const REMINDER_JOB = 'deadline-reminders';

const longDate = new Intl.DateTimeFormat('en-GB', {
  weekday: 'long',
  day: 'numeric',
  month: 'long',
  year: 'numeric',
  timeZone: 'UTC',
});
const monthYear = new Intl.DateTimeFormat('en-GB', {
  month: 'long',
  year: 'numeric',
  timeZone: 'UTC',
});

/** "Wednesday 16 December 2026" */
export function formatDeadline(date: string): string {
  const parts = Object.fromEntries(
    longDate.formatToParts(new Date(`${date}T00:00:00Z`)).map((p) => [p.type, p.value]),
  );
  return `${parts.weekday} ${parts.day} ${parts.month} ${parts.year}`;
}
/** "October 2025 to September 2026" */
export const formatWindow = (start: string, end: string) =>
  `${monthYear.format(new Date(`${start}-01T00:00:00Z`))} to ${monthYear.format(new Date(`${end}-01T00:00:00Z`))}`;

export interface ReminderCheck {
  /** Quarters whose reminder window is open */
  quarters: number;
  /** Practices reminded now (not reminded before) */
  practices: number;
  messages: number;
}

@Injectable()
export class QuarterMailService implements OnModuleInit, OnApplicationBootstrap {
  private readonly logger = new Logger('QuarterMail');
  private readonly owner = `${hostname().slice(0, 30)}:${process.pid}:${randomBytes(3).toString('hex')}`;

  constructor(
    @Inject(QuarterEvents) private readonly quarterEvents: QuarterEvents,
    @Inject(QuartersService) private readonly quarters: QuartersService,
    @Inject(OrganisationsService) private readonly organisations: OrganisationsService,
    @Inject(SubmissionsService) private readonly submissions: SubmissionsService,
    @Inject(RecipientsService) private readonly recipients: RecipientsService,
    @Inject(OutboxService) private readonly outbox: OutboxService,
    @Inject(MailComposers) private readonly composers: MailComposers,
    @Inject(MailTablesRepository) private readonly tables: MailTablesRepository,
    @Inject(AuditTrailService) private readonly audit: AuditTrailService,
    @Inject(SchedulerRegistry) private readonly scheduler: SchedulerRegistry,
    @Inject(ConfigService) private readonly config: ConfigService<CairnConfig, true>,
  ) {}

  onModuleInit(): void {
    this.quarterEvents.onOpened((quarter, actor, transaction) =>
      this.queueOpening(quarter, actor, transaction),
    );
    const label = (noun: string) => async (quarterId: number) => {
      const quarter = await this.quarters.find(quarterId);
      return `${quarter?.label ?? `Quarter ${quarterId}`} ${noun}`;
    };
    this.composers.register('quarter_opened', {
      sourceLabel: label(MAIL_KIND_INFO.quarter_opened.sourceNoun),
      compose: (row) => this.compose('quarter_opened', row),
    });
    this.composers.register('deadline_reminder', {
      sourceLabel: label(MAIL_KIND_INFO.deadline_reminder.sourceNoun),
      compose: (row) => this.compose('deadline_reminder', row),
    });
  }

  onApplicationBootstrap(): void {
    const job = CronJob.from({
      cronTime: this.config.get('mail', { infer: true }).reminders.checkCron,
      onTick: () => void this.runReminderCheck(),
      start: true,
      timeZone: 'UTC',
    });
    this.scheduler.addCronJob(REMINDER_JOB, job);
    // And once soon after start: a process started after a missed tick catches up.
    setTimeout(() => void this.runReminderCheck(), 2000).unref();
  }

  // ── the opening message ──

  private async queueOpening(
    quarter: QuarterDto,
    actor: Actor,
    transaction: Transaction,
  ): Promise<void> {
    if (quarter.status !== 'open' || quarter.submissionDeadline < todayUtc()) return;
    const practices = await this.organisations.regionPractices(quarter.regionId, {
      activeOnly: true,
      transaction,
    });
    const recipients = await this.recipients.forPractices(
      practices.map((p) => p.id),
      'quarter_opened',
    );
    let messages = 0;
    for (const practice of practices) {
      messages +=
        (await this.outbox.queue(
          {
            kind: 'quarter_opened',
            sourceId: quarter.id,
            regionId: quarter.regionId,
            practiceId: practice.id,
            recipients: recipients.get(practice.id) ?? [],
          },
          transaction,
        )) ?? 0;
    }
    await this.audit.append(
      {
        action: 'mail.queued',
        summary: `${quarter.label} opening message queued for ${practices.length} practices (${messages} recipients)`,
        actor: { id: actor.id, label: actor.label },
        regionId: quarter.regionId,
        subjectType: 'audit_quarter',
        subjectId: quarter.id,
        detail: { kind: 'quarter_opened', practices: practices.length, messages },
        requestId: actor.requestId,
        ipAddress: actor.ipAddress,
      },
      transaction,
    );
    // A quarter opened close to its deadline is due its reminders at once.
    transaction.afterCommit(() => void this.runReminderCheck());
  }

  // ── reminders ──

  /** Runs the reminder check unless another process is running it; null when it did not run. */
  async runReminderCheck(now = new Date()): Promise<ReminderCheck | null> {
    try {
      if (!(await this.tables.claimJob(REMINDER_JOB, this.owner, 300))) return null;
    } catch (error) {
      this.logger.warn({ err: error }, 'could not claim the reminder check; will try again');
      return null;
    }
    let outcome = 'failed';
    try {
      const result = await this.queueReminders(todayUtc(now));
      outcome = `${result.quarters} quarters due, ${result.practices} practices reminded, ${result.messages} messages`;
      return result;
    } catch (error) {
      outcome = `failed: ${(error as Error).message}`;
      this.logger.error({ err: error }, 'reminder check failed');
      return null;
    } finally {
      await this.tables.releaseJob(REMINDER_JOB, this.owner, outcome).catch(() => undefined);
    }
  }

  /** Queues the reminders due on `today` that were not queued before. */
  async queueReminders(today: string): Promise<ReminderCheck> {
    const days = this.config.get('mail', { infer: true }).reminders.daysBeforeDeadline;
    const due = (await this.quarters.openQuarters()).filter((q) =>
      reminderDue(q.submissionDeadline, today, days),
    );
    const result: ReminderCheck = { quarters: due.length, practices: 0, messages: 0 };
    for (const quarter of due) {
      const system = systemActor('deadline reminders', quarter.regionId);
      const coverage = await this.submissions.coverage(system, quarter.id);
      const without = coverage.practices.filter((p) => p.current === null).map((p) => p.practice);
      if (without.length === 0) continue;
      const recipients = await this.recipients.forPractices(
        without.map((p) => p.id),
        'deadline_reminder',
      );
      await this.outbox.transaction(async (transaction) => {
        let practices = 0;
        let messages = 0;
        for (const practice of without) {
          const queued = await this.outbox.queue(
            {
              kind: 'deadline_reminder',
              sourceId: quarter.id,
              regionId: quarter.regionId,
              practiceId: practice.id,
              recipients: recipients.get(practice.id) ?? [],
            },
            transaction,
          );
          if (queued === null) continue;
          practices++;
          messages += queued;
        }
        if (practices === 0) return;
        await this.audit.append(
          {
            action: 'mail.queued',
            summary: `${quarter.label} deadline reminders queued for ${practices} practices without a current submission (${messages} recipients)`,
            actor: { id: null, label: system.label },
            regionId: quarter.regionId,
            subjectType: 'audit_quarter',
            subjectId: quarter.id,
            detail: { kind: 'deadline_reminder', practices, messages, today },
          },
          transaction,
        );
        result.practices += practices;
        result.messages += messages;
      });
    }
    return result;
  }

  // ── what the messages say ──

  private async compose(kind: MailKind, row: OutboxMessageRow): Promise<ComposedMail> {
    const [quarter, practice] = await Promise.all([
      this.quarters.find(row.source_id),
      this.organisations.practice(row.practice_id),
    ]);
    if (!quarter) throw new CompositionError(`audit quarter ${row.source_id} no longer exists`);
    if (!practice) throw new CompositionError(`practice ${row.practice_id} no longer exists`);
    const region = await this.organisations.region(quarter.regionId);
    const publicUrl = this.config.get('server', { infer: true }).publicUrl;
    const link = (path: string) => new URL(path, publicUrl).href;
    const deadline = formatDeadline(quarter.submissionDeadline);
    const practiceName = `${practice.name} (${practice.code})`;
    const facts: MailBlock = {
      type: 'facts',
      rows: [
        { label: 'Practice', value: practiceName },
        { label: 'Audit quarter', value: quarter.label },
        { label: 'Review window', value: formatWindow(quarter.windowStart, quarter.windowEnd) },
        { label: 'Submission deadline', value: deadline },
      ],
    };
    const actions: MailBlock[] = [
      {
        type: 'action',
        label: 'Download the extract template (XLSX)',
        url: link('/api/extracts/template.xlsx'),
        note: 'The template holds no data; no sign-in is needed to download it.',
      },
      {
        type: 'action',
        label: 'Upload your extract',
        url: link('/extracts/upload'),
        note: 'Cairn asks you to sign in first. This link carries no data.',
      },
    ];
    const footer = row.recipient_user_id
      ? [
          `You receive this as a practice lead of ${practice.name}.`,
          `To stop these messages, change your mail preferences on your Cairn profile: ${link('/profile')}`,
        ]
      : [
          `You receive this because the regional lead added your address to the mail recipients of ${practice.name}.`,
          'To stop these messages, ask the regional lead to remove it.',
        ];
    footer.push('This message holds no patient data.');
    const greeting = row.recipient_name ? `Dear ${row.recipient_name},` : 'Hello,';
    const rendered =
      kind === 'quarter_opened'
        ? renderMail({
            subject: `${quarter.label} is open for submissions (deadline ${deadline})`,
            preheader: `Send ${practice.name}'s ${quarter.label} extract by ${deadline}.`,
            regionName: region?.name ?? '',
            greeting,
            blocks: [
              {
                type: 'paragraph',
                text: `The audit quarter ${quarter.label} is now open. Please send ${practiceName}'s de-identified annual-review extract by ${deadline}.`,
              },
              facts,
              ...actions,
              {
                type: 'paragraph',
                text: 'Cairn checks each extract as soon as it arrives and explains anything it cannot accept. Your submission counts once you confirm it.',
              },
            ],
            footer,
          })
        : renderMail({
            subject: `Reminder: ${practice.name} has no ${quarter.label} submission yet (deadline ${deadline})`,
            preheader: `The ${quarter.label} deadline is ${deadline}.`,
            regionName: region?.name ?? '',
            greeting,
            blocks: [
              {
                type: 'paragraph',
                text: `When this reminder was prepared, ${practiceName} had no current submission for the audit quarter ${quarter.label}. The deadline is ${deadline}.`,
              },
              facts,
              ...actions,
              {
                type: 'paragraph',
                text: 'If you have uploaded an extract already, check that you confirmed it: an extract counts once it is confirmed. If you have sent it since this reminder was prepared, thank you; there is nothing more to do.',
              },
            ],
            footer,
          });
    return { subject: rendered.subject, html: rendered.html, text: rendered.text };
  }
}
