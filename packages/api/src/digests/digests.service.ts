/**
 * Practices' digests: composed from a report's practice parts (DigestSource)
 * by composeDigest, previewed by the regional lead exactly as sent, sent as a
 * test to the regional lead alone, then queued for every practice of the
 * report (at once, or at a time stored in digest_schedules and sent by a
 * scheduled check through @nestjs/schedule, one process at a time under the
 * mail_schedule lease). Messages go through the outbox (kind `digest`, source
 * = the report), once per practice and recipient; recipients are the
 * practice's active leads who did not opt out on their profile and the extra
 * addresses the regional lead added.
 *
 * Composition is cached per (report, its publication time, practice): a
 * report is immutable, so its digests for a practice are the same every time.
 */
import { randomBytes } from 'node:crypto';
import { hostname } from 'node:os';
import {
  HttpStatus,
  Inject,
  Injectable,
  Logger,
  type OnApplicationBootstrap,
  type OnModuleInit,
} from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { SchedulerRegistry } from '@nestjs/schedule';
import { CronJob } from 'cron';
import { AuditTrailService } from '../audit-trail/audit-trail.service.js';
import { type Actor, systemActor } from '../auth/actor.js';
import { practiceDto } from '../benchmarks/benchmarks.service.js';
import { ProblemException } from '../common/problem.js';
import type { CairnConfig } from '../config/config.schema.js';
import { type ComposedMail, CompositionError, MailComposers } from '../mail/mail-composers.js';
import { MailTransport } from '../mail/mail-transport.js';
import { messageIdHost } from '../mail/outbox-policy.js';
import { type OutboxMessageRow, OutboxService, type Recipient } from '../mail/outbox.service.js';
import { mailOptions } from '../mail/outbox-worker.service.js';
import { RecipientsService } from '../mail/recipients.service.js';
import {
  CLINICAL_CAUTION,
  OrganisationsService,
  type PracticeInfo,
} from '../organisations/organisations.service.js';
import { QuarterReports } from '../quarters/quarter-reports.js';
import { QuartersService } from '../quarters/quarters.service.js';
import { composeDigest } from './digest-compose.js';
import { dataQualityFlags, digestMeasures } from './digest-from-results.js';
import type { DigestInput, DigestRecipient } from './digest-input.js';
import { DigestSchedulesRepository } from './digest-schedules.repository.js';
import {
  type DataPack,
  DIGEST_SOURCE,
  type DigestReport,
  type DigestSource,
} from './digest-source.js';
import type {
  DigestPreviewDto,
  DigestReportRefDto,
  DigestScheduleDto,
  DigestSendResultDto,
  DigestTestSendDto,
} from './dto/digest.dto.js';
import { OpenReviewCases } from './review-case-counts.js';

export const DIGEST_KIND = 'digest';
export const DIGEST_SCHEDULE_JOB = 'digest-schedules';
/** Reports published longer ago than this are not scheduled on their own (older ones: by hand). */
const PUBLICATION_LOOKBACK_MS = 7 * 86_400_000;
const CACHE_LIMIT = 256;
const YEAR_MS = 366 * 86_400_000;

interface PracticePart {
  input: Omit<DigestInput, 'openReviewCases'>;
  /** None for a practice without figures in the report */
  dataPack: DataPack | null;
}

@Injectable()
export class DigestsService implements OnModuleInit, OnApplicationBootstrap {
  private readonly logger = new Logger('Digests');
  private readonly owner = `${hostname().slice(0, 30)}:${process.pid}:${randomBytes(3).toString('hex')}`;
  /** Practice parts by report, publication time and practice (immutable content) */
  private readonly parts = new Map<string, Promise<PracticePart>>();

  constructor(
    @Inject(DIGEST_SOURCE) private readonly source: DigestSource,
    @Inject(OpenReviewCases) private readonly reviewCases: OpenReviewCases,
    @Inject(MailComposers) private readonly composers: MailComposers,
    @Inject(OutboxService) private readonly outbox: OutboxService,
    @Inject(RecipientsService) private readonly recipients: RecipientsService,
    @Inject(OrganisationsService) private readonly organisations: OrganisationsService,
    @Inject(QuartersService) private readonly quarters: QuartersService,
    @Inject(QuarterReports) private readonly quarterReports: QuarterReports,
    @Inject(MailTransport) private readonly transport: MailTransport,
    @Inject(DigestSchedulesRepository) private readonly schedules: DigestSchedulesRepository,
    @Inject(AuditTrailService) private readonly audit: AuditTrailService,
    @Inject(SchedulerRegistry) private readonly scheduler: SchedulerRegistry,
    @Inject(ConfigService) private readonly config: ConfigService<CairnConfig, true>,
  ) {}

  onModuleInit(): void {
    this.composers.register(DIGEST_KIND, {
      sourceLabel: async (id, regionId) =>
        `${(await this.source.report(id, regionId))?.label ?? `Report ${id}`} digests`,
      compose: (row) => this.composeRow(row),
    });
  }

  onApplicationBootstrap(): void {
    const job = CronJob.from({
      cronTime: this.config.get('mail', { infer: true }).digests.checkCron,
      onTick: () => void this.runScheduled(),
      start: true,
      timeZone: 'UTC',
    });
    this.scheduler.addCronJob(DIGEST_SCHEDULE_JOB, job);
  }

  // ── composing ──

  private link(path: string): string {
    return new URL(path, this.config.get('server', { infer: true }).publicUrl).href;
  }

  private async report(id: number, regionId: number): Promise<DigestReport> {
    const report = await this.source.report(id, regionId);
    if (!report)
      throw new ProblemException(
        HttpStatus.NOT_FOUND,
        'digest-source-not-found',
        `No such ${this.source.noun}`,
        `There is no ${this.source.noun} ${id} in your region to make digests from.`,
      );
    return report;
  }

  private async practice(report: DigestReport, practiceId: number): Promise<PracticeInfo> {
    const practice = await this.organisations.practice(practiceId);
    if (
      !practice ||
      practice.regionId !== report.regionId ||
      !report.practiceIds.includes(practiceId)
    )
      throw new ProblemException(
        HttpStatus.NOT_FOUND,
        'practice-not-in-report',
        'The practice has no part in this report',
        `Practice ${practiceId} is not one of the ${report.practiceIds.length} practices of ${report.label}.`,
      );
    return practice;
  }

  /** The practice's part of the report: its digest content (less review cases) and data pack. */
  private part(report: DigestReport, practice: PracticeInfo): Promise<PracticePart> {
    const key = `${report.id}:${report.publishedAt}:${practice.id}`;
    let part = this.parts.get(key);
    if (!part) {
      part = this.makePart(report, practice);
      part.catch(() => this.parts.delete(key));
      if (this.parts.size >= CACHE_LIMIT) this.parts.delete(this.parts.keys().next().value!);
      this.parts.set(key, part);
    }
    return part;
  }

  private async makePart(report: DigestReport, practice: PracticeInfo): Promise<PracticePart> {
    const results = await this.source.practiceResults(report, practice.id);
    const region = await this.organisations.region(report.regionId);
    const paths = this.source.paths(report, practice.id);
    const input: PracticePart['input'] = {
      region: { name: region?.name ?? '' },
      practice: { id: practice.id, code: practice.code, name: practice.name },
      quarter: { id: report.quarterId, label: report.quarterLabel },
      report: { id: report.id, label: report.label, publishedAt: report.publishedAt },
      state: results ? 'results' : 'no-current-submission',
      measures: results ? digestMeasures(results) : [],
      dataQualityFlags: results ? dataQualityFlags(results) : 0,
      caution: results?.caution || CLINICAL_CAUTION,
      links: {
        report: this.link(paths.report),
        recallLists: this.link(paths.recallLists),
        reviewCases: this.link(`/review-cases?practice=${practice.id}`),
        profile: this.link('/profile'),
      },
    };
    return { input, dataPack: results ? await this.source.dataPack(report, practice.id) : null };
  }

  private async compose(
    report: DigestReport,
    practice: PracticeInfo,
    recipient: DigestRecipient,
  ): Promise<ComposedMail> {
    const [part, openReviewCases] = await Promise.all([
      this.part(report, practice),
      this.reviewCases.count(practice.id, report.regionId),
    ]);
    const mail = composeDigest({ ...part.input, openReviewCases }, recipient);
    return { ...mail, attachments: part.dataPack ? [{ ...part.dataPack }] : [] };
  }

  private async composeRow(row: OutboxMessageRow): Promise<ComposedMail> {
    const report = await this.source.report(row.source_id, row.region_id);
    if (!report)
      throw new CompositionError(`${this.source.noun} ${row.source_id} no longer exists`);
    const practice = await this.organisations.practice(row.practice_id);
    if (!practice) throw new CompositionError(`practice ${row.practice_id} no longer exists`);
    return this.compose(report, practice, {
      name: row.recipient_name,
      isUser: row.recipient_user_id !== null,
    });
  }

  private reportRef(report: DigestReport): DigestReportRefDto {
    return {
      id: report.id,
      label: report.label,
      quarterId: report.quarterId,
      quarterLabel: report.quarterLabel,
      publishedAt: report.publishedAt,
      practices: report.practiceIds.length,
    };
  }

  async list(actor: Actor): Promise<DigestReportRefDto[]> {
    return (await this.source.list(actor.regionId)).map((r) => this.reportRef(r));
  }

  // ── preview and test ──

  async preview(actor: Actor, reportId: number, practiceId: number): Promise<DigestPreviewDto> {
    const report = await this.report(reportId, actor.regionId);
    const practice = await this.practice(report, practiceId);
    const recipients =
      (await this.recipients.forPractices([practiceId], DIGEST_KIND)).get(practiceId) ?? [];
    const first = recipients[0] ?? null;
    const mail = await this.compose(report, practice, recipientOf(first));
    const pack = mail.attachments?.[0] ?? null;
    return {
      report: this.reportRef(report),
      practice: practiceDto(practice),
      addressedTo: first ? recipientDto(first) : null,
      recipients: recipients.map(recipientDto),
      from: this.config.get('mail', { infer: true }).from,
      subject: mail.subject,
      text: mail.text,
      htmlPath: `/api/digests/${report.id}/practices/${practiceId}/preview.html`,
      attachment: pack
        ? { filename: pack.filename, contentType: pack.contentType, bytes: pack.content.length }
        : null,
      reviewCasesCounted: this.reviewCases.registered,
    };
  }

  /** The HTML part alone, exactly as the first recipient receives it. */
  async previewHtml(actor: Actor, reportId: number, practiceId: number): Promise<string> {
    const report = await this.report(reportId, actor.regionId);
    const practice = await this.practice(report, practiceId);
    const recipients =
      (await this.recipients.forPractices([practiceId], DIGEST_KIND)).get(practiceId) ?? [];
    return (await this.compose(report, practice, recipientOf(recipients[0] ?? null))).html;
  }

  /**
   * Sends the practice's digest to the regional lead alone, now, addressed to them (not
   * through the outbox: nothing is recorded as sent to the practice).
   */
  async sendTest(actor: Actor, reportId: number, practiceId: number): Promise<DigestTestSendDto> {
    const report = await this.report(reportId, actor.regionId);
    const practice = await this.practice(report, practiceId);
    const mail = await this.compose(report, practice, { name: actor.displayName, isUser: true });
    const settings = this.config.get('mail', { infer: true });
    const publicUrl = this.config.get('server', { infer: true }).publicUrl;
    const messageId = `<digest-test-${randomBytes(8).toString('hex')}.region-${report.regionId}@${messageIdHost(publicUrl)}>`;
    const options = mailOptions(
      testRow(actor, messageId),
      { ...mail, subject: `Test: ${mail.subject}` },
      { from: settings.from, publicUrl },
    );
    try {
      const reply = await this.transport.send(options);
      await this.audit.append({
        action: 'mail.digest_test_sent',
        summary: `${actor.displayName} sent themselves a test of ${practice.code}'s digest of ${report.label}`,
        actor: { id: actor.id, label: actor.label },
        regionId: report.regionId,
        subjectType: 'practice',
        subjectId: practice.id,
        detail: { sourceId: report.id, messageId },
        requestId: actor.requestId,
        ipAddress: actor.ipAddress,
      });
      return { to: actor.label, messageId, reply: reply.response };
    } catch (error) {
      const reply = (error as { response?: string }).response ?? (error as Error).message;
      throw new ProblemException(
        HttpStatus.BAD_GATEWAY,
        'mail-server-refused',
        'The mail server did not take the test message',
        `Sending to ${actor.label} failed: ${reply}`,
      );
    }
  }

  // ── sending ──

  /** Queues every practice's digests for a report; practices queued before are left alone. */
  async sendAll(actor: Actor, reportId: number): Promise<DigestSendResultDto> {
    const report = await this.report(reportId, actor.regionId);
    const recipients = await this.recipients.forPractices(report.practiceIds, DIGEST_KIND);
    return this.outbox.transaction(async (transaction) => {
      let practices = 0;
      let messages = 0;
      let alreadyQueued = 0;
      for (const practiceId of report.practiceIds) {
        const queued = await this.outbox.queue(
          {
            kind: DIGEST_KIND,
            sourceId: report.id,
            regionId: report.regionId,
            practiceId,
            recipients: recipients.get(practiceId) ?? [],
          },
          transaction,
        );
        if (queued === null) alreadyQueued++;
        else {
          practices++;
          messages += queued;
        }
      }
      if (practices > 0)
        await this.audit.append(
          {
            action: 'mail.queued',
            summary: `${report.label} digests queued for ${practices} practices (${messages} recipients)`,
            actor: { id: actor.id, label: actor.label },
            regionId: report.regionId,
            subjectType: 'audit_quarter',
            subjectId: report.quarterId,
            detail: { kind: DIGEST_KIND, sourceId: report.id, practices, messages },
            requestId: actor.requestId,
            ipAddress: actor.ipAddress,
          },
          transaction,
        );
      return { report: this.reportRef(report), practices, messages, alreadyQueued };
    });
  }

  // ── scheduled sending ──

  async scheduleOf(actor: Actor, reportId: number): Promise<DigestScheduleDto> {
    const report = await this.report(reportId, actor.regionId);
    const row = await this.schedules.find(report.id);
    return {
      report: this.reportRef(report),
      state: row?.state ?? 'none',
      sendAt: row ? row.send_at.toISOString() : null,
      scheduledBy: row?.scheduled_by_label ?? null,
      ranAt: row?.ran_at ? row.ran_at.toISOString() : null,
      outcome: row?.outcome ?? null,
    };
  }

  async schedule(
    actor: Actor,
    reportId: number,
    sendAt: string,
    now = new Date(),
  ): Promise<DigestScheduleDto> {
    const report = await this.report(reportId, actor.regionId);
    const at = new Date(sendAt);
    if (
      Number.isNaN(at.getTime()) ||
      at.getTime() <= now.getTime() ||
      at.getTime() > now.getTime() + YEAR_MS
    )
      throw new ProblemException(
        HttpStatus.UNPROCESSABLE_ENTITY,
        'validation-failed',
        'The time to send is not usable',
        `sendAt must lie in the future and at most a year ahead; ${sendAt} does not.`,
        { errors: [{ field: 'sendAt', message: 'must lie in the future, at most a year ahead' }] },
      );
    if (
      !(await this.schedules.schedule(report.id, report.regionId, at, {
        userId: actor.id,
        label: actor.label,
      }))
    )
      throw new ProblemException(
        HttpStatus.CONFLICT,
        'digests-sent-already',
        'These digests were sent already',
        `The scheduled sending of ${report.label} digests has run; nothing is left to schedule.`,
      );
    await this.audit.append({
      action: 'mail.digests_scheduled',
      summary: `${actor.displayName} scheduled ${report.label} digests for ${at.toISOString()}`,
      actor: { id: actor.id, label: actor.label },
      regionId: report.regionId,
      subjectType: 'audit_quarter',
      subjectId: report.quarterId,
      detail: { sourceId: report.id, sendAt: at.toISOString() },
      requestId: actor.requestId,
      ipAddress: actor.ipAddress,
    });
    return this.scheduleOf(actor, reportId);
  }

  async cancelSchedule(actor: Actor, reportId: number): Promise<DigestScheduleDto> {
    const report = await this.report(reportId, actor.regionId);
    if (!(await this.schedules.cancel(report.id)))
      throw new ProblemException(
        HttpStatus.CONFLICT,
        'no-digest-schedule',
        'Nothing is scheduled',
        `${report.label} digests have no scheduled sending to cancel.`,
      );
    await this.audit.append({
      action: 'mail.digests_unscheduled',
      summary: `${actor.displayName} cancelled the scheduled sending of ${report.label} digests`,
      actor: { id: actor.id, label: actor.label },
      regionId: report.regionId,
      subjectType: 'audit_quarter',
      subjectId: report.quarterId,
      detail: { sourceId: report.id },
      requestId: actor.requestId,
      ipAddress: actor.ipAddress,
    });
    return this.scheduleOf(actor, reportId);
  }

  /**
   * Gives each report published in the last week that has no scheduled sending (and was never
   * scheduled, moved or cancelled by the regional lead) one, `mail.digests.afterPublicationMinutes`
   * after its publication: time for the regional lead to preview the digests, send a test, move
   * or cancel the sending. Every region is looked at (a report may be published from a closed
   * quarter, and in any region), through each quarter's list of reports: no snapshot is read.
   */
  async scheduleNewReports(now = new Date()): Promise<number> {
    const after = this.config.get('mail', { infer: true }).digests.afterPublicationMinutes * 60_000;
    let scheduled = 0;
    for (const region of await this.organisations.allRegions()) {
      const quarterIds = (await this.quarters.list(region.id)).map((q) => q.id);
      for (const reports of (await this.quarterReports.of(region.id, quarterIds)).values()) {
        for (const report of reports) {
          if (report.status !== 'published') continue;
          const published = Date.parse(report.publishedAt);
          if (now.getTime() - published > PUBLICATION_LOOKBACK_MS) continue;
          if (await this.schedules.find(report.id)) continue;
          await this.schedules.schedule(report.id, region.id, new Date(published + after), {
            userId: null,
            label: 'on publication',
          });
          scheduled++;
        }
      }
    }
    return scheduled;
  }

  /** Sends the digests whose time has come; one process at a time (null: another ran it). */
  async runScheduled(now = new Date()): Promise<number | null> {
    try {
      return await this.outbox.exclusive(
        DIGEST_SCHEDULE_JOB,
        this.owner,
        300,
        async () => {
          await this.scheduleNewReports(now);
          let ran = 0;
          for (const row of await this.schedules.due(now)) {
            const system = systemActor('scheduled digests', row.region_id);
            try {
              const result = await this.sendAll(system, row.source_id);
              await this.schedules.markRan(
                row.source_id,
                `${result.practices} practices, ${result.messages} messages queued; ${result.alreadyQueued} practices queued before`,
              );
              ran++;
            } catch (error) {
              this.logger.error(
                { err: error, sourceId: row.source_id },
                'scheduled digests failed',
              );
            }
          }
          return ran;
        },
        (ran) => `${ran} scheduled sendings run`,
      );
    } catch (error) {
      this.logger.warn({ err: error }, 'the digest schedule check failed; it runs again');
      return null;
    }
  }
}

const recipientOf = (r: Recipient | null): DigestRecipient =>
  r ? { name: r.name, isUser: r.userId !== null } : { name: null, isUser: true };

const recipientDto = (r: Recipient) => ({
  address: r.address,
  name: r.name,
  isUser: r.userId !== null,
});

/** Addressed as mailOptions takes it, for a test that goes to the regional lead. */
const testRow = (actor: Actor, messageId: string) => ({
  recipient_address: actor.label,
  recipient_name: actor.displayName,
  message_id: messageId,
});
