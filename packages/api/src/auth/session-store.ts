/**
 * express-session in MariaDB: connect-session-sequelize (from the registry)
 * over the app's own Sequelize connection and the `sessions` table (made by
 * migration 0100, never by sync()). Cookie: httpOnly, SameSite=Lax, Secure
 * when session.secureCookie, expiring after session.idleTimeoutMinutes of
 * inactivity (rolling); the absolute timeout is enforced by SessionService.
 */
import { type INestApplication, Injectable, type OnApplicationShutdown } from '@nestjs/common';
import { InjectModel } from '@nestjs/sequelize';
import connectSessionSequelize from 'connect-session-sequelize';
import type { NextFunction, Request, RequestHandler, Response } from 'express';
import session, { type SessionData, type Store } from 'express-session';
import type { CairnConfig, CairnSecrets } from '../config/config.schema.js';
import { CAIRN_SECRETS } from '../config/config.module.js';
import { SessionRecord } from './models/session-record.model.js';
import './session-data.js';

const SequelizeStore = connectSessionSequelize(session.Store);
type StoreWithTimer = Store & { stopExpiringSessions(): void };

@Injectable()
export class SessionStoreProvider implements OnApplicationShutdown {
  readonly store: StoreWithTimer;

  constructor(@InjectModel(SessionRecord) model: typeof SessionRecord) {
    this.store = new SequelizeStore({
      db: model.sequelize!,
      table: SessionRecord.name,
      checkExpirationInterval: 15 * 60_000,
      extendDefaultFields: (defaults, data: Partial<SessionData>) => ({
        data: defaults.data,
        expires: defaults.expires,
        userId: data.auth?.userId ?? null,
      }),
    }) as unknown as StoreWithTimer;
  }

  onApplicationShutdown(): void {
    this.store.stopExpiringSessions();
  }
}

export function sessionMiddleware(
  config: CairnConfig,
  secrets: Pick<CairnSecrets, 'CAIRN_SESSION_SECRET'>,
  store: Store,
): RequestHandler {
  const handler = session({
    name: config.session.cookieName,
    secret: secrets.CAIRN_SESSION_SECRET,
    store,
    resave: false,
    saveUninitialized: false,
    rolling: true,
    unset: 'destroy',
    proxy: config.server.trustProxy,
    cookie: {
      httpOnly: true,
      sameSite: 'lax',
      secure: config.session.secureCookie,
      path: '/',
      maxAge: config.session.idleTimeoutMinutes * 60_000,
    },
  });
  // Only the API needs sessions; static files and the web's index.html do not.
  return (req: Request, res: Response, next: NextFunction) =>
    req.path === '/api' || req.path.startsWith('/api/') ? handler(req, res, next) : next();
}

/** Installs the session middleware on the app (configureApp calls it before any route). */
export function installSessions(app: INestApplication, config: CairnConfig): void {
  const secrets = app.get<CairnSecrets>(CAIRN_SECRETS);
  app.use(sessionMiddleware(config, secrets, app.get(SessionStoreProvider).store));
}
