/**
 * Publishing the benchmark of the chosen quarter from the benchmark page: who
 * may (the quarter's report list says, `actions.publish`) and the publishing
 * itself. Publishing refreshes every report view, the quarters page, measure
 * sets ("used by") and the audit trail.
 */
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { apiFetch, apiJson } from '../../../lib/api-client';
import type { Report, ReportList } from '../../../lib/api/types';

export const publishKeys = {
  /** The reports pages' key of a quarter's list: one cache entry for both pages */
  list: (quarterId: number) => ['reports', 'list', quarterId] as const,
};

export const quarterReportsQueryOptions = (quarterId: number) =>
  queryOptions({
    queryKey: publishKeys.list(quarterId),
    queryFn: () => apiFetch<ReportList>(`/api/reports?quarterId=${quarterId}`),
  });

export const useQuarterReports = (quarterId: number | null) =>
  useQuery({ ...quarterReportsQueryOptions(quarterId ?? 0), enabled: quarterId !== null });

export function usePublishQuarter() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: ({ quarterId, releaseNote }: { quarterId: number; releaseNote: string }) =>
      apiFetch<Report>(`/api/quarters/${quarterId}/reports`, {
        method: 'POST',
        ...apiJson({ releaseNote }),
      }),
    onSuccess: async () => {
      for (const key of [['reports'], ['quarter-overview'], ['measure-sets'], ['audit-events']]) {
        await client.invalidateQueries({ queryKey: key });
      }
    },
  });
}
