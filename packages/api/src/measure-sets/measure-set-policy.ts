/**
 * Who may read and change which measure-set version: the one place the rule
 * lives. The services' checks and the actions sent with every version both
 * call it (a table of cases in measure-set-policy.spec.ts).
 *
 * - Everyone reads the published versions shipped with Cairn and those of
 *   their own region; a region's drafts are read by its regional leads and
 *   auditors, not by practice leads (a draft decides nothing yet).
 * - A regional lead starts a draft from any published version they read,
 *   edits, publishes and discards the drafts of their region.
 * - A published version never changes: it is fixed for every quarter and
 *   report that uses it. Only drafts are edited, and nothing uses a draft.
 */
import type { Actor } from '../auth/actor.js';
import type { MeasureSetActionsDto, MeasureSetStatus } from './dto/measure-set.dto.js';

export interface VersionFacts {
  /** null: shipped with Cairn */
  regionId: number | null;
  status: MeasureSetStatus;
}

type Who = Pick<Actor, 'role' | 'regionId'>;

export function mayRead(actor: Who, version: VersionFacts): boolean {
  if (version.regionId !== null && version.regionId !== actor.regionId) return false;
  if (version.status === 'draft') return actor.role === 'regional_lead' || actor.role === 'auditor';
  return true;
}

/** Whether this person may start drafts at all. */
export const mayStartDrafts = (actor: Who): boolean => actor.role === 'regional_lead';

export function measureSetActions(actor: Who, version: VersionFacts): MeasureSetActionsDto {
  const readable = mayRead(actor, version);
  const ownDraft =
    readable &&
    version.status === 'draft' &&
    version.regionId === actor.regionId &&
    actor.role === 'regional_lead';
  return {
    clone: readable && version.status === 'published' && mayStartDrafts(actor),
    edit: ownDraft,
    publish: ownDraft,
    discard: ownDraft,
  };
}
