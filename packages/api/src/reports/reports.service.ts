/**
 * Published reports: a quarter's draft benchmark frozen into an immutable
 * snapshot (snapshot.ts) by the regional lead, read for good from its stored
 * bytes (never from the quarter's current submissions), listed per region,
 * withdrawn with a tombstone, replaced by a later report of the same quarter.
 *
 * Who reads what: regional leads and auditors read the region's part (every
 * practice's figures) and every practice's part; a practice lead reads the
 * report's identity and their own practices' parts. A practice's part is its
 * report as its leads read it: its own figures in full, the region's figures
 * and other practices under disclosure control (docs/methods.md §9). Other modules (digests) read
 * one practice's part through `practicePart`.
 */
import { PassThrough, type Writable } from 'node:stream';
import { HttpStatus, Inject, Injectable } from '@nestjs/common';
import type { Actor } from '../auth/actor.js';
import { AuditTrailService } from '../audit-trail/audit-trail.service.js';
import { BenchmarksService } from '../benchmarks/benchmarks.service.js';
import type { RegionBenchmarkDto } from '../benchmarks/dto/benchmark.dto.js';
import type { PracticeResultsWithDetailDto } from '../benchmarks/dto/practice-results.dto.js';
import { PracticeResultsService } from '../benchmarks/practice-results.service.js';
import { PDF, XLSX } from '../common/file-response.js';
import { ProblemException } from '../common/problem.js';
import type { MeasureSetUseDto } from '../measure-sets/dto/measure-set.dto.js';
import { MeasureSetUsage } from '../measure-sets/measure-set-usage.js';
import type { PracticeDto } from '../organisations/dto/practice.dto.js';
import { CLINICAL_CAUTION } from '../organisations/organisations.service.js';
import type { QuarterReportDto } from '../quarters/dto/quarter.dto.js';
import { QuarterReports } from '../quarters/quarter-reports.js';
import { QuartersService } from '../quarters/quarters.service.js';
import type {
  PeerTableDto,
  ReportDto,
  ReportListDto,
  ReportPracticeDto,
  ReportRegionDto,
} from './dto/report.dto.js';
import { type PackScope, packSheets } from './pack.js';
import { writePack } from './pack-writer.js';
import { writeReportPdf } from './pdf.js';
import { type PeerCounts, protectedPeerTable } from './peer-table.js';
import { regionBreakdowns } from './region-breakdowns.js';
import {
  assertMayPublish,
  assertMayWithdraw,
  mayReadRegion,
  reportActions,
  reportListActions,
} from './report-policy.js';
import { ReportRepository, type ReportRow } from './report.repository.js';
import {
  canonicalBytes,
  decodeSnapshot,
  encodeSnapshot,
  practicePeers,
  type ReportSnapshot,
  SNAPSHOT_FORMAT,
  type SnapshotPractice,
} from './snapshot.js';

const SPLITS = ['all', 'type1', 'type2_other'] as const;

/** Decoded snapshots kept in memory (keyed by report id: the bytes never change). */
const CACHE_ENTRIES = 8;

/** Reports whose practice lists are kept in memory (a few kB each). */
const PRACTICE_LIST_ENTRIES = 1000;

/** Practices' data packs kept in memory (about 100 kB each). */
const PRACTICE_PACK_ENTRIES = 128;

/** Practices whose results are read at once while publishing. */
const PARALLEL = 4;

/** A file made from a report, written to a stream. */
export interface ReportDownload {
  fileName: string;
  contentType: string;
  write: (stream: Writable) => Promise<void>;
}

export const reportLabel = (quarterLabel: string, sequence: number) =>
  `${quarterLabel} · report ${sequence}`;

@Injectable()
export class ReportsService {
  private readonly cache = new Map<number, { canonical: Buffer; snapshot: ReportSnapshot }>();
  private readonly practiceLists = new Map<number, PracticeDto[]>();
  private readonly practicePacks = new Map<string, Buffer>();

  constructor(
    @Inject(ReportRepository) private readonly repository: ReportRepository,
    @Inject(QuartersService) private readonly quarters: QuartersService,
    @Inject(BenchmarksService) private readonly benchmarks: BenchmarksService,
    @Inject(PracticeResultsService) private readonly practiceResults: PracticeResultsService,
    @Inject(AuditTrailService) private readonly audit: AuditTrailService,
    @Inject(QuarterReports) quarterReports: QuarterReports,
    @Inject(MeasureSetUsage) usage: MeasureSetUsage,
  ) {
    quarterReports.register({ reportsOf: (regionId, ids) => this.quarterReports(regionId, ids) });
    usage.register({ usesOf: (regionId, ids) => this.measureSetUses(regionId, ids) });
  }

  // ── publish ──

  /** Freezes the quarter's benchmark of its current submissions into a new report. */
  async publish(actor: Actor, quarterId: number, releaseNote: string): Promise<ReportDto> {
    assertMayPublish(actor);
    const note = releaseNote.trim();
    if (note.length === 0) {
      throw new ProblemException(
        HttpStatus.BAD_REQUEST,
        'validation-failed',
        'The release note is empty',
        'Write a release note: what readers of this report should know.',
        { errors: [{ field: 'releaseNote', message: 'must not be blank' }] },
      );
    }
    const quarter = await this.quarters.get(actor, quarterId);
    const { meta, body } = await this.figures(actor, quarter.id);
    const { id, canonical } = await this.repository.transaction(async (transaction) => {
      const earlier = await this.repository.ofQuarterForUpdate(quarter.id, transaction);
      const sequence = earlier.reduce((max, r) => Math.max(max, r.sequence), 0) + 1;
      const publishedAt = new Date();
      const snapshot: ReportSnapshot = {
        ...body,
        identity: {
          regionId: quarter.regionId,
          quarter,
          sequence,
          label: reportLabel(quarter.label, sequence),
          ...meta,
          publishedAt: publishedAt.toISOString(),
          publishedBy: { userId: actor.id, name: actor.displayName },
          releaseNote: note,
        },
      };
      const encoded = encodeSnapshot(snapshot);
      const id = await this.repository.insert(
        {
          regionId: quarter.regionId,
          quarterId: quarter.id,
          sequence,
          measureSetId: snapshot.identity.measureSetId,
          benchmarkResultId: snapshot.identity.benchmarkResultId,
          submissionsKey: snapshot.identity.submissionsKey,
          submissionCount: snapshot.submissions.length,
          publishedAt,
          publishedByUserId: actor.id,
          publishedBy: actor.displayName,
          releaseNote: note,
          contentHash: encoded.contentHash,
          snapshotBytes: encoded.canonical.length,
          snapshot: encoded.stored,
        },
        transaction,
      );
      const replaced = earlier.filter((r) => r.status === 'published');
      for (const r of replaced) {
        await this.repository.markReplaced(r.id, id, publishedAt, transaction);
      }
      await this.audit.append(
        {
          action: 'report.published',
          summary: `${actor.displayName} published ${snapshot.identity.label} (${snapshot.submissions.length} practices)${
            replaced.length > 0
              ? `, replacing ${replaced.map((r) => reportLabel(quarter.label, r.sequence)).join(', ')}`
              : ''
          }`,
          actor,
          regionId: quarter.regionId,
          subjectType: 'report',
          subjectId: id,
          detail: {
            quarterId: quarter.id,
            contentHash: encoded.contentHash,
            replaced: replaced.map((r) => r.id),
          },
          requestId: actor.requestId,
          ipAddress: actor.ipAddress,
        },
        transaction,
      );
      return { id, canonical: encoded.canonical };
    });
    this.remember(id, canonical);
    return this.get(actor, id);
  }

  /** Every figure of the quarter's benchmark now, checked to come from one stored result. */
  private async figures(actor: Actor, quarterId: number) {
    const splits: RegionBenchmarkDto[] = [];
    for (const split of SPLITS) {
      splits.push(await this.benchmarks.region(actor, quarterId, { split }));
    }
    const all = splits[0]!;
    if (all.state !== 'results' || !all.builtFrom) {
      throw new ProblemException(
        HttpStatus.CONFLICT,
        'nothing-to-publish',
        'Nothing to publish yet',
        `${all.quarter.label} has no confirmed extract yet, so it has no benchmark to publish. A report can be published once at least one practice's extract is confirmed.`,
      );
    }
    const resultId = all.builtFrom.resultId;
    const funnels = [];
    const trends = [];
    for (const m of all.measures) {
      funnels.push(await this.benchmarks.funnel(actor, quarterId, m.key, 'all'));
      trends.push(await this.benchmarks.trend(actor, quarterId, { measure: m.key, split: 'all' }));
    }
    const countsOf = (measureIndex: number): PeerCounts[] =>
      all.practices.map((p) => ({
        practice: p.practice,
        events: p.cells[measureIndex]!.events,
        n: p.cells[measureIndex]!.n,
      }));
    const part = async (p: (typeof all.practices)[number]): Promise<SnapshotPractice> => {
      const results = frozen(
        await this.practiceResults.resultsWithDetail(
          practiceReader(actor, p.practice.id),
          p.practice.id,
          quarterId,
        ),
      );
      return { practice: p.practice, submissionId: p.submissionId, results };
    };
    const practices: SnapshotPractice[] = [];
    // A few at a time: their reads of the database overlap.
    for (let i = 0; i < all.practices.length; i += PARALLEL) {
      practices.push(...(await Promise.all(all.practices.slice(i, i + PARALLEL).map(part))));
    }
    const first = all.practices[0];
    const region = first
      ? await this.practiceResults.detail(actor, first.practice.id, quarterId)
      : null;
    const regionDetail = region?.detail ?? null;
    const built = [
      ...(region ? [region.builtFrom?.resultId] : []),
      ...splits.map((s) => s.builtFrom?.resultId),
      ...funnels.map((f) => f.builtFrom?.resultId),
      ...practices.map((p) => p.results.builtFrom?.resultId),
    ];
    if (built.some((id) => id !== resultId)) {
      throw new ProblemException(
        HttpStatus.CONFLICT,
        'benchmark-changed',
        'The benchmark changed while publishing',
        `An extract for ${all.quarter.label} was confirmed while the report was being frozen, so its figures would not all come from one set of submissions. Nothing was published: review the benchmark and publish again.`,
      );
    }
    const peerTables: PeerTableDto[] = all.measures.map((m, i) =>
      protectedPeerTable(m.key, 'all', countsOf(i)),
    );
    const meta = {
      measureSetId: all.measureSetId,
      benchmarkResultId: resultId,
      submissionsKey: all.builtFrom.submissionsKey,
    };
    const body: Omit<ReportSnapshot, 'identity'> = {
      format: SNAPSHOT_FORMAT,
      submissions: all.practices.map((p) => ({
        practiceId: p.practice.id,
        code: p.practice.code,
        submissionId: p.submissionId,
      })),
      region: {
        splits,
        funnels,
        trends: trends.map((t) => ({ ...t, practices: [] })),
        peerTables,
        breakdowns: regionDetail ? regionBreakdowns(regionDetail) : [],
      },
      practices,
      caution: CLINICAL_CAUTION,
    };
    return { meta, body };
  }

  // ── read ──

  async list(actor: Actor, quarterId?: number): Promise<ReportListDto> {
    if (quarterId !== undefined) await this.quarters.get(actor, quarterId);
    const rows = await this.repository.list(
      actor.regionId,
      quarterId === undefined ? undefined : [quarterId],
    );
    const reports: ReportDto[] = [];
    for (const row of rows) reports.push(await this.dto(actor, row));
    return {
      reports,
      actions: reportListActions(actor, quarterId ?? null),
    };
  }

  async get(actor: Actor, id: number): Promise<ReportDto> {
    return this.dto(actor, await this.row(actor, id));
  }

  /** The region's part of a report (regional leads and auditors: the route declares them). */
  async region(actor: Actor, id: number): Promise<ReportRegionDto> {
    const row = await this.readable(actor, id);
    const { snapshot } = await this.snapshot(row);
    return {
      report: await this.dto(actor, row),
      splits: snapshot.region.splits,
      funnels: snapshot.region.funnels,
      trends: snapshot.region.trends,
      peerTables: snapshot.region.peerTables,
      caution: snapshot.caution,
    };
  }

  /** One practice's part of a report as this reader may see it (the route scopes the practice). */
  async practice(actor: Actor, id: number, practiceId: number): Promise<ReportPracticeDto> {
    const row = await this.readable(actor, id);
    return this.part(actor, row, practiceId);
  }

  /**
   * One practice's part of a report, for another module acting for Cairn (a digest): the
   * practice's report as its leads read it (region and peers under disclosure control), without
   * a role check (the caller decides who receives it). 404 report-not-found, 410
   * report-withdrawn; a practice without results in the report gets state `not-in-report`.
   */
  async practicePart(actor: Actor, id: number, practiceId: number): Promise<ReportPracticeDto> {
    const row = await this.readable(actor, id);
    return this.part(actor, row, practiceId);
  }

  /** The canonical bytes of a report's snapshot (checked against its hash). */
  async canonical(actor: Actor, id: number): Promise<{ row: ReportRow; canonical: Buffer }> {
    const row = await this.row(actor, id);
    return { row, canonical: (await this.snapshot(row)).canonical };
  }

  /** The decoded snapshot of a readable (not withdrawn) report, with its row. */
  async snapshotOf(
    actor: Actor,
    id: number,
  ): Promise<{ row: ReportRow; snapshot: ReportSnapshot }> {
    const row = await this.readable(actor, id);
    return { row, snapshot: (await this.snapshot(row)).snapshot };
  }

  private async part(actor: Actor, row: ReportRow, practiceId: number): Promise<ReportPracticeDto> {
    const { snapshot } = await this.snapshot(row);
    const report = await this.dto(actor, row);
    const found = snapshot.practices.find((p) => p.practice.id === practiceId);
    if (!found) {
      const missing = snapshot.region.splits[0]?.coverage.missing.find((p) => p.id === practiceId);
      if (!missing) {
        throw new ProblemException(
          HttpStatus.NOT_FOUND,
          'practice-not-in-report',
          'The practice is not in this report',
          `Practice ${practiceId} was not a practice of the region when ${report.label} was published.`,
        );
      }
      return {
        report,
        practice: missing,
        state: 'not-in-report',
        message: `${missing.code} had no confirmed extract for ${snapshot.identity.quarter.label} when this report was published, so the report has no results for it.`,
        results: null,
        peers: [],
        caution: snapshot.caution,
      };
    }
    return {
      report,
      practice: found.practice,
      state: 'results',
      message: null,
      results: found.results,
      peers: practicePeers(snapshot, practiceId),
      caution: snapshot.caution,
    };
  }

  // ── downloads ──

  /** A report's data pack (the region's, or one practice's as its leads see it). */
  async pack(actor: Actor, id: number, scope: PackScope): Promise<ReportDownload> {
    const { row, snapshot } = await this.snapshotOf(actor, id);
    const name = this.fileStem(row, snapshot, scope);
    if (scope.kind === 'practice') this.assertInReport(snapshot, scope.practiceId, row);
    const make = (stream: Writable) =>
      writePack(
        packSheets(row, snapshot, scope),
        {
          title: `${snapshot.identity.label} data pack`,
          subject: `Content hash ${row.contentHash}`,
          created: new Date(snapshot.identity.publishedAt),
        },
        stream,
      );
    return {
      fileName: `${name}.xlsx`,
      contentType: XLSX,
      // A practice's pack is the same bytes every time (pack-writer.ts): made once per process
      // and kept by report and practice. The region's (thousands of practices) is streamed.
      write:
        scope.kind === 'region'
          ? make
          : async (stream) => {
              const key = `${row.id}:${row.contentHash}:${scope.practiceId}`;
              let bytes = this.practicePacks.get(key);
              if (!bytes) {
                bytes = await collect(make);
                if (this.practicePacks.size >= PRACTICE_PACK_ENTRIES) {
                  this.practicePacks.delete(this.practicePacks.keys().next().value!);
                }
                this.practicePacks.set(key, bytes);
              }
              await endWith(stream, bytes);
            },
    };
  }

  /** A report's PDF (the region's, or one practice's as its leads see it). */
  async pdf(actor: Actor, id: number, scope: PackScope): Promise<ReportDownload> {
    const { row, snapshot } = await this.snapshotOf(actor, id);
    if (scope.kind === 'practice') this.assertInReport(snapshot, scope.practiceId, row);
    return {
      fileName: `${this.fileStem(row, snapshot, scope)}.pdf`,
      contentType: PDF,
      write: (stream) => writeReportPdf(row, snapshot, scope, stream),
    };
  }

  private fileStem(row: ReportRow, snapshot: ReportSnapshot, scope: PackScope): string {
    const quarter = snapshot.identity.quarter.label.replace(/\s+/g, '-');
    if (scope.kind === 'region') return `cairn-report-${row.id}-${quarter}-region`;
    const code =
      snapshot.practices.find((p) => p.practice.id === scope.practiceId)?.practice.code ??
      String(scope.practiceId);
    return `cairn-report-${row.id}-${quarter}-${code}`;
  }

  private assertInReport(snapshot: ReportSnapshot, practiceId: number, row: ReportRow): void {
    if (snapshot.practices.some((p) => p.practice.id === practiceId)) return;
    throw new ProblemException(
      HttpStatus.NOT_FOUND,
      'practice-not-in-report',
      'The practice has no results in this report',
      `Practice ${practiceId} had no confirmed extract for ${snapshot.identity.quarter.label} when report ${row.id} was published, so the report has no figures of it to download.`,
    );
  }

  // ── withdraw ──

  async withdraw(actor: Actor, id: number, reason: string): Promise<ReportDto> {
    assertMayWithdraw(actor);
    const text = reason.trim();
    if (text.length === 0) {
      throw new ProblemException(
        HttpStatus.BAD_REQUEST,
        'validation-failed',
        'The reason is empty',
        'Say why the report is withdrawn: readers see the reason in its place.',
        { errors: [{ field: 'reason', message: 'must not be blank' }] },
      );
    }
    await this.repository.transaction(async (transaction) => {
      const row = await this.repository.get(id, transaction);
      if (!row || row.regionId !== actor.regionId) throw notFound(id);
      if (row.status === 'withdrawn') {
        throw new ProblemException(
          HttpStatus.CONFLICT,
          'report-withdrawn',
          'Already withdrawn',
          `${reportLabel(await this.quarterLabel(actor, row), row.sequence)} was withdrawn on ${row.withdrawnAt} by ${row.withdrawnBy}: ${row.withdrawnReason}`,
        );
      }
      await this.repository.withdraw(
        id,
        { at: new Date(), userId: actor.id, by: actor.displayName, reason: text },
        transaction,
      );
      await this.audit.append(
        {
          action: 'report.withdrawn',
          summary: `${actor.displayName} withdrew report ${id}: ${text}`,
          actor,
          regionId: row.regionId,
          subjectType: 'report',
          subjectId: id,
          detail: { reason: text, contentHash: row.contentHash },
          requestId: actor.requestId,
          ipAddress: actor.ipAddress,
        },
        transaction,
      );
    });
    return this.get(actor, id);
  }

  // ── pieces ──

  private async row(actor: Pick<Actor, 'regionId'>, id: number): Promise<ReportRow> {
    const row = Number.isSafeInteger(id) ? await this.repository.get(id) : null;
    if (!row || row.regionId !== actor.regionId) throw notFound(id);
    return row;
  }

  /** A report whose figures may be read: not withdrawn (410 with the tombstone otherwise). */
  private async readable(actor: Actor, id: number): Promise<ReportRow> {
    const row = await this.row(actor, id);
    if (row.status === 'withdrawn') {
      throw new ProblemException(
        HttpStatus.GONE,
        'report-withdrawn',
        'This report was withdrawn',
        `Withdrawn on ${row.withdrawnAt} by ${row.withdrawnBy}: ${row.withdrawnReason}`,
        {
          withdrawal: { at: row.withdrawnAt, by: row.withdrawnBy, reason: row.withdrawnReason },
        },
      );
    }
    return row;
  }

  private async snapshot(row: ReportRow): Promise<{ canonical: Buffer; snapshot: ReportSnapshot }> {
    const cached = this.cache.get(row.id);
    if (cached) return cached;
    const stored = await this.repository.snapshot(row.id);
    if (!stored) throw notFound(row.id);
    return this.remember(row.id, canonicalBytes(stored, row.contentHash));
  }

  /** Keeps a report's decoded snapshot (its bytes never change). */
  private remember(id: number, canonical: Buffer) {
    const entry = { canonical, snapshot: decodeSnapshot(canonical) };
    if (this.cache.size >= CACHE_ENTRIES) {
      this.cache.delete(this.cache.keys().next().value!);
    }
    this.cache.set(id, entry);
    if (!this.practiceLists.has(id)) this.practiceLists.set(id, practiceList(entry.snapshot));
    return entry;
  }

  /**
   * The practices of a report (with results or not), by code: kept by report id apart from the
   * snapshots, so that listing reports decodes each snapshot once per process, not per list.
   */
  private async practicesOf(row: ReportRow): Promise<PracticeDto[]> {
    const kept = this.practiceLists.get(row.id);
    if (kept) return kept;
    const list = practiceList((await this.snapshot(row)).snapshot);
    if (this.practiceLists.size >= PRACTICE_LIST_ENTRIES) {
      this.practiceLists.delete(this.practiceLists.keys().next().value!);
    }
    this.practiceLists.set(row.id, list);
    return list;
  }

  private async quarterLabel(actor: Pick<Actor, 'regionId'>, row: ReportRow): Promise<string> {
    return (await this.quarters.get(actor, row.quarterId)).label;
  }

  private async dto(actor: Actor, row: ReportRow): Promise<ReportDto> {
    const quarterLabel = await this.quarterLabel(actor, row);
    const region = mayReadRegion(actor);
    let practices: PracticeDto[] = [];
    if (row.status !== 'withdrawn') {
      const all = await this.practicesOf(row);
      practices = region ? all : all.filter((p) => actor.practiceIds.includes(p.id));
    }
    const replacedBy = row.replacedById ? await this.repository.get(row.replacedById) : null;
    return {
      id: row.id,
      label: reportLabel(quarterLabel, row.sequence),
      sequence: row.sequence,
      quarterId: row.quarterId,
      quarterLabel,
      measureSetId: row.measureSetId,
      status: row.status,
      publishedAt: row.publishedAt,
      publishedBy: row.publishedBy,
      releaseNote: row.releaseNote,
      contentHash: row.contentHash,
      submissionCount: row.submissionCount,
      replacedBy: replacedBy
        ? { id: replacedBy.id, label: reportLabel(quarterLabel, replacedBy.sequence) }
        : null,
      withdrawal:
        row.status === 'withdrawn'
          ? { at: row.withdrawnAt!, by: row.withdrawnBy!, reason: row.withdrawnReason! }
          : null,
      permalink: `/reports/${row.id}`,
      practices,
      actions: reportActions(actor, row.status),
    };
  }

  private async quarterReports(
    regionId: number,
    quarterIds: readonly number[],
  ): Promise<Map<number, QuarterReportDto[]>> {
    const out = new Map<number, QuarterReportDto[]>();
    const rows = await this.repository.list(regionId, quarterIds);
    const labels = new Map<number, string>();
    for (const row of rows) {
      if (!labels.has(row.quarterId)) {
        labels.set(row.quarterId, (await this.quarters.get({ regionId }, row.quarterId)).label);
      }
      const list = out.get(row.quarterId) ?? [];
      list.push({
        id: row.id,
        label: reportLabel(labels.get(row.quarterId)!, row.sequence),
        status: row.status,
        publishedAt: row.publishedAt,
      });
      out.set(row.quarterId, list);
    }
    return out;
  }

  private async measureSetUses(
    regionId: number,
    ids: readonly string[],
  ): Promise<Map<string, MeasureSetUseDto[]>> {
    const out = new Map<string, MeasureSetUseDto[]>();
    const labels = new Map<number, string>();
    for (const row of await this.repository.usingMeasureSets(regionId, ids)) {
      if (!labels.has(row.quarterId)) {
        labels.set(row.quarterId, (await this.quarters.get({ regionId }, row.quarterId)).label);
      }
      const list = out.get(row.measureSetId) ?? [];
      list.push({
        kind: 'report',
        id: row.id,
        label: reportLabel(labels.get(row.quarterId)!, row.sequence),
        status: row.status,
      });
      out.set(row.measureSetId, list);
    }
    return out;
  }
}

const notFound = (id: number) =>
  new ProblemException(
    HttpStatus.NOT_FOUND,
    'report-not-found',
    'No such report',
    `Your region has no report ${id}.`,
  );

/**
 * A practice's results as frozen in a report: nothing to act on; every measure, breakdown,
 * kidney grid and value histogram in the split the report shows (everyone). The region's part
 * keeps all three splits of every practice's counts.
 */
function frozen(results: PracticeResultsWithDetailDto): PracticeResultsWithDetailDto {
  const everyone = <T extends { split: string }>(splits: T[]) =>
    splits.filter((s) => s.split === 'all');
  const detail = results.detail && {
    ...results.detail,
    measures: results.detail.measures.map((m) => ({ ...m, splits: everyone(m.splits) })),
    kidney: { ...results.detail.kidney, splits: everyone(results.detail.kidney.splits) },
    values: results.detail.values.map((v) => ({ ...v, splits: everyone(v.splits) })),
  };
  return {
    ...results,
    measures: results.measures.map((m) => ({ ...m, splits: everyone(m.splits) })),
    detail,
    actions: { upload: false, uploadPath: null },
  };
}

/** The bytes a writer writes to a stream. */
async function collect(write: (stream: Writable) => Promise<void>): Promise<Buffer> {
  const sink = new PassThrough();
  const chunks: Buffer[] = [];
  sink.on('data', (chunk: Buffer) => chunks.push(chunk));
  const ended = new Promise<void>((resolve, reject) => {
    sink.on('end', resolve);
    sink.on('error', reject);
  });
  await write(sink);
  // exceljs ends the stream it was given once the workbook is written; end it if it did not.
  if (!sink.writableEnded) sink.end();
  await ended;
  return Buffer.concat(chunks);
}

/** Writes `bytes` to a stream and ends it, once the stream has taken them. */
async function endWith(stream: Writable, bytes: Buffer): Promise<void> {
  await new Promise<void>((resolve, reject) => {
    stream.once('error', reject);
    stream.end(bytes, () => resolve());
  });
}

/** Every practice of a report, with results or without, by code. */
function practiceList(snapshot: ReportSnapshot): PracticeDto[] {
  return [
    ...snapshot.practices.map((p) => p.practice),
    ...(snapshot.region.splits[0]?.coverage.missing ?? []),
  ].sort((a, b) => (a.code < b.code ? -1 : a.code > b.code ? 1 : 0));
}

/** How a lead of this practice (and no other) reads its results: under disclosure control. */
function practiceReader(actor: Actor, practiceId: number): Actor {
  return { ...actor, role: 'practice_lead', practiceIds: [practiceId] };
}
