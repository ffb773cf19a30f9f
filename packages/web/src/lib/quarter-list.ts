/**
 * The region's audit quarters (GET /api/quarters, newest first as the API sends them), as one
 * query for every screen that lists or picks quarters: a quarter added, opened or closed
 * (useChangeQuarter invalidates ['quarters']) reaches all of them at once, and a screen that
 * needs the list after another one read it does not ask for it again.
 */
import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiFetch } from './api-client';
import type { Quarter } from './api/types';

export const quarterListKey = () => ['quarters', 'list'] as const;

export const quarterListQueryOptions = () =>
  queryOptions({
    queryKey: quarterListKey(),
    queryFn: () => apiFetch<Quarter[]>('/api/quarters'),
    staleTime: 5 * 60_000,
  });

export function useQuarterList() {
  return useQuery(quarterListQueryOptions());
}
