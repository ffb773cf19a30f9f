/**
 * Outlier review: the outlier list and drill-down of an audit quarter, and
 * review cases (list, one case, open, ask / close / reopen, comments, the
 * practice's answer with attachments).
 */
import { queryOptions, useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { apiFetch, apiJson } from '../../../lib/api-client';
import type {
  CaseComment,
  CaseTransition,
  DrillDown,
  DrillRecordPage,
  OpenCase,
  OutlierList,
  ReviewCase,
  ReviewCaseList,
} from '../../../lib/api/types';

export interface OutlierFilters {
  level: 'outer' | 'inner';
  caseMix: boolean;
  measure: string;
  locality: string;
}

export const reviewKeys = {
  all: ['review'] as const,
  outliers: (quarterId: number, f: OutlierFilters) => ['review', 'outliers', quarterId, f] as const,
  drill: (quarterId: number, practiceId: number, measure: string, split: string) =>
    ['review', 'drill', quarterId, practiceId, measure, split] as const,
  records: (quarterId: number, practiceId: number, measure: string, page: number) =>
    ['review', 'records', quarterId, practiceId, measure, page] as const,
  cases: () => ['review', 'cases'] as const,
  case: (id: number) => ['review', 'cases', id] as const,
};

export const outliersQueryOptions = (quarterId: number, f: OutlierFilters) =>
  queryOptions({
    queryKey: reviewKeys.outliers(quarterId, f),
    queryFn: () => {
      const q = new URLSearchParams({ level: f.level, caseMix: String(f.caseMix) });
      if (f.measure) q.set('measure', f.measure);
      if (f.locality) q.set('locality', f.locality);
      return apiFetch<OutlierList>(`/api/quarters/${quarterId}/outliers?${q.toString()}`);
    },
  });

export const drillQueryOptions = (
  quarterId: number,
  practiceId: number,
  measure: string,
  split: string,
) =>
  queryOptions({
    queryKey: reviewKeys.drill(quarterId, practiceId, measure, split),
    queryFn: () =>
      apiFetch<DrillDown>(
        `/api/quarters/${quarterId}/outliers/practices/${practiceId}/measures/${encodeURIComponent(measure)}?split=${split}`,
      ),
  });

/** Where the drill-down of a practice × measure and its downloads live. */
export const drillPath = (quarterId: number, practiceId: number, measure: string) =>
  `/api/quarters/${quarterId}/outliers/practices/${practiceId}/measures/${encodeURIComponent(measure)}`;

export const RECORDS_PAGE_SIZE = 25;

export const recordsQueryOptions = (
  quarterId: number,
  practiceId: number,
  measure: string,
  page: number,
) =>
  queryOptions({
    queryKey: reviewKeys.records(quarterId, practiceId, measure, page),
    queryFn: () =>
      apiFetch<DrillRecordPage>(
        `${drillPath(quarterId, practiceId, measure)}/records?page=${page}&pageSize=${RECORDS_PAGE_SIZE}`,
      ),
  });

export const casesQueryOptions = () =>
  queryOptions({
    queryKey: reviewKeys.cases(),
    queryFn: () => apiFetch<ReviewCaseList>('/api/review-cases'),
  });

export const caseQueryOptions = (id: number) =>
  queryOptions({
    queryKey: reviewKeys.case(id),
    queryFn: () => apiFetch<ReviewCase>(`/api/review-cases/${id}`),
  });

export const useCases = () => useQuery(casesQueryOptions());
export const useCase = (id: number) => useQuery(caseQueryOptions(id));

function useCaseMutation<T>(fn: (input: T) => Promise<ReviewCase>) {
  const client = useQueryClient();
  return useMutation({
    mutationFn: fn,
    onSuccess: async (c) => {
      client.setQueryData(reviewKeys.case(c.id), c);
      await client.invalidateQueries({ queryKey: reviewKeys.all });
    },
    onError: async () => {
      // A 409 carries the case as it is: read it again so the page shows it.
      await client.invalidateQueries({ queryKey: reviewKeys.all });
    },
  });
}

export const useOpenCase = () =>
  useCaseMutation((input: OpenCase) =>
    apiFetch<ReviewCase>('/api/review-cases', { method: 'POST', ...apiJson(input) }),
  );

export const useTransition = (id: number) =>
  useCaseMutation((input: CaseTransition) =>
    apiFetch<ReviewCase>(`/api/review-cases/${id}/transitions`, {
      method: 'POST',
      ...apiJson(input),
    }),
  );

export const useComment = (id: number) =>
  useCaseMutation((input: CaseComment) =>
    apiFetch<ReviewCase>(`/api/review-cases/${id}/comments`, { method: 'POST', ...apiJson(input) }),
  );

export const useAnswer = (id: number) =>
  useCaseMutation((input: { text: string; expectedVersion: number; files: File[] }) => {
    const form = new FormData();
    form.set('text', input.text);
    form.set('expectedVersion', String(input.expectedVersion));
    for (const f of input.files) form.append('files', f, f.name);
    return apiFetch<ReviewCase>(`/api/review-cases/${id}/answers`, { method: 'POST', body: form });
  });
