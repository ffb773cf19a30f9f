/**
 * Who is signed in, for every feature: GET /api/session (always 200) gives
 * the person, or null, and the CSRF token every state-changing request sends.
 */
import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiFetch, setWriteHeaders } from './api-client';
import type { Me, Session } from './api/types';

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
