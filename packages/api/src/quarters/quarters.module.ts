import { Module } from '@nestjs/common';
import { MeasureSetsModule } from '../measure-sets/measure-sets.module.js';
import { QuarterReports } from './quarter-reports.js';
import { QuartersController } from './quarters.controller.js';
import { QuarterEvents } from './quarter-events.js';
import { QuartersService } from './quarters.service.js';

@Module({
  imports: [MeasureSetsModule],
  controllers: [QuartersController],
  providers: [QuarterReports, QuartersService, QuarterEvents],
  exports: [QuartersService, QuarterReports, QuarterEvents],
})
export class QuartersModule {}
