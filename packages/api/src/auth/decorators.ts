/**
 * Access is declared on each route, never coded in handlers. The global
 * AccessGuard reads these declarations; a route with neither @Public() nor
 * @Roles() is refused (and the access-matrix test fails on it).
 *
 *   @Public()                    reachable without sign-in
 *   @Roles('regional_lead', …)   signed-in, active people with one of these roles
 *   @PracticeScoped('practiceId') the numeric route param names a practice the caller must be able to read
 *   @AuditorMayWrite()           lets auditors use this non-GET route (they are read-only otherwise)
 *   @SkipCsrf()                  for SAML bindings only: the message itself is signed by the identity provider
 *   @CurrentUser()               the signed-in AuthUser (undefined on a public route when nobody is signed in)
 */
import {
  createParamDecorator,
  type CustomDecorator,
  type ExecutionContext,
  SetMetadata,
} from '@nestjs/common';
import type { Request } from 'express';
import { ROLES, type Role } from '../users/roles.js';
import type { AuthUser } from './auth-user.js';

export const PUBLIC_KEY = 'cairn:auth:public';
export const ROLES_KEY = 'cairn:auth:roles';
export const PRACTICE_PARAM_KEY = 'cairn:auth:practice-param';
export const AUDITOR_MAY_WRITE_KEY = 'cairn:auth:auditor-may-write';
export const SKIP_CSRF_KEY = 'cairn:auth:skip-csrf';

/** Reachable without sign-in (health, about, session, SAML metadata/login/acs, docs). */
export const Public = (): CustomDecorator<string> => SetMetadata(PUBLIC_KEY, true);

/** Signed-in, active people having one of these roles. */
export const Roles = (...roles: Role[]): CustomDecorator<string> => {
  if (roles.length === 0) throw new Error('@Roles() needs at least one role');
  for (const role of roles) {
    if (!ROLES.includes(role)) throw new Error(`@Roles(): unknown role ${String(role)}`);
  }
  return SetMetadata(ROLES_KEY, roles);
};

/** Every role: any signed-in, active person. */
export const AnySignedIn = (): CustomDecorator<string> => Roles(...ROLES);

/**
 * The numeric route param `param` names a practice: practice leads must lead
 * it; regional leads and auditors must belong to its region. Unknown practice: 404.
 */
export const PracticeScoped = (param = 'practiceId'): CustomDecorator<string> =>
  SetMetadata(PRACTICE_PARAM_KEY, param);

/** Auditors are read-only; this lets them use one non-GET route (e.g. annotating a review case). */
export const AuditorMayWrite = (): CustomDecorator<string> =>
  SetMetadata(AUDITOR_MAY_WRITE_KEY, true);

/** No CSRF token: only for SAML bindings, whose messages are signed by the identity provider. */
export const SkipCsrf = (): CustomDecorator<string> => SetMetadata(SKIP_CSRF_KEY, true);

export type RequestWithUser = Request & { user?: AuthUser };

/** The signed-in person (AuthUser); undefined on a public route when nobody is signed in. */
export const CurrentUser = createParamDecorator(
  (_data: unknown, context: ExecutionContext): AuthUser | undefined =>
    context.switchToHttp().getRequest<RequestWithUser>().user,
);
