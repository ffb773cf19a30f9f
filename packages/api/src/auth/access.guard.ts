/**
 * The one global guard: deny by default, then the declarations (decorators.ts).
 *
 *   1. who is signed in (SessionService: idle/absolute timeouts, deactivation)
 *   2. a route with neither @Public() nor @Roles()      → 403 undeclared-route
 *   3. not @Public() and nobody signed in               → 401 sign-in-required
 *   4. a state-changing method without the session's X-CSRF-Token (unless @SkipCsrf) → 403 csrf
 *   5. @Roles() without the caller's role                → 403 role-not-allowed
 *   6. an auditor on a non-GET/HEAD route (unless @AuditorMayWrite) → 403 auditor-read-only
 *   7. @PracticeScoped(param): 400 / 404 / 403 from PracticeAccess
 */
import {
  type CanActivate,
  type ExecutionContext,
  HttpStatus,
  Inject,
  Injectable,
  Logger,
} from '@nestjs/common';
import { Reflector } from '@nestjs/core';
import type { Request } from 'express';
import { ProblemException } from '../common/problem.js';
import type { Role } from '../users/roles.js';
import {
  AUDITOR_MAY_WRITE_KEY,
  PRACTICE_PARAM_KEY,
  PUBLIC_KEY,
  ROLES_KEY,
  SKIP_CSRF_KEY,
} from './decorators.js';
import { PracticeAccess } from './practice-access.js';
import { csrfTokenMatches, type SessionEnd, SessionService } from './session.service.js';

export const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

/** The problem types the guard answers with (the access matrix recognises refusals by them). */
export const ACCESS_PROBLEMS = [
  '/api/problems/undeclared-route',
  '/api/problems/sign-in-required',
  '/api/problems/csrf',
  '/api/problems/role-not-allowed',
  '/api/problems/auditor-read-only',
  '/api/problems/practice-not-yours',
] as const;

const endedDetail: Record<SessionEnd, string> = {
  idle: 'Your session ended after a period without activity. Sign in again to continue.',
  absolute: 'Your session reached its maximum length. Sign in again to continue.',
  deactivated: 'Your Cairn account has been deactivated, so your session was ended.',
  removed: 'Your Cairn account no longer exists, so your session was ended.',
};

const roleNames: Record<Role, string> = {
  regional_lead: 'regional leads',
  practice_lead: 'practice leads',
  auditor: 'auditors',
};

@Injectable()
export class AccessGuard implements CanActivate {
  private readonly logger = new Logger('AccessGuard');

  constructor(
    @Inject(Reflector) private readonly reflector: Reflector,
    @Inject(SessionService) private readonly sessions: SessionService,
    @Inject(PracticeAccess) private readonly practices: PracticeAccess,
  ) {}

  async canActivate(context: ExecutionContext): Promise<boolean> {
    if (context.getType() !== 'http') return false;
    const req = context.switchToHttp().getRequest<Request>();
    const targets = [context.getHandler(), context.getClass()];
    const isPublic =
      this.reflector.getAllAndOverride<boolean | undefined>(PUBLIC_KEY, targets) === true;
    const roles = this.reflector.getAllAndOverride<Role[] | undefined>(ROLES_KEY, targets);
    const { user, ended } = await this.sessions.resolve(req);

    if (!isPublic && !roles) {
      this.logger.error(
        `${req.method} ${req.path}: ${context.getClass().name}.${context.getHandler().name} has no @Public() or @Roles() declaration; refused`,
      );
      throw new ProblemException(
        HttpStatus.FORBIDDEN,
        'undeclared-route',
        'Not allowed',
        'This route declares no access rule, so Cairn refuses it to everyone.',
      );
    }
    if (!isPublic && !user) {
      throw new ProblemException(
        HttpStatus.UNAUTHORIZED,
        'sign-in-required',
        'Sign-in required',
        ended ? endedDetail[ended] : 'Sign in to Cairn to use this.',
        ended ? { sessionEnded: ended } : {},
      );
    }
    const unsafe = !SAFE_METHODS.has(req.method);
    const skipCsrf =
      this.reflector.getAllAndOverride<boolean | undefined>(SKIP_CSRF_KEY, targets) === true;
    if (
      unsafe &&
      !skipCsrf &&
      !csrfTokenMatches(this.sessions.csrfToken(req), req.header('x-csrf-token'))
    ) {
      throw new ProblemException(
        HttpStatus.FORBIDDEN,
        'csrf',
        'Missing or wrong security token',
        user
          ? 'This change was sent without the security token of your session (X-CSRF-Token). Reload the page and try again.'
          : 'There is no signed-in session to make this change in.',
      );
    }
    if (isPublic) return true;

    if (!roles!.includes(user!.role)) {
      throw new ProblemException(
        HttpStatus.FORBIDDEN,
        'role-not-allowed',
        'Not allowed for your role',
        `Only ${roles!.map((r) => roleNames[r]).join(' and ')} can use this.`,
      );
    }
    if (
      user!.role === 'auditor' &&
      unsafe &&
      this.reflector.getAllAndOverride<boolean | undefined>(AUDITOR_MAY_WRITE_KEY, targets) !== true
    ) {
      throw new ProblemException(
        HttpStatus.FORBIDDEN,
        'auditor-read-only',
        'Auditors have read-only access',
        'As an auditor you can read everything in your region but change nothing here.',
      );
    }
    const param = this.reflector.getAllAndOverride<string | undefined>(PRACTICE_PARAM_KEY, targets);
    if (param) {
      const value = (req.params as Record<string, string | undefined>)[param];
      await this.practices.assertCanRead(user!, value);
    }
    return true;
  }
}
