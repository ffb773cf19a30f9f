/**
 * Where the outlier list and the drill-down read a quarter's benchmark from.
 * Today: the draft benchmark, the stored result of the quarter's current
 * submissions (BenchmarkStore). A published report's frozen snapshot can feed
 * the same list by providing an `OutlierSource` of its own that returns the
 * snapshot's benchmark with `origin: 'report'`: nothing else in the outlier
 * list depends on where the benchmark came from.
 */
import { Inject, Injectable } from '@nestjs/common';
import type { Benchmark } from '@cairn/metrics';
import { BenchmarkStore } from '../../benchmarks/benchmark-store.service.js';
import type { QuarterDto } from '../../quarters/dto/quarter.dto.js';

export type OutlierOrigin = 'draft' | 'report';

/** A quarter's benchmark as the outlier list reads it, and what it was built from. */
export interface OutlierBasis {
  origin: OutlierOrigin;
  quarterId: number;
  quarterLabel: string;
  /** The stored result (draft) or snapshot (report) it is read from */
  resultId: number;
  /** What identifies its inputs (the draft's submissions key, or the snapshot's) */
  key: string;
  measureSetId: string;
  builtAt: string;
  benchmark: Benchmark;
  /** Practice code → the submission its figures come from */
  submissionOf: ReadonlyMap<string, number>;
}

export interface OutlierSource {
  basisOf(quarter: QuarterDto): Promise<OutlierBasis | null>;
  basesOf(quarters: readonly QuarterDto[]): Promise<Map<number, OutlierBasis | null>>;
}

export const OUTLIER_SOURCE = Symbol('OutlierSource');

/** The draft benchmark of each quarter: the stored result of its current submissions. */
@Injectable()
export class DraftBenchmarkSource implements OutlierSource {
  constructor(@Inject(BenchmarkStore) private readonly store: BenchmarkStore) {}

  async basisOf(quarter: QuarterDto): Promise<OutlierBasis | null> {
    const result = await this.store.resultOf(quarter);
    return result ? this.basis(result) : null;
  }

  async basesOf(quarters: readonly QuarterDto[]): Promise<Map<number, OutlierBasis | null>> {
    const results = await this.store.resultsOf(quarters);
    return new Map([...results].map(([id, r]) => [id, r ? this.basis(r) : null]));
  }

  private basis(r: Awaited<ReturnType<BenchmarkStore['resultOf']>> & object): OutlierBasis {
    return {
      origin: 'draft',
      quarterId: r.quarterId,
      quarterLabel: r.quarterLabel,
      resultId: r.id,
      key: r.key,
      measureSetId: r.version.id,
      builtAt: r.builtAt,
      benchmark: r.benchmark,
      submissionOf: r.submissionOf,
    };
  }
}
