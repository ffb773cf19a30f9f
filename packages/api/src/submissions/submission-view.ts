/** The API's view of a submission: what the report, history and coverage screens show. */
import { formatQuarter } from '@cairn/metrics';
import type { AuthUser } from '../auth/index.js';
import { ISSUE_CODES, type IssueCodeKey } from './format/issue-codes.js';
import { type SubmissionRow, type SubmissionStatus, summaryJson } from './submission-store.js';

export const STATUS_LABELS: Record<SubmissionStatus, string> = {
  processing: 'Processing',
  rejected: 'Rejected',
  awaiting_confirmation: 'Awaiting confirmation',
  accepted: 'Accepted',
  superseded: 'Superseded',
  cancelled: 'Cancelled',
  failed: 'Failed',
};

const iso = (d: Date | string | null) => (d ? new Date(d).toISOString() : null);

/** Practice leads of the practice see record references; everyone else sees pseudonyms (methods.md §9). */
export function seesRecordRefs(user: AuthUser, practiceId: number): boolean {
  return user.role === 'practice_lead' && user.practiceIds.includes(practiceId);
}

export function canWrite(user: AuthUser, practiceId: number): boolean {
  if (user.role === 'regional_lead') return true;
  return user.role === 'practice_lead' && user.practiceIds.includes(practiceId);
}

export interface SubmissionView {
  id: number;
  status: SubmissionStatus;
  statusLabel: string;
  /** While processing: waiting for a reader, or being read */
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
    status: string;
  };
  file: {
    name: string;
    sizeBytes: number;
    sha256: string | null;
    kind: string | null;
    sheetName: string | null;
    dateConvention: string | null;
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
  counts: {
    rowsRead: number;
    rowsAccepted: number;
    rowsRejected: number;
    rowsBlank: number;
    errors: number;
    warnings: number;
    flags: number;
  } | null;
  issuesByCode: { code: string; severity: string; title: string; count: number }[];
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
  actions: { confirm: boolean; cancel: boolean; retry: boolean };
}

export function toView(row: SubmissionRow, user: AuthUser): SubmissionView {
  const summary = summaryJson(row);
  const write =
    canWrite(user, row.practice_id) &&
    (row.quarter_status === 'open' || user.role === 'regional_lead');
  const counts =
    row.rows_read === null || row.rows_accepted === null || row.error_count === null
      ? null
      : {
          rowsRead: row.rows_read,
          rowsAccepted: row.rows_accepted,
          rowsRejected: row.rows_rejected ?? 0,
          rowsBlank: row.rows_blank ?? 0,
          errors: row.error_count ?? 0,
          warnings: row.warning_count ?? 0,
          flags: row.flag_count ?? 0,
        };
  const issuesByCode = Object.entries(summary.issueCounts ?? {})
    .map(([code, count]) => {
      const def = ISSUE_CODES[code as IssueCodeKey];
      return { code, severity: def?.severity ?? 'warning', title: def?.title ?? code, count };
    })
    .sort((a, b) => severityRank(a.severity) - severityRank(b.severity) || b.count - a.count);
  const fileKept = row.file_deleted_at === null && row.file_sha256 !== null;
  return {
    id: row.id,
    status: row.status,
    statusLabel: STATUS_LABELS[row.status],
    phase:
      row.status !== 'processing'
        ? null
        : row.lease_owner === null
          ? 'queued'
          : row.lease_owner.startsWith('upload:')
            ? 'uploading'
            : 'reading',
    isCurrent: row.current_submission_id === row.id,
    practice: { id: row.practice_id, code: row.practice_code, name: row.practice_name },
    quarter: {
      id: row.quarter_id,
      year: row.year,
      quarter: row.quarter,
      label: formatQuarter({ year: row.year, quarter: row.quarter as 1 | 2 | 3 | 4 }),
      windowStart: row.window_start,
      windowEnd: row.window_end,
      status: row.quarter_status,
    },
    file: {
      name: row.file_name,
      sizeBytes: Number(row.file_size_bytes),
      sha256: row.file_sha256,
      kind: row.file_kind,
      sheetName: row.sheet_name,
      dateConvention: row.date_convention,
      delimiter: summary.delimiter ?? null,
      encoding: summary.encoding ?? null,
      kept: fileKept && (row.status === 'processing' || row.status === 'failed'),
    },
    uploadedBy: row.uploaded_by_label,
    uploadedAt: iso(row.uploaded_at)!,
    processingStartedAt: iso(row.processing_started_at),
    processedAt: iso(row.processed_at),
    confirmedAt: iso(row.confirmed_at),
    confirmedBy: row.confirmed_by_label,
    cancelledAt: iso(row.cancelled_at),
    cancelledBy: row.cancelled_by_label,
    supersededAt: iso(row.superseded_at),
    supersededBySubmissionId: row.superseded_by_submission_id,
    failedAt: iso(row.failed_at),
    progress: { rowsDone: row.rows_done, rowsTotal: row.rows_total },
    counts,
    issuesByCode,
    refusal: row.refusal_code
      ? {
          code: row.refusal_code,
          title: ISSUE_CODES[row.refusal_code as IssueCodeKey]?.title ?? row.refusal_code,
          message: row.refusal_message ?? '',
          fix: row.refusal_fix ?? '',
          detail: summary.refusalDetail ?? null,
        }
      : null,
    failure:
      row.status === 'failed'
        ? { message: row.failure_message ?? '', attempts: row.attempts, canRetry: fileKept }
        : null,
    headerRow: summary.headerRow ?? null,
    columnsFound: summary.columnsFound ?? [],
    columnsIgnored: summary.columnsIgnored ?? [],
    actions: {
      confirm: write && row.status === 'awaiting_confirmation',
      cancel: write && ['processing', 'awaiting_confirmation', 'failed'].includes(row.status),
      retry: write && row.status === 'failed' && fileKept,
    },
  };
}

function severityRank(severity: string): number {
  return severity === 'error' ? 0 : severity === 'flag' ? 1 : 2;
}
