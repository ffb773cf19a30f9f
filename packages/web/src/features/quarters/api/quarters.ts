/**
 * Audit quarters: the quarters page's reading (GET /api/quarter-overview)
 * and the regional lead's changes. Every change refreshes what shows
 * quarters anywhere (by key: the page, the quarter lists, coverage, measure
 * sets' "used by", the audit trail).
 */
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { apiFetch, apiJson } from '../../../lib/api-client';
import type {
  AuditQuarters,
  OpenQuarter,
  Quarter,
  QuarterChanges,
  ReopenQuarter,
} from '../../../lib/api/types';

export const quartersPageKeys = {
  overview: () => ['quarter-overview'] as const,
};

export const quarterOverviewQueryOptions = () =>
  queryOptions({
    queryKey: quartersPageKeys.overview(),
    queryFn: () => apiFetch<AuditQuarters>('/api/quarter-overview'),
  });

export function useQuarterOverview() {
  return useQuery(quarterOverviewQueryOptions());
}

export type QuarterChange =
  | { kind: 'open'; body: OpenQuarter }
  | { kind: 'update'; quarterId: number; body: QuarterChanges }
  | { kind: 'close'; quarterId: number }
  | { kind: 'reopen'; quarterId: number; body: ReopenQuarter };

function send(change: QuarterChange): Promise<Quarter> {
  switch (change.kind) {
    case 'open':
      return apiFetch<Quarter>('/api/quarters', { method: 'POST', ...apiJson(change.body) });
    case 'update':
      return apiFetch<Quarter>(`/api/quarters/${change.quarterId}`, {
        method: 'PATCH',
        ...apiJson(change.body),
      });
    case 'close':
      return apiFetch<Quarter>(`/api/quarters/${change.quarterId}/close`, { method: 'POST' });
    case 'reopen':
      return apiFetch<Quarter>(`/api/quarters/${change.quarterId}/reopen`, {
        method: 'POST',
        ...apiJson(change.body),
      });
  }
}

export function useChangeQuarter() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: send,
    onSuccess: async () => {
      for (const key of [
        quartersPageKeys.overview(),
        ['quarters'],
        ['coverage'],
        ['measure-sets'],
        ['extracts', 'upload-options'],
        ['audit-events'],
      ]) {
        await client.invalidateQueries({ queryKey: key });
      }
    },
  });
}
