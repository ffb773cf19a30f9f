/**
 * The signed-in person as every route sees them (`@CurrentUser()`), loaded
 * fresh from the database on each request: a role or practice change, or a
 * deactivation, takes effect at the next request.
 */
import type { Role } from '../users/roles.js';

export interface AuthUser {
  id: number;
  email: string;
  displayName: string;
  role: Role;
  regionId: number;
  /** The practices this person leads (empty for regional leads and auditors) */
  practiceIds: number[];
}

/** The practice a route or service is about, as far as access is concerned. */
export interface PracticeRef {
  id: number;
  regionId: number;
}

/**
 * May this person read this practice's data? Regional leads and auditors:
 * every practice of their region. Practice leads: only their own practices.
 * Pure (no database): pass the practice row. With only an id, inject
 * `PracticeAccess` and call `canRead(user, practiceId)` or `assertCanRead`.
 */
export function canReadPractice(user: AuthUser, practice: PracticeRef): boolean {
  if (practice.regionId !== user.regionId) return false;
  if (user.role === 'practice_lead') return user.practiceIds.includes(practice.id);
  return true;
}

/**
 * Sequelize-style filter of the practices a person may read, for list endpoints:
 * `{ regionId }` for regional leads and auditors, `{ regionId, id: [...] }` for practice leads.
 */
export function readablePracticeFilter(user: AuthUser): { regionId: number; id?: number[] } {
  return user.role === 'practice_lead'
    ? { regionId: user.regionId, id: user.practiceIds }
    : { regionId: user.regionId };
}
