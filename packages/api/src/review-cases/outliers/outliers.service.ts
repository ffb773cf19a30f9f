/**
 * The outlier list of an audit quarter and the drill-down of one practice ×
 * measure, for auditors and regional leads. Both read the quarter's benchmark
 * through an OutlierSource (today the draft benchmark's stored result); the
 * list judges every practice × measure with outlier-rule.ts, says why in
 * words, counts how many consecutive quarters each has been flagged on the
 * same side, and marks those with a case not yet closed. The drill-down takes
 * the practice's results (PracticeResultsService) for the measure: its
 * figures by diabetes type with trends and run-chart signals, the breakdowns
 * against the region, the value histogram and the data-quality flags.
 */
import type { Writable } from 'node:stream';
import { HttpStatus, Inject, Injectable } from '@nestjs/common';
import {
  bandOfCode,
  benchmarkMeasure,
  benchmarkPractice,
  benchmarkTable,
  type TypeSplit,
  type UnitResult,
} from '@cairn/metrics';
import ExcelJS from 'exceljs';
import { neutralise } from '../../common/neutralise.js';
import { SubmissionsService } from '../../submissions/submissions.service.js';
import type { Actor } from '../../auth/actor.js';
import { quartersUpTo } from '../../benchmarks/benchmarks.service.js';
import { ProblemException } from '../../common/problem.js';
import type { MeasureView } from '../../measure-sets/describe.js';
import { toMeasureDto } from '../../measure-sets/measure-set-views.js';
import {
  type MeasureSetVersion,
  MeasureSetsService,
} from '../../measure-sets/measure-sets.service.js';
import {
  CLINICAL_CAUTION,
  OrganisationsService,
  type PracticeInfo,
} from '../../organisations/organisations.service.js';
import type { QuarterDto } from '../../quarters/dto/quarter.dto.js';
import { QuartersService } from '../../quarters/quarters.service.js';
import type {
  DrillDownDto,
  DrillRecordPageDto,
  OutlierBasisDto,
  OutlierListDto,
  OutlierMeasureDto,
  OutlierQueryDto,
  OutlierRowDto,
} from '../dto/outliers.dto.js';
import { mayOpen } from '../review-case-policy.js';
import { caseSubjectKey, ReviewCaseRepository } from '../review-case.repository.js';
import { drillDetail, type DrillQuarter, drillSplits } from './drill-figures.js';
import { DrillRecords, outcomeWords } from './drill-records.js';
import { evidenceOf, evidenceOfUnit, measureContext } from './evidence.js';
import {
  flaggedLike,
  judge,
  type Judgement,
  type MeasureContext,
  reasonInWords,
} from './outlier-rule.js';
import { OUTLIER_SOURCE, type OutlierBasis, type OutlierSource } from './outlier-source.js';

/** The value histogram shown for a measure: by words in its key (none when no value fits). */
const HISTOGRAM_OF: [RegExp, string][] = [
  [/hba1c/, 'hba1c'],
  [/blood_pressure|bp_|systolic/, 'systolic'],
  [/cholesterol/, 'cholesterol'],
  [/bmi/, 'bmi'],
  [/egfr|creatinine|kidney/, 'egfr'],
];

const basisDto = (b: OutlierBasis): OutlierBasisDto => ({
  origin: b.origin,
  resultId: b.resultId,
  key: b.key,
  measureSetId: b.measureSetId,
  builtAt: b.builtAt,
});

const measureRef = (m: MeasureView): OutlierMeasureDto => ({
  key: m.key,
  label: m.label,
  direction: m.direction,
  source: m.source,
});

const index = (q: QuarterDto) => q.year * 4 + q.quarter;

@Injectable()
export class OutliersService {
  constructor(
    @Inject(OUTLIER_SOURCE) private readonly source: OutlierSource,
    @Inject(QuartersService) private readonly quarters: QuartersService,
    @Inject(MeasureSetsService) private readonly measureSets: MeasureSetsService,
    @Inject(OrganisationsService) private readonly organisations: OrganisationsService,
    @Inject(ReviewCaseRepository) private readonly cases: ReviewCaseRepository,
    @Inject(SubmissionsService) private readonly submissions: SubmissionsService,
  ) {
    this.drillRecords = new DrillRecords(submissions);
  }

  private readonly drillRecords: DrillRecords;
  private readonly drills = new Map<string, FixedDrill>();

  async list(actor: Actor, quarterId: number, query: OutlierQueryDto): Promise<OutlierListDto> {
    const quarter = await this.quarters.get(actor, quarterId);
    const version = await this.measureSets.get(quarter.measureSetId);
    const level = query.level ?? 'outer';
    const caseMix = query.caseMix ?? false;
    const split: TypeSplit = query.split ?? 'all';
    const localities = await this.organisations.regionLocalities(quarter.regionId);
    if (query.locality !== undefined && !localities.some((l) => l.code === query.locality)) {
      throw new ProblemException(
        HttpStatus.NOT_FOUND,
        'locality-not-found',
        'No such locality',
        `Your region has no locality "${query.locality}". Its localities are: ${localities.map((l) => l.code).join(', ')}.`,
        { errors: [{ field: 'locality', message: 'no such locality' }] },
      );
    }
    if (query.measure !== undefined && !version.measures.some((m) => m.key === query.measure)) {
      throw new ProblemException(
        HttpStatus.NOT_FOUND,
        'measure-not-found',
        'No such measure',
        `The measure set of ${quarter.label} (${version.id}) has no measure "${query.measure}". Its measures are: ${version.measures.map((m) => m.key).join(', ')}.`,
        { errors: [{ field: 'measure', message: 'not in the quarter’s measure set' }] },
      );
    }
    const base = {
      quarter,
      level,
      caseMix,
      split,
      measures: version.measures.map(measureRef),
      localities: localities.map((l) => ({ code: l.code, name: l.name })),
      mayOpenCases: mayOpen(actor),
      caution: CLINICAL_CAUTION,
    };
    const basis = await this.source.basisOf(quarter);
    if (!basis) {
      return { ...base, state: 'no-accepted-submissions', basis: null, rows: [], practices: 0 };
    }
    const b = basis.benchmark;
    const choice = { level, caseMix };
    // One pass per measure over the stored result's units; practices are read for those listed.
    const found: { u: UnitResult; m: MeasureView; j: Judgement; context: MeasureContext }[] = [];
    const wantLocality = query.locality === undefined ? -1 : b.localities.indexOf(query.locality);
    const practiceIndex = new Map(b.practices.map((code, i) => [code, i]));
    const measures = version.measures.filter(
      (m) => query.measure === undefined || m.key === query.measure,
    );
    // Without case mix the stored flags (adjusted limits) say which units can be listed: only
    // those are read in full (a practice's every measure at once), when they are few enough for
    // that to be cheaper than reading each measure's every unit. With case mix every unit's
    // adjusted rate is judged.
    const flagged = caseMix ? null : benchmarkTable(b, split);
    const few =
      flagged !== null &&
      new Set(
        flagged.units
          .filter((t) => t.adjusted.some((code) => mayBeListed(code, level)))
          .map((t) => t.code),
      ).size *
        b.measures.length *
        3 <
        measures.length * b.practices.length;
    const table = few ? flagged : null;
    const views = new Map<string, ReturnType<typeof benchmarkPractice>>();
    const unitOf = (code: string, key: string): UnitResult => {
      let view = views.get(code);
      if (!view) views.set(code, (view = benchmarkPractice(b, code)));
      return view.results.find((r) => r.measure.key === key && r.split === split)!.unit;
    };
    for (const m of measures) {
      if (!b.measures.some((x) => x.key === m.key)) continue;
      const context = measureContext(b, m.key, split);
      const mi = table ? table.measures.indexOf(m.key) : -1;
      const units = table
        ? table.units
            .filter((t) => mayBeListed(t.adjusted[mi] ?? 0, level))
            .map((t) => unitOf(t.code, m.key))
        : benchmarkMeasure(b, m.key, split).units;
      for (const u of units) {
        const j = judge(u, context, choice);
        if (!j) continue;
        if (query.assessment !== undefined && j.assessment !== query.assessment) continue;
        if (
          query.locality !== undefined &&
          b.practiceLocality[practiceIndex.get(u.code) ?? -1] !== wantLocality
        )
          continue;
        found.push({ u, m, j, context });
      }
    }
    const practices = new Map(
      (
        await this.organisations.practicesByCode(
          quarter.regionId,
          found.map((f) => f.u.code),
        )
      ).map((p) => [p.code, p]),
    );
    const localityOf = (code: string) => {
      const l = b.practiceLocality[practiceIndex.get(code) ?? -1] ?? -1;
      return l < 0 ? null : (localities.find((x) => x.code === b.localities[l]) ?? null);
    };
    const open = await this.cases.unclosedOf(quarter.id);
    const rows: OutlierRowDto[] = [];
    for (const { u, m, j, context } of found) {
      const practice = practices.get(u.code);
      if (!practice) continue;
      const locality = localityOf(u.code);
      const { evidence } = evidenceOfUnit(basis, u, context, choice);
      evidence.reason = reasonInWords(u, j, context, choice);
      rows.push({
        practice: {
          id: practice.id,
          code: practice.code,
          name: practice.name,
          localityName: locality?.name ?? null,
        },
        localityCode: locality?.code ?? null,
        measure: measureRef(m),
        band: j.band,
        side: j.side,
        assessment: j.assessment,
        rate: j.rate,
        limit: j.limit,
        z: j.z,
        evidence,
        flaggedQuarters: 1,
        openCase: open.get(caseSubjectKey(practice.id, m.key, split)) ?? null,
      });
    }
    rows.sort(
      (x, y) => Math.abs(y.z) - Math.abs(x.z) || (x.practice.code < y.practice.code ? -1 : 1),
    );
    await this.countStreaks(quarter, rows, split, level);
    return {
      ...base,
      state: 'results',
      basis: basisDto(basis),
      rows,
      practices: b.practices.length,
    };
  }

  /**
   * Consecutive earlier quarters in which each listed result was flagged on the same side, read
   * from each quarter's stored flag against the over-dispersion-adjusted limits (docs/methods.md
   * §12); a quarter without a benchmark, the practice or the measure ends the run.
   */
  private async countStreaks(
    quarter: QuarterDto,
    rows: OutlierRowDto[],
    split: TypeSplit,
    level: 'outer' | 'inner',
  ): Promise<void> {
    if (rows.length === 0) return;
    const earlier = (await this.quarters.list(quarter.regionId))
      .filter((q) => index(q) < index(quarter))
      .sort((a, b) => index(b) - index(a));
    const bases = await this.source.basesOf(earlier);
    const open = new Set(rows.map((_, i) => i));
    for (const q of earlier) {
      if (open.size === 0) return;
      const basis = bases.get(q.id) ?? null;
      if (!basis) return;
      const table = benchmarkTable(basis.benchmark, split);
      const units = new Map(table.units.map((u) => [u.code, u]));
      for (const i of [...open]) {
        const row = rows[i]!;
        const m = table.measures.indexOf(row.measure.key);
        const code = m < 0 ? undefined : units.get(row.practice.code)?.adjusted[m];
        if (code !== undefined && flaggedLike(code, row.side, level)) row.flaggedQuarters++;
        else open.delete(i);
      }
      // A quarter that is not the one just before ends every run.
    }
  }

  /** The subject of a drill-down: quarter, measure, practice, basis and its submission; 404s. */
  private async subject(actor: Actor, quarterId: number, practiceId: number, measureKey: string) {
    const quarter = await this.quarters.get(actor, quarterId);
    const version = await this.measureSets.get(quarter.measureSetId);
    const measure = measureOf(quarter, version, measureKey);
    const practice = await this.organisations.practice(practiceId);
    if (!practice || practice.regionId !== actor.regionId) throw practiceNotFound(practiceId);
    const basis = await this.source.basisOf(quarter);
    const submissionId = basis?.submissionOf.get(practice.code);
    if (!basis || submissionId === undefined) throw noSubmission(practice, quarter);
    const submission = { id: submissionId, practiceCode: practice.code };
    return { quarter, version, measure, practice, basis, submission };
  }

  /** One page of the de-identified records behind the result (pseudonyms only). */
  async records(
    actor: Actor,
    quarterId: number,
    practiceId: number,
    measureKey: string,
    query: { split?: TypeSplit; page?: number; pageSize?: number },
  ): Promise<DrillRecordPageDto> {
    const s = await this.subject(actor, quarterId, practiceId, measureKey);
    const at = { year: s.quarter.year, quarter: s.quarter.quarter };
    const rows = await this.drillRecords.rowsOf(
      s.submission,
      s.version,
      s.measure,
      query.split ?? 'all',
      at,
    );
    const page = query.page ?? 1;
    const pageSize = query.pageSize ?? 50;
    const slice = Array.from(rows.subarray((page - 1) * pageSize, page * pageSize));
    return {
      total: rows.length,
      page,
      pageSize,
      records: await this.drillRecords.describe(s.submission, s.version, s.measure, slice, at),
    };
  }

  /**
   * The evidence as a workbook: what it is about and why it stands out, the figures by diabetes
   * type, the breakdowns against the region, the trend, the data-quality flags and the records
   * behind it (pseudonyms only). Every text cell goes through neutralise().
   */
  async evidenceXlsx(
    actor: Actor,
    quarterId: number,
    practiceId: number,
    measureKey: string,
    out: Writable,
  ): Promise<void> {
    const d = await this.drillDown(actor, quarterId, practiceId, measureKey, 'all');
    const s = await this.subject(actor, quarterId, practiceId, measureKey);
    const at = { year: s.quarter.year, quarter: s.quarter.quarter };
    const text = (v: string) => neutralise(v);
    const workbook = new ExcelJS.stream.xlsx.WorkbookWriter({
      stream: out,
      useSharedStrings: false,
      useStyles: true,
    });
    const sheet = (name: string, heading: string[], widths: number[]) => {
      const ws = workbook.addWorksheet(name, { views: [{ state: 'frozen', ySplit: 1 }] });
      widths.forEach((w, i) => (ws.getColumn(i + 1).width = w));
      const row = ws.addRow(heading.map(text));
      row.font = { bold: true };
      row.commit();
      return ws;
    };
    const about = sheet('About', ['Item', 'Value'], [26, 110]);
    const lines: [string, string | number][] = [
      ['Practice', `${d.practice.name} (${d.practice.code})`],
      ['Audit quarter', d.quarter.label],
      ['Measure', `${d.measure.label} (${d.measure.key})`],
      ['Guideline', d.measure.source],
      ['Why it stands out', d.evidence.reason],
      [
        'Read from',
        `${d.basis.origin === 'report' ? 'Published report' : 'Draft benchmark'} ${d.basis.resultId}, built ${d.basis.builtAt}`,
      ],
      ['Records', 'Pseudonyms only (never the practice’s own references)'],
      ['Caution', d.caution],
    ];
    for (const [k, v] of lines)
      about.addRow([text(k), typeof v === 'string' ? text(v) : v]).commit();
    about.commit();
    const byType = sheet(
      'By diabetes type',
      ['Diabetes type', 'Events', 'n', 'Rate', 'Region rate'],
      [22, 10, 10, 10, 12],
    );
    for (const x of d.splits)
      byType.addRow([text(x.split), x.own.events, x.own.n, x.own.rate, x.region.rate]).commit();
    byType.commit();
    const breakdowns = sheet(
      'Breakdowns',
      ['Breakdown', 'Category', 'Events', 'n', 'Rate', 'Region events', 'Region n', 'Region rate'],
      [18, 22, 10, 10, 10, 14, 12, 12],
    );
    for (const b of d.breakdowns)
      b.cells.cells.forEach((c, i) =>
        breakdowns
          .addRow([
            text(b.breakdown.label),
            text(b.breakdown.categories[i]?.label ?? c.category),
            c.practice.events,
            c.practice.n,
            c.practice.rate,
            text(c.region.events.display),
            text(c.region.n.display),
            c.region.rate,
          ])
          .commit(),
      );
    breakdowns.commit();
    const trend = sheet(
      'Trend',
      ['Quarter', 'Events', 'n', 'Rate', 'Region rate'],
      [12, 10, 10, 10, 12],
    );
    const all = d.splits.find((x) => x.split === 'all');
    d.trendQuarters.forEach((q, i) => {
      const p = all?.trend.points[i];
      trend
        .addRow([
          text(q),
          p?.events ?? null,
          p?.n ?? null,
          p?.rate ?? null,
          all?.regionTrend.points[i]?.rate ?? null,
        ])
        .commit();
    });
    trend.commit();
    const flags = sheet('Data quality', ['Flag', 'Records'], [60, 10]);
    for (const f of d.dataQuality) flags.addRow([text(f.title), f.count]).commit();
    flags.commit();
    const records = sheet(
      'Records',
      [
        'Pseudonym',
        'Birth year',
        'Age',
        'Sex',
        'Diabetes type',
        'Deprivation quintile',
        'Outcome',
        'Readings',
      ],
      [14, 10, 6, 6, 14, 12, 14, 90],
    );
    const rows = await this.drillRecords.rowsOf(s.submission, s.version, s.measure, 'all', at);
    for (let from = 0; from < rows.length; from += 2000) {
      const described = await this.drillRecords.describe(
        s.submission,
        s.version,
        s.measure,
        Array.from(rows.subarray(from, from + 2000)),
        at,
      );
      for (const r of described)
        records
          .addRow([
            text(r.pseudonym),
            r.birthYear,
            r.age,
            text(r.sex),
            text(r.diabetesType),
            r.deprivationQuintile,
            text(outcomeWords(r.outcome)),
            text(r.readings),
          ])
          .commit();
    }
    records.commit();
    await workbook.commit();
  }

  async drillDown(
    actor: Actor,
    quarterId: number,
    practiceId: number,
    measureKey: string,
    split: TypeSplit,
  ): Promise<DrillDownDto> {
    const quarter = await this.quarters.get(actor, quarterId);
    const version = await this.measureSets.get(quarter.measureSetId);
    const measure = measureOf(quarter, version, measureKey);
    const practice = await this.organisations.practice(practiceId);
    if (!practice || practice.regionId !== actor.regionId) throw practiceNotFound(practiceId);
    const series = quartersUpTo(await this.quarters.list(quarter.regionId), quarter);
    // What the answer would be built from, without reading it: the quarters' sets, by key.
    const keys = await this.source.keysOf(series);
    const known = series.every((q) => keys.get(q.id) !== null);
    const wanted = known ? drillKey(practice.id, measure.key, split, series, keys) : null;
    let fixed = wanted === null ? undefined : this.drills.get(wanted);
    if (fixed) {
      // Most recently used last.
      this.drills.delete(wanted!);
      this.drills.set(wanted!, fixed);
    } else {
      const built = await this.buildDrill(quarter, version, measure, practice, split, series);
      fixed = built.fixed;
      if (this.drills.size >= DRILL_CACHE) this.drills.delete(this.drills.keys().next().value!);
      this.drills.set(built.key, fixed);
    }
    const open = [...(await this.cases.unclosedOf(quarter.id))]
      .filter(([key]) => key.startsWith(`${practice.id}/${measure.key}/`))
      .map(([, c]) => c);
    return {
      ...fixed,
      practice: {
        id: practice.id,
        code: practice.code,
        name: practice.name,
        localityName: practice.localityName,
      },
      quarter,
      openCases: open,
      mayOpenCase: mayOpen(actor),
      caution: CLINICAL_CAUTION,
    };
  }

  /**
   * The part of a drill-down that depends only on the stored results it is read from (this
   * quarter's and the earlier ones' of the trend), the practice, measure and split: kept by
   * that key (results never change), so any process builds the same.
   */
  private async buildDrill(
    quarter: QuarterDto,
    version: MeasureSetVersion,
    measure: MeasureView,
    practice: PracticeInfo,
    split: TypeSplit,
    series: QuarterDto[],
  ): Promise<{ key: string; fixed: FixedDrill }> {
    const bases = await this.source.basesOf(series);
    const basis = bases.get(quarter.id) ?? null;
    const submissionId = basis?.submissionOf.get(practice.code);
    if (!basis || submissionId === undefined) throw noSubmission(practice, quarter);
    const drillSeries: DrillQuarter[] = [];
    for (const q of series) {
      const v = await this.measureSets.get(q.measureSetId);
      drillSeries.push({
        quarter: q,
        benchmark: bases.get(q.id)?.benchmark ?? null,
        measureKeys: new Set(v.measures.map((m) => m.key)),
      });
    }
    const { evidence } = evidenceOf(basis, practice.code, measure.key, split, {
      level: 'inner',
      caseMix: false,
    });
    const at = { year: quarter.year, quarter: quarter.quarter };
    const sums = (
      await this.submissions.sumsOfCurrent(
        [{ submissionId, practiceCode: practice.code, records: 0 }],
        version,
        at,
      )
    ).get(submissionId);
    // The values the measure reads; none for a measure without a value of its own (smoking).
    const histogramKey = HISTOGRAM_OF.find(([re]) => re.test(measure.key))?.[1] ?? null;
    const detail =
      sums && basis.regionSums
        ? drillDetail(sums, basis.regionSums, version, measure.key, split, histogramKey)
        : { everyone: null, breakdowns: [], histogram: null };
    const facts = (await this.submissions.confirmedFacts([submissionId])).get(submissionId);
    const keys = new Map(
      series.map((q) => {
        const b = bases.get(q.id);
        return [q.id, b ? `${b.origin}/${b.measureSetId}/${b.key}` : 'none'];
      }),
    );
    return {
      key: drillKey(practice.id, measure.key, split, series, keys),
      fixed: {
        measure: toMeasureDto(measure),
        split,
        basis: basisDto(basis),
        evidence,
        splits: drillSplits(measure, practice.code, drillSeries),
        trendQuarters: series.map((q) => q.label),
        ...detail,
        dataQuality: facts?.dataQuality ?? [],
      },
    };
  }
}

/** Whether a stored flag code (adjusted limits) lies beyond the chosen level on either side. */
function mayBeListed(code: number, level: 'outer' | 'inner'): boolean {
  if (code < 2) return false;
  const { band } = bandOfCode(code as 2 | 3 | 4 | 5);
  return band === 'outlier' || level === 'inner';
}

/** The part of a drill-down kept by what it was built from. */
type FixedDrill = Omit<
  DrillDownDto,
  'practice' | 'quarter' | 'openCases' | 'mayOpenCase' | 'caution'
>;

/** Finished drill-downs kept in each process, at most. */
const DRILL_CACHE = 512;

function drillKey(
  practiceId: number,
  measureKey: string,
  split: TypeSplit,
  series: readonly QuarterDto[],
  keys: ReadonlyMap<number, string | null>,
): string {
  return `${practiceId}/${measureKey}/${split}/${series.map((q) => `${q.id}:${keys.get(q.id)}`).join(',')}`;
}

function measureOf(quarter: QuarterDto, version: MeasureSetVersion, measureKey: string) {
  const measure = version.measures.find((m) => m.key === measureKey);
  if (!measure) {
    throw new ProblemException(
      HttpStatus.NOT_FOUND,
      'measure-not-found',
      'No such measure',
      `The measure set of ${quarter.label} (${version.id}) has no measure "${measureKey}". Its measures are: ${version.measures.map((m) => m.key).join(', ')}.`,
    );
  }
  return measure;
}

function practiceNotFound(practiceId: number): ProblemException {
  return new ProblemException(
    HttpStatus.NOT_FOUND,
    'practice-not-found',
    'No such practice',
    `There is no practice ${practiceId} in your region.`,
  );
}

function noSubmission(practice: PracticeInfo, quarter: QuarterDto): ProblemException {
  return new ProblemException(
    HttpStatus.NOT_FOUND,
    'no-current-submission',
    'No figures for this practice',
    `${practice.name} (${practice.code}) has no current submission for ${quarter.label}: there is nothing to drill into.`,
  );
}
