import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiFetch } from '../../../lib/api-client';

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
}

export interface Session {
  user: Me | null;
}

/** The signed-in person, or null when nobody is signed in (GET /api/session always answers 200). */
export async function fetchMe(): Promise<Me | null> {
  const session = await apiFetch<Session>('/api/session');
  return session.user;
}

export const meQueryOptions = () =>
  queryOptions({ queryKey: ['session', 'me'], queryFn: fetchMe, staleTime: 60_000 });

export function useMe() {
  return useQuery(meQueryOptions());
}
