/**
 * Loads the demo scenario's extracts (seed-data/out/extracts/manifest.json)
 * through the same pipeline as an upload in the browser: each file is stored
 * as an upload (IntakeService.store), checked by the job runner, and
 * confirmed (SubmissionsService.confirm), quarter by quarter. The demo's
 * eight audit quarters are opened first; all but the latest are then closed.
 */
import { createReadStream, existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { Module } from '@nestjs/common';
import { NestFactory } from '@nestjs/core';
import { AuditTrailModule } from '../audit-trail/audit-trail.module.js';
import { systemActor } from '../auth/actor.js';
import type { CairnConfig, CairnSecrets } from '../config/config.schema.js';
import { CairnConfigModule } from '../config/config.module.js';
import { DatabaseModule } from '../database/database.module.js';
import { OrganisationsService } from '../organisations/organisations.service.js';
import { QuartersModule } from '../quarters/quarters.module.js';
import { QuartersService } from '../quarters/quarters.service.js';
import { IntakeService } from './intake.service.js';
import { JobRunner } from './job-runner.service.js';
import { SubmissionRepository } from './submission.repository.js';
import { SubmissionsModule } from './submissions.module.js';
import { SubmissionsService } from './submissions.service.js';

interface Manifest {
  quarters: string[];
  extracts: {
    practice: string;
    quarter: string;
    file: string;
    dateConvention: 'day_first' | 'month_first' | null;
  }[];
}

export interface DemoIngestResult {
  quarters: number;
  extracts: number;
  accepted: number;
  records: number;
  refusedRows: number;
  seconds: number;
}

export async function ingestDemoExtracts(
  dir: string,
  config: CairnConfig,
  secrets: CairnSecrets,
  log: (line: string) => void = () => undefined,
): Promise<DemoIngestResult | null> {
  const manifestFile = join(dir, 'extracts', 'manifest.json');
  if (!existsSync(manifestFile)) return null;
  const manifest = JSON.parse(readFileSync(manifestFile, 'utf8')) as Manifest;
  const started = Date.now();

  @Module({
    imports: [
      CairnConfigModule.forRoot({ config, secrets }),
      DatabaseModule,
      AuditTrailModule,
      QuartersModule,
      SubmissionsModule,
    ],
  })
  class DemoIngestModule {}

  const app = await NestFactory.createApplicationContext(DemoIngestModule, {
    logger: ['error', 'warn'],
  });
  try {
    const organisations = app.get(OrganisationsService);
    const repository = app.get(SubmissionRepository);
    const quarters = app.get(QuartersService);
    const intake = app.get(IntakeService);
    const runner = app.get(JobRunner);
    const submissions = app.get(SubmissionsService);
    const region = await organisations.primaryRegion();
    if (!region) throw new Error('no region to load the demo extracts into');
    const practices = new Map(
      (await organisations.regionPractices(region.id)).map((p) => [p.code, p.id]),
    );
    const system = systemActor('demo seeding', region.id);
    const quarterIds = new Map<string, number>();
    for (const label of manifest.quarters) {
      const [year, q] = label.split(' Q').map(Number) as [number, number];
      const quarter = await quarters.open(system, { year, quarter: q });
      quarterIds.set(label, quarter.id);
    }

    let accepted = 0;
    let records = 0;
    let refusedRows = 0;
    for (const label of manifest.quarters) {
      const ids: { id: number; practiceId: number }[] = [];
      for (const entry of manifest.extracts.filter((e) => e.quarter === label)) {
        const practiceId = practices.get(entry.practice);
        if (practiceId === undefined)
          throw new Error(`the manifest names an unknown practice ${entry.practice}`);
        const path = join(dir, entry.file);
        const id = await intake.store(
          system,
          practiceId,
          quarterIds.get(label)!,
          entry.dateConvention,
          {
            fileName: entry.file.split('/').pop()!,
            chunks: createReadStream(path, { highWaterMark: 1 << 20 }),
            truncated: () => false,
          },
        );
        ids.push({ id, practiceId });
      }
      await runner.waitFor(ids.map((i) => i.id));
      for (const { id, practiceId } of ids) {
        const row = await repository.find(id);
        if (row?.status !== 'awaiting_confirmation') {
          throw new Error(
            `demo extract ${row?.file_name} for ${label} ended ${row?.status}: ${row?.refusal_message ?? row?.failure_message ?? ''}`,
          );
        }
        await submissions.confirm(system, practiceId, id);
        accepted++;
        records += row.rows_accepted ?? 0;
        refusedRows += row.rows_rejected ?? 0;
      }
      log(`demo ${label}: ${ids.length} extracts checked and confirmed`);
    }
    for (const label of manifest.quarters.slice(0, -1)) {
      await quarters.setStatus(system, quarterIds.get(label)!, 'closed');
    }
    return {
      quarters: manifest.quarters.length,
      extracts: manifest.extracts.length,
      accepted,
      records,
      refusedRows,
      seconds: (Date.now() - started) / 1000,
    };
  } finally {
    await app.close();
  }
}
