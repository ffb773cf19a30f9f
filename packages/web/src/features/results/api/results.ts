/**
 * A practice's results for an audit quarter (GET
 * /api/practices/:practiceId/quarters/:quarterId/results), their detail (…/results/detail:
 * read only while a tab that shows it is open), its recall list, and the audit quarters to
 * choose from.
 */
import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { apiFetch } from '../../../lib/api-client';
import type {
  PracticeResults,
  PracticeResultsDetail,
  RecallList,
  TypeSplit,
} from '../../../lib/api/types';

export const resultsKeys = {
  results: (practiceId: number, quarterId: number) =>
    ['results', 'practice', practiceId, quarterId] as const,
  detail: (practiceId: number, quarterId: number) =>
    ['results', 'detail', practiceId, quarterId] as const,
  recall: (
    practiceId: number,
    quarterId: number,
    measure: string,
    split: TypeSplit,
    offset: number,
  ) => ['results', 'recall', practiceId, quarterId, measure, split, offset] as const,
};

export const practiceResultsQueryOptions = (practiceId: number, quarterId: number) =>
  queryOptions({
    queryKey: resultsKeys.results(practiceId, quarterId),
    queryFn: () =>
      apiFetch<PracticeResults>(`/api/practices/${practiceId}/quarters/${quarterId}/results`),
  });

export function usePracticeResults(practiceId: number | null, quarterId: number | null) {
  return useQuery({
    ...practiceResultsQueryOptions(practiceId ?? 0, quarterId ?? 0),
    enabled: practiceId != null && quarterId != null,
  });
}

export const practiceDetailQueryOptions = (practiceId: number, quarterId: number) =>
  queryOptions({
    queryKey: resultsKeys.detail(practiceId, quarterId),
    queryFn: () =>
      apiFetch<PracticeResultsDetail>(
        `/api/practices/${practiceId}/quarters/${quarterId}/results/detail`,
      ),
  });

/**
 * The practice's detail (breakdowns, kidney grid, time to insulin, value histograms): read
 * only when `enabled`, i.e. while a tab that shows it is open.
 */
export function usePracticeDetail(practiceId: number, quarterId: number, enabled: boolean) {
  return useQuery({ ...practiceDetailQueryOptions(practiceId, quarterId), enabled });
}

export const RECALL_PAGE = 50;

export function recallPath(
  practiceId: number,
  quarterId: number,
  measure: string,
  split: TypeSplit,
  format: '' | '.csv' | '.xlsx' = '',
  offset = 0,
): string {
  const query = new URLSearchParams({ measure, split });
  if (format === '') {
    query.set('offset', String(offset));
    query.set('limit', String(RECALL_PAGE));
  }
  return `/api/practices/${practiceId}/quarters/${quarterId}/recall-list${format}?${query.toString()}`;
}

export function useRecallList(
  practiceId: number,
  quarterId: number,
  measure: string | null,
  split: TypeSplit,
  offset: number,
) {
  return useQuery({
    queryKey: resultsKeys.recall(practiceId, quarterId, measure ?? '', split, offset),
    queryFn: () =>
      apiFetch<RecallList>(recallPath(practiceId, quarterId, measure ?? '', split, '', offset)),
    enabled: measure != null,
    placeholderData: keepPreviousData,
  });
}
