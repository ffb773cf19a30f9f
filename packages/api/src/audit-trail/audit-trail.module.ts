import { Global, Module } from '@nestjs/common';
import { SequelizeModule } from '@nestjs/sequelize';
import { OrganisationsModule } from '../organisations/organisations.module.js';
import { AuditTrailController } from './audit-trail.controller.js';
import { AuditTrailService } from './audit-trail.service.js';
import { AuditEvent } from './models/audit-event.model.js';
import { PeopleNamesModule } from '../users/people-names.js';

@Global()
@Module({
  imports: [SequelizeModule.forFeature([AuditEvent]), OrganisationsModule, PeopleNamesModule],
  controllers: [AuditTrailController],
  providers: [AuditTrailService],
  exports: [AuditTrailService],
})
export class AuditTrailModule {}
