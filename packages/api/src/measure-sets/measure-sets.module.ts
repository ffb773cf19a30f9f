import { Module } from '@nestjs/common';
import { MeasureSetsController } from './measure-sets.controller.js';
import { MeasureSetsService } from './measure-sets.service.js';

/** Measure-set versions: decoded, compiled and described once, read by every other module here. */
@Module({
  controllers: [MeasureSetsController],
  providers: [MeasureSetsService],
  exports: [MeasureSetsService],
})
export class MeasureSetsModule {}
