import { Module } from '@nestjs/common';
import { QuartersController } from './quarters.controller.js';
import { QuartersService } from './quarters.service.js';

@Module({
  controllers: [QuartersController],
  providers: [QuartersService],
  exports: [QuartersService],
})
export class QuartersModule {}
