import { Module } from '@nestjs/common';
import { AuditTrailModule } from '../audit-trail/audit-trail.module.js';
import { BenchmarksModule } from '../benchmarks/benchmarks.module.js';
import { DigestsModule } from '../digests/digests.module.js';
import { MailModule } from '../mail/mail.module.js';
import { MeasureSetsModule } from '../measure-sets/measure-sets.module.js';
import { OrganisationsModule } from '../organisations/organisations.module.js';
import { QuartersModule } from '../quarters/quarters.module.js';
import { SubmissionsModule } from '../submissions/submissions.module.js';
import { DigestCaseCount } from './digest-case-count.js';
import { DraftBenchmarkSource, OUTLIER_SOURCE } from './outliers/outlier-source.js';
import { OutliersController } from './outliers/outliers.controller.js';
import { OutliersService } from './outliers/outliers.service.js';
import { ReviewCaseMail } from './review-case-mail.js';
import { ReviewCaseRepository } from './review-case.repository.js';
import { ReviewCasesController } from './review-cases.controller.js';
import { ReviewCasesService } from './review-cases.service.js';

/**
 * Outlier review: the outlier list and drill-down of a quarter's benchmark,
 * and review cases (this module's tables: review_cases, review_case_entries,
 * review_case_files, review_case_file_chunks, written only by
 * ReviewCaseRepository). The benchmark is read through OUTLIER_SOURCE (the
 * draft benchmark today; a published report's snapshot can be bound instead).
 */
@Module({
  imports: [
    AuditTrailModule,
    BenchmarksModule,
    DigestsModule,
    MailModule,
    MeasureSetsModule,
    OrganisationsModule,
    QuartersModule,
    SubmissionsModule,
  ],
  controllers: [OutliersController, ReviewCasesController],
  providers: [
    ReviewCaseRepository,
    ReviewCasesService,
    ReviewCaseMail,
    DigestCaseCount,
    OutliersService,
    { provide: OUTLIER_SOURCE, useClass: DraftBenchmarkSource },
  ],
})
export class ReviewCasesModule {}
