import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiFetch, setWriteHeaders } from '../../../lib/api-client';

export type Role = 'regional_lead' | 'practice_lead' | 'auditor';

export const roleLabels: Record<Role, string> = {
  regional_lead: 'Regional lead',
  practice_lead: 'Practice lead',
  auditor: 'Auditor',
};

export interface MePractice {
  id: number;
  code: string;
  name: string;
}

export interface Me {
  id: number;
  email: string;
  displayName: string;
  role: Role;
  regionName: string;
  practices: MePractice[];
  /** When the session ends at the latest (ISO 8601) */
  sessionExpiresAt?: string;
}

export type SessionEnded = 'idle' | 'absolute' | 'deactivated' | 'removed';

export interface Session {
  user: Me | null;
  /** Sent as X-CSRF-Token on every state-changing request */
  csrfToken?: string | null;
  /** Why a session ended on this request, if it did */
  sessionEnded?: SessionEnded | null;
  /** True when sign-in goes through the local fake identity provider */
  localSignIn?: boolean;
}

let csrfToken: string | null = null;
// Every state-changing request carries the session's CSRF token.
setWriteHeaders((): Record<string, string> => (csrfToken ? { 'X-CSRF-Token': csrfToken } : {}));

/** GET /api/session (always 200): the signed-in person or null, and the CSRF token. */
export async function fetchSession(): Promise<Session> {
  const session = await apiFetch<Session>('/api/session');
  csrfToken = session.csrfToken ?? null;
  return session;
}

export const sessionQueryOptions = () =>
  queryOptions({ queryKey: ['session'], queryFn: fetchSession, staleTime: 60_000 });

export function useSession() {
  return useQuery(sessionQueryOptions());
}

/** The signed-in person, or null when nobody is signed in. */
export async function fetchMe(): Promise<Me | null> {
  return (await fetchSession()).user;
}

export const meQueryOptions = () =>
  queryOptions({
    ...sessionQueryOptions(),
    select: (session: Session) => session.user,
  });

export function useMe() {
  return useQuery(meQueryOptions());
}
