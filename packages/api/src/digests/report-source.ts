/**
 * Digests made from published reports (src/reports), read only through
 * ReportsService: the source id is the report's id. A practice's part is the
 * report's frozen results as the practice's own leads see them (disclosure
 * control applied); its attachment is the practice's data pack of the report,
 * the same file its leads download from the report's page. A withdrawn report
 * makes no digest (its queued digests fail rather than send withdrawn
 * figures): its status is read afresh for every message, from the database.
 */
import { PassThrough } from 'node:stream';
import { Inject, Injectable } from '@nestjs/common';
import { type Actor, systemActor } from '../auth/actor.js';
import type { PracticeResultsDto } from '../benchmarks/dto/practice-results.dto.js';
import type { ReportDto } from '../reports/dto/report.dto.js';
import { ReportsService } from '../reports/reports.service.js';
import type { DataPack, DigestReport, DigestSource } from './digest-source.js';

/** Cairn reading a report for the region: every practice of it is listed. */
const reader = (regionId: number): Actor => ({
  ...systemActor('digest', regionId),
  role: 'auditor',
});

/** Reports' practice lists kept, by report id and content hash (a report's content never changes). */
const MEMO_ENTRIES = 32;

@Injectable()
export class ReportDigestSource implements DigestSource {
  readonly noun = 'report';
  private readonly memo = new Map<string, DigestReport>();

  constructor(@Inject(ReportsService) private readonly reports: ReportsService) {}

  private digestReport(regionId: number, dto: ReportDto): DigestReport | null {
    if (dto.status === 'withdrawn') return null;
    const key = `${dto.id}:${dto.contentHash}`;
    const known = this.memo.get(key);
    if (known && known.regionId === regionId) return known;
    const report: DigestReport = {
      id: dto.id,
      regionId,
      quarterId: dto.quarterId,
      quarterLabel: dto.quarterLabel,
      label: dto.label,
      publishedAt: dto.publishedAt,
      practiceIds: dto.practices.map((p) => p.id).sort((a, b) => a - b),
    };
    if (this.memo.size >= MEMO_ENTRIES) this.memo.delete(this.memo.keys().next().value!);
    this.memo.set(key, report);
    return report;
  }

  async report(id: number, regionId: number): Promise<DigestReport | null> {
    try {
      return this.digestReport(regionId, await this.reports.get(reader(regionId), id));
    } catch (error) {
      // 404 report-not-found (unknown or of another region), 410 report-withdrawn
      const status = (error as { getStatus?: () => number }).getStatus?.();
      if (status === 404 || status === 410) return null;
      throw error;
    }
  }

  async list(regionId: number): Promise<DigestReport[]> {
    const { reports } = await this.reports.list(reader(regionId));
    return reports
      .filter((r) => r.status === 'published')
      .map((dto) => this.digestReport(regionId, dto))
      .filter((r): r is DigestReport => r !== null);
  }

  async practiceResults(
    report: DigestReport,
    practiceId: number,
  ): Promise<PracticeResultsDto | null> {
    const part = await this.reports.practicePart(reader(report.regionId), report.id, practiceId);
    return part.state === 'results' ? part.results : null;
  }

  paths(report: DigestReport, practiceId: number) {
    return {
      report: `/reports/${report.id}?practice=${practiceId}`,
      recallLists: `/practices/${practiceId}/results?quarter=${report.quarterId}&tab=recall`,
    };
  }

  async dataPack(report: DigestReport, practiceId: number): Promise<DataPack> {
    const pack = await this.reports.pack(reader(report.regionId), report.id, {
      kind: 'practice',
      practiceId,
    });
    const sink = new PassThrough();
    const chunks: Buffer[] = [];
    sink.on('data', (chunk: Buffer) => chunks.push(chunk));
    const ended = new Promise<void>((resolve, reject) => {
      sink.on('end', resolve);
      sink.on('error', reject);
    });
    await pack.write(sink);
    // exceljs ends the stream it was given once the workbook is written; end it if it did not.
    if (!sink.writableEnded) sink.end();
    await ended;
    return {
      filename: pack.fileName,
      content: Buffer.concat(chunks),
      contentType: pack.contentType,
    };
  }
}
