/**
 * A DigestSource read from an audit quarter's benchmark as it stands (the
 * quarter's current submissions): the source id is the quarter's id. Each
 * practice's part is its results as its own leads see them (disclosure control
 * applied); the data pack is the practice's figures workbook.
 */
import { Inject, Injectable } from '@nestjs/common';
import { type Actor, systemActor } from '../auth/actor.js';
import { BenchmarkStore } from '../benchmarks/benchmark-store.service.js';
import type { PracticeResultsDto } from '../benchmarks/dto/practice-results.dto.js';
import { PracticeResultsService } from '../benchmarks/practice-results.service.js';
import { OrganisationsService } from '../organisations/organisations.service.js';
import { QuartersService } from '../quarters/quarters.service.js';
import type { DataPack, DigestReport, DigestSource } from './digest-source.js';
import { XLSX_TYPE } from './digest-source.js';
import { figuresWorkbook } from './figures-workbook.js';

/** Cairn reading a practice's results as that practice's leads would see them. */
function leadsView(regionId: number, practiceId: number): Actor {
  return {
    ...systemActor('digest', regionId),
    role: 'practice_lead',
    practiceIds: [practiceId],
  };
}

@Injectable()
export class DraftBenchmarkDigestSource implements DigestSource {
  readonly noun = 'audit quarter';

  constructor(
    @Inject(QuartersService) private readonly quarters: QuartersService,
    @Inject(BenchmarkStore) private readonly store: BenchmarkStore,
    @Inject(PracticeResultsService) private readonly results: PracticeResultsService,
    @Inject(OrganisationsService) private readonly organisations: OrganisationsService,
  ) {}

  async report(id: number, regionId: number): Promise<DigestReport | null> {
    const quarter = await this.quarters.find(id);
    if (!quarter || quarter.regionId !== regionId) return null;
    const result = await this.store.resultOf(quarter);
    const practices = await this.organisations.regionPractices(quarter.regionId, {
      activeOnly: true,
    });
    return {
      id: quarter.id,
      regionId: quarter.regionId,
      quarterId: quarter.id,
      quarterLabel: quarter.label,
      label: `${quarter.label} results`,
      publishedAt: result?.builtAt ?? new Date(0).toISOString(),
      practiceIds: practices.map((p) => p.id),
    };
  }

  async list(regionId: number): Promise<DigestReport[]> {
    const quarters = await this.quarters.list(regionId);
    const reports = await Promise.all(quarters.map((q) => this.report(q.id, regionId)));
    return reports.filter((r): r is DigestReport => r !== null);
  }

  async practiceResults(
    report: DigestReport,
    practiceId: number,
  ): Promise<PracticeResultsDto | null> {
    const results = await this.results.results(
      leadsView(report.regionId, practiceId),
      practiceId,
      report.quarterId,
    );
    return results.state === 'results' ? results : null;
  }

  paths(report: DigestReport, practiceId: number) {
    const results = `/practices/${practiceId}/results?quarter=${report.quarterId}`;
    return { report: results, recallLists: `${results}&tab=recall` };
  }

  async dataPack(report: DigestReport, results: PracticeResultsDto): Promise<DataPack> {
    return {
      filename: `cairn-${results.practice.code}-${report.quarterLabel.replace(/\s+/g, '-')}-figures.xlsx`,
      content: await figuresWorkbook(results, {
        reportLabel: report.label,
        publishedAt: report.publishedAt,
      }),
      contentType: XLSX_TYPE,
    };
  }
}
