/**
 * The rebuild of a quarter's result after a confirm (docs/methods.md §10), from the previous
 * result's parts instead of every practice's sums:
 *
 * - region sums = previous region sums − the sums of the submissions that left the set (the
 *   replaced ones) + the sums of those that joined (`replaceSums`);
 * - each unchanged practice keeps what the benchmark reads of its sums (tallies, record counts,
 *   case-mix strata: `BenchmarkParts`), a joining practice's are taken from its sums;
 * - everything that depends on the region (pooled rates, case-mix rates and expected counts,
 *   medians, over-dispersion, limits, flags, intervals, the life table) is computed again by
 *   `buildBenchmarkOfParts`, the same code as the build from every practice's sums.
 *
 * The result's content, and so its stored bytes, equal those of a build from scratch
 * (`resultContent`) of the same set: rebuild.spec.ts checks random sequences of confirms.
 */
import {
  type BenchmarkParts,
  buildBenchmarkOfParts,
  mergeSums,
  type PracticeSums,
  replaceSums,
  sumsLayout,
} from '@cairn/metrics';
import type { MeasureSetVersion } from '../../measure-sets/measure-sets.service.js';
import type { QuarterDto } from '../../quarters/dto/quarter.dto.js';
import type { ResultContent } from './result-body.js';

/** One practice of a result, with what a rebuild keeps of its sums. */
export interface PartsEntry {
  code: string;
  locality: string | null;
  submissionId: number;
  parts: BenchmarkParts;
}

/** What a rebuild needs of a built result: its practices' parts (code order) and region sums. */
export interface ResultParts {
  quarterId: number;
  measureSetId: string;
  practices: PartsEntry[];
  regionSums: PracticeSums | null;
}

/** A practice of the new set: its code and locality now, and its current submission. */
export interface SetMember {
  submissionId: number;
  practice: { code: string; localityCode: string | null };
}

/** Copies of the parts of a practice's sums (not views that would keep its full sums alive). */
export function partsOf(sums: PracticeSums): BenchmarkParts {
  return {
    tallies: sums.tallies.slice(),
    records: sums.records.slice(),
    strata: { ids: sums.strata.ids.slice(), values: sums.strata.values.slice() },
  };
}

/** The parts of a result built from every practice's sums (members in code order). */
export function partsOfBuild(
  quarterId: number,
  version: MeasureSetVersion,
  members: readonly SetMember[],
  sums: ReadonlyMap<number, PracticeSums>,
  regionSums: PracticeSums | null,
): ResultParts {
  return {
    quarterId,
    measureSetId: version.id,
    practices: members.map((m) => ({
      code: m.practice.code,
      locality: m.practice.localityCode,
      submissionId: m.submissionId,
      parts: partsOf(sums.get(m.submissionId)!),
    })),
    regionSums,
  };
}

/** What changed between a result's set and the new one: submissions that left and joined. */
export function setChange(
  previous: ResultParts,
  members: readonly SetMember[],
): { left: number[]; joined: number[] } {
  const before = new Set(previous.practices.map((p) => p.submissionId));
  const now = new Set(members.map((m) => m.submissionId));
  return {
    left: [...before].filter((id) => !now.has(id)),
    joined: [...now].filter((id) => !before.has(id)),
  };
}

/**
 * The new set's result content and parts from the previous result's parts. `changed` holds the
 * sums of every submission that left or joined (setChange).
 */
export function rebuildContent(
  quarter: Pick<QuarterDto, 'id' | 'year' | 'quarter'>,
  version: MeasureSetVersion,
  previous: ResultParts,
  members: readonly SetMember[],
  changed: ReadonlyMap<number, PracticeSums>,
): { content: ResultContent; parts: ResultParts } {
  if (previous.quarterId !== quarter.id || previous.measureSetId !== version.id) {
    throw new Error('a result is rebuilt only from a result of its quarter and measure set');
  }
  const { left, joined } = setChange(previous, members);
  const sumsOf = (id: number): PracticeSums => {
    const s = changed.get(id);
    if (!s) throw new Error(`no sums for submission ${id}`);
    return s;
  };
  const kept = new Map(previous.practices.map((p) => [p.submissionId, p.parts]));
  const practices: PartsEntry[] = members.map((m) => ({
    code: m.practice.code,
    locality: m.practice.localityCode,
    submissionId: m.submissionId,
    parts: kept.get(m.submissionId) ?? partsOf(sumsOf(m.submissionId)),
  }));
  const added = joined.map(sumsOf);
  const regionSums =
    previous.regionSums === null
      ? added.length > 0
        ? mergeSums(added)
        : null
      : replaceSums(previous.regionSums, left.map(sumsOf), added);
  const benchmark = buildBenchmarkOfParts({
    practices: practices.map((p) => ({ code: p.code, locality: p.locality, parts: p.parts })),
    insulin: regionSums ? [regionSums.insulin] : [],
    measureSet: sumsLayout(version.compiled),
    quarter: { year: quarter.year, quarter: quarter.quarter },
  });
  return {
    content: {
      description: {
        quarterId: quarter.id,
        measureSetId: version.id,
        practices: members.map((m) => ({ code: m.practice.code, submissionId: m.submissionId })),
      },
      benchmark,
      regionSums,
    },
    parts: { quarterId: quarter.id, measureSetId: version.id, practices, regionSums },
  };
}
