/**
 * Extracts and submissions: the shapes the API sends (packages/api/src/submissions,
 * packages/api/src/quarters) and one queryOptions factory per read.
 */
import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiFetch } from '../../../lib/api-client';

// ── audit quarters ──

export type QuarterStatus = 'open' | 'closed';

export interface Quarter {
  id: number;
  year: number;
  quarter: 1 | 2 | 3 | 4;
  label: string;
  /** First and last month of the review window, YYYY-MM */
  windowStart: string;
  windowEnd: string;
  measureSetId: string;
  submissionDeadline: string;
  status: QuarterStatus;
  openedAt: string;
  closedAt: string | null;
}

// ── the extract format ──

export interface FormatColumn {
  key: string;
  group: string;
  meaning: string;
  allowed: string;
  required: string;
  columnRequired: boolean;
  valueRequired: boolean;
  units: string[];
  codes: string[] | null;
  example: string;
}

export type IssueSeverity = 'refusal' | 'error' | 'warning' | 'flag';

export interface ExtractFormat {
  limits: { maxBytes: number; maxRows: number };
  columns: FormatColumn[];
  issueCodes: { code: string; severity: IssueSeverity; title: string }[];
}

// ── submissions ──

export type SubmissionStatus =
  | 'processing'
  | 'rejected'
  | 'awaiting_confirmation'
  | 'accepted'
  | 'superseded'
  | 'cancelled'
  | 'failed';

export type DateConvention = 'day_first' | 'month_first';

export interface SubmissionCounts {
  rowsRead: number;
  rowsAccepted: number;
  rowsRejected: number;
  rowsBlank: number;
  errors: number;
  warnings: number;
  flags: number;
}

export interface IssueCount {
  code: string;
  severity: IssueSeverity;
  title: string;
  count: number;
}

export interface Submission {
  id: number;
  status: SubmissionStatus;
  statusLabel: string;
  phase: 'queued' | 'uploading' | 'reading' | null;
  isCurrent: boolean;
  practice: { id: number; code: string; name: string };
  quarter: {
    id: number;
    year: number;
    quarter: number;
    label: string;
    windowStart: string;
    windowEnd: string;
    status: QuarterStatus;
  };
  file: {
    name: string;
    sizeBytes: number;
    sha256: string | null;
    kind: string | null;
    sheetName: string | null;
    dateConvention: DateConvention | null;
    delimiter: string | null;
    encoding: string | null;
    kept: boolean;
  };
  uploadedBy: string;
  uploadedAt: string;
  processingStartedAt: string | null;
  processedAt: string | null;
  confirmedAt: string | null;
  confirmedBy: string | null;
  cancelledAt: string | null;
  cancelledBy: string | null;
  supersededAt: string | null;
  supersededBySubmissionId: number | null;
  failedAt: string | null;
  progress: { rowsDone: number; rowsTotal: number | null };
  counts: SubmissionCounts | null;
  issuesByCode: IssueCount[];
  refusal: {
    code: string;
    title: string;
    message: string;
    fix: string;
    detail: Record<string, unknown> | null;
  } | null;
  failure: { message: string; attempts: number; canRetry: boolean } | null;
  headerRow: number | null;
  columnsFound: string[];
  columnsIgnored: string[];
  /** What the signed-in person may do now (the server decides) */
  actions: { confirm: boolean; cancel: boolean; retry: boolean };
}

export interface SubmissionHistory {
  practice: { id: number; code: string; name: string };
  canUpload: boolean;
  quarters: { quarter: Quarter; currentSubmissionId: number | null; submissions: Submission[] }[];
}

// ── issues ──

export type IssueSort =
  'row' | '-row' | 'severity' | '-severity' | 'code' | '-code' | 'column' | '-column';

export interface IssueFilters {
  severity?: 'error' | 'warning' | 'flag' | '';
  code?: string;
  column?: string;
  sort?: IssueSort;
  offset?: number;
  limit?: number;
}

export interface Issue {
  seq: number;
  severity: IssueSeverity;
  code: string;
  title: string;
  row: number | null;
  column: string | null;
  columnKey: string | null;
  value: string | null;
  message: string;
  fix: string;
}

export interface IssuePage {
  total: number;
  offset: number;
  limit: number;
  /** False when record references are shown as pseudonyms (anyone outside the practice) */
  recordRefsShown: boolean;
  columns: { column: string; count: number }[];
  items: Issue[];
}

// ── coverage ──

export type CoverageState = 'current' | 'awaiting_confirmation' | 'none';

export interface CoveragePractice {
  practice: { id: number; code: string; name: string; locality: string | null };
  state: CoverageState;
  current: {
    submissionId: number;
    records: number | null;
    confirmedAt: string | null;
    confirmedBy: string | null;
  } | null;
  waiting: { submissionId: number; status: SubmissionStatus; uploadedAt: string }[];
  lastProblem: {
    submissionId: number;
    status: SubmissionStatus;
    code: string | null;
    uploadedAt: string;
  } | null;
}

export interface Coverage {
  quarter: Quarter;
  totals: {
    practices: number;
    current: number;
    /** Practices with an extract waiting for confirmation (some also have a current one) */
    awaitingConfirmation: number;
    none: number;
    records: number;
  };
  practices: CoveragePractice[];
}

// ── keys and queries ──

export const extractsKeys = {
  quarters: () => ['quarters'] as const,
  format: () => ['extracts', 'format'] as const,
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

export const quartersQueryOptions = () =>
  queryOptions({
    queryKey: extractsKeys.quarters(),
    queryFn: () => apiFetch<Quarter[]>('/api/quarters'),
    staleTime: 5 * 60_000,
  });

export function useQuarters() {
  return useQuery(quartersQueryOptions());
}

export const extractFormatQueryOptions = () =>
  queryOptions({
    queryKey: extractsKeys.format(),
    queryFn: () => apiFetch<ExtractFormat>('/api/extracts/format'),
    staleTime: 30 * 60_000,
  });

export function useExtractFormat() {
  return useQuery(extractFormatQueryOptions());
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
