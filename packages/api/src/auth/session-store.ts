/**
 * express-session in MariaDB: Cairn's own Store over the `sessions` table
 * (made by migration 0100, never by sync()), with raw statements on the app's
 * connection pool (database/raw-select.ts). Cookie: httpOnly, SameSite=Lax,
 * Secure when session.secureCookie, expiring after session.idleTimeoutMinutes
 * of inactivity; the absolute timeout is enforced by SessionService.
 *
 * Every request reads its session row with its person (one SELECT by primary
 * key; the person's part is written by the users module, UserAccounts.
 * accountJsonSql, and handed to SessionService): nothing of a session or a
 * person is kept in this process, so a sign-out, a deactivation or an
 * expiry at any process takes effect at the next request everywhere. A row
 * whose `expires` has passed is refused (and deleted) when read; a sweep
 * deletes the ones nobody reads again.
 *
 * Renewal rule: a session's expiry (the row's `expires`, the cookie, and
 * `auth.lastSeenAt`, see SessionService) is renewed only when it would move by
 * at least RENEW_MS (one minute), not on every request. A request less than a
 * minute after the last renewal writes nothing; so the idle timeout counts
 * from the last renewal, at most a minute before the last request.
 *
 * A session read from the table is only ever updated, never inserted again: a
 * request still in flight when its session is destroyed elsewhere (sign-out at
 * another process, deactivation) cannot bring the row back.
 */
import {
  type INestApplication,
  Inject,
  Injectable,
  type OnApplicationShutdown,
} from '@nestjs/common';
import type { NextFunction, Request, RequestHandler, Response } from 'express';
import session, { type SessionData, Store } from 'express-session';
import { Sequelize } from 'sequelize-typescript';
import type { CairnConfig, CairnSecrets } from '../config/config.schema.js';
import { CAIRN_SECRETS } from '../config/config.module.js';
import { type Account, UserAccounts } from '../users/user-accounts.js';
import { execute, selectRows } from '../database/raw-select.js';
import './session-data.js';

/** A session's expiry is written again only when it would move by at least this much. */
export const RENEW_MS = 60_000;

/** How often rows past their expiry are deleted. */
const SWEEP_MS = 15 * 60_000;

/** The expiry (epoch ms) the row had when this request read it; absent on a new session. */
const STORED_EXPIRY = Symbol('cairn.session.storedExpiry');

/** The person read with the session row (null: no such person any more). */
const STORED_PERSON = Symbol('cairn.session.person');

type Callback<T = void> = (err?: unknown, value?: T) => void;
type WithStoredExpiry = { [STORED_EXPIRY]?: number; [STORED_PERSON]?: Account | null };

/**
 * The person read in the same statement as this request's session (undefined when the session
 * was not read from the table on this request, e.g. one just begun).
 */
export function personReadWith(session: object | undefined): Account | null | undefined {
  return session ? (session as WithStoredExpiry)[STORED_PERSON] : undefined;
}

function expiryOf(data: SessionData): number {
  const expires = data.cookie?.expires;
  return expires ? new Date(expires).getTime() : Date.now();
}

function storedExpiryOf(data: unknown): number | undefined {
  return (data as WithStoredExpiry)[STORED_EXPIRY];
}

/** Not enumerable, and symbols: never part of the session's JSON, its hash or its copy. */
function mark(data: object, key: symbol, value: unknown): void {
  Object.defineProperty(data, key, {
    value,
    enumerable: false,
    configurable: true,
    writable: true,
  });
}

function markStored(data: object, expires: number): void {
  mark(data, STORED_EXPIRY, expires);
}

export class CairnSessionStore extends Store {
  private readonly sweep: NodeJS.Timeout;

  private readonly readSql: string;

  constructor(
    private readonly sequelize: Sequelize,
    private readonly accounts: UserAccounts,
  ) {
    super();
    this.readSql = `SELECT s.data, ROUND(UNIX_TIMESTAMP(s.expires) * 1000) AS expires_ms,
        ${accounts.accountJsonSql('s.user_id')} AS person
      FROM sessions s WHERE s.sid = ?`;
    this.sweep = setInterval(() => {
      execute(this.sequelize, 'DELETE FROM sessions WHERE expires <= FROM_UNIXTIME(? / 1000)', [
        Date.now(),
      ]).catch(() => undefined);
    }, SWEEP_MS);
    this.sweep.unref();
  }

  stop(): void {
    clearInterval(this.sweep);
  }

  override get(sid: string, callback: Callback<SessionData | null>): void {
    this.read(sid).then(
      (data) => callback(null, data),
      (error) => callback(error),
    );
  }

  private async read(sid: string): Promise<SessionData | null> {
    const [row] = await selectRows<{
      data: string;
      expires_ms: number | string | null;
      person: unknown;
    }>(this.sequelize, this.readSql, [sid]);
    if (!row) return null;
    const expires = row.expires_ms === null ? null : Number(row.expires_ms);
    let data: SessionData | null = null;
    try {
      data = JSON.parse(row.data) as SessionData;
    } catch {
      // A damaged row is no session: refused and deleted like an expired one.
    }
    if (expires === null || expires <= Date.now() || !data || typeof data !== 'object') {
      await this.remove(sid);
      return null;
    }
    markStored(data, expires);
    mark(data, STORED_PERSON, this.accounts.accountOfJson(row.person));
    return data;
  }

  /** Carries the row's expiry and person from get() onto the request's session. */
  override createSession(req: Request, data: SessionData) {
    const stored = storedExpiryOf(data);
    const person = personReadWith(data);
    const created = super.createSession(req, data);
    if (stored !== undefined) markStored(created, stored);
    if (person !== undefined) mark(created, STORED_PERSON, person);
    return created;
  }

  override set(sid: string, data: SessionData, callback?: Callback): void {
    const expires = expiryOf(data);
    const values = [JSON.stringify(data), data.auth?.userId ?? null, expires, sid];
    const write =
      storedExpiryOf(data) !== undefined
        ? // Read from the table: updated only (destroyed meanwhile: stays destroyed).
          execute(
            this.sequelize,
            'UPDATE sessions SET data = ?, user_id = ?, expires = FROM_UNIXTIME(? / 1000) WHERE sid = ?',
            values,
          )
        : execute(
            this.sequelize,
            `INSERT INTO sessions (data, user_id, expires, sid) VALUES (?, ?, FROM_UNIXTIME(? / 1000), ?)
             ON DUPLICATE KEY UPDATE data = VALUES(data), user_id = VALUES(user_id), expires = VALUES(expires)`,
            values,
          );
    write.then(
      () => {
        markStored(data, expires);
        callback?.();
      },
      (error) => callback?.(error),
    );
  }

  /** Renews the row's expiry, only when it would move by at least RENEW_MS (see above). */
  override touch(sid: string, data: SessionData, callback?: Callback): void {
    const expires = expiryOf(data);
    const stored = storedExpiryOf(data);
    if (stored !== undefined && expires - stored < RENEW_MS) {
      callback?.();
      return;
    }
    execute(this.sequelize, 'UPDATE sessions SET expires = FROM_UNIXTIME(? / 1000) WHERE sid = ?', [
      expires,
      sid,
    ]).then(
      () => {
        markStored(data, expires);
        callback?.();
      },
      (error) => callback?.(error),
    );
  }

  override destroy(sid: string, callback?: Callback): void {
    this.remove(sid).then(
      () => callback?.(),
      (error) => callback?.(error),
    );
  }

  private async remove(sid: string): Promise<void> {
    await execute(this.sequelize, 'DELETE FROM sessions WHERE sid = ?', [sid]);
  }
}

@Injectable()
export class SessionStoreProvider implements OnApplicationShutdown {
  readonly store: CairnSessionStore;

  constructor(
    @Inject(Sequelize) sequelize: Sequelize,
    @Inject(UserAccounts) accounts: UserAccounts,
  ) {
    this.store = new CairnSessionStore(sequelize, accounts);
  }

  onApplicationShutdown(): void {
    this.store.stop();
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
    // Not rolling: the cookie is sent again when the session is saved, which SessionService
    // makes happen when lastSeenAt moves (at most once a minute; the renewal rule above).
    rolling: false,
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
