/**
 * Sessions: who is signed in on this request, starting a session at sign-in
 * (always a new session id: no fixation), ending one, and ending all of a
 * person's sessions. Sessions live in MariaDB (express-session with Cairn's
 * own store, see session-store.ts); the person is re-read from the database
 * on every request.
 */
import { randomBytes, timingSafeEqual } from 'node:crypto';
import { Inject, Injectable } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { InjectModel } from '@nestjs/sequelize';
import type { Request, Response } from 'express';
import type { Session, SessionData } from 'express-session';
import type { Transaction } from 'sequelize';
import { AuditTrailService } from '../audit-trail/audit-trail.service.js';
import type { CairnConfig } from '../config/config.schema.js';
import { type Account, UserAccounts } from '../users/user-accounts.js';
import type { AuthUser } from './auth-user.js';
import { SessionRecord } from './models/session-record.model.js';
import type { SessionAuth } from './session-data.js';
import { personReadWith, RENEW_MS } from './session-store.js';
import './session-data.js';
import { section } from './config-section.js';

import type { SessionEnd } from './dto/session.dto.js';

export type { SessionEnd };

export interface ResolvedSession {
  user?: AuthUser;
  /** Why a session that existed no longer counts (its auth was removed on this request) */
  ended?: SessionEnd;
}

type SessionRequest = Request & {
  session?: Session & Partial<SessionData>;
  user?: AuthUser;
  cairnSession?: ResolvedSession;
};

const promisify = (fn: (cb: (err?: unknown) => void) => void) =>
  new Promise<void>((resolve, reject) => fn((err) => (err ? reject(err) : resolve())));

export function newCsrfToken(): string {
  return randomBytes(32).toString('base64url');
}

export function csrfTokenMatches(expected: string | undefined, given: unknown): boolean {
  if (!expected || typeof given !== 'string' || given.length !== expected.length) return false;
  return timingSafeEqual(Buffer.from(expected), Buffer.from(given));
}

@Injectable()
export class SessionService {
  constructor(
    @Inject(ConfigService) private readonly configService: ConfigService,
    @Inject(UserAccounts) private readonly accounts: UserAccounts,
    @InjectModel(SessionRecord) private readonly sessions: typeof SessionRecord,
    @Inject(AuditTrailService) private readonly audit: AuditTrailService,
  ) {}

  private get settings(): CairnConfig['session'] {
    return section(this.configService, 'session');
  }

  /** The signed-in person for this request (memoised on the request). */
  async resolve(req: Request): Promise<ResolvedSession> {
    const r = req as SessionRequest;
    if (r.cairnSession) return r.cairnSession;
    r.cairnSession = await this.load(r);
    if (r.cairnSession.user) r.user = r.cairnSession.user;
    return r.cairnSession;
  }

  private async load(req: SessionRequest): Promise<ResolvedSession> {
    const auth = req.session?.auth;
    if (!auth) return {};
    const now = Date.now();
    const { idleTimeoutMinutes, absoluteTimeoutHours } = this.settings;
    let ended: SessionEnd | undefined;
    if (now - auth.lastSeenAt > idleTimeoutMinutes * 60_000) ended = 'idle';
    else if (now - auth.signedInAt > absoluteTimeoutHours * 3600_000) ended = 'absolute';
    // The person as read with the session row (the same statement), else read now.
    const read = personReadWith(req.session);
    const user = ended
      ? null
      : read && read.id === auth.userId
        ? read
        : await this.accounts.find(auth.userId);
    if (!ended && !user) ended = 'removed';
    if (!ended && user!.status !== 'active') ended = 'deactivated';
    if (ended) {
      await this.drop(req);
      await this.audit.append({
        action: 'auth.session_ended',
        summary: `Session ended: ${
          ended === 'idle'
            ? `no activity for ${idleTimeoutMinutes} minutes`
            : ended === 'absolute'
              ? `signed in more than ${absoluteTimeoutHours} hours ago`
              : ended === 'deactivated'
                ? 'the person was deactivated'
                : 'the person no longer exists'
        }`,
        actor: { id: auth.userId, label: user?.email ?? `user ${auth.userId}` },
        regionId: user?.regionId ?? null,
        subjectType: 'user',
        subjectId: auth.userId,
        detail: { reason: ended },
        requestId: (req as Request & { id?: string }).id ?? null,
        ipAddress: req.ip ?? null,
      });
      return { ended };
    }
    // Renewed at most once a minute (session-store.ts): the change saves the session, which
    // writes the row's expiry and sends the cookie again.
    if (now - auth.lastSeenAt >= RENEW_MS) auth.lastSeenAt = now;
    return { user: toAuthUser(user!) };
  }

  /** When this request's session signed in (epoch milliseconds; undefined when nobody is signed in). */
  signedInAt(req: Request): number | undefined {
    return (req as SessionRequest).session?.auth?.signedInAt;
  }

  /** The CSRF token of this request's session (undefined when nobody is signed in). */
  csrfToken(req: Request): string | undefined {
    return (req as SessionRequest).session?.auth?.csrfToken;
  }

  /** Starts a fresh session (new id: the old one, if any, is destroyed) for this person. */
  async begin(
    req: Request,
    user: Account,
    saml: Pick<SessionAuth, 'nameId' | 'nameIdFormat' | 'sessionIndex'>,
  ): Promise<SessionAuth> {
    const r = req as SessionRequest;
    if (!r.session) throw new Error('express-session is not installed');
    await promisify((cb) => r.session!.regenerate(cb));
    const now = Date.now();
    const auth: SessionAuth = {
      userId: user.id,
      signedInAt: now,
      lastSeenAt: now,
      csrfToken: newCsrfToken(),
      ...saml,
    };
    r.session!.auth = auth;
    await promisify((cb) => r.session!.save(cb));
    r.cairnSession = { user: toAuthUser(user) };
    return auth;
  }

  /** Ends this request's session; returns what it held. */
  async end(req: Request, res?: Response): Promise<SessionAuth | undefined> {
    const r = req as SessionRequest;
    const auth = r.session?.auth;
    await this.drop(r);
    res?.clearCookie(this.settings.cookieName, { path: '/' });
    r.cairnSession = {};
    delete r.user;
    return auth;
  }

  private async drop(req: SessionRequest): Promise<void> {
    if (!req.session) return;
    const session = req.session;
    await promisify((cb) => session.destroy(cb));
  }

  /** Ends every session of this person (deactivation): their next request is signed out. */
  async endAllFor(userId: number, transaction?: Transaction): Promise<number> {
    return this.sessions.destroy({ where: { userId }, transaction });
  }
}

export function toAuthUser(user: Account): AuthUser {
  return {
    id: user.id,
    email: user.email,
    displayName: user.displayName,
    role: user.role,
    regionId: user.regionId,
    practiceIds: user.role === 'practice_lead' ? user.practiceIds : [],
  };
}
