/**
 * The region benchmark of an audit quarter (every practice × every measure),
 * one measure's funnel, and the audit quarters to choose from.
 */
import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { apiFetch } from '../../../lib/api-client';
import type {
  BenchmarkTrend,
  MeasureFunnel,
  RegionBenchmark,
  TypeSplit,
} from '../../../lib/api/types';
import { funnelPath, regionBenchmarkPath, takeEarly } from './early';

export { funnelPath, regionBenchmarkPath };

export const benchmarkKeys = {
  region: (quarterId: number, split: TypeSplit, locality: string) =>
    ['benchmark', 'region', quarterId, split, locality] as const,
  funnel: (quarterId: number, measure: string, split: TypeSplit) =>
    ['benchmark', 'funnel', quarterId, measure, split] as const,
  trend: (quarterId: number, measure: string, split: TypeSplit) =>
    ['benchmark', 'trend', quarterId, measure, split] as const,
};

/**
 * Every page of a region benchmark, as one: the first page (handed over by the route loader
 * when it asked already), then the others, all of the same stored result (read again from the
 * first page when a confirm came in between).
 */
export async function fetchRegionBenchmark(
  path: string,
  first?: Promise<RegionBenchmark>,
): Promise<RegionBenchmark> {
  for (let attempt = 0; ; attempt++) {
    const head = await (attempt === 0 && first ? first : apiFetch<RegionBenchmark>(path));
    const rest = await Promise.all(
      Array.from({ length: head.page.pages - 1 }, (_, i) =>
        apiFetch<RegionBenchmark>(`${path}&page=${i + 2}`),
      ),
    );
    const same = rest.every((r) => r.builtFrom?.resultId === head.builtFrom?.resultId);
    if (same || attempt >= 2) {
      if (!same) throw new Error('The benchmark changed while its pages were read; try again.');
      const practices = [...head.practices, ...rest.flatMap((r) => r.practices)];
      return {
        ...head,
        practices,
        page: { ...head.page, page: 1, pages: 1, total: practices.length },
      };
    }
  }
}

export const regionBenchmarkQueryOptions = (
  quarterId: number,
  split: TypeSplit,
  locality: string,
) =>
  queryOptions({
    queryKey: benchmarkKeys.region(quarterId, split, locality),
    queryFn: () => {
      const path = regionBenchmarkPath(quarterId, split, locality);
      return fetchRegionBenchmark(path, takeEarly<RegionBenchmark>(path));
    },
  });

export function useRegionBenchmark(quarterId: number | null, split: TypeSplit, locality: string) {
  return useQuery({
    ...regionBenchmarkQueryOptions(quarterId ?? 0, split, locality),
    enabled: quarterId != null,
    placeholderData: keepPreviousData,
  });
}

export const funnelQueryOptions = (quarterId: number, measure: string, split: TypeSplit) =>
  queryOptions({
    queryKey: benchmarkKeys.funnel(quarterId, measure, split),
    queryFn: () => {
      const path = funnelPath(quarterId, measure, split);
      return takeEarly<MeasureFunnel>(path) ?? apiFetch<MeasureFunnel>(path);
    },
  });

export function useFunnel(quarterId: number | null, measure: string | null, split: TypeSplit) {
  return useQuery({
    ...funnelQueryOptions(quarterId ?? 0, measure ?? '', split),
    enabled: quarterId != null && measure != null,
    placeholderData: keepPreviousData,
  });
}

export const benchmarkTrendQueryOptions = (quarterId: number, measure: string, split: TypeSplit) =>
  queryOptions({
    queryKey: benchmarkKeys.trend(quarterId, measure, split),
    queryFn: () =>
      apiFetch<BenchmarkTrend>(
        `/api/quarters/${quarterId}/benchmark/trend?${new URLSearchParams({ measure, split }).toString()}`,
      ),
  });

/** The region's rate (and every practice's) per quarter up to this one, for one measure. */
export function useBenchmarkTrend(
  quarterId: number | null,
  measure: string | null,
  split: TypeSplit,
) {
  return useQuery({
    ...benchmarkTrendQueryOptions(quarterId ?? 0, measure ?? '', split),
    enabled: quarterId != null && measure != null,
    placeholderData: keepPreviousData,
  });
}
