/**
 * The audit quarters page: each quarter of the region with its deadline,
 * measure-set version, coverage (from the submissions module's coverage)
 * and the reports published from it, what the caller may do with it, and
 * the quarter that would be opened next. It only reads: every change goes
 * through QuartersService.
 */
import { Inject, Injectable } from '@nestjs/common';
import { formatQuarter, reviewWindow } from '@cairn/metrics';
import { ConfigService } from '@nestjs/config';
import type { Actor } from '../auth/actor.js';
import type { CairnConfig } from '../config/config.schema.js';
import { MeasureSetsService } from '../measure-sets/measure-sets.service.js';
import { defaultDeadline, quarterEnd } from '../quarters/deadline.js';
import type { QuarterDto } from '../quarters/dto/quarter.dto.js';
import { mayManageQuarters } from '../quarters/quarter-policy.js';
import { QuartersService } from '../quarters/quarters.service.js';
import { SubmissionsService } from '../submissions/submissions.service.js';
import type {
  AuditQuartersDto,
  MeasureSetRefDto,
  NextQuarterDto,
} from './dto/quarter-overview.dto.js';

/** The quarter after the latest one; with none yet, the calendar quarter of `today`. */
export function nextQuarter(
  quarters: readonly Pick<QuarterDto, 'year' | 'quarter'>[],
  today: Date,
): { year: number; quarter: 1 | 2 | 3 | 4 } {
  const latest = [...quarters].sort((a, b) => b.year - a.year || b.quarter - a.quarter)[0];
  if (!latest) {
    return {
      year: today.getUTCFullYear(),
      quarter: (Math.floor(today.getUTCMonth() / 3) + 1) as 1 | 2 | 3 | 4,
    };
  }
  return latest.quarter === 4
    ? { year: latest.year + 1, quarter: 1 }
    : { year: latest.year, quarter: (latest.quarter + 1) as 1 | 2 | 3 | 4 };
}

@Injectable()
export class QuarterOverviewService {
  constructor(
    @Inject(QuartersService) private readonly quarters: QuartersService,
    @Inject(SubmissionsService) private readonly submissions: SubmissionsService,
    @Inject(MeasureSetsService) private readonly measureSets: MeasureSetsService,
    @Inject(ConfigService) private readonly config: ConfigService<CairnConfig, true>,
  ) {}

  async overview(actor: Actor): Promise<AuditQuartersDto> {
    const quarters = await this.quarters.list(actor.regionId);
    const standing = await this.quarters.standing(actor, quarters);
    const seesCoverage = actor.role === 'regional_lead' || actor.role === 'auditor';
    const usable = (await this.measureSets.summaries(actor))
      .filter((m) => m.status === 'published')
      .map((m): MeasureSetRefDto => ({ id: m.id, label: m.label }));
    const labels = new Map(usable.map((m) => [m.id, m.label]));
    const rows = [];
    for (const quarter of quarters) {
      const coverage = seesCoverage
        ? (await this.submissions.coverage(actor, quarter.id)).totals
        : null;
      const here = standing.get(quarter.id)!;
      rows.push({
        quarter,
        measureSet: {
          id: quarter.measureSetId,
          label:
            labels.get(quarter.measureSetId) ??
            (await this.measureSets.find(quarter.measureSetId))?.label ??
            quarter.measureSetId,
        },
        coverage,
        reports: here.reports,
        actions: here.actions,
      });
    }
    return {
      quarters: rows,
      next: this.next(quarters, usable),
      measureSets: usable,
      actions: { open: mayManageQuarters(actor) },
    };
  }

  private next(quarters: readonly QuarterDto[], usable: MeasureSetRefDto[]): NextQuarterDto {
    const { year, quarter } = nextQuarter(quarters, new Date());
    const window = reviewWindow({ year, quarter });
    const settings = this.config.get('quarters', { infer: true });
    const latest = quarters[0]?.measureSetId;
    const defaultMeasureSetId =
      [settings.defaultMeasureSetId, latest].find(
        (id) => id !== undefined && usable.some((m) => m.id === id),
      ) ??
      usable[0]?.id ??
      null;
    return {
      year,
      quarter,
      label: formatQuarter({ year, quarter }),
      windowStart: window.start,
      windowEnd: window.end,
      quarterEnd: quarterEnd(year, quarter),
      defaultDeadline: defaultDeadline(year, quarter, settings.deadlineDaysAfterQuarterEnd),
      defaultMeasureSetId,
    };
  }
}
