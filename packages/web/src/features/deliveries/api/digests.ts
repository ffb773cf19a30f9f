/**
 * A report's digests (the regional lead): the reports they can be made from,
 * one practice's digest as sent, a test to oneself, sending to every practice,
 * and the scheduled sending.
 */
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { apiFetch, apiJson } from '../../../lib/api-client';
import type {
  DigestPreview,
  DigestReportRef,
  DigestSchedule,
  DigestSendResult,
  DigestTestSend,
} from '../../../lib/api/types';

export const digestKeys = {
  all: ['digests'] as const,
  reports: () => ['digests', 'reports'] as const,
  preview: (reportId: number, practiceId: number) =>
    ['digests', reportId, 'preview', practiceId] as const,
  schedule: (reportId: number) => ['digests', reportId, 'schedule'] as const,
};

export const digestReportsQueryOptions = () =>
  queryOptions({
    queryKey: digestKeys.reports(),
    queryFn: () => apiFetch<DigestReportRef[]>('/api/digests'),
  });

export function useDigestReports() {
  return useQuery(digestReportsQueryOptions());
}

export function useDigestPreview(reportId: number | null, practiceId: number | null) {
  return useQuery({
    queryKey: digestKeys.preview(reportId ?? 0, practiceId ?? 0),
    queryFn: () =>
      apiFetch<DigestPreview>(`/api/digests/${reportId}/practices/${practiceId}/preview`),
    enabled: reportId !== null && practiceId !== null,
  });
}

export function useDigestSchedule(reportId: number | null) {
  return useQuery({
    queryKey: digestKeys.schedule(reportId ?? 0),
    queryFn: () => apiFetch<DigestSchedule>(`/api/digests/${reportId}/schedule`),
    enabled: reportId !== null,
  });
}

export function useSendTest() {
  return useMutation({
    mutationFn: (v: { reportId: number; practiceId: number }) =>
      apiFetch<DigestTestSend>(`/api/digests/${v.reportId}/practices/${v.practiceId}/test`, {
        method: 'POST',
      }),
  });
}

export function useSendAll() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (reportId: number) =>
      apiFetch<DigestSendResult>(`/api/digests/${reportId}/send`, { method: 'POST' }),
    onSuccess: async () => {
      await client.invalidateQueries({ queryKey: ['mail'] });
    },
  });
}

export type ScheduleChange =
  { reportId: number; sendAt: string } | { reportId: number; cancel: true };

export function useChangeSchedule() {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (change: ScheduleChange) =>
      apiFetch<DigestSchedule>(
        `/api/digests/${change.reportId}/schedule`,
        'cancel' in change
          ? { method: 'DELETE' }
          : { method: 'PUT', ...apiJson({ sendAt: change.sendAt }) },
      ),
    onSuccess: (schedule) => client.setQueryData(digestKeys.schedule(schedule.report.id), schedule),
  });
}
