/**
 * The region benchmark of an audit quarter (every practice × every measure),
 * one measure's funnel, and the audit quarters to choose from.
 */
import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { apiFetch } from '../../../lib/api-client';
import type { MeasureFunnel, Quarter, RegionBenchmark, TypeSplit } from '../../../lib/api/types';

export const benchmarkKeys = {
  quarters: () => ['benchmark', 'quarters'] as const,
  region: (quarterId: number, split: TypeSplit, locality: string) =>
    ['benchmark', 'region', quarterId, split, locality] as const,
  funnel: (quarterId: number, measure: string, split: TypeSplit) =>
    ['benchmark', 'funnel', quarterId, measure, split] as const,
};

export const benchmarkQuartersQueryOptions = () =>
  queryOptions({
    queryKey: benchmarkKeys.quarters(),
    queryFn: () => apiFetch<Quarter[]>('/api/quarters'),
    staleTime: 5 * 60_000,
  });

export function useBenchmarkQuarters() {
  return useQuery(benchmarkQuartersQueryOptions());
}

export function regionBenchmarkPath(quarterId: number, split: TypeSplit, locality: string): string {
  const query = new URLSearchParams({ split });
  if (locality) query.set('locality', locality);
  return `/api/quarters/${quarterId}/benchmark?${query.toString()}`;
}

export const regionBenchmarkQueryOptions = (
  quarterId: number,
  split: TypeSplit,
  locality: string,
) =>
  queryOptions({
    queryKey: benchmarkKeys.region(quarterId, split, locality),
    queryFn: () => apiFetch<RegionBenchmark>(regionBenchmarkPath(quarterId, split, locality)),
  });

export function useRegionBenchmark(quarterId: number | null, split: TypeSplit, locality: string) {
  return useQuery({
    ...regionBenchmarkQueryOptions(quarterId ?? 0, split, locality),
    enabled: quarterId != null,
    placeholderData: keepPreviousData,
  });
}

export function funnelPath(quarterId: number, measure: string, split: TypeSplit): string {
  return `/api/quarters/${quarterId}/benchmark/measures/${encodeURIComponent(measure)}?split=${split}`;
}

export const funnelQueryOptions = (quarterId: number, measure: string, split: TypeSplit) =>
  queryOptions({
    queryKey: benchmarkKeys.funnel(quarterId, measure, split),
    queryFn: () => apiFetch<MeasureFunnel>(funnelPath(quarterId, measure, split)),
  });

export function useFunnel(quarterId: number | null, measure: string | null, split: TypeSplit) {
  return useQuery({
    ...funnelQueryOptions(quarterId ?? 0, measure ?? '', split),
    enabled: quarterId != null && measure != null,
    placeholderData: keepPreviousData,
  });
}
