import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiFetch } from '../../../lib/api-client';
import type { About } from '../../../lib/api/types';

export const fetchAbout = () => apiFetch<About>('/api/about');

export const aboutQueryOptions = () =>
  queryOptions({ queryKey: ['about'], queryFn: fetchAbout, staleTime: 5 * 60_000 });

export function useAbout() {
  return useQuery(aboutQueryOptions());
}
