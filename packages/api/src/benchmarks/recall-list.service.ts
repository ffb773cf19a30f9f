/**
 * Recall lists: a practice's own records that count against it on one care
 * process or treatment target in an audit quarter (recall/recall-rule.ts),
 * read from the practice's current submission for the quarter and evaluated
 * by @cairn/metrics' plain per-record evaluation (evaluateRecord) under the
 * quarter's measure set.
 *
 * The steps: the quarter (404 outside the caller's region), its measure set
 * and the measure (404 naming it), the current submission (404
 * no-current-submission: there is no list to show, not an empty one), then
 * the listing — for every measure, the extract rows of the records on its
 * list, by type group — built in one pass over the submission's records in
 * batches. A listing depends only on a submission's records and a
 * measure-set version, neither of which ever changes, so it is kept in
 * memory (bounded) by both ids; any process can rebuild it. A page or a
 * download then reads just its records again and describes them.
 */
import type { Writable } from 'node:stream';
import { HttpStatus, Inject, Injectable } from '@nestjs/common';
import { evaluateRecord, reviewWindow, type TypeSplit } from '@cairn/metrics';
import ExcelJS from 'exceljs';
import type { Actor } from '../auth/actor.js';
import { ProblemException } from '../common/problem.js';
import type { MeasureView } from '../measure-sets/describe.js';
import { toMeasureDto } from '../measure-sets/measure-set-views.js';
import {
  type MeasureSetVersion,
  MeasureSetsService,
} from '../measure-sets/measure-sets.service.js';
import { CLINICAL_CAUTION } from '../organisations/organisations.service.js';
import type { QuarterDto } from '../quarters/dto/quarter.dto.js';
import { QuartersService } from '../quarters/quarters.service.js';
import { neutralise } from '../common/neutralise.js';
import { mayWrite, seesRecordRefs } from '../submissions/submission-policy.js';
import { type CurrentSubmission, SubmissionsService } from '../submissions/submissions.service.js';
import {
  RECALL_PAGE_DEFAULT,
  type RecallExportQueryDto,
  type RecallListDto,
  type RecallListQueryDto,
} from './dto/recall-list.dto.js';
import { type RecallItem, recallItem, type RecallItemContext } from './recall/recall-item.js';
import { inDenominator, recallReason } from './recall/recall-rule.js';
import { csvLine, recallCells, recallColumns } from './recall/recall-sheet.js';

/** One measure's list: extract rows by type group (0 type 1, 1 type 2 and other), ascending. */
interface MeasureListing {
  denominator: [number, number];
  rows: [Uint32Array, Uint32Array];
}

interface Listing {
  eligible: [number, number];
  measures: MeasureListing[];
  /** Rows held, for the cache's budget */
  size: number;
}

interface Opened {
  user: Actor;
  quarter: QuarterDto;
  version: MeasureSetVersion;
  measure: MeasureView;
  split: TypeSplit;
  submission: CurrentSubmission;
  rows: Uint32Array;
  counts: { eligible: number; denominator: number; listed: number };
  context: RecallItemContext;
}

export interface RecallDownload {
  fileName: string;
  contentType: string;
  write(out: Writable): Promise<void>;
}

/** Rows of listings kept in memory at most (4 bytes each). */
const CACHE_ROWS = 4_000_000;
/** Records read per query while describing a download */
const DESCRIBE_BATCH = 2000;

const GROUPS: Record<TypeSplit, readonly (0 | 1)[]> = {
  all: [0, 1],
  type1: [0],
  type2_other: [1],
};

/** Merges ascending row lists. */
function merged(lists: Uint32Array[]): Uint32Array {
  if (lists.length === 1) return lists[0]!;
  const out = new Uint32Array(lists.reduce((n, l) => n + l.length, 0));
  out.set(lists[0]!);
  for (let k = 1; k < lists.length; k++) out.set(lists[k]!, lists[k - 1]!.length);
  return out.sort();
}

const safeName = (text: string) => text.replace(/[^A-Za-z0-9_-]/g, '_');

@Injectable()
export class RecallListService {
  private readonly listings = new Map<string, Promise<Listing>>();
  private readonly sizes = new Map<string, number>();
  private cachedRows = 0;

  constructor(
    @Inject(QuartersService) private readonly quarters: QuartersService,
    @Inject(MeasureSetsService) private readonly measureSets: MeasureSetsService,
    @Inject(SubmissionsService) private readonly submissions: SubmissionsService,
  ) {}

  /** One page of a practice's recall list for a measure. */
  async page(
    user: Actor,
    practiceId: number,
    quarterId: number,
    query: RecallListQueryDto,
  ): Promise<RecallListDto> {
    const opened = await this.open(user, practiceId, quarterId, query);
    const offset = query.offset ?? 0;
    const limit = query.limit ?? RECALL_PAGE_DEFAULT;
    const items = await this.describe(opened, opened.rows.subarray(offset, offset + limit));
    const { quarter, submission } = opened;
    return {
      practice: {
        id: submission.practiceId,
        code: submission.practiceCode,
        name: submission.practiceName,
      },
      quarter,
      measureSetId: opened.version.id,
      measure: toMeasureDto(opened.measure),
      split: opened.split,
      submission: {
        id: submission.id,
        records: submission.records,
        confirmedAt: submission.confirmedAt,
      },
      recordReferences: opened.context.showRecordRefs ? 'record_ref' : 'pseudonym',
      counts: opened.counts,
      total: opened.rows.length,
      offset,
      limit,
      items,
    };
  }

  /** The whole list as CSV or XLSX; every problem is found before anything is sent. */
  async download(
    user: Actor,
    practiceId: number,
    quarterId: number,
    query: RecallExportQueryDto,
    kind: 'csv' | 'xlsx',
  ): Promise<RecallDownload> {
    const opened = await this.open(user, practiceId, quarterId, query);
    const { submission, quarter, measure, split } = opened;
    const fileName = `cairn-recall-${safeName(submission.practiceCode)}-${quarter.year}Q${quarter.quarter}-${measure.key}${split === 'all' ? '' : `-${split}`}.${kind}`;
    return kind === 'csv'
      ? {
          fileName,
          contentType: 'text/csv; charset=utf-8',
          write: (out) => this.writeCsv(opened, out),
        }
      : {
          fileName,
          contentType: 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet',
          write: (out) => this.writeXlsx(opened, out),
        };
  }

  private async open(
    user: Actor,
    practiceId: number,
    quarterId: number,
    query: RecallExportQueryDto,
  ): Promise<Opened> {
    const quarter = await this.quarters.get(user, quarterId);
    const version = await this.measureSets.get(quarter.measureSetId);
    const measure = version.measures.find((m) => m.key === query.measure);
    if (!measure) {
      throw new ProblemException(
        HttpStatus.NOT_FOUND,
        'measure-not-found',
        'No such measure',
        `The measure set of ${quarter.label} (${version.id}) has no measure "${query.measure}". Its measures are: ${version.measures.map((m) => m.key).join(', ')}.`,
        {
          measure: query.measure,
          measureSetId: version.id,
          knownMeasures: version.measures.map((m) => m.key),
        },
      );
    }
    const submission = await this.submissions.current(practiceId, quarterId);
    if (!submission) {
      // The practice and the quarter are both of the caller's region (the route is practice-scoped).
      const canUpload = mayWrite(user, {
        practiceId,
        practiceRegionId: quarter.regionId,
        quarterStatus: quarter.status,
      });
      throw new ProblemException(
        HttpStatus.NOT_FOUND,
        'no-current-submission',
        'No confirmed extract for this quarter',
        `This practice has no confirmed extract for ${quarter.label}, so it has no recall list yet. ${
          canUpload
            ? `Upload the practice's extract for ${quarter.label} and confirm it; the recall list is built from it.`
            : "The list appears once the practice's extract for this quarter is uploaded and confirmed."
        }`,
        {
          practiceId,
          quarterId,
          canUpload,
          uploadPath: canUpload
            ? `/extracts/upload?practice=${practiceId}&quarter=${quarterId}`
            : null,
        },
      );
    }
    const split = query.split ?? 'all';
    const listing = await this.listing(submission, version, quarter);
    const groups = GROUPS[split];
    const own = listing.measures[measure.index]!;
    const rows = merged(groups.map((g) => own.rows[g]));
    const measures = new Map(version.measures.map((m) => [m.key, m]));
    const ageDimension = version.compiled.dimensions.find((d) => d.key === 'age_band');
    return {
      user,
      quarter,
      version,
      measure,
      split,
      submission,
      rows,
      counts: {
        eligible: groups.reduce<number>((n, g) => n + listing.eligible[g], 0),
        denominator: groups.reduce<number>((n, g) => n + own.denominator[g], 0),
        listed: rows.length,
      },
      context: {
        measure,
        measures,
        window: reviewWindow(
          { year: quarter.year, quarter: quarter.quarter },
          version.compiled.retinalWindowMonths,
        ),
        ageBands: new Map((ageDimension?.categories ?? []).map((c) => [c.key, c.label])),
        showRecordRefs: seesRecordRefs(user, practiceId),
      },
    };
  }

  /** The listing of a submission under a measure-set version: built once, kept while it fits. */
  private listing(
    submission: CurrentSubmission,
    version: MeasureSetVersion,
    quarter: QuarterDto,
  ): Promise<Listing> {
    const key = `${submission.id}/${version.id}`;
    const cached = this.listings.get(key);
    if (cached) {
      // Most recently used last.
      this.listings.delete(key);
      this.listings.set(key, cached);
      return cached;
    }
    const building = this.build(submission, version, quarter);
    this.listings.set(key, building);
    building.then(
      (listing) => {
        if (this.listings.get(key) !== building) return;
        this.sizes.set(key, listing.size);
        this.cachedRows += listing.size;
        for (const [oldest] of this.listings) {
          if (this.cachedRows <= CACHE_ROWS || oldest === key) break;
          this.forget(oldest);
        }
      },
      () => this.listings.delete(key),
    );
    return building;
  }

  private forget(key: string): void {
    this.listings.delete(key);
    this.cachedRows -= this.sizes.get(key) ?? 0;
    this.sizes.delete(key);
  }

  private async build(
    submission: CurrentSubmission,
    version: MeasureSetVersion,
    quarter: QuarterDto,
  ): Promise<Listing> {
    const at = { year: quarter.year, quarter: quarter.quarter };
    const measures = version.measures;
    const rows = measures.map(() => [[], []] as [number[], number[]]);
    const denominator = measures.map(() => [0, 0] as [number, number]);
    const eligible: [number, number] = [0, 0];
    for await (const batch of this.submissions.records(submission)) {
      for (const stored of batch) {
        const outcome = evaluateRecord(stored.record, version.compiled, at);
        if (!outcome.eligible) continue;
        const g = outcome.typeGroup === 'type1' ? 0 : 1;
        eligible[g]++;
        measures.forEach((m, i) => {
          const o = outcome.outcomes[m.key];
          if (inDenominator(m, o)) denominator[i]![g]++;
          if (recallReason(m, o) !== null) rows[i]![g].push(stored.row);
        });
      }
    }
    const listed = measures.map((_, i): MeasureListing => {
      const [a, b] = rows[i]!;
      return { denominator: denominator[i]!, rows: [Uint32Array.from(a), Uint32Array.from(b)] };
    });
    const size = listed.reduce((n, m) => n + m.rows[0].length + m.rows[1].length, 0);
    return { eligible, measures: listed, size };
  }

  /** The lines of these rows (ascending), described. */
  private async describe(opened: Opened, rows: Uint32Array): Promise<RecallItem[]> {
    const stored = await this.submissions.recordsAt(opened.submission, Array.from(rows));
    const at = { year: opened.quarter.year, quarter: opened.quarter.quarter };
    const items: RecallItem[] = [];
    for (const s of stored) {
      const outcome = evaluateRecord(s.record, opened.version.compiled, at);
      const reason = recallReason(opened.measure, outcome.outcomes[opened.measure.key]);
      // The listing was built from these same immutable records under the same measure set.
      if (reason === null)
        throw new Error(`record at row ${s.row} is not on the list it was listed on`);
      items.push(recallItem(s, outcome, reason, opened.context));
    }
    return items;
  }

  private async *lines(opened: Opened): AsyncGenerator<RecallItem[]> {
    for (let from = 0; from < opened.rows.length; from += DESCRIBE_BATCH) {
      yield this.describe(opened, opened.rows.subarray(from, from + DESCRIBE_BATCH));
    }
  }

  private async writeCsv(opened: Opened, out: Writable): Promise<void> {
    const write = (text: string) =>
      out.write(text)
        ? Promise.resolve()
        : new Promise<void>((resolve) => out.once('drain', () => resolve()));
    // A byte-order mark, so that spreadsheet programs read the file as UTF-8 (µ, –, ²).
    await write('\uFEFF' + csvLine(recallColumns(opened.context.showRecordRefs)));
    for await (const items of this.lines(opened)) {
      await write(items.map((item) => csvLine(recallCells(item))).join(''));
    }
    out.end();
  }

  private async writeXlsx(opened: Opened, out: Writable): Promise<void> {
    const workbook = new ExcelJS.stream.xlsx.WorkbookWriter({
      stream: out,
      useSharedStrings: false,
      useStyles: true,
    });
    const sheet = workbook.addWorksheet('Recall list', { views: [{ state: 'frozen', ySplit: 1 }] });
    const widths = [16, 10, 10, 10, 14, 13, 40, 13, 16, 80];
    widths.forEach((w, i) => (sheet.getColumn(i + 1).width = w));
    const heading = sheet.addRow(recallColumns(opened.context.showRecordRefs));
    heading.font = { bold: true };
    heading.commit();
    for await (const items of this.lines(opened)) {
      for (const item of items) sheet.addRow(recallCells(item)).commit();
    }
    sheet.commit();

    const { quarter, measure, submission } = opened;
    const about = workbook.addWorksheet('About this list');
    about.getColumn(1).width = 26;
    about.getColumn(2).width = 100;
    const lines: [string, string | number][] = [
      ['Practice', `${submission.practiceName} (${submission.practiceCode})`],
      [
        'Audit quarter',
        `${quarter.label} (review window ${quarter.windowStart} to ${quarter.windowEnd})`,
      ],
      ['Measure', `${measure.label} (${measure.key})`],
      ['Kind', measure.kind === 'care_process' ? 'Care process' : 'Treatment target'],
      ['Definition', measure.definition],
      ['Population', measure.populationText],
      ['Denominator', measure.denominatorText],
      ['Better', measure.direction === 'higher' ? 'Higher' : 'Lower'],
      ['Guideline', measure.source],
      ...(measure.note ? ([['Note', measure.note]] as [string, string][]) : []),
      ['Measure set', opened.version.id],
      [
        'Diabetes types',
        opened.split === 'all' ? 'All' : opened.split === 'type1' ? 'Type 1' : 'Type 2 and other',
      ],
      ['Listed', opened.counts.listed],
      ['In the denominator', opened.counts.denominator],
      ['Read from', `Submission ${submission.id}, confirmed ${submission.confirmedAt}`],
      [
        'References',
        opened.context.showRecordRefs
          ? "The practice's own record references"
          : 'Pseudonyms (you are not a lead of this practice)',
      ],
      ['Caution', CLINICAL_CAUTION],
    ];
    for (const [k, v] of lines)
      about.addRow([k, typeof v === 'string' ? neutralise(v) : v]).commit();
    about.commit();
    await workbook.commit();
  }
}
