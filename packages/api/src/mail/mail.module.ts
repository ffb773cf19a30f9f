import { Module } from '@nestjs/common';
import { ScheduleModule } from '@nestjs/schedule';
import { OrganisationsModule } from '../organisations/organisations.module.js';
import { QuartersModule } from '../quarters/quarters.module.js';
import { SubmissionsModule } from '../submissions/submissions.module.js';
import { UsersModule } from '../users/users.module.js';
import { DeliveriesController } from './deliveries.controller.js';
import { DeliveriesService } from './deliveries.service.js';
import { MailComposers } from './mail-composers.js';
import { MailPreferencesController } from './mail-preferences.controller.js';
import { MailPreferencesService } from './mail-preferences.service.js';
import { MailRecipientsController } from './mail-recipients.controller.js';
import { MailTablesRepository } from './mail-tables.repository.js';
import { MailTransport } from './mail-transport.js';
import { OutboxRepository } from './outbox.repository.js';
import { OutboxService } from './outbox.service.js';
import { OutboxWorker } from './outbox-worker.service.js';
import { QuarterMailService } from './quarter-mail.service.js';
import { RecipientsService } from './recipients.service.js';

/**
 * E-mail: the outbox (one row per message, sent by every API process's worker
 * exactly once per row, see outbox-worker.service.ts), who receives a
 * practice's mail, the quarter's opening message and deadline reminders, the
 * delivery page, and each person's mail preferences. A module that sends a new
 * kind of message imports this one, adds the kind to mail-kinds.ts, registers
 * its composer (MailComposers) and queues with OutboxService.queue in its own
 * transaction, asking RecipientsService who receives each practice's mail.
 */
@Module({
  imports: [
    ScheduleModule.forRoot(),
    OrganisationsModule,
    UsersModule,
    QuartersModule,
    SubmissionsModule,
  ],
  controllers: [DeliveriesController, MailRecipientsController, MailPreferencesController],
  providers: [
    OutboxRepository,
    MailTablesRepository,
    MailTransport,
    MailComposers,
    OutboxWorker,
    OutboxService,
    RecipientsService,
    QuarterMailService,
    DeliveriesService,
    MailPreferencesService,
  ],
  exports: [
    MailComposers,
    OutboxService,
    OutboxWorker,
    RecipientsService,
    QuarterMailService,
    MailTransport,
  ],
})
export class MailModule {}
