/**
 * The practices a person may send extracts for: a practice lead's own
 * practices (from the session), or for a regional lead every practice of the
 * region (the list the users screen offers).
 */
import { useQuery } from '@tanstack/react-query';
import { useMe } from '../../session/api/me';
import { userOptionsQueryOptions } from '../../users/api/users';

export interface PracticeChoice {
  id: number;
  code: string;
  name: string;
  localityName?: string | null;
}

export function usePracticeChoices(): {
  practices: PracticeChoice[];
  isPending: boolean;
  error: unknown;
} {
  const me = useMe();
  const regional = me.data?.role === 'regional_lead';
  const options = useQuery({ ...userOptionsQueryOptions(), enabled: regional });
  if (!me.data) return { practices: [], isPending: me.isPending, error: me.error };
  if (regional) {
    return {
      practices: options.data?.practices ?? [],
      isPending: options.isPending,
      error: options.error,
    };
  }
  return { practices: me.data.practices, isPending: false, error: null };
}

export const practiceLabel = (p: PracticeChoice) =>
  `${p.code} · ${p.name}${p.localityName ? ` (${p.localityName})` : ''}`;
