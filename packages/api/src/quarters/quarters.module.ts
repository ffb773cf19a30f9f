import { Module } from '@nestjs/common';
import { MeasureSetsModule } from '../measure-sets/measure-sets.module.js';
import { QuartersController } from './quarters.controller.js';
import { QuarterEvents } from './quarter-events.js';
import { QuartersService } from './quarters.service.js';

@Module({
  imports: [MeasureSetsModule],
  controllers: [QuartersController],
  providers: [QuartersService, QuarterEvents],
  exports: [QuartersService, QuarterEvents],
})
export class QuartersModule {}
