/**
 * The reports published from each audit quarter. Reports come after
 * quarters in the data flow, so the module that publishes them registers a
 * source here instead of this module reading its tables; with none
 * registered, no quarter has a report.
 */
import { Injectable } from '@nestjs/common';
import type { QuarterReportDto } from './dto/quarter.dto.js';

export interface QuarterReportSource {
  /** The reports of these quarters of a region, by quarter id, newest first. */
  reportsOf(
    regionId: number,
    quarterIds: readonly number[],
  ): Promise<Map<number, QuarterReportDto[]>>;
}

@Injectable()
export class QuarterReports {
  private readonly sources: QuarterReportSource[] = [];

  register(source: QuarterReportSource): void {
    this.sources.push(source);
  }

  async of(
    regionId: number,
    quarterIds: readonly number[],
  ): Promise<Map<number, QuarterReportDto[]>> {
    const all = new Map<number, QuarterReportDto[]>(quarterIds.map((id) => [id, []]));
    if (quarterIds.length === 0) return all;
    for (const source of this.sources) {
      for (const [id, reports] of await source.reportsOf(regionId, quarterIds)) {
        all.get(id)?.push(...reports);
      }
    }
    return all;
  }
}
