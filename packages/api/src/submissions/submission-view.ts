/**
 * The one view of a submission (SubmissionDto), built from its record, its
 * practice (organisations) and its audit quarter (quarters), for the person
 * asking: its allowed actions come from submission-policy.ts.
 */
import { Inject, Injectable } from '@nestjs/common';
import type { PracticeInfo } from '../organisations/organisations.service.js';
import { OrganisationsService } from '../organisations/organisations.service.js';
import type { QuarterDto } from '../quarters/dto/quarter.dto.js';
import { QuartersService } from '../quarters/quarters.service.js';
import { PeopleNames } from '../users/people-names.js';
import type {
  SubmissionDto,
  SubmissionRefusalDto,
  SubmissionStatus,
} from './dto/submission.dto.js';
import { ISSUE_CODES, type IssueCodeKey } from './format/issue-codes.js';
import { type PolicyActor, submissionActions } from './submission-policy.js';
import {
  type SubmissionRecord,
  SubmissionRepository,
  type SubmissionSummaryJson,
  summaryJson,
} from './submission.repository.js';

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

/** A submission with what it belongs to. */
export interface LoadedSubmission {
  record: SubmissionRecord;
  practice: PracticeInfo;
  quarter: QuarterDto;
  /** People's names by the e-mail address recorded for who acted (PeopleNames.byEmail) */
  names?: ReadonlyMap<string, string>;
}

/** The addresses recorded for who uploaded, confirmed and cancelled a submission. */
export const actorLabels = (record: SubmissionRecord): (string | null)[] => [
  record.uploaded_by_label,
  record.confirmed_by_label,
  record.cancelled_by_label,
];

/** Its file is still kept (a failed check can be retried). */
export const fileKept = (record: SubmissionRecord) =>
  record.file_deleted_at === null && record.file_sha256 !== null;

export function toView(
  { record: row, practice, quarter, names }: LoadedSubmission,
  actor: PolicyActor,
): SubmissionDto {
  const summary = summaryJson(row);
  // A person by name; what Cairn did ("demo seeding"), or an address no longer known, as recorded.
  const who = (label: string | null) => (label === null ? null : (names?.get(label) ?? label));
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
  const kept = fileKept(row);
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
    practice: { id: practice.id, code: practice.code, name: practice.name },
    quarter,
    file: {
      name: row.file_name,
      sizeBytes: Number(row.file_size_bytes),
      sha256: row.file_sha256,
      kind: row.file_kind,
      sheetName: row.sheet_name,
      dateConvention: row.date_convention,
      delimiter: summary.delimiter ?? null,
      encoding: summary.encoding ?? null,
      kept: kept && (row.status === 'processing' || row.status === 'failed'),
    },
    uploadedBy: who(row.uploaded_by_label)!,
    uploadedAt: iso(row.uploaded_at)!,
    processingStartedAt: iso(row.processing_started_at),
    processedAt: iso(row.processed_at),
    confirmedAt: iso(row.confirmed_at),
    confirmedBy: who(row.confirmed_by_label),
    cancelledAt: iso(row.cancelled_at),
    cancelledBy: who(row.cancelled_by_label),
    supersededAt: iso(row.superseded_at),
    supersededBySubmissionId: row.superseded_by_submission_id,
    failedAt: iso(row.failed_at),
    progress: { rowsDone: row.rows_done, rowsTotal: row.rows_total },
    counts,
    issuesByCode,
    refusal: row.refusal_code ? refusalView(row, summary) : null,
    failure:
      row.status === 'failed'
        ? { message: row.failure_message ?? '', attempts: row.attempts, canRetry: kept }
        : null,
    headerRow: summary.headerRow ?? null,
    columnsFound: summary.columnsFound ?? [],
    columnsIgnored: summary.columnsIgnored ?? [],
    actions: submissionActions(actor, {
      practiceId: practice.id,
      practiceRegionId: practice.regionId,
      quarterStatus: quarter.status,
      status: row.status,
      fileKept: kept,
    }),
  };
}

/** A refusal in words: its primary reason, and every reason found (one, or the heading row's several). */
function refusalView(row: SubmissionRecord, summary: SubmissionSummaryJson): SubmissionRefusalDto {
  const code = row.refusal_code!;
  const primary = {
    code,
    title: issueTitle(code),
    message: row.refusal_message ?? '',
    fix: row.refusal_fix ?? '',
    detail: summary.refusalDetail ?? null,
  };
  const stored = summary.refusalProblems ?? [];
  return {
    ...primary,
    problems:
      stored.length > 0
        ? stored.map((p) => ({
            code: p.code,
            title: issueTitle(p.code),
            message: p.message,
            fix: p.fix,
            detail: p.detail ?? null,
          }))
        : [primary],
  };
}

/** The words for an issue or refusal code (the code itself for one Cairn no longer has). */
export const issueTitle = (code: string): string =>
  ISSUE_CODES[code as IssueCodeKey]?.title ?? code;

function severityRank(severity: string): number {
  return severity === 'error' ? 0 : severity === 'flag' ? 1 : 2;
}

/** Loads submissions with their practice and quarter (from their owners). */
@Injectable()
export class SubmissionLoader {
  constructor(
    @Inject(SubmissionRepository) private readonly submissions: SubmissionRepository,
    @Inject(OrganisationsService) private readonly organisations: OrganisationsService,
    @Inject(QuartersService) private readonly quarters: QuartersService,
    @Inject(PeopleNames) private readonly people: PeopleNames,
  ) {}

  async load(id: number): Promise<LoadedSubmission | null> {
    const record = await this.submissions.find(id);
    return record ? this.complete(record) : null;
  }

  async complete(record: SubmissionRecord): Promise<LoadedSubmission> {
    const [practice, quarter] = await Promise.all([
      this.organisations.practice(record.practice_id),
      this.quarters.find(record.quarter_id),
    ]);
    if (!practice || !quarter)
      throw new Error(`submission ${record.id} names a practice or quarter that does not exist`);
    return { record, practice, quarter, names: await this.names(practice.regionId, [record]) };
  }

  /** The names of the people who uploaded, confirmed or cancelled these submissions. */
  names(regionId: number, records: readonly SubmissionRecord[]): Promise<Map<string, string>> {
    return this.people.byEmail(regionId, records.flatMap(actorLabels));
  }
}
