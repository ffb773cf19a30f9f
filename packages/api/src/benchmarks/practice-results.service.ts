/**
 * One practice's results for an audit quarter (its leads, the regional lead,
 * the auditor), read from the quarter's stored result and those of every
 * earlier quarter of the region (BenchmarkStore): its own figures on every
 * measure and split, the region's rate, median and limits at its n, its
 * flags, the change since the previous quarter, its trend with run-chart
 * signals, improvement potential and its submission's data-quality flags;
 * and, as a second answer of its own route, the breakdowns, kidney grid, time
 * to insulin and value histograms against the region (practiceDetail), which
 * the results page reads only on the tabs that show them.
 *
 * Other practices appear only as region aggregates and as unnamed points;
 * for a practice lead under disclosure control (results/peer-disclosure.ts,
 * docs/methods.md §9). A practice without a current submission gets a clear
 * state (`no-current-submission`) and the upload action the submission policy
 * gives the reader.
 */
import { HttpStatus, Inject, Injectable } from '@nestjs/common';
import {
  benchmarkMeasure,
  benchmarkPractice,
  type PracticeDetail,
  type PracticeView,
  practiceDetail,
  type SurvivalEstimate,
  type TypeSplit,
  TYPE_SPLITS,
} from '@cairn/metrics';
import type { Actor } from '../auth/actor.js';
import { ProblemException } from '../common/problem.js';
import { toMeasureDto } from '../measure-sets/measure-set-views.js';
import { MeasureSetsService } from '../measure-sets/measure-sets.service.js';
import {
  CLINICAL_CAUTION,
  OrganisationsService,
  type PracticeInfo,
} from '../organisations/organisations.service.js';
import type { QuarterDto } from '../quarters/dto/quarter.dto.js';
import { QuartersService } from '../quarters/quarters.service.js';
import { mayWrite } from '../submissions/submission-policy.js';
import { SubmissionsService } from '../submissions/submissions.service.js';
import type { CurrentSetRow } from '../submissions/submissions.service.js';
import { type StoredAnswer, StoredAnswers } from './answers/stored-answers.service.js';
import { ResultInputs } from './answers/result-inputs.js';
import { BenchmarkStore, type QuarterResult, SetChangedError } from './benchmark-store.service.js';
import { comparisonOf, practiceDto, quartersUpTo } from './benchmarks.service.js';
import type {
  DisclosedCountDto,
  HistogramCountsDto,
  PracticeDetailDto,
  PracticeMeasureResultDto,
  PracticeResultsDetailDto,
  PracticeResultsDto,
  PracticeResultsWithDetailDto,
  PracticeSplitResultDto,
  SurvivalDto,
} from './dto/practice-results.dto.js';
import { regionCount, regionRate, peerShown } from './results/peer-disclosure.js';
import {
  builtFrom,
  caseMix,
  flagWithLimits,
  interval,
  type TrendInput,
  trendDto,
} from './results/views.js';

/**
 * The common rule of thumb that people with type 2 diabetes need insulin about seven years
 * after diagnosis (docs/methods.md §5: common practice, no source); a reference line only.
 */
const INSULIN_RULE_OF_THUMB_YEARS = 7;

const SPLITS = [...TYPE_SPLITS];

type Figures = { events: number; n: number };

/** Per quarter (oldest first): the quarter, its result, and this practice's view of it. */
interface QuarterSeries {
  quarter: QuarterDto;
  result: QuarterResult | null;
  measureKeys: Set<string>;
  own: Map<string, Figures> | null;
}

const figureKey = (measure: string, split: TypeSplit) => `${measure}/${split}`;

/** What one practice's answer for a quarter is built from, as read for its key. */
interface AnswerScope {
  quarter: QuarterDto;
  /** The quarters it reads: every one up to this (the results' trends), or this one alone */
  quarters: readonly QuarterDto[];
  sets: ReadonlyMap<number, CurrentSetRow | null>;
  /** Disclosure control applies (a practice lead) */
  applied: boolean;
  /** The reader may upload an extract for this practice and quarter */
  upload: boolean;
}

const parsed = <T>(answer: StoredAnswer): T => JSON.parse(answer.plain.toString('utf8')) as T;

@Injectable()
export class PracticeResultsService {
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
   * A practice's results for a quarter: the stored answer of the route (resultsAnswer), read
   * back as the DTO. Digests and the outlier drill-down call this too; a published report reads
   * resultsWithDetail.
   */
  async results(actor: Actor, practiceId: number, quarterId: number): Promise<PracticeResultsDto> {
    return parsed<PracticeResultsDto>(await this.resultsAnswer(actor, practiceId, quarterId));
  }

  /** The practice's detail for a quarter: the stored answer of its route, read back as the DTO. */
  async detail(
    actor: Actor,
    practiceId: number,
    quarterId: number,
  ): Promise<PracticeResultsDetailDto> {
    return parsed<PracticeResultsDetailDto>(await this.detailAnswer(actor, practiceId, quarterId));
  }

  /**
   * A practice's results with their detail, both built from the same stored result (what a
   * published report freezes). A confirm between the two reads gives parts of two results: they
   * are read again; a 409 if they still differ.
   */
  async resultsWithDetail(
    actor: Actor,
    practiceId: number,
    quarterId: number,
  ): Promise<PracticeResultsWithDetailDto> {
    for (let attempt = 0; ; attempt++) {
      const results = await this.results(actor, practiceId, quarterId);
      const detail = await this.detail(actor, practiceId, quarterId);
      if ((results.builtFrom?.resultId ?? null) === (detail.builtFrom?.resultId ?? null)) {
        return { ...results, detail: detail.detail };
      }
      if (attempt >= 2) {
        throw new ProblemException(
          HttpStatus.CONFLICT,
          'results-changed',
          'The results changed while they were read',
          `An extract for ${results.quarter.label} was confirmed while ${results.practice.code}'s results were read, so its results and their detail came from different sets of submissions. Try again.`,
        );
      }
    }
  }

  /**
   * The results route's finished response (StoredAnswers), keyed by the stored results of the
   * quarter and of every earlier quarter of the region (its trends), the quarters as sent, the
   * region's practices and localities as they are, the practice, what the reader may see and
   * whether they may upload. Three small SELECTs when the answer is known; built once otherwise.
   */
  async resultsAnswer(actor: Actor, practiceId: number, quarterId: number): Promise<StoredAnswer> {
    return this.answerOf('practice', actor, practiceId, quarterId, { trend: true }, (scope) =>
      this.build(practiceId, scope),
    );
  }

  /**
   * The detail route's finished response, keyed the same way as resultsAnswer but by this
   * quarter's stored result only (the detail has no trend) and without the upload action.
   */
  async detailAnswer(actor: Actor, practiceId: number, quarterId: number): Promise<StoredAnswer> {
    return this.answerOf(
      'practice-detail',
      actor,
      practiceId,
      quarterId,
      { trend: false },
      (scope) => this.buildDetail(practiceId, scope),
    );
  }

  /**
   * A stored answer of one practice and quarter: what it is built from read in one SELECT
   * (ResultInputs), its key made of all of it, built by `build` when not known yet.
   */
  private async answerOf(
    kind: string,
    actor: Actor,
    practiceId: number,
    quarterId: number,
    { trend }: { trend: boolean },
    build: (scope: AnswerScope) => Promise<unknown>,
  ): Promise<StoredAnswer> {
    let inputs = await this.inputs.of(actor.regionId);
    // Unknown, or of another region: the same 404 as everywhere.
    const quarter = this.quarters.quarterAmong(inputs.quarters, quarterId);
    const quarters = trend ? quartersUpTo(inputs.quarters, quarter) : [quarter];
    const applied = actor.role === 'practice_lead';
    // The route is practice-scoped: the practice is of the reader's region. Only the results
    // carry the upload action.
    const upload =
      trend &&
      mayWrite(actor, {
        practiceId,
        practiceRegionId: actor.regionId,
        quarterStatus: quarter.status,
      });
    for (let attempt = 0; ; attempt++) {
      try {
        if (attempt > 0) inputs = await this.inputs.of(actor.regionId);
        const sets = await inputs.setsOf(quarters);
        const key = StoredAnswers.keyOf(kind, [
          String(practiceId),
          applied ? 'applied' : 'none',
          upload ? 'upload' : '',
          JSON.stringify(quarters),
          ...(await this.store.resultIdsOf(quarters, sets)),
          inputs.fingerprint,
        ]);
        return await this.answers.answer(kind, quarter.id, key, async () =>
          build({ quarter, quarters, sets, applied, upload }),
        );
      } catch (error) {
        // The set changed while it was read (a confirm in between): read it again.
        if (!(error instanceof SetChangedError) || attempt >= 2) throw error;
      }
    }
  }

  private async build(
    practiceId: number,
    { quarter, quarters, sets, applied, upload }: AnswerScope,
  ): Promise<PracticeResultsDto> {
    const quarterId = quarter.id;
    const practice = (await this.organisations.practice(practiceId))!;
    const version = await this.measureSets.get(quarter.measureSetId);
    const actions = {
      upload,
      uploadPath: upload ? `/extracts/upload?practice=${practiceId}&quarter=${quarterId}` : null,
    };
    const results = await this.store.resultsWith(quarters, sets);
    const result = results.get(quarter.id) ?? null;
    const submissionId = result?.submissionOf.get(practice.code);
    const base = {
      practice: practiceDto(practice),
      quarter,
      measureSetId: version.id,
      actions,
      disclosure: applied ? ('applied' as const) : ('none' as const),
      caution: CLINICAL_CAUTION,
    };
    if (!result || submissionId === undefined) {
      return {
        ...base,
        state: 'no-current-submission',
        message: `This practice has no confirmed extract for ${quarter.label}, so it has no results for it yet. ${
          upload
            ? `Upload the practice's extract for ${quarter.label} and confirm it; its results are built from it.`
            : "Its results appear once the practice's extract for this quarter is uploaded and confirmed."
        }`,
        submission: null,
        builtFrom: null,
        records: null,
        quarters: [],
        measures: [],
        dataQuality: [],
      };
    }
    const facts = (await this.submissions.confirmedFacts([submissionId])).get(submissionId);
    const view = benchmarkPractice(result.benchmark, practice.code);
    const series = await this.series(quarters, results, practice);
    return {
      ...base,
      state: 'results',
      message: null,
      submission: facts
        ? { id: facts.id, records: facts.records, confirmedAt: facts.confirmedAt }
        : null,
      builtFrom: builtFrom(result),
      records: view.records,
      quarters: series.map((s) => ({
        quarterId: s.quarter.id,
        quarterLabel: s.quarter.label,
        measureSetId: s.quarter.measureSetId,
        builtFrom: s.result ? builtFrom(s.result) : null,
      })),
      measures: this.measures(version.measures, view, result, series, practice, applied),
      dataQuality: facts?.dataQuality ?? [],
    };
  }

  /** The detail answer: practiceDetail of this quarter's stored result, as the reader may see it. */
  private async buildDetail(
    practiceId: number,
    { quarter, sets, applied }: AnswerScope,
  ): Promise<PracticeResultsDetailDto> {
    const practice = (await this.organisations.practice(practiceId))!;
    const result = (await this.store.resultsWith([quarter], sets)).get(quarter.id) ?? null;
    const base = {
      practice: practiceDto(practice),
      quarter,
      disclosure: applied ? ('applied' as const) : ('none' as const),
      caution: CLINICAL_CAUTION,
    };
    if (!result || !result.submissionOf.has(practice.code)) {
      return { ...base, state: 'no-current-submission', builtFrom: null, detail: null };
    }
    const version = await this.measureSets.get(quarter.measureSetId);
    const sums = await this.store.practiceSums(result, practice.code);
    const detail =
      sums && result.regionSums ? practiceDetail(sums, result.regionSums, version.compiled) : null;
    return {
      ...base,
      state: 'results',
      builtFrom: builtFrom(result),
      detail: detail ? this.detailDto(detail, applied) : null,
    };
  }

  /** The practice's figures in every quarter up to this one (its own view of each result). */
  private async series(
    quarters: readonly QuarterDto[],
    results: ReadonlyMap<number, QuarterResult | null>,
    practice: PracticeInfo,
  ): Promise<QuarterSeries[]> {
    const out: QuarterSeries[] = [];
    for (const quarter of quarters) {
      const result = results.get(quarter.id) ?? null;
      const version = await this.measureSets.get(quarter.measureSetId);
      let own: Map<string, Figures> | null = null;
      if (result?.submissionOf.has(practice.code)) {
        own = new Map(
          benchmarkPractice(result.benchmark, practice.code).results.map((r) => [
            figureKey(r.measure.key, r.split),
            { events: r.unit.events, n: r.unit.n },
          ]),
        );
      }
      out.push({ quarter, result, measureKeys: new Set(version.measures.map((m) => m.key)), own });
    }
    return out;
  }

  private measures(
    measures: Awaited<ReturnType<MeasureSetsService['get']>>['measures'],
    view: PracticeView,
    result: QuarterResult,
    series: readonly QuarterSeries[],
    practice: PracticeInfo,
    applied: boolean,
  ): PracticeMeasureResultDto[] {
    const byKey = new Map(view.results.map((r) => [figureKey(r.measure.key, r.split), r]));
    const previous = series.length >= 2 ? series[series.length - 2]! : null;
    return measures.map((m) => ({
      measure: toMeasureDto(m),
      splits: SPLITS.map((split): PracticeSplitResultDto => {
        const r = byKey.get(figureKey(m.key, split))!;
        const u = r.unit;
        const c = comparisonOf(result.benchmark, m.key, split)!;
        const point = (s: QuarterSeries, figures: Figures | null): TrendInput => ({
          at: { year: s.quarter.year, quarter: s.quarter.quarter },
          state: !s.measureKeys.has(m.key)
            ? 'not-in-measure-set'
            : figures === null
              ? 'no-submission'
              : 'value',
          events: figures?.events ?? 0,
          n: figures?.n ?? 0,
        });
        const trend = trendDto(
          series.map((s) => point(s, s.own?.get(figureKey(m.key, split)) ?? null)),
        );
        const regionTrend = trendDto(
          series.map((s) => {
            const rc = s.result ? comparisonOf(s.result.benchmark, m.key, split) : null;
            return point(s, rc ? { events: rc.events, n: rc.n } : null);
          }),
        );
        const before = previous?.own?.get(figureKey(m.key, split));
        const change =
          previous && before && before.n > 0 && u.rate !== null
            ? {
                previousQuarterId: previous.quarter.id,
                previousQuarterLabel: previous.quarter.label,
                previousRate: before.events / before.n,
                difference: u.rate - before.events / before.n,
              }
            : null;
        const peers = benchmarkMeasure(result.benchmark, m.key, split)
          .units.filter((x) => x.code !== practice.code)
          .map((x) => ({ n: x.n, events: x.events, rate: x.rate }));
        const shownPeers = peers
          .filter((x) => peerShown(x.events, x.n, applied))
          .sort((a, b) => a.n - b.n || (a.rate ?? 0) - (b.rate ?? 0));
        return {
          split,
          own: {
            n: u.n,
            events: u.events,
            rate: u.rate,
            interval: interval(u.interval),
            exact: flagWithLimits(u.exact),
            adjusted: flagWithLimits(u.adjusted),
            caseMix: caseMix(u),
          },
          region: {
            rate: regionRate(c.events, c.n, u.events, u.n, applied),
            median: c.practice.median,
            events: regionCount(c.events, u.events, applied),
            n: regionCount(c.n, u.n, applied),
            practices: c.practice.units,
            overdispersion: c.practice.overdispersion?.present ?? false,
          },
          change,
          improvement: { records: u.improvementPotential, median: c.practice.median },
          trend,
          regionTrend,
          peers: {
            n: shownPeers.map((x) => x.n),
            rate: shownPeers.map((x) => x.rate as number),
            withheld: peers.length - shownPeers.length,
          },
        };
      }),
    }));
  }

  /** practiceDetail with the region's figures as the reader may see them. */
  private detailDto(d: PracticeDetail, applied: boolean): PracticeDetailDto {
    const count = (region: number, own: number): DisclosedCountDto =>
      regionCount(region, own, applied);
    const cellOf = (
      category: string,
      c: PracticeDetail['measures'][number]['splits'][number]['everyone'],
    ) => ({
      category,
      practice: {
        events: c.practice.events,
        n: c.practice.n,
        rate: c.practice.rate,
        interval: interval(c.practice.interval),
      },
      region: {
        events: count(c.region.events, c.practice.events),
        n: count(c.region.n, c.practice.n),
        rate: regionRate(c.region.events, c.region.n, c.practice.events, c.practice.n, applied),
      },
    });
    const histogram = (
      region: PracticeDetail['values'][number]['splits'][number]['region'],
      own: PracticeDetail['values'][number]['splits'][number]['practice'],
    ): HistogramCountsDto => ({
      notRecorded: count(region.notRecorded, own.notRecorded),
      below: count(region.below, own.below),
      bins: region.bins.map((b, i) => count(b, own.bins[i] ?? 0)),
      above: count(region.above, own.above),
    });
    const survival = (
      s: SurvivalEstimate & { excluded: number },
      own: (SurvivalEstimate & { excluded: number }) | null,
    ): SurvivalDto => {
      const ownAt = new Map((own?.steps ?? []).map((x) => [x.time, x]));
      return {
        n: own ? count(s.n, own.n) : shown(s.n),
        events: own ? count(s.events, own.events) : shown(s.events),
        excluded: s.excluded,
        median: s.median,
        steps: s.steps.map((x) => {
          const mine = ownAt.get(x.time);
          const ownAtRisk = own ? (mine?.atRisk ?? atRiskAt(own, x.time)) : 0;
          const ownEvents = mine?.events ?? 0;
          const withheld =
            own !== null && regionRate(x.events, x.atRisk, ownEvents, ownAtRisk, applied) === null;
          return {
            time: x.time,
            atRisk: own ? count(x.atRisk, ownAtRisk) : shown(x.atRisk),
            events: own ? count(x.events, ownEvents) : shown(x.events),
            survival: withheld ? null : x.survival,
            standardError: withheld ? null : x.standardError,
          };
        }),
      };
    };
    const R = d.kidney.rows;
    return {
      breakdowns: d.dimensions.map((dim) => ({
        key: dim.key,
        label: dim.label,
        categories: dim.categories.map((c) => ({ key: c.key, label: c.label })),
      })),
      measures: d.measures.map((m) => ({
        measure: m.key,
        splits: m.splits.map((s) => ({
          split: s.split,
          everyone: cellOf('everyone', s.everyone),
          breakdowns: d.dimensions.map((dim) => ({
            breakdown: dim.key,
            cells: (s.categories[dim.key] ?? []).map((c, i) =>
              cellOf(dim.categories[i]?.key ?? String(i), c),
            ),
          })),
        })),
      })),
      kidney: {
        rows: [...R],
        columns: [...d.kidney.columns],
        splits: d.kidney.splits.map((s) => ({
          split: s.split,
          rows: R.map((row, r) => ({
            row,
            practice: [...(s.practice[r] ?? [])],
            region: (s.region[r] ?? []).map((x, q) => count(x, s.practice[r]?.[q] ?? 0)),
          })),
        })),
      },
      progression: {
        // The practice's own estimate is its own data: shown in full.
        practice: survival(d.progression.practice, null),
        region: survival(d.progression.region, d.progression.practice),
        ruleOfThumbYears: INSULIN_RULE_OF_THUMB_YEARS,
      },
      values: d.values.map((v) => ({
        key: v.key,
        label: v.label,
        unit: v.unit,
        edges: [...v.edges],
        splits: v.splits.map((s) => ({
          split: s.split,
          practice: ownHistogram(s.practice),
          region: histogram(s.region, s.practice),
        })),
      })),
    };
  }
}

const shown = (value: number): DisclosedCountDto => ({ value, display: String(value) });

/** The practice's own histogram: its own data, shown in full. */
function ownHistogram(
  h: PracticeDetail['values'][number]['splits'][number]['practice'],
): HistogramCountsDto {
  return {
    notRecorded: shown(h.notRecorded),
    below: shown(h.below),
    bins: h.bins.map(shown),
    above: shown(h.above),
  };
}

/** People of an estimate still at risk at time t (those whose event or censoring is at t or later). */
function atRiskAt(s: SurvivalEstimate, t: number): number {
  const next = s.steps.find((x) => x.time >= t);
  return next ? next.atRisk : 0;
}
