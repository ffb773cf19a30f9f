import { Module } from '@nestjs/common';
import { MeasureSetsModule } from '../measure-sets/measure-sets.module.js';
import { OrganisationsModule } from '../organisations/organisations.module.js';
import { QuartersModule } from '../quarters/quarters.module.js';
import { SubmissionsModule } from '../submissions/submissions.module.js';
import { BenchmarkAnswersRepository } from './answers/benchmark-answers.repository.js';
import { ResultInputs } from './answers/result-inputs.js';
import { StoredAnswers } from './answers/stored-answers.service.js';
import { BenchmarkController } from './benchmark.controller.js';
import { BenchmarkResultsRepository } from './benchmark-results.repository.js';
import { BenchmarkStore } from './benchmark-store.service.js';
import { BenchmarksService } from './benchmarks.service.js';
import { PracticeResultsController } from './practice-results.controller.js';
import { PracticeResultsService } from './practice-results.service.js';
import { BenchmarkPruning } from './pruning/benchmark-pruning.service.js';
import { BenchmarkUpkeepRepository } from './pruning/benchmark-upkeep.repository.js';
import { RecallListController } from './recall-list.controller.js';
import { RecallListService } from './recall-list.service.js';

/**
 * Results of an audit quarter, read from practices' current submissions: the
 * region's benchmark (stored in benchmark_results, this module's table, and
 * the routes' finished responses in benchmark_answers),
 * a practice's results against it, and recall lists; pruning of both tables
 * (pruning/).
 */
@Module({
  imports: [MeasureSetsModule, OrganisationsModule, QuartersModule, SubmissionsModule],
  controllers: [BenchmarkController, PracticeResultsController, RecallListController],
  providers: [
    BenchmarkAnswersRepository,
    BenchmarkResultsRepository,
    StoredAnswers,
    ResultInputs,
    BenchmarkStore,
    BenchmarksService,
    PracticeResultsService,
    RecallListService,
    BenchmarkUpkeepRepository,
    BenchmarkPruning,
  ],
  exports: [BenchmarkStore, BenchmarksService, PracticeResultsService],
})
export class BenchmarksModule {}
