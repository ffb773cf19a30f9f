import { Module } from '@nestjs/common';
import { BenchmarksModule } from '../benchmarks/benchmarks.module.js';
import { MailModule } from '../mail/mail.module.js';
import { OrganisationsModule } from '../organisations/organisations.module.js';
import { QuartersModule } from '../quarters/quarters.module.js';
import { DigestSchedulesRepository } from './digest-schedules.repository.js';
import { DIGEST_SOURCE } from './digest-source.js';
import { DigestsController } from './digests.controller.js';
import { DigestsService } from './digests.service.js';
import { DraftBenchmarkDigestSource } from './draft-benchmark-source.js';
import { OpenReviewCases } from './review-case-counts.js';

/**
 * Practices' digests (kind `digest` in the outbox): composed from a report's
 * practice parts through a DigestSource, previewed, tested, sent at once or at
 * a scheduled time. A review-case module registers its counter with
 * OpenReviewCases (exported); until then digests say no case is waiting.
 */
@Module({
  imports: [MailModule, BenchmarksModule, OrganisationsModule, QuartersModule],
  controllers: [DigestsController],
  providers: [
    DigestSchedulesRepository,
    DraftBenchmarkDigestSource,
    { provide: DIGEST_SOURCE, useExisting: DraftBenchmarkDigestSource },
    OpenReviewCases,
    DigestsService,
  ],
  exports: [DigestsService, OpenReviewCases],
})
export class DigestsModule {}
