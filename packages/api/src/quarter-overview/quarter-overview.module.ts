import { Module } from '@nestjs/common';
import { MeasureSetsModule } from '../measure-sets/measure-sets.module.js';
import { QuartersModule } from '../quarters/quarters.module.js';
import { SubmissionsModule } from '../submissions/submissions.module.js';
import { QuarterOverviewController } from './quarter-overview.controller.js';
import { QuarterOverviewService } from './quarter-overview.service.js';

/** The audit quarters page's reading: quarters, coverage and reports together. */
@Module({
  imports: [QuartersModule, SubmissionsModule, MeasureSetsModule],
  controllers: [QuarterOverviewController],
  providers: [QuarterOverviewService],
})
export class QuarterOverviewModule {}
