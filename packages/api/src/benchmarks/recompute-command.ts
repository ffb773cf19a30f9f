/**
 * The operator's full recompute of a region's results (`cli.js recompute`): for each audit
 * quarter chosen, every current submission's sums computed again from all of the quarter's
 * current records in one streamed read and stored, and the quarter's benchmark built from them
 * and stored (BenchmarkStore.recompute). Used after a measure set's definitions change in place,
 * or to check the stored results against the records.
 */
import { Module } from '@nestjs/common';
import { NestFactory } from '@nestjs/core';
import { AuditTrailModule } from '../audit-trail/audit-trail.module.js';
import type { CairnConfig, CairnSecrets } from '../config/config.schema.js';
import { CairnConfigModule } from '../config/config.module.js';
import { DatabaseModule } from '../database/database.module.js';
import { OrganisationsService } from '../organisations/organisations.service.js';
import { QuartersService } from '../quarters/quarters.service.js';
import { OperatorError } from '../users/operator-commands.js';
import { BenchmarkStore } from './benchmark-store.service.js';
import { BenchmarksModule } from './benchmarks.module.js';

export interface RecomputedQuarter {
  quarter: string;
  measureSetId: string;
  submissions: number;
  /** The stored result's id, and whether its bytes equal those the recompute built */
  resultId: number | null;
  sameAsStored: boolean;
  seconds: number;
}

export async function recomputeResults(
  config: CairnConfig,
  secrets: CairnSecrets,
  options: { region: string; quarter?: string },
): Promise<RecomputedQuarter[]> {
  @Module({
    imports: [
      CairnConfigModule.forRoot({ config, secrets }),
      DatabaseModule,
      AuditTrailModule,
      BenchmarksModule,
    ],
  })
  class RecomputeModule {}

  const app = await NestFactory.createApplicationContext(RecomputeModule, {
    logger: ['error', 'warn'],
  });
  try {
    const region = await app.get(OrganisationsService).regionByCode(options.region);
    if (!region) throw new OperatorError(`no region with the code "${options.region}"`);
    const quarters = await app.get(QuartersService).list(region.id);
    const chosen = options.quarter ? quarters.filter((q) => q.label === options.quarter) : quarters;
    if (chosen.length === 0) {
      throw new OperatorError(
        `region ${options.region} has no audit quarter "${options.quarter}" (it has ${quarters.map((q) => q.label).join(', ') || 'none'})`,
      );
    }
    const store = app.get(BenchmarkStore);
    const out: RecomputedQuarter[] = [];
    for (const quarter of chosen) {
      const t0 = performance.now();
      const { result, body, stored } = await store.recompute(quarter);
      out.push({
        quarter: quarter.label,
        measureSetId: quarter.measureSetId,
        submissions: result?.submissionCount ?? 0,
        resultId: result?.id ?? null,
        sameAsStored: body === null || stored === null || body.equals(stored),
        seconds: (performance.now() - t0) / 1000,
      });
    }
    return out;
  } finally {
    await app.close();
  }
}
