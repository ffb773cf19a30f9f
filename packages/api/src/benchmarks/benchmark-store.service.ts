/**
 * A quarter's benchmark, as every route reads it (docs/methods.md §10): the
 * result of exactly one set of current submissions, said which.
 *
 * 1. One SELECT of the quarter's current-set row (SubmissionsService), which
 *    the confirm's transaction keeps in step with the pointers: key = SHA-256
 *    of the sorted ids of the current submissions.
 * 2. The stored result of (quarter, measure-set version, result format, key)
 *    is looked up (the pointers are read only to build one).
 * 3. Found: its body is decoded (kept in memory by result id: rows never
 *    change). Not found: the sums of those submissions (SubmissionsService,
 *    which fills any missing from records), `buildBenchmark` with the
 *    practices in code order and their localities (OrganisationsService), the
 *    region's sums merged, the body stored (INSERT IGNORE) and served.
 *
 * A set built after a confirm is rebuilt from the previous result of its
 * quarter when this process built that one (results/rebuild.ts): the region's
 * sums minus the replaced submission's plus the new one's, every other
 * practice's parts kept, the region's statistics computed again; the same
 * bytes as a build from every practice's sums. A confirm starts the new set's
 * build as soon as its transaction commits, so that the first reader finds it
 * built or joins the build.
 *
 * A request thus sees one consistent set, never a mix; nothing a reader needs
 * lives only here (any process finds the row, or builds the same bytes).
 * `recompute` is the full recompute from records: every current record of the
 * quarter in one streamed read, every submission's sums stored again, the
 * benchmark built and stored the same way.
 */
import { Inject, Injectable, Logger } from '@nestjs/common';
import {
  type Benchmark,
  buildBenchmark,
  mergeSums,
  type PracticeSums,
  sumsLayout,
} from '@cairn/metrics';
import {
  type MeasureSetVersion,
  MeasureSetsService,
} from '../measure-sets/measure-sets.service.js';
import { OrganisationsService, type PracticeInfo } from '../organisations/organisations.service.js';
import type { QuarterDto } from '../quarters/dto/quarter.dto.js';
import {
  type CurrentPointer,
  type CurrentSetRow,
  SubmissionsService,
  submissionsKey,
  type SumsSubject,
} from '../submissions/submissions.service.js';
import { BenchmarkResultsRepository, type ResultRow } from './benchmark-results.repository.js';
import {
  decodeResult,
  encodeResult,
  RESULT_FORMAT,
  type ResultContent,
} from './results/result-body.js';
import { partsOfBuild, rebuildContent, type ResultParts, setChange } from './results/rebuild.js';

/** A quarter's current set changed while an answer of it was being built: read it again. */
export class SetChangedError extends Error {
  override name = 'SetChangedError';
  constructor(quarterId: number) {
    super(`the current set of quarter ${quarterId} changed while it was being read`);
  }
}

/** A quarter's built benchmark and what it was built from. */
export interface QuarterResult {
  /** benchmark_results.id */
  id: number;
  quarterId: number;
  quarterLabel: string;
  /** The audit quarter's year and quarter */
  at: { year: number; quarter: 1 | 2 | 3 | 4 };
  version: MeasureSetVersion;
  /** SHA-256 (hex) of the sorted ids of the submissions it was built from */
  key: string;
  submissionCount: number;
  builtAt: string;
  buildMs: number;
  benchmark: Benchmark;
  regionSums: PracticeSums | null;
  /** Practices in benchmark order (by code) with the submission each was built from */
  practices: { code: string; submissionId: number }[];
  submissionOf: ReadonlyMap<string, number>;
}

export { submissionsKey };

/** Practices by code, in a fixed order that does not depend on a database collation. */
export const byCode = <T extends { code: string }>(a: T, b: T): number =>
  a.code < b.code ? -1 : a.code > b.code ? 1 : 0;

/**
 * The benchmark and the region's sums of these submissions, whose practices come in code order
 * (`byCode`): what a stored result holds, whichever way the sums were made.
 */
export function resultContent(
  quarter: Pick<QuarterDto, 'id' | 'year' | 'quarter'>,
  version: MeasureSetVersion,
  subjects: readonly (SumsSubject & { practice: Pick<PracticeInfo, 'code' | 'localityCode'> })[],
  sums: ReadonlyMap<number, PracticeSums>,
): ResultContent {
  const ordered = subjects.map((s) => {
    const own = sums.get(s.submissionId);
    if (!own) throw new Error(`no sums for submission ${s.submissionId}`);
    return { code: s.practice.code, locality: s.practice.localityCode, sums: own };
  });
  const at = { year: quarter.year, quarter: quarter.quarter };
  const benchmark = buildBenchmark({
    practices: ordered,
    measureSet: sumsLayout(version.compiled),
    quarter: at,
  });
  return {
    description: {
      quarterId: quarter.id,
      measureSetId: version.id,
      practices: subjects.map((s) => ({ code: s.practice.code, submissionId: s.submissionId })),
    },
    benchmark,
    regionSums: ordered.length > 0 ? mergeSums(ordered.map((o) => o.sums)) : null,
  };
}

/** Decoded results kept in memory at most, by the size of their stored bodies. */
const CACHE_BYTES = 96 * 1024 * 1024;
/** Quarters whose latest built result's parts are kept for a rebuild (a few MB per 1,000 practices). */
const PARTS_QUARTERS = 2;
/** A set is rebuilt from the previous one while at most this share of its practices changed. */
const REBUILD_SHARE = 1 / 8;

@Injectable()
export class BenchmarkStore {
  private readonly logger = new Logger('BenchmarkStore');
  /** Result ids by key (rows never change, so a key's id never does). */
  private readonly ids = new Map<string, ResultRow>();
  private readonly results = new Map<number, { result: QuarterResult; size: number }>();
  private cachedBytes = 0;
  private readonly building = new Map<string, Promise<QuarterResult>>();
  /** The parts of the latest result this process built, per quarter (rows never change). */
  private readonly parts = new Map<number, ResultParts>();

  constructor(
    @Inject(BenchmarkResultsRepository) private readonly repository: BenchmarkResultsRepository,
    @Inject(SubmissionsService) private readonly submissions: SubmissionsService,
    @Inject(OrganisationsService) private readonly organisations: OrganisationsService,
    @Inject(MeasureSetsService) private readonly measureSets: MeasureSetsService,
  ) {
    // The new set's result is built once the confirm has committed (a reader joins the build).
    submissions.onConfirmed((quarter) => {
      this.resultOf(quarter).catch((error: unknown) =>
        this.logger.warn(
          `the benchmark of ${quarter.label} after a confirm was not built ahead of its readers: ${(error as Error).message}`,
        ),
      );
    });
  }

  /** The quarter's result for its current submissions now; null when it has none. */
  async resultOf(quarter: QuarterDto): Promise<QuarterResult | null> {
    const sets = await this.submissions.currentSetRows([quarter.id]);
    return this.resultFor(quarter, sets.get(quarter.id) ?? null);
  }

  /** The results of several quarters of one region (their current sets read in one SELECT). */
  async resultsOf(quarters: readonly QuarterDto[]): Promise<Map<number, QuarterResult | null>> {
    return this.resultsWith(quarters, await this.currentSets(quarters));
  }

  /** The current set of each quarter as its row names it (one SELECT); null: none. */
  async currentSets(quarters: readonly QuarterDto[]): Promise<Map<number, CurrentSetRow | null>> {
    const sets = await this.submissions.currentSetRows(quarters.map((q) => q.id));
    return new Map(
      quarters.map((q) => {
        const set = sets.get(q.id);
        return [q.id, set && set.count > 0 ? set : null];
      }),
    );
  }

  /**
   * What identifies the stored result of each quarter's set (read by currentSets): quarter,
   * measure set, result format, the set's key and the stored row's id ('none' for a quarter
   * without a current submission). Known rows' ids are remembered (rows never change); a set
   * whose result was never built is built now.
   */
  async resultIdsOf(
    quarters: readonly QuarterDto[],
    sets: ReadonlyMap<number, CurrentSetRow | null>,
  ): Promise<string[]> {
    const out: string[] = [];
    for (const quarter of quarters) {
      const set = sets.get(quarter.id) ?? null;
      if (!set) {
        out.push('none');
        continue;
      }
      const version = await this.measureSets.get(quarter.measureSetId);
      const cacheKey = `${quarter.id}/${version.id}/${RESULT_FORMAT}/${set.key}`;
      let row = this.ids.get(cacheKey) ?? null;
      if (!row) {
        row = await this.repository.find(this.resultKey(quarter, version, set.key));
        if (row) this.ids.set(cacheKey, row);
      }
      let id = row?.id;
      if (id === undefined) {
        const built = await this.resultFor(quarter, set);
        if (!built || built.key !== set.key) throw new SetChangedError(quarter.id);
        id = built.id;
      }
      out.push(`${cacheKey}#${id}`);
    }
    return out;
  }

  /**
   * The results of exactly these sets (read by currentSets). Throws SetChangedError when a set
   * is no longer current and its result was never built (a confirm in between): read the sets
   * again.
   */
  async resultsWith(
    quarters: readonly QuarterDto[],
    sets: ReadonlyMap<number, CurrentSetRow | null>,
  ): Promise<Map<number, QuarterResult | null>> {
    const out = new Map<number, QuarterResult | null>();
    for (const quarter of quarters) {
      const set = sets.get(quarter.id) ?? null;
      const result = await this.resultFor(quarter, set);
      if (set && result && result.key !== set.key) throw new SetChangedError(quarter.id);
      out.set(quarter.id, result);
    }
    return out;
  }

  /** The decoded sums of one practice of a result (for its page). */
  async practiceSums(result: QuarterResult, code: string): Promise<PracticeSums | null> {
    const submissionId = result.submissionOf.get(code);
    if (submissionId === undefined) return null;
    const sums = await this.submissions.sumsOfCurrent(
      [{ submissionId, practiceCode: code, records: 0 }],
      result.version,
      result.at,
    );
    return sums.get(submissionId) ?? null;
  }

  /**
   * A full recompute from records (a measure-set change, and the check of the incremental
   * path): the sums of every current submission computed again from every current record of
   * the quarter in one streamed read and stored, then the benchmark built and stored. Returns
   * the result as stored, the bytes this recompute built and the bytes stored under its key
   * (equal to the built ones, also when the set was built before by the incremental path).
   */
  async recompute(
    quarter: QuarterDto,
  ): Promise<{ result: QuarterResult | null; body: Buffer | null; stored: Buffer | null }> {
    const version = await this.measureSets.get(quarter.measureSetId);
    const pointers = await this.submissions.currentSet(quarter.id);
    if (pointers.length === 0) return { result: null, body: null, stored: null };
    const subjects = await this.subjects(quarter, pointers);
    const t0 = performance.now();
    const sums = await this.submissions.recomputeSums(quarter.id, subjects, version, quarter);
    const content = resultContent(quarter, version, subjects, sums);
    this.keepParts(partsOfBuild(quarter.id, version, subjects, sums, content.regionSums));
    const body = encodeResult(content);
    const key = submissionsKey(pointers.map((p) => p.submissionId));
    const row = await this.repository.insert(this.resultKey(quarter, version, key), {
      submissionCount: pointers.length,
      body,
      buildMs: performance.now() - t0,
    });
    const stored = await this.repository.body(row.id);
    if (stored && !stored.equals(body)) {
      this.logger.warn(
        `the stored benchmark ${row.id} (${quarter.label}) differs from a recompute from records`,
      );
    }
    return {
      result: this.remember(row, quarter, version, key, content, body.length),
      body,
      stored,
    };
  }

  private resultKey(quarter: QuarterDto, version: MeasureSetVersion, key: string) {
    return {
      quarterId: quarter.id,
      measureSetId: version.id,
      formatVersion: RESULT_FORMAT,
      submissionsKey: key,
    };
  }

  private async resultFor(
    quarter: QuarterDto,
    set: CurrentSetRow | null,
  ): Promise<QuarterResult | null> {
    if (!set || set.count === 0) return null;
    const version = await this.measureSets.get(quarter.measureSetId);
    const key = set.key;
    const resultKey = this.resultKey(quarter, version, key);
    const cacheKey = `${quarter.id}/${version.id}/${RESULT_FORMAT}/${key}`;
    let row = this.ids.get(cacheKey) ?? null;
    if (!row) {
      row = await this.repository.find(resultKey);
      if (row) this.ids.set(cacheKey, row);
    }
    if (row) {
      const cached = this.results.get(row.id);
      if (cached) {
        // Most recently used last.
        this.results.delete(row.id);
        this.results.set(row.id, cached);
        return cached.result;
      }
      const loaded = await this.load(row, quarter, version, key);
      if (loaded) return loaded;
    }
    let pending = this.building.get(cacheKey);
    if (!pending) {
      pending = this.submissions
        .currentSet(quarter.id)
        .then((pointers) => {
          if (submissionsKey(pointers.map((p) => p.submissionId)) !== key) {
            // The set changed since its row was read: build the newer one.
            return this.resultOf(quarter).then((r) => r!);
          }
          return this.build(quarter, version, pointers, key);
        })
        .finally(() => this.building.delete(cacheKey));
      this.building.set(cacheKey, pending);
    }
    return pending;
  }

  /** Reads and decodes a stored result; null when its bytes cannot be read by this build. */
  private async load(
    row: ResultRow,
    quarter: QuarterDto,
    version: MeasureSetVersion,
    key: string,
  ): Promise<QuarterResult | null> {
    const body = await this.repository.body(row.id);
    if (!body) return null;
    try {
      const content = decodeResult(body, sumsLayout(version.compiled));
      return this.remember(row, quarter, version, key, content, body.length);
    } catch (error) {
      this.logger.warn(
        `stored benchmark ${row.id} (${quarter.label}) cannot be read, built again in memory: ${(error as Error).message}`,
      );
      return null;
    }
  }

  private async subjects(
    quarter: QuarterDto,
    pointers: readonly CurrentPointer[],
  ): Promise<(SumsSubject & { practice: PracticeInfo })[]> {
    const practices = await this.organisations.regionPractices(quarter.regionId, {
      ids: pointers.map((p) => p.practiceId),
    });
    const byId = new Map(practices.map((p) => [p.id, p]));
    return pointers
      .map((p) => {
        const practice = byId.get(p.practiceId);
        if (!practice) {
          throw new Error(
            `practice ${p.practiceId} has a current submission for ${quarter.label} but is not of its region`,
          );
        }
        return { submissionId: p.submissionId, practiceCode: practice.code, records: 0, practice };
      })
      .sort((a, b) => byCode(a.practice, b.practice));
  }

  private async build(
    quarter: QuarterDto,
    version: MeasureSetVersion,
    pointers: readonly CurrentPointer[],
    key: string,
  ): Promise<QuarterResult> {
    const t0 = performance.now();
    const subjects = await this.subjects(quarter, pointers);
    let content = await this.rebuilt(quarter, version, subjects);
    if (content === null) {
      const sums = await this.submissions.sumsOfCurrent(subjects, version, quarter);
      content = resultContent(quarter, version, subjects, sums);
      this.keepParts(partsOfBuild(quarter.id, version, subjects, sums, content.regionSums));
    }
    const body = encodeResult(content);
    const row = await this.repository.insert(this.resultKey(quarter, version, key), {
      submissionCount: pointers.length,
      body,
      buildMs: performance.now() - t0,
    });
    this.ids.set(`${quarter.id}/${version.id}/${RESULT_FORMAT}/${key}`, row);
    return this.remember(row, quarter, version, key, content, body.length);
  }

  /**
   * The set's content rebuilt from the previous result of its quarter that this process built
   * (results/rebuild.ts), reading only the sums of the submissions that left or joined; null
   * when there is none, or too much changed.
   */
  private async rebuilt(
    quarter: QuarterDto,
    version: MeasureSetVersion,
    subjects: readonly (SumsSubject & { practice: PracticeInfo })[],
  ): Promise<ResultContent | null> {
    const previous = this.parts.get(quarter.id);
    if (!previous || previous.measureSetId !== version.id) return null;
    const { left, joined } = setChange(previous, subjects);
    if (left.length + joined.length > Math.max(16, subjects.length * REBUILD_SHARE)) return null;
    const codeOf = new Map<number, string>([
      ...previous.practices.map((p) => [p.submissionId, p.code] as const),
      ...subjects.map((s) => [s.submissionId, s.practice.code] as const),
    ]);
    try {
      const changed = await this.submissions.sumsOfCurrent(
        [...left, ...joined].map((id) => ({
          submissionId: id,
          practiceCode: codeOf.get(id)!,
          records: 0,
        })),
        version,
        quarter,
      );
      const { content, parts } = rebuildContent(quarter, version, previous, subjects, changed);
      this.keepParts(parts);
      return content;
    } catch (error) {
      // Built from every practice's sums instead (the same bytes).
      this.logger.warn(
        `the benchmark of ${quarter.label} was not rebuilt from the previous one: ${(error as Error).message}`,
      );
      return null;
    }
  }

  private keepParts(parts: ResultParts): void {
    this.parts.delete(parts.quarterId);
    this.parts.set(parts.quarterId, parts);
    for (const quarterId of this.parts.keys()) {
      if (this.parts.size <= PARTS_QUARTERS) break;
      this.parts.delete(quarterId);
    }
  }

  private remember(
    row: ResultRow,
    quarter: QuarterDto,
    version: MeasureSetVersion,
    key: string,
    content: ResultContent,
    size: number,
  ): QuarterResult {
    const result: QuarterResult = {
      id: row.id,
      quarterId: quarter.id,
      quarterLabel: quarter.label,
      at: { year: quarter.year, quarter: quarter.quarter },
      version,
      key,
      submissionCount: row.submissionCount,
      builtAt: row.builtAt,
      buildMs: row.buildMs,
      benchmark: content.benchmark,
      regionSums: content.regionSums,
      practices: content.description.practices,
      submissionOf: new Map(content.description.practices.map((p) => [p.code, p.submissionId])),
    };
    const old = this.results.get(row.id);
    if (old) this.cachedBytes -= old.size;
    this.results.delete(row.id);
    this.results.set(row.id, { result, size });
    this.cachedBytes += size;
    for (const [oldest, entry] of this.results) {
      if (this.cachedBytes <= CACHE_BYTES || oldest === row.id) break;
      this.results.delete(oldest);
      this.cachedBytes -= entry.size;
    }
    return result;
  }
}
