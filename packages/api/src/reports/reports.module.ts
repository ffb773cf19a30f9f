import { Module } from '@nestjs/common';
import { AuditTrailModule } from '../audit-trail/audit-trail.module.js';
import { BenchmarksModule } from '../benchmarks/benchmarks.module.js';
import { MeasureSetsModule } from '../measure-sets/measure-sets.module.js';
import { QuartersModule } from '../quarters/quarters.module.js';
import { ReportRepository } from './report.repository.js';
import { PublishReportController, ReportsController } from './reports.controller.js';
import { ReportsService } from './reports.service.js';

/**
 * Published reports (the `reports` table, this module's): a quarter's benchmark frozen into an
 * immutable snapshot, read for good from its bytes, withdrawn with a tombstone.
 */
@Module({
  imports: [AuditTrailModule, BenchmarksModule, MeasureSetsModule, QuartersModule],
  controllers: [PublishReportController, ReportsController],
  providers: [ReportRepository, ReportsService],
  exports: [ReportsService],
})
export class ReportsModule {}
