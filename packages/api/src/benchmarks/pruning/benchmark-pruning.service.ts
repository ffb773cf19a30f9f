/**
 * Pruning of the benchmarks module's stored results and answers, which otherwise grow with every
 * confirm (a result per set of current submissions) and every answer key. Runs every
 * `benchmarks.pruning.intervalMinutes` and once soon after start, one process at a time (the
 * `benchmark_upkeep` lease); what it removes:
 *
 *  - stored answers last used (read from the table, or built if never read) more than
 *    `answersUnusedDays` ago, unless built for a quarter's current result (built at or after
 *    it). A removed answer that is asked for again is built again and stored.
 *  - stored results that are neither of their quarter's current set, nor among its
 *    `resultsKeepNewest` newest, nor built less than `resultsGraceMinutes` ago, nor named by a
 *    published report (prune-plan.ts).
 *
 * Every statement removes rows no reader reads any more, whatever another process does at the
 * same time, so two processes running it at once (a lease that expired) remove nothing wrong.
 */
import { randomBytes } from 'node:crypto';
import { hostname } from 'node:os';
import {
  Inject,
  Injectable,
  Logger,
  type OnApplicationBootstrap,
  type OnApplicationShutdown,
} from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import type { CairnConfig } from '../../config/config.schema.js';
import { SubmissionsService } from '../../submissions/submissions.service.js';
import { BenchmarkAnswersRepository } from '../answers/benchmark-answers.repository.js';
import { BenchmarkResultsRepository } from '../benchmark-results.repository.js';
import { BenchmarkUpkeepRepository } from './benchmark-upkeep.repository.js';
import { currentResultIds, resultsToRemove } from './prune-plan.js';

export const PRUNING_JOB = 'pruning';

export interface PruneOutcome {
  answersRemoved: number;
  resultsRemoved: number;
}

@Injectable()
export class BenchmarkPruning implements OnApplicationBootstrap, OnApplicationShutdown {
  private readonly logger = new Logger('BenchmarkPruning');
  private readonly owner = `${hostname().slice(0, 30)}:${process.pid}:${randomBytes(3).toString('hex')}`;
  private timers: NodeJS.Timeout[] = [];

  constructor(
    @Inject(BenchmarkResultsRepository) private readonly results: BenchmarkResultsRepository,
    @Inject(BenchmarkAnswersRepository) private readonly answers: BenchmarkAnswersRepository,
    @Inject(BenchmarkUpkeepRepository) private readonly upkeep: BenchmarkUpkeepRepository,
    @Inject(SubmissionsService) private readonly submissions: SubmissionsService,
    @Inject(ConfigService) private readonly config: ConfigService<CairnConfig, true>,
  ) {}

  private get settings() {
    return this.config.get('benchmarks', { infer: true }).pruning;
  }

  onApplicationBootstrap(): void {
    const { enabled, intervalMinutes } = this.settings;
    if (!enabled) return;
    const tick = () =>
      void this.run().catch((error: Error) => this.logger.warn(`pruning failed: ${error.message}`));
    const every = setInterval(tick, intervalMinutes * 60_000);
    // And once soon after start: a process started after a missed run catches up.
    const soon = setTimeout(tick, 30_000);
    every.unref();
    soon.unref();
    this.timers = [every, soon];
  }

  onApplicationShutdown(): void {
    for (const timer of this.timers) clearTimeout(timer);
    this.timers = [];
  }

  /** Prunes unless another process is pruning now; null when it did not run. */
  async run(): Promise<PruneOutcome | null> {
    const { leaseSeconds } = this.settings;
    if (!(await this.upkeep.claim(PRUNING_JOB, this.owner, leaseSeconds))) return null;
    let outcome = 'failed';
    try {
      const result = await this.prune();
      outcome = `removed ${result.answersRemoved} answers and ${result.resultsRemoved} results`;
      if (result.answersRemoved + result.resultsRemoved > 0) this.logger.log(outcome);
      return result;
    } catch (error) {
      outcome = `failed: ${(error as Error).message}`;
      throw error;
    } finally {
      await this.upkeep.release(PRUNING_JOB, this.owner, outcome).catch(() => undefined);
    }
  }

  /** One pruning, without the lease (run() takes it). */
  async prune(): Promise<PruneOutcome> {
    const { answersUnusedDays, resultsKeepNewest, resultsGraceMinutes } = this.settings;
    const rows = await this.results.listAll();
    const answerQuarters = await this.answers.quarters();
    const quarterIds = [...new Set([...rows.map((r) => r.quarterId), ...answerQuarters])];
    const currentKeys =
      quarterIds.length > 0
        ? await this.submissions.currentSetKeys(quarterIds)
        : new Map<number, string>();

    const current = currentResultIds(rows, currentKeys);
    let answersRemoved = 0;
    for (const quarterId of answerQuarters) {
      answersRemoved += await this.answers.deleteUnused(
        quarterId,
        answersUnusedDays,
        current.get(quarterId) ?? [],
      );
    }
    const remove = resultsToRemove(rows, currentKeys, {
      keepNewest: resultsKeepNewest,
      graceMinutes: resultsGraceMinutes,
    });
    let resultsRemoved = 0;
    for (let i = 0; i < remove.length; i += 500) {
      resultsRemoved += await this.results.deleteIds(remove.slice(i, i + 500));
    }
    return { answersRemoved, resultsRemoved };
  }
}
