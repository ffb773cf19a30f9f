/**
 * Extracts and submissions: one queryOptions factory per read (the shapes are
 * the API's generated types, src/lib/api/types.ts).
 */
import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiFetch } from '../../../lib/api-client';
import type {
  Coverage,
  ExtractFormat,
  IssuePage,
  IssueSort,
  RowIssueSeverity,
  Submission,
  SubmissionHistory,
  UploadOptions,
} from '../../../lib/api/types';

// ── issues ──

export interface IssueFilters {
  severity?: RowIssueSeverity | '';
  code?: string;
  column?: string;
  sort?: IssueSort;
  offset?: number;
  limit?: number;
}

// ── keys and queries ──

export const extractsKeys = {
  format: () => ['extracts', 'format'] as const,
  /** Where the signed-in person may send extracts (changes with quarters and memberships) */
  uploadOptions: () => ['extracts', 'upload-options'] as const,
  /** Everything about one practice's submissions (history, each submission, its issues) */
  practice: (practiceId: number) => ['submissions', practiceId] as const,
  history: (practiceId: number) => ['submissions', practiceId, 'history'] as const,
  submission: (practiceId: number, submissionId: number) =>
    ['submissions', practiceId, submissionId] as const,
  issues: (practiceId: number, submissionId: number, filters: IssueFilters) =>
    ['submissions', practiceId, submissionId, 'issues', filters] as const,
  coverageAll: () => ['coverage'] as const,
  coverage: (quarterId: number) => ['coverage', quarterId] as const,
};

const submissionPath = (practiceId: number, submissionId: number) =>
  `/api/practices/${practiceId}/submissions/${submissionId}`;

export const downloadLinks = (practiceId: number, submissionId: number) => ({
  reportJson: `${submissionPath(practiceId, submissionId)}/report.json`,
  rejectedRowsXlsx: `${submissionPath(practiceId, submissionId)}/rejected-rows.xlsx`,
});

export const TEMPLATE_XLSX = '/api/extracts/template.xlsx';
export const TEMPLATE_CSV = '/api/extracts/template.csv';

export const extractFormatQueryOptions = () =>
  queryOptions({
    queryKey: extractsKeys.format(),
    queryFn: () => apiFetch<ExtractFormat>('/api/extracts/format'),
    staleTime: 30 * 60_000,
  });

export function useExtractFormat() {
  return useQuery(extractFormatQueryOptions());
}

export const uploadOptionsQueryOptions = () =>
  queryOptions({
    queryKey: extractsKeys.uploadOptions(),
    queryFn: () => apiFetch<UploadOptions>('/api/extracts/upload-options'),
    staleTime: 60_000,
  });

export function useUploadOptions(enabled = true) {
  return useQuery({ ...uploadOptionsQueryOptions(), enabled });
}

/** How often a submission being checked is asked for again (ms). */
export const POLL_MS = 1000;

export const submissionQueryOptions = (practiceId: number, submissionId: number) =>
  queryOptions({
    queryKey: extractsKeys.submission(practiceId, submissionId),
    queryFn: () => apiFetch<Submission>(submissionPath(practiceId, submissionId)),
    // A real progress bar: ask again while Cairn is still reading the file.
    refetchInterval: (query) => (query.state.data?.status === 'processing' ? POLL_MS : false),
    staleTime: 0,
  });

export function useSubmission(practiceId: number, submissionId: number) {
  return useQuery(submissionQueryOptions(practiceId, submissionId));
}

export const historyQueryOptions = (practiceId: number) =>
  queryOptions({
    queryKey: extractsKeys.history(practiceId),
    queryFn: () => apiFetch<SubmissionHistory>(`/api/practices/${practiceId}/submissions`),
    // Keep the list moving while one of its submissions is being checked.
    refetchInterval: (query) =>
      query.state.data?.quarters.some((q) => q.submissions.some((s) => s.status === 'processing'))
        ? 2 * POLL_MS
        : false,
  });

export function useHistory(practiceId: number | null) {
  return useQuery({ ...historyQueryOptions(practiceId ?? 0), enabled: practiceId !== null });
}

export function issuesQuery(filters: IssueFilters): string {
  const params = new URLSearchParams();
  if (filters.severity) params.set('severity', filters.severity);
  if (filters.code) params.set('code', filters.code);
  if (filters.column) params.set('column', filters.column);
  if (filters.sort && filters.sort !== 'row') params.set('sort', filters.sort);
  if (filters.offset) params.set('offset', String(filters.offset));
  if (filters.limit) params.set('limit', String(filters.limit));
  const text = params.toString();
  return text ? `?${text}` : '';
}

export const issuesQueryOptions = (
  practiceId: number,
  submissionId: number,
  filters: IssueFilters,
) =>
  queryOptions({
    queryKey: extractsKeys.issues(practiceId, submissionId, filters),
    queryFn: () =>
      apiFetch<IssuePage>(
        `${submissionPath(practiceId, submissionId)}/issues${issuesQuery(filters)}`,
      ),
    placeholderData: (previous) => previous,
  });

export function useIssues(
  practiceId: number,
  submissionId: number,
  filters: IssueFilters,
  enabled: boolean,
) {
  return useQuery({ ...issuesQueryOptions(practiceId, submissionId, filters), enabled });
}

export const coverageQueryOptions = (quarterId: number) =>
  queryOptions({
    queryKey: extractsKeys.coverage(quarterId),
    queryFn: () => apiFetch<Coverage>(`/api/quarters/${quarterId}/coverage`),
  });

export function useCoverage(quarterId: number | null) {
  return useQuery({ ...coverageQueryOptions(quarterId ?? 0), enabled: quarterId !== null });
}
