/**
 * Measure-set versions: reading them, and the regional lead's drafts (start,
 * save, publish, discard). Every change refreshes the measure-set views, the
 * quarters page (its choices and "used by") and the audit trail.
 */
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { apiFetch, apiJson } from '../../../lib/api-client';
import type {
  DiscardedMeasureSet,
  MeasureSet,
  MeasureSetChanges,
  MeasureSetSummary,
  NewDraft,
  SaveDraft,
} from '../../../lib/api/types';

export const measureSetKeys = {
  all: ['measure-sets'] as const,
  list: () => ['measure-sets', 'list'] as const,
  detail: (id: string) => ['measure-sets', 'detail', id] as const,
  changes: (id: string) => ['measure-sets', 'changes', id] as const,
};

const path = (id: string) => `/api/measure-sets/${encodeURIComponent(id)}`;

export const measureSetsQueryOptions = () =>
  queryOptions({
    queryKey: measureSetKeys.list(),
    queryFn: () => apiFetch<MeasureSetSummary[]>('/api/measure-sets'),
  });

export function useMeasureSets() {
  return useQuery(measureSetsQueryOptions());
}

export const measureSetQueryOptions = (id: string) =>
  queryOptions({
    queryKey: measureSetKeys.detail(id),
    queryFn: () => apiFetch<MeasureSet>(path(id)),
  });

export function useMeasureSet(id: string) {
  return useQuery(measureSetQueryOptions(id));
}

export function useMeasureSetChanges(id: string, enabled: boolean) {
  return useQuery({
    queryKey: measureSetKeys.changes(id),
    queryFn: () => apiFetch<MeasureSetChanges>(`${path(id)}/changes`),
    enabled,
  });
}

function useRefreshAfter() {
  const client = useQueryClient();
  return async () => {
    await client.invalidateQueries({ queryKey: measureSetKeys.all });
    await client.invalidateQueries({ queryKey: ['quarter-overview'] });
    await client.invalidateQueries({ queryKey: ['audit-events'] });
  };
}

export function useStartDraft(fromId: string) {
  const refresh = useRefreshAfter();
  return useMutation({
    mutationFn: (draft: NewDraft) =>
      apiFetch<MeasureSet>(`${path(fromId)}/drafts`, { method: 'POST', ...apiJson(draft) }),
    onSuccess: refresh,
  });
}

export function useSaveDraft(id: string) {
  const refresh = useRefreshAfter();
  return useMutation({
    mutationFn: (body: SaveDraft) =>
      apiFetch<MeasureSet>(path(id), { method: 'PUT', ...apiJson(body) }),
    onSuccess: refresh,
  });
}

export function usePublishDraft(id: string) {
  const refresh = useRefreshAfter();
  return useMutation({
    mutationFn: (revision: number) =>
      apiFetch<MeasureSet>(`${path(id)}/publish`, { method: 'POST', ...apiJson({ revision }) }),
    onSuccess: refresh,
  });
}

export function useDiscardDraft(id: string) {
  const refresh = useRefreshAfter();
  return useMutation({
    mutationFn: () => apiFetch<DiscardedMeasureSet>(path(id), { method: 'DELETE' }),
    onSuccess: refresh,
  });
}
