/**
 * Digests made from published reports (src/reports): the source id is the
 * report's id. A practice's part is the report's frozen results as the
 * practice's own leads see them (disclosure control applied); a withdrawn
 * report makes no digest (its queued digests fail rather than send withdrawn
 * figures). The data pack is the figures workbook made from those frozen
 * results.
 */
import { Inject, Injectable } from '@nestjs/common';
import { systemActor } from '../auth/actor.js';
import type { PracticeResultsDto } from '../benchmarks/dto/practice-results.dto.js';
import type { ReportDto } from '../reports/dto/report.dto.js';
import { ReportsService } from '../reports/reports.service.js';
import { type DataPack, type DigestReport, type DigestSource, XLSX_TYPE } from './digest-source.js';
import { figuresWorkbook } from './figures-workbook.js';

const reader = (regionId: number) => systemActor('digest', regionId);

@Injectable()
export class ReportDigestSource implements DigestSource {
  readonly noun = 'report';

  constructor(@Inject(ReportsService) private readonly reports: ReportsService) {}

  private async digestReport(regionId: number, dto: ReportDto): Promise<DigestReport | null> {
    if (dto.status === 'withdrawn') return null;
    const { snapshot } = await this.reports.snapshotOf(reader(regionId), dto.id);
    const practiceIds = [
      ...snapshot.practices.map((p) => p.practice.id),
      ...(snapshot.region.splits[0]?.coverage.missing ?? []).map((p) => p.id),
    ].sort((a, b) => a - b);
    return {
      id: dto.id,
      regionId,
      quarterId: dto.quarterId,
      quarterLabel: dto.quarterLabel,
      label: dto.label,
      publishedAt: dto.publishedAt,
      practiceIds,
    };
  }

  async report(id: number, regionId: number): Promise<DigestReport | null> {
    try {
      return await this.digestReport(regionId, await this.reports.get(reader(regionId), id));
    } catch (error) {
      // 404 report-not-found (unknown or of another region), 410 report-withdrawn
      const status = (error as { getStatus?: () => number }).getStatus?.();
      if (status === 404 || status === 410) return null;
      throw error;
    }
  }

  async list(regionId: number): Promise<DigestReport[]> {
    const { reports } = await this.reports.list(reader(regionId));
    const out: DigestReport[] = [];
    for (const dto of reports.filter((r) => r.status === 'published')) {
      const report = await this.digestReport(regionId, dto);
      if (report) out.push(report);
    }
    return out;
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

  async dataPack(report: DigestReport, results: PracticeResultsDto): Promise<DataPack> {
    return {
      filename: `cairn-${results.practice.code}-${report.quarterLabel.replace(/\s+/g, '-')}-report-${report.id}-figures.xlsx`,
      content: await figuresWorkbook(results, {
        reportLabel: report.label,
        publishedAt: report.publishedAt,
      }),
      contentType: XLSX_TYPE,
    };
  }
}
