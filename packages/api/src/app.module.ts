import { type DynamicModule, Module, type Type } from '@nestjs/common';
import { AuditTrailModule } from './audit-trail/audit-trail.module.js';
import { AuthModule } from './auth/auth.module.js';
import { BenchmarksModule } from './benchmarks/benchmarks.module.js';
import type { CairnConfig, CairnSecrets } from './config/config.schema.js';
import { CairnConfigModule } from './config/config.module.js';
import { DatabaseModule } from './database/database.module.js';
import { DigestsModule } from './digests/digests.module.js';
import { HealthModule } from './health/health.module.js';
import { MailModule } from './mail/mail.module.js';
import { MeasureSetsModule } from './measure-sets/measure-sets.module.js';
import { OrganisationsModule } from './organisations/organisations.module.js';
import { QuarterOverviewModule } from './quarter-overview/quarter-overview.module.js';
import { QuartersModule } from './quarters/quarters.module.js';
import { ReportsModule } from './reports/reports.module.js';
import { ReviewCasesModule } from './review-cases/review-cases.module.js';
import { SubmissionsModule } from './submissions/submissions.module.js';
import { UsersModule } from './users/users.module.js';

export interface AppModuleOptions {
  /** A loaded configuration (tests pass one with their own database name) */
  config?: CairnConfig;
  secrets?: CairnSecrets;
  /** Extra modules (tests mount test-only controllers this way) */
  extraModules?: (Type<unknown> | DynamicModule)[];
}

/** Feature modules, in the order of the data flow (see DEVELOPERS.md). */
export const featureModules = [
  OrganisationsModule,
  UsersModule,
  AuditTrailModule,
  AuthModule,
  HealthModule,
  MeasureSetsModule,
  QuartersModule,
  SubmissionsModule,
  BenchmarksModule,
  QuarterOverviewModule,
  ReportsModule,
  MailModule,
  ReviewCasesModule,
  DigestsModule,
];

@Module({})
export class AppModule {
  static forRoot(options: AppModuleOptions = {}): DynamicModule {
    return {
      module: AppModule,
      imports: [
        CairnConfigModule.forRoot(options),
        DatabaseModule,
        ...featureModules,
        ...(options.extraModules ?? []),
      ],
    };
  }
}
