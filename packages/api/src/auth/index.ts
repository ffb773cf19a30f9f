/**
 * Cairn's access contract for feature modules (see decorators.ts and access.guard.ts):
 *
 *   @Public() | @Roles(...roles) | @AnySignedIn()   every route declares one (else it is refused)
 *   @PracticeScoped('practiceId')                    the numeric route param names a practice the caller may read
 *   @AuditorMayWrite()                               auditors are read-only unless a write route says so
 *   @CurrentUser() user: AuthUser                    the signed-in person
 *   @CurrentActor() actor: Actor                     the same person as services take them (actor.ts)
 *   canReadPractice(user, practice) / PracticeAccess for list endpoints and services
 *
 * State-changing requests need X-CSRF-Token (from GET /api/session); missing
 * or wrong → 403 /api/problems/csrf. Multipart uploads send it too.
 */
export {
  AnySignedIn,
  AuditorMayWrite,
  CurrentUser,
  PracticeScoped,
  Public,
  Roles,
  SkipCsrf,
} from './decorators.js';
export {
  type AuthUser,
  canReadPractice,
  type PracticeRef,
  readablePracticeFilter,
} from './auth-user.js';
export { PracticeAccess } from './practice-access.js';
export { type Actor, actorOf, CurrentActor, systemActor } from './actor.js';
export { ACCESS_PROBLEMS, SAFE_METHODS } from './access.guard.js';
export { SessionService } from './session.service.js';
export type { Role } from '../users/roles.js';
