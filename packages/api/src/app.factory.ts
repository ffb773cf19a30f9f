/**
 * Builds the HTTP application: the same function serves `main.ts` and the
 * e2e tests, so tests go through the real middleware, pipes, filter and guards.
 */
import { type INestApplication, ValidationPipe } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { NestFactory } from '@nestjs/core';
import type { NestExpressApplication } from '@nestjs/platform-express';
import { SwaggerModule } from '@nestjs/swagger';
import type { NextFunction, Request, Response } from 'express';
import helmet from 'helmet';
import type { Logger } from 'pino';
import { type AppModuleOptions, AppModule } from './app.module.js';
import { installSessions } from './auth/session-store.js';
import { createRootLogger, PinoNestLogger, requestLogger } from './common/logger.js';
import { ProblemDetailsFilter } from './common/problem-details.filter.js';
import { figuresAsSent } from './common/sent-figures.js';
import type { CairnConfig } from './config/config.schema.js';
import { loadConfig } from './config/load-config.js';
import { describeApi } from './contract/openapi.js';
import { serveWeb } from './web/serve-web.js';

export interface CreateAppOptions extends AppModuleOptions {
  logger?: Logger;
}

export async function createApp(options: CreateAppOptions = {}): Promise<NestExpressApplication> {
  const config: CairnConfig = options.config ?? loadConfig();
  const rootLogger = options.logger ?? createRootLogger(config.logging.level);
  const app = await NestFactory.create<NestExpressApplication>(
    AppModule.forRoot({ ...options, config }),
    {
      logger: new PinoNestLogger(rootLogger),
      bufferLogs: false,
      bodyParser: true,
      abortOnError: false,
    },
  );
  configureApp(app, config, rootLogger);
  return app;
}

export function configureApp(app: INestApplication, config: CairnConfig, logger: Logger): void {
  const express = app as NestExpressApplication;
  express.set('trust proxy', config.server.trustProxy ? 1 : false);
  express.disable('x-powered-by');
  // Every JSON response sends non-integer numbers to six significant figures (sent-figures.ts).
  express.set('json replacer', figuresAsSent);
  express.useBodyParser('json', { limit: '1mb' });
  app.use(requestLogger(logger, config.logging.requests));
  app.use(
    helmet({
      contentSecurityPolicy: {
        useDefaults: true,
        directives: {
          'img-src': ["'self'", 'data:'],
          'font-src': ["'self'", 'data:'],
          'style-src': ["'self'", "'unsafe-inline'"],
          'form-action': [
            "'self'",
            ...(config.devFakes.enabled
              ? [`http://${config.devFakes.host}:${config.devFakes.port}`]
              : []),
          ],
          'upgrade-insecure-requests': config.session.secureCookie ? [] : null,
        },
      },
      strictTransportSecurity: config.session.secureCookie,
      crossOriginEmbedderPolicy: false,
    }),
  );
  // No API answer is kept by the browser or a proxy: most hold records or who is signed in, and a
  // shared computer's cache must not keep them after sign-out. (The web's files are cached.)
  app.use('/api', (_req: Request, res: Response, next: NextFunction) => {
    res.setHeader('Cache-Control', 'no-store');
    next();
  });
  // Sessions in MariaDB, before any route (see auth/session-store.ts).
  installSessions(app, config);
  app.setGlobalPrefix('api');
  app.useGlobalPipes(
    new ValidationPipe({
      whitelist: true,
      forbidNonWhitelisted: true,
      transform: true,
      transformOptions: { enableImplicitConversion: false },
    }),
  );
  app.useGlobalFilters(new ProblemDetailsFilter());
  app.enableShutdownHooks();

  SwaggerModule.setup('api/docs', app, describeApi(app), {
    jsonDocumentUrl: 'api/docs/openapi.json',
  });

  if (config.server.serveWeb) serveWeb(express, app.get(ConfigService));
}
