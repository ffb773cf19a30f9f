import { Module } from '@nestjs/common';
import { AboutController } from './about.controller.js';
import { SequelizeModule } from '@nestjs/sequelize';
import { Locality } from './models/locality.model.js';
import { Practice } from './models/practice.model.js';
import { Region } from './models/region.model.js';
import { OrganisationsService } from './organisations.service.js';

@Module({
  imports: [SequelizeModule.forFeature([Region, Locality, Practice])],
  controllers: [AboutController],
  providers: [OrganisationsService],
  exports: [OrganisationsService],
})
export class OrganisationsModule {}
