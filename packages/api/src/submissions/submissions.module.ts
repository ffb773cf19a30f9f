import { Module } from '@nestjs/common';
import { MeasureSetsModule } from '../measure-sets/measure-sets.module.js';
import { OrganisationsModule } from '../organisations/organisations.module.js';
import { QuartersModule } from '../quarters/quarters.module.js';
import { PeopleNamesModule } from '../users/people-names.js';
import { CoverageController } from './coverage.controller.js';
import { ExtractProcessor } from './extract-processor.js';
import { ExtractsController } from './extracts.controller.js';
import { IntakeService } from './intake.service.js';
import { JobRunner } from './job-runner.service.js';
import { ValidationReportService } from './validation-report/validation-report.service.js';
import { SubmissionRepository } from './submission.repository.js';
import { SubmissionLoader } from './submission-view.js';
import { SubmissionsController } from './submissions.controller.js';
import { SubmissionsService } from './submissions.service.js';
import { UploadHandoff } from './upload-handoff.js';

/** Extracts: template, upload, checking as a job, validation report, confirm/cancel/retry, coverage. */
@Module({
  imports: [OrganisationsModule, QuartersModule, MeasureSetsModule, PeopleNamesModule],
  controllers: [ExtractsController, SubmissionsController, CoverageController],
  providers: [
    SubmissionRepository,
    SubmissionLoader,
    ExtractProcessor,
    JobRunner,
    IntakeService,
    SubmissionsService,
    ValidationReportService,
    { provide: UploadHandoff, useFactory: () => new UploadHandoff() },
  ],
  exports: [IntakeService, SubmissionsService, JobRunner, SubmissionRepository],
})
export class SubmissionsModule {}
