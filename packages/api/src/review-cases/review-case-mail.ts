/**
 * The e-mail a practice's leads get when an auditor asks them a question in a
 * review case (kind review_case_question): queued through the outbox in the
 * transaction that records the question, once per question (the outbox's
 * source is the question's timeline entry). It names the case and says where
 * to answer; it carries the question (which the practice sees in Cairn anyway)
 * and the clinical caution, and no patient data.
 */
import { Inject, Injectable, type OnModuleInit } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import type { Transaction } from 'sequelize';
import { AuditTrailService } from '../audit-trail/audit-trail.service.js';
import type { Actor } from '../auth/actor.js';
import type { CairnConfig } from '../config/config.schema.js';
import {
  type ComposedMail,
  CompositionError,
  type MailComposer,
  MailComposers,
} from '../mail/mail-composers.js';
import { renderMail } from '../mail/mail-layout.js';
import { OutboxService } from '../mail/outbox.service.js';
import { RecipientsService } from '../mail/recipients.service.js';
import { MeasureSetsService } from '../measure-sets/measure-sets.service.js';
import {
  CLINICAL_CAUTION,
  OrganisationsService,
  type PracticeInfo,
} from '../organisations/organisations.service.js';
import { QuartersService } from '../quarters/quarters.service.js';
import { type CaseRow, ReviewCaseRepository } from './review-case.repository.js';

export const QUESTION_KIND = 'review_case_question';

@Injectable()
export class ReviewCaseMail implements OnModuleInit {
  constructor(
    @Inject(ConfigService) private readonly config: ConfigService<CairnConfig, true>,
    @Inject(MailComposers) private readonly composers: MailComposers,
    @Inject(OutboxService) private readonly outbox: OutboxService,
    @Inject(RecipientsService) private readonly recipients: RecipientsService,
    @Inject(ReviewCaseRepository) private readonly cases: ReviewCaseRepository,
    @Inject(QuartersService) private readonly quarters: QuartersService,
    @Inject(OrganisationsService) private readonly organisations: OrganisationsService,
    @Inject(MeasureSetsService) private readonly measureSets: MeasureSetsService,
    @Inject(AuditTrailService) private readonly audit: AuditTrailService,
  ) {}

  onModuleInit(): void {
    this.composers.register(QUESTION_KIND, {
      sourceLabel: async (entryId) => {
        const entry = await this.cases.entry(entryId);
        return entry ? `Review case ${entry.case_id} question` : `Question ${entryId}`;
      },
      compose: (row) => this.compose(row),
    });
  }

  /** Queues the question's message to the practice's recipients (in the question's transaction). */
  async queueQuestion(
    actor: Actor,
    c: CaseRow,
    practice: PracticeInfo,
    entryId: number,
    transaction: Transaction,
  ): Promise<void> {
    const recipients =
      (await this.recipients.forPractices([practice.id], QUESTION_KIND)).get(practice.id) ?? [];
    const queued = await this.outbox.queue(
      {
        kind: QUESTION_KIND,
        sourceId: entryId,
        regionId: c.region_id,
        practiceId: practice.id,
        recipients,
      },
      transaction,
    );
    await this.audit.append(
      {
        action: 'mail.queued',
        summary: `Review case ${c.id} question queued for ${practice.code} (${queued ?? 0} recipients)`,
        actor: { id: actor.id, label: actor.label },
        regionId: c.region_id,
        practiceId: practice.id,
        subjectType: 'review_case',
        subjectId: c.id,
        detail: { kind: QUESTION_KIND, entryId, messages: queued ?? 0 },
        requestId: actor.requestId,
        ipAddress: actor.ipAddress,
      },
      transaction,
    );
  }

  private async compose(row: Parameters<MailComposer['compose']>[0]): Promise<ComposedMail> {
    const entry = await this.cases.entry(row.source_id);
    if (!entry) throw new CompositionError(`review case question ${row.source_id} does not exist`);
    const c = await this.cases.find(entry.case_id);
    if (!c) throw new CompositionError(`review case ${entry.case_id} does not exist`);
    const [quarter, practice] = await Promise.all([
      this.quarters.find(c.quarter_id),
      this.organisations.practice(c.practice_id),
    ]);
    if (!quarter || !practice) throw new CompositionError(`review case ${c.id} lost its subject`);
    const version = await this.measureSets.get(quarter.measureSetId);
    const measure = version.measures.find((m) => m.key === c.measure_key);
    const region = await this.organisations.region(c.region_id);
    const publicUrl = this.config.get('server', { infer: true }).publicUrl;
    const link = new URL(`/review-cases/${c.id}`, publicUrl).href;
    const measureLabel = measure?.label ?? c.measure_key;
    const rendered = renderMail({
      subject: `Review case ${c.id}: a question about ${practice.name}'s ${measureLabel} (${quarter.label})`,
      preheader: `The audit team asks ${practice.name} about ${measureLabel}. Answer in Cairn.`,
      regionName: region?.name ?? '',
      greeting: row.recipient_name ? `Dear ${row.recipient_name},` : 'Hello,',
      blocks: [
        {
          type: 'paragraph',
          text: `The regional audit team has asked ${practice.name} (${practice.code}) a question in review case ${c.id}. Please answer in Cairn; you can attach files (PDF, XLSX, CSV, PNG or JPEG).`,
        },
        {
          type: 'facts',
          rows: [
            { label: 'Practice', value: `${practice.name} (${practice.code})` },
            { label: 'Audit quarter', value: quarter.label },
            { label: 'Measure', value: measureLabel },
            { label: 'Guideline', value: measure?.source ?? '' },
            { label: 'Question', value: entry.body },
          ],
        },
        {
          type: 'action',
          label: 'Open the review case',
          url: link,
          note: 'Cairn asks you to sign in first. This link carries no data.',
        },
        { type: 'caution', title: 'Audit support, not clinical advice', text: CLINICAL_CAUTION },
      ],
      footer: [
        row.recipient_user_id
          ? `You receive this as a practice lead of ${practice.name}. To stop these messages, change your mail preferences on your Cairn profile: ${new URL('/profile', publicUrl).href}`
          : `You receive this because the regional lead added your address to the mail recipients of ${practice.name}.`,
        'This message holds no patient data.',
      ],
    });
    return { subject: rendered.subject, html: rendered.html, text: rendered.text };
  }
}
