import {
  infiniteQueryOptions,
  queryOptions,
  useInfiniteQuery,
  useQuery,
} from '@tanstack/react-query';
import { apiFetch } from '../../../lib/api-client';
import type { AuditAction, AuditEventPage, AuditOutcome } from '../../../lib/api/types';

export interface AuditFilters {
  action?: string;
  outcome?: AuditOutcome | '';
  search?: string;
  from?: string;
  to?: string;
}

const PAGE = 100;

function query(filters: AuditFilters, before: number | null): string {
  const params = new URLSearchParams({ limit: String(PAGE) });
  if (filters.action) params.set('action', filters.action);
  if (filters.outcome) params.set('outcome', filters.outcome);
  if (filters.search?.trim()) params.set('search', filters.search.trim());
  if (filters.from) params.set('from', filters.from);
  if (filters.to) params.set('to', filters.to);
  if (before) params.set('before', String(before));
  return params.toString();
}

export const auditEventsQueryOptions = (filters: AuditFilters) =>
  infiniteQueryOptions({
    queryKey: ['audit-events', 'list', filters],
    queryFn: ({ pageParam }) =>
      apiFetch<AuditEventPage>(`/api/audit-events?${query(filters, pageParam)}`),
    initialPageParam: null as number | null,
    getNextPageParam: (last) => last.nextBefore,
  });

export function useAuditEvents(filters: AuditFilters) {
  return useInfiniteQuery(auditEventsQueryOptions(filters));
}

export const auditActionsQueryOptions = () =>
  queryOptions({
    queryKey: ['audit-events', 'actions'],
    queryFn: () => apiFetch<AuditAction[]>('/api/audit-events/actions'),
  });

export function useAuditActions() {
  return useQuery(auditActionsQueryOptions());
}
