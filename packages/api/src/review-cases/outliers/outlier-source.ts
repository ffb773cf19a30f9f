/**
 * Where the outlier list and the drill-down read a quarter's benchmark from.
 * Today: the draft benchmark, the stored result of the quarter's current
 * submissions (BenchmarkStore). A published report's frozen snapshot can feed
 * the same list by providing an `OutlierSource` of its own that returns the
 * snapshot's benchmark with `origin: 'report'`: nothing else in the outlier
 * list depends on where the benchmark came from.
 */
import { Inject, Injectable } from '@nestjs/common';
import type { Benchmark, PracticeSums } from '@cairn/metrics';
import { BenchmarkStore } from '../../benchmarks/benchmark-store.service.js';
import { SubmissionsService } from '../../submissions/submissions.service.js';
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
  /** The region's merged sums (breakdowns and histograms against the region), when kept */
  regionSums: PracticeSums | null;
  /** Practice code → the submission its figures come from */
  submissionOf: ReadonlyMap<string, number>;
}

export interface OutlierSource {
  basisOf(quarter: QuarterDto): Promise<OutlierBasis | null>;
  basesOf(quarters: readonly QuarterDto[]): Promise<Map<number, OutlierBasis | null>>;
  /**
   * What each quarter's basis would be built from, cheaply, without reading it: equal keys mean
   * equal bases. `none` for a quarter without a basis; null when it cannot be told (read the
   * basis then).
   */
  keysOf(quarters: readonly QuarterDto[]): Promise<Map<number, string | null>>;
}

export const OUTLIER_SOURCE = Symbol('OutlierSource');

/**
 * Reads shared by callers that come while one is running, without ever handing a caller a read
 * that began before it came: a caller arriving during a read waits for the next one, which
 * starts when the running one ends and serves everyone who came meanwhile. At most one read
 * runs and one waits per key, however many callers.
 */
export class FreshReads<V> {
  private readonly running = new Map<string, Promise<V>>();
  private readonly waiting = new Map<string, Promise<V>>();

  read(key: string, fn: () => Promise<V>): Promise<V> {
    const queued = this.waiting.get(key);
    if (queued) return queued;
    const start = (): Promise<V> => {
      const p = fn().finally(() => {
        if (this.running.get(key) === p) this.running.delete(key);
      });
      this.running.set(key, p);
      return p;
    };
    const current = this.running.get(key);
    if (!current) return start();
    const next = current
      .catch(() => undefined)
      .then(() => {
        this.waiting.delete(key);
        return start();
      });
    this.waiting.set(key, next);
    return next;
  }
}

/** The draft benchmark of each quarter: the stored result of its current submissions. */
@Injectable()
export class DraftBenchmarkSource implements OutlierSource {
  constructor(
    @Inject(BenchmarkStore) private readonly store: BenchmarkStore,
    @Inject(SubmissionsService) private readonly submissions: SubmissionsService,
  ) {}

  private readonly keyReads = new FreshReads<Map<number, string | null>>();

  /**
   * The quarter's current set (its key, from the quarter's current-set row) under the quarter's measure set.
   * Requests at once share reads (`FreshReads`): never one that began before they came.
   */
  async keysOf(quarters: readonly QuarterDto[]): Promise<Map<number, string | null>> {
    const ids = quarters.map((q) => q.id);
    const keys = await this.keyReads.read(ids.join(','), () =>
      this.submissions.currentSetKeys(ids),
    );
    return new Map(
      quarters.map((q) => {
        const key = keys.get(q.id);
        return [
          q.id,
          key === undefined ? 'none' : key === null ? null : `draft/${q.measureSetId}/${key}`,
        ];
      }),
    );
  }

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
      regionSums: r.regionSums,
      submissionOf: r.submissionOf,
    };
  }
}
