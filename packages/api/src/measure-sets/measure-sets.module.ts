import { Module } from '@nestjs/common';
import { MeasureSetRepository } from './measure-set.repository.js';
import { MeasureSetUsage } from './measure-set-usage.js';
import { MeasureSetsController } from './measure-sets.controller.js';
import { MeasureSetsService } from './measure-sets.service.js';

/**
 * Measure-set versions (MariaDB, seeded from config/measure-sets/): drafts,
 * publishing, and the published versions decoded, compiled and described
 * once, read by every other module here. Modules that use a version register
 * with MeasureSetUsage.
 */
@Module({
  controllers: [MeasureSetsController],
  providers: [MeasureSetRepository, MeasureSetUsage, MeasureSetsService],
  exports: [MeasureSetsService, MeasureSetUsage],
})
export class MeasureSetsModule {}
