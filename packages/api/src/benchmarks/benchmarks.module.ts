import { Module } from '@nestjs/common';
import { MeasureSetsModule } from '../measure-sets/measure-sets.module.js';
import { QuartersModule } from '../quarters/quarters.module.js';
import { SubmissionsModule } from '../submissions/submissions.module.js';
import { RecallListController } from './recall-list.controller.js';
import { RecallListService } from './recall-list.service.js';

/**
 * Results of an audit quarter read from practices' current submissions:
 * recall lists today (benchmark_results, migration 0301, is this module's).
 */
@Module({
  imports: [MeasureSetsModule, QuartersModule, SubmissionsModule],
  controllers: [RecallListController],
  providers: [RecallListService],
})
export class BenchmarksModule {}
