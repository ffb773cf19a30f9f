/**
 * Sign-in and access: the SAML service provider, sessions in MariaDB, the
 * global deny-by-default AccessGuard, CSRF, throttling of the sign-in routes.
 * Global, so feature modules can inject PracticeAccess and SessionService.
 */
import { Global, Module } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { APP_GUARD } from '@nestjs/core';
import { SequelizeModule } from '@nestjs/sequelize';
import { ThrottlerModule } from '@nestjs/throttler';
import { Sequelize } from 'sequelize-typescript';
import { OrganisationsModule } from '../organisations/organisations.module.js';
import { UsersModule } from '../users/users.module.js';
import { AccessGuard } from './access.guard.js';
import { MeService } from './me.service.js';
import { SessionRecord } from './models/session-record.model.js';
import { PracticeAccess } from './practice-access.js';
import { IdpSettingsService } from './saml/idp-settings.js';
import { SamlRequestCache } from './saml/request-cache.js';
import { SamlController } from './saml/saml.controller.js';
import { SamlStrategy } from './saml/saml.strategy.js';
import { SessionController } from './session.controller.js';
import { SessionService } from './session.service.js';
import { SessionStoreProvider } from './session-store.js';
import { SignInService } from './sign-in.service.js';
import { DatabaseThrottlerStorage, SignInThrottlerGuard } from './throttle.js';
import { section } from './config-section.js';

@Global()
@Module({
  imports: [
    SequelizeModule.forFeature([SessionRecord]),
    UsersModule,
    OrganisationsModule,
    ThrottlerModule.forRootAsync({
      inject: [ConfigService, Sequelize],
      useFactory: (config: ConfigService, sequelize: Sequelize) => {
        const throttle = section(config, 'auth').throttle;
        return {
          throttlers: [
            { name: 'default', ttl: throttle.windowSeconds * 1000, limit: throttle.limit },
          ],
          storage: new DatabaseThrottlerStorage(sequelize),
        };
      },
    }),
  ],
  controllers: [SessionController, SamlController],
  providers: [
    SessionStoreProvider,
    SessionService,
    SignInService,
    MeService,
    PracticeAccess,
    IdpSettingsService,
    {
      provide: SamlRequestCache,
      inject: [Sequelize, ConfigService],
      useFactory: (sequelize: Sequelize, config: ConfigService) =>
        new SamlRequestCache(sequelize, section(config, 'auth').requestTtlMinutes),
    },
    SamlStrategy,
    SignInThrottlerGuard,
    { provide: APP_GUARD, useClass: AccessGuard },
  ],
  exports: [PracticeAccess, SessionService],
})
export class AuthModule {}
