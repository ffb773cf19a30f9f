import type { Me } from '../../session/api/me';

/**
 * Whether the person may send extracts for this practice (regional leads:
 * any practice of the region; practice leads: their own). Only decides what
 * is shown; the server enforces the same rule.
 */
export function canSend(me: Me | null | undefined, practiceId?: number): boolean {
  if (!me) return false;
  if (me.role === 'regional_lead') return true;
  if (me.role !== 'practice_lead') return false;
  return practiceId === undefined
    ? me.practices.length > 0
    : me.practices.some((p) => p.id === practiceId);
}

export function uploadLink(practiceId?: number, quarterId?: number): string {
  const params = new URLSearchParams();
  if (practiceId) params.set('practice', String(practiceId));
  if (quarterId) params.set('quarter', String(quarterId));
  const text = params.toString();
  return `/extracts/upload${text ? `?${text}` : ''}`;
}
