/**
 * Published reports: the region's list, one report's identity, its region
 * and practice parts (exactly as published), publishing and withdrawing.
 * Publishing or withdrawing refreshes the report views, the quarters page
 * (its report column), measure sets ("used by") and the audit trail.
 */
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { apiFetch, apiJson } from '../../../lib/api-client';
import type { Report, ReportList, ReportPractice, ReportRegion } from '../../../lib/api/types';

export const reportKeys = {
  all: ['reports'] as const,
  list: (quarterId: number | null) => ['reports', 'list', quarterId] as const,
  detail: (id: number) => ['reports', 'detail', id] as const,
  region: (id: number) => ['reports', 'region', id] as const,
  practice: (id: number, practiceId: number) => ['reports', 'practice', id, practiceId] as const,
};

export const reportListQueryOptions = (quarterId: number | null) =>
  queryOptions({
    queryKey: reportKeys.list(quarterId),
    queryFn: () =>
      apiFetch<ReportList>(
        quarterId === null ? '/api/reports' : `/api/reports?quarterId=${quarterId}`,
      ),
  });

export const useReportList = (quarterId: number | null) =>
  useQuery(reportListQueryOptions(quarterId));

export const reportQueryOptions = (id: number) =>
  queryOptions({
    queryKey: reportKeys.detail(id),
    queryFn: () => apiFetch<Report>(`/api/reports/${id}`),
  });

export const useReport = (id: number) => useQuery(reportQueryOptions(id));

export function useReportRegion(id: number, enabled: boolean) {
  return useQuery({
    queryKey: reportKeys.region(id),
    queryFn: () => apiFetch<ReportRegion>(`/api/reports/${id}/region`),
    enabled,
    // A report's figures never change.
    staleTime: Infinity,
  });
}

export function useReportPractice(id: number, practiceId: number | null) {
  return useQuery({
    queryKey: reportKeys.practice(id, practiceId ?? 0),
    queryFn: () => apiFetch<ReportPractice>(`/api/reports/${id}/practices/${practiceId}`),
    enabled: practiceId !== null,
    staleTime: Infinity,
  });
}

async function refresh(client: ReturnType<typeof useQueryClient>) {
  for (const key of [reportKeys.all, ['quarter-overview'], ['measure-sets'], ['audit-events']]) {
    await client.invalidateQueries({ queryKey: key });
  }
}

export function usePublishReport() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: ({ quarterId, releaseNote }: { quarterId: number; releaseNote: string }) =>
      apiFetch<Report>(`/api/quarters/${quarterId}/reports`, {
        method: 'POST',
        ...apiJson({ releaseNote }),
      }),
    onSuccess: () => refresh(client),
  });
}

export function useWithdrawReport() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: ({ id, reason }: { id: number; reason: string }) =>
      apiFetch<Report>(`/api/reports/${id}/withdraw`, { method: 'POST', ...apiJson({ reason }) }),
    onSuccess: () => refresh(client),
  });
}

/** Where a report's files are downloaded from. */
export const downloads = {
  regionPack: (id: number) => `/api/reports/${id}/data-pack.xlsx`,
  regionPdf: (id: number) => `/api/reports/${id}/report.pdf`,
  practicePack: (id: number, practiceId: number) =>
    `/api/reports/${id}/practices/${practiceId}/data-pack.xlsx`,
  practicePdf: (id: number, practiceId: number) =>
    `/api/reports/${id}/practices/${practiceId}/report.pdf`,
};
