/**
 * The region's benchmark of an audit quarter, for regional leads and
 * auditors: every practice with a current submission on every measure (the
 * practices × measures table), one measure's funnel, and the trend of a
 * measure over the region's quarters. Every figure is read from the quarter's
 * stored result (BenchmarkStore) through @cairn/metrics' views; practices
 * without a current submission are listed as missing, never counted as zero.
 */
import { HttpStatus, Inject, Injectable } from '@nestjs/common';
import {
  type Benchmark,
  benchmarkMeasure,
  benchmarkMeasureAt,
  benchmarkRecords,
  type MeasureComparison,
  type TypeSplit,
} from '@cairn/metrics';
import type { Actor } from '../auth/actor.js';
import { ProblemException } from '../common/problem.js';
import type { MeasureView } from '../measure-sets/describe.js';
import { toMeasureDto } from '../measure-sets/measure-set-views.js';
import {
  type MeasureSetVersion,
  MeasureSetsService,
} from '../measure-sets/measure-sets.service.js';
import type { PracticeDto } from '../organisations/dto/practice.dto.js';
import {
  CLINICAL_CAUTION,
  OrganisationsService,
  type PracticeInfo,
} from '../organisations/organisations.service.js';
import type { QuarterDto } from '../quarters/dto/quarter.dto.js';
import { QuartersService } from '../quarters/quarters.service.js';
import { SubmissionsService } from '../submissions/submissions.service.js';
import { ResultInputs } from './answers/result-inputs.js';
import { type StoredAnswer, StoredAnswers } from './answers/stored-answers.service.js';
import {
  BenchmarkStore,
  byCode,
  type QuarterResult,
  SetChangedError,
} from './benchmark-store.service.js';
import {
  BENCHMARK_PAGE_MAX,
  BENCHMARK_PAGE_SIZE,
  type BenchmarkPracticeDto,
  type BenchmarkQueryDto,
  BenchmarkTrendDto,
  type MeasureFunnelDto,
  type PracticeTrendDto,
  type RegionBenchmarkDto,
  type TrendQueryDto,
} from './dto/benchmark.dto.js';
import type { LocalityDto } from './dto/results-common.dto.js';
import {
  builtFrom,
  caseMix,
  cell,
  flagWithLimits,
  interval,
  regionMeasure,
  type TrendInput,
  trendDto,
} from './results/views.js';

const SPLIT_INDEX: Record<TypeSplit, number> = { all: 0, type1: 1, type2_other: 2 };

export const practiceDto = (p: PracticeInfo): PracticeDto => ({
  id: p.id,
  code: p.code,
  name: p.name,
  localityName: p.localityName,
});

/** The measure of a quarter's measure set; 404 naming it and the known ones otherwise. */
export function measureOf(
  version: MeasureSetVersion,
  key: string,
  quarter: QuarterDto,
): MeasureView {
  const measure = version.measures.find((m) => m.key === key);
  if (!measure) {
    throw new ProblemException(
      HttpStatus.NOT_FOUND,
      'measure-not-found',
      'No such measure',
      `The measure set of ${quarter.label} (${version.id}) has no measure "${key}". Its measures are: ${version.measures.map((m) => m.key).join(', ')}.`,
      { measure: key, measureSetId: version.id, knownMeasures: version.measures.map((m) => m.key) },
    );
  }
  return measure;
}

/** A measure's comparison of a split in a benchmark (null when the benchmark lacks it). */
export function comparisonOf(
  b: Benchmark,
  key: string,
  split: TypeSplit,
): MeasureComparison | null {
  const m = b.measures.findIndex((x) => x.key === key);
  return m < 0 ? null : (b.comparisons[m * 3 + SPLIT_INDEX[split]] ?? null);
}

/** Every quarter of a region up to and including `quarter`, oldest first. */
export function quartersUpTo(all: readonly QuarterDto[], quarter: QuarterDto): QuarterDto[] {
  const index = (q: QuarterDto) => q.year * 4 + q.quarter;
  return all.filter((q) => index(q) <= index(quarter)).sort((a, b) => index(a) - index(b));
}

@Injectable()
export class BenchmarksService {
  private readonly recordCounts = new Map<string, ReturnType<typeof benchmarkRecords>>();

  constructor(
    @Inject(BenchmarkStore) private readonly store: BenchmarkStore,
    @Inject(QuartersService) private readonly quarters: QuartersService,
    @Inject(MeasureSetsService) private readonly measureSets: MeasureSetsService,
    @Inject(OrganisationsService) private readonly organisations: OrganisationsService,
    @Inject(SubmissionsService) private readonly submissions: SubmissionsService,
    @Inject(StoredAnswers) private readonly answers: StoredAnswers,
    @Inject(ResultInputs) private readonly inputs: ResultInputs,
  ) {}

  /**
   * Every practice × measure of a quarter, with the region's statistics and coverage: every
   * page of the route's stored answers (regionAnswer) read back as one DTO, all of one result
   * (read again when a confirm came in between pages).
   */
  async region(
    actor: Actor,
    quarterId: number,
    query: Omit<BenchmarkQueryDto, 'page' | 'pageSize'>,
  ): Promise<RegionBenchmarkDto> {
    const read = async (page: number) =>
      JSON.parse(
        (
          await this.regionAnswer(actor, quarterId, {
            ...query,
            page,
            pageSize: BENCHMARK_PAGE_MAX,
          })
        ).plain.toString('utf8'),
      ) as RegionBenchmarkDto;
    for (let attempt = 0; ; attempt++) {
      const first = await read(1);
      const practices = [...first.practices];
      let same = true;
      for (let page = 2; same && page <= first.page.pages; page++) {
        const next = await read(page).catch((error: unknown) => {
          // Fewer pages now: a confirm came in between.
          if (error instanceof ProblemException && attempt < 2) return null;
          throw error;
        });
        if (!next || next.builtFrom?.resultId !== first.builtFrom?.resultId) same = false;
        else practices.push(...next.practices);
      }
      if (same) {
        return {
          ...first,
          practices,
          page: {
            page: 1,
            pageSize: Math.max(1, practices.length),
            pages: 1,
            total: practices.length,
          },
        };
      }
      if (attempt >= 2) throw new SetChangedError(quarterId);
    }
  }

  /**
   * The route's finished response (StoredAnswers): keyed by the quarter's stored result (its
   * current set, measure set and result format), the quarter as sent, the region's practices
   * and localities as they are, the split and the locality. Three small SELECTs when the
   * answer is known; built (buildRegion) and stored once otherwise.
   */
  async regionAnswer(
    actor: Actor,
    quarterId: number,
    query: BenchmarkQueryDto,
  ): Promise<StoredAnswer> {
    const split = query.split ?? 'all';
    const page = query.page ?? 1;
    const pageSize = query.pageSize ?? BENCHMARK_PAGE_SIZE;
    for (let attempt = 0; ; attempt++) {
      try {
        // One SELECT: the quarter, its current set and the region's fingerprint.
        const inputs = await this.inputs.of(actor.regionId);
        const quarter = this.quarters.quarterAmong(inputs.quarters, quarterId);
        const sets = await inputs.setsOf([quarter]);
        const organisation = inputs.fingerprint;
        const key = StoredAnswers.keyOf('region', [
          ...(await this.store.resultIdsOf([quarter], sets)),
          JSON.stringify(quarter),
          organisation,
          split,
          query.locality ?? '',
          String(page),
          String(pageSize),
        ]);
        return await this.answers.answer('region', quarter.id, key, async () => {
          const result = (await this.store.resultsWith([quarter], sets)).get(quarter.id) ?? null;
          return this.buildRegion(quarter, result, {
            split,
            locality: query.locality,
            page,
            pageSize,
          });
        });
      } catch (error) {
        // The set changed while it was read (a confirm in between): read it again.
        if (!(error instanceof SetChangedError) || attempt >= 2) throw error;
      }
    }
  }

  private async buildRegion(
    quarter: QuarterDto,
    result: QuarterResult | null,
    query: BenchmarkQueryDto & { page: number; pageSize: number },
  ): Promise<RegionBenchmarkDto> {
    const version = await this.measureSets.get(quarter.measureSetId);
    const split = query.split ?? 'all';
    const localities = await this.organisations.regionLocalities(quarter.regionId);
    const locality = this.localityOf(localities, query.locality);
    const practices = await this.organisations.regionPractices(quarter.regionId);
    const inLocality = (p: PracticeInfo) => locality === null || p.localityCode === locality.code;
    const measures = version.measures.map(toMeasureDto);
    const localityList = localities.map((l) => ({ code: l.code, name: l.name }));
    const coverage = this.coverage(practices.filter(inLocality), result);
    const paging = (total: number) => {
      const pages = Math.max(1, Math.ceil(total / query.pageSize));
      if (query.page > pages) {
        throw new ProblemException(
          HttpStatus.BAD_REQUEST,
          'validation',
          'No such page',
          `page ${query.page} is past the last page: ${total} practices make ${pages} page${pages === 1 ? '' : 's'} of ${query.pageSize}.`,
          {
            errors: [{ field: 'page', message: `page must be from 1 to ${pages}` }],
            pages,
          },
        );
      }
      return { page: query.page, pageSize: query.pageSize, pages, total };
    };
    if (!result) {
      return {
        state: 'no-accepted-submissions',
        quarter,
        measureSetId: version.id,
        split,
        locality,
        localities: localityList,
        builtFrom: null,
        measures,
        region: [],
        practices: [],
        page: paging(0),
        coverage,
        caution: CLINICAL_CAUTION,
      };
    }
    const b = result.benchmark;
    const byCodeInfo = new Map(practices.map((p) => [p.code, p]));
    const listed = result.practices
      .map((p, i) => ({ ...p, index: i, info: byCodeInfo.get(p.code) }))
      .filter((p) => p.info !== undefined && inLocality(p.info));
    const page = paging(listed.length);
    const shown = listed.slice((page.page - 1) * page.pageSize, page.page * page.pageSize);
    // Every measure's units of this page's practices only.
    const indices = shown.map((p) => p.index);
    const units = new Map(
      b.measures.map((m) => [m.key, benchmarkMeasureAt(b, m.key, split, indices)]),
    );
    const facts = await this.submissions.confirmedFacts(shown.map((p) => p.submissionId));
    const records = this.records(result);
    const rows: BenchmarkPracticeDto[] = shown.map((p, i) => {
      const info = p.info!;
      const { code: _code, ...counts } = records[p.index]!;
      void _code;
      return {
        practice: practiceDto(info),
        localityCode: info.localityCode,
        submissionId: p.submissionId,
        records: counts,
        dataQuality: facts.get(p.submissionId)?.dataQuality ?? [],
        cells: b.measures.map((m) => cell(m.key, units.get(m.key)![i]!)),
      };
    });
    return {
      state: 'results',
      quarter,
      measureSetId: version.id,
      split,
      locality,
      localities: localityList,
      builtFrom: builtFrom(result),
      measures,
      region: b.measures.map((m) => regionMeasure(comparisonOf(b, m.key, split)!)),
      practices: rows,
      page,
      coverage,
      caution: CLINICAL_CAUTION,
    };
  }

  /** One measure's funnel: every practice's point, the limits as curves, over-dispersion. */
  async funnel(
    actor: Actor,
    quarterId: number,
    measureKey: string,
    split: TypeSplit,
  ): Promise<MeasureFunnelDto> {
    const quarter = await this.quarters.get(actor, quarterId);
    const version = await this.measureSets.get(quarter.measureSetId);
    const measure = measureOf(version, measureKey, quarter);
    const practices = await this.organisations.regionPractices(quarter.regionId);
    const result = await this.store.resultOf(quarter);
    const missing = this.coverage(practices, result).missing;
    const base = {
      quarter,
      measureSetId: version.id,
      measure: toMeasureDto(measure),
      split,
      missing,
      caution: CLINICAL_CAUTION,
    };
    if (!result) {
      return {
        ...base,
        state: 'no-accepted-submissions',
        builtFrom: null,
        region: null,
        overdispersion: null,
        points: [],
        curves: null,
      };
    }
    const view = benchmarkMeasure(result.benchmark, measure.key, split);
    const c = view.comparison;
    const od = c.practice.overdispersion;
    const byCodeInfo = new Map(practices.map((p) => [p.code, p]));
    const curves = c.practice.curves;
    return {
      ...base,
      state: 'results',
      builtFrom: builtFrom(result),
      region: regionMeasure(c),
      overdispersion: od
        ? {
            phi: od.phi,
            tau2: od.tau2,
            present: od.present,
            statistic: od.statistic,
            critical: od.critical,
            bounds: od.bounds ? { lower: od.bounds.lower, upper: od.bounds.upper } : null,
          }
        : null,
      points: view.units.flatMap((u) => {
        const info = byCodeInfo.get(u.code);
        if (!info) return [];
        return [
          {
            practice: practiceDto(info),
            localityCode: info.localityCode,
            n: u.n,
            events: u.events,
            rate: u.rate,
            interval: interval(u.interval),
            z: u.z,
            exact: flagWithLimits(u.exact),
            adjusted: flagWithLimits(u.adjusted),
            caseMix: caseMix(u),
            improvementPotential: u.improvementPotential,
          },
        ];
      }),
      curves: curves
        ? {
            n: [...curves.n],
            exact: { ...curves.exact },
            adjusted: curves.adjusted ? { ...curves.adjusted } : null,
          }
        : null,
    };
  }

  /** The region's and every practice's series of one measure over the region's quarters. */
  async trend(actor: Actor, quarterId: number, query: TrendQueryDto): Promise<BenchmarkTrendDto> {
    const quarter = await this.quarters.get(actor, quarterId);
    const version = await this.measureSets.get(quarter.measureSetId);
    const measure = measureOf(version, query.measure, quarter);
    const split = query.split ?? 'all';
    const quarters = quartersUpTo(await this.quarters.list(quarter.regionId), quarter);
    const results = await this.store.resultsOf(quarters);
    const hasMeasure = new Map<number, boolean>();
    for (const q of quarters) {
      const v = await this.measureSets.get(q.measureSetId);
      hasMeasure.set(
        q.id,
        v.measures.some((m) => m.key === measure.key),
      );
    }
    const practices = await this.organisations.regionPractices(quarter.regionId);
    // Per quarter: the practices' units on this measure (null: a gap for everyone).
    const perQuarter = quarters.map((q) => {
      const result = results.get(q.id) ?? null;
      const comparison = result ? comparisonOf(result.benchmark, measure.key, split) : null;
      const units =
        result && comparison
          ? new Map(
              benchmarkMeasure(result.benchmark, measure.key, split).units.map((u) => [u.code, u]),
            )
          : null;
      return { quarter: q, result, comparison, units };
    });
    const input = (
      q: (typeof perQuarter)[number],
      figures: { events: number; n: number } | null,
    ): TrendInput => ({
      at: { year: q.quarter.year, quarter: q.quarter.quarter },
      state: !hasMeasure.get(q.quarter.id)
        ? 'not-in-measure-set'
        : figures === null
          ? 'no-submission'
          : 'value',
      events: figures?.events ?? 0,
      n: figures?.n ?? 0,
    });
    const appears = new Set(
      perQuarter.flatMap((q) => (q.result ? q.result.practices.map((p) => p.code) : [])),
    );
    const listed = practices.filter((p) => p.active || appears.has(p.code)).sort(byCode);
    const practiceSeries: PracticeTrendDto[] = listed.map((p) => ({
      practice: practiceDto(p),
      trend: trendDto(
        perQuarter.map((q) => {
          const u = q.units?.get(p.code);
          return input(q, u ? { events: u.events, n: u.n } : null);
        }),
      ),
    }));
    return {
      quarter,
      measure: toMeasureDto(measure),
      split,
      quarters: perQuarter.map((q) => ({
        quarterId: q.quarter.id,
        quarterLabel: q.quarter.label,
        measureSetId: q.result?.version.id ?? q.quarter.measureSetId,
        hasMeasure: hasMeasure.get(q.quarter.id) ?? false,
        builtFrom: q.result ? builtFrom(q.result) : null,
      })),
      region: trendDto(
        perQuarter.map((q) =>
          input(q, q.comparison ? { events: q.comparison.events, n: q.comparison.n } : null),
        ),
      ),
      practices: practiceSeries,
    };
  }

  private localityOf(localities: LocalityDto[], code: string | undefined): LocalityDto | null {
    if (code === undefined) return null;
    const found = localities.find((l) => l.code === code);
    if (!found) {
      throw new ProblemException(
        HttpStatus.NOT_FOUND,
        'locality-not-found',
        'No such locality',
        `Your region has no locality "${code}". Its localities are: ${localities.map((l) => l.code).join(', ') || 'none'}.`,
        { locality: code, knownLocalities: localities.map((l) => l.code) },
      );
    }
    return { code: found.code, name: found.name };
  }

  private coverage(practices: readonly PracticeInfo[], result: QuarterResult | null) {
    const active = practices.filter((p) => p.active);
    const missing = active.filter((p) => !result?.submissionOf.has(p.code));
    return {
      practices: active.length,
      withSubmission: active.length - missing.length,
      missing: missing.map(practiceDto),
    };
  }

  /** Every practice's record counts of a result (benchmark order), kept with it. */
  private records(result: QuarterResult): ReturnType<typeof benchmarkRecords> {
    const key = `${result.id}/records`;
    let records = this.recordCounts.get(key);
    if (!records) {
      records = benchmarkRecords(result.benchmark);
      if (this.recordCounts.size >= 64) this.recordCounts.clear();
      this.recordCounts.set(key, records);
    }
    return records;
  }
}
