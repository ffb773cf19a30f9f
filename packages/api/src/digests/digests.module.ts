import { Module } from '@nestjs/common';
import { MailModule } from '../mail/mail.module.js';
import { OrganisationsModule } from '../organisations/organisations.module.js';
import { QuartersModule } from '../quarters/quarters.module.js';
import { ReportsModule } from '../reports/reports.module.js';
import { DigestSchedulesRepository } from './digest-schedules.repository.js';
import { DIGEST_SOURCE } from './digest-source.js';
import { DigestsController } from './digests.controller.js';
import { DigestsService } from './digests.service.js';
import { ReportDigestSource } from './report-source.js';
import { OpenReviewCases } from './review-case-counts.js';

/**
 * Practices' digests (kind `digest` in the outbox): composed from a published report's
 * practice parts through a DigestSource, previewed, tested, sent at once or at
 * a scheduled time. A review-case module registers its counter with
 * OpenReviewCases (exported); until then digests say no case is waiting.
 */
@Module({
  imports: [MailModule, OrganisationsModule, QuartersModule, ReportsModule],
  controllers: [DigestsController],
  providers: [
    DigestSchedulesRepository,
    ReportDigestSource,
    // Digests are made from published reports, read through ReportsService alone.
    { provide: DIGEST_SOURCE, useExisting: ReportDigestSource },
    OpenReviewCases,
    DigestsService,
  ],
  exports: [DigestsService, OpenReviewCases],
})
export class DigestsModule {}
