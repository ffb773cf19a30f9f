/**
 * SQL for submissions: reading their state, and the clean-up every path
 * that ends a submission without making it current relies on.
 */
import { QueryTypes, type Transaction } from 'sequelize';
import type { Sequelize } from 'sequelize';

export const SUBMISSION_STATUSES = [
  'processing',
  'rejected',
  'awaiting_confirmation',
  'accepted',
  'superseded',
  'cancelled',
  'failed',
] as const;
export type SubmissionStatus = (typeof SUBMISSION_STATUSES)[number];

export interface SubmissionRow {
  id: number;
  practice_id: number;
  quarter_id: number;
  status: SubmissionStatus;
  file_name: string;
  file_size_bytes: number;
  file_sha256: string | null;
  file_kind: string | null;
  sheet_name: string | null;
  date_convention: 'day_first' | 'month_first' | null;
  uploaded_by_user_id: number | null;
  uploaded_by_label: string;
  uploaded_at: Date;
  processing_started_at: Date | null;
  processed_at: Date | null;
  confirmed_at: Date | null;
  confirmed_by_label: string | null;
  cancelled_at: Date | null;
  cancelled_by_label: string | null;
  superseded_at: Date | null;
  superseded_by_submission_id: number | null;
  failed_at: Date | null;
  failure_message: string | null;
  attempts: number;
  lease_owner: string | null;
  lease_expires_at: Date | null;
  rows_total: number | null;
  rows_done: number;
  rows_read: number | null;
  rows_accepted: number | null;
  rows_rejected: number | null;
  rows_blank: number | null;
  error_count: number | null;
  warning_count: number | null;
  flag_count: number | null;
  refusal_code: string | null;
  refusal_message: string | null;
  refusal_fix: string | null;
  summary: SubmissionSummaryJson | string | null;
  file_deleted_at: Date | null;
  records_purged_at: Date | null;
  // joined
  practice_code: string;
  practice_name: string;
  region_id: number;
  year: number;
  quarter: number;
  quarter_status: 'open' | 'closed';
  window_start: string;
  window_end: string;
  current_submission_id: number | null;
}

export interface SubmissionSummaryJson {
  issueCounts?: Record<string, number>;
  headerRow?: number | null;
  header?: string[];
  columnsFound?: string[];
  columnsIgnored?: string[];
  refColumnIndex?: number | null;
  delimiter?: string | null;
  encoding?: string | null;
  refusalDetail?: Record<string, unknown> | null;
}

export const SELECT_SUBMISSION = `
  SELECT s.*, p.code AS practice_code, p.name AS practice_name, p.region_id,
         q.year, q.quarter, q.status AS quarter_status, q.window_start, q.window_end,
         pq.current_submission_id
    FROM submissions s
    JOIN practices p ON p.id = s.practice_id
    JOIN audit_quarters q ON q.id = s.quarter_id
    LEFT JOIN practice_quarters pq ON pq.practice_id = s.practice_id AND pq.quarter_id = s.quarter_id`;

export function summaryJson(row: Pick<SubmissionRow, 'summary'>): SubmissionSummaryJson {
  if (!row.summary) return {};
  return typeof row.summary === 'string'
    ? (JSON.parse(row.summary) as SubmissionSummaryJson)
    : row.summary;
}

export async function findSubmission(
  sequelize: Sequelize,
  id: number,
  transaction?: Transaction,
): Promise<SubmissionRow | null> {
  const [row] = await sequelize.query<SubmissionRow>(`${SELECT_SUBMISSION} WHERE s.id = ?`, {
    replacements: [id],
    type: QueryTypes.SELECT,
    transaction,
  });
  return row ?? null;
}

/** Runs an UPDATE or DELETE and returns the number of rows it changed. */
export async function execute(
  sequelize: Sequelize,
  sql: string,
  replacements: unknown[],
  transaction?: Transaction,
): Promise<number> {
  const [, affected] = (await sequelize.query(sql, {
    replacements,
    type: QueryTypes.UPDATE,
    transaction,
  })) as unknown as [unknown, number];
  return Number(affected ?? 0);
}

const PURGE_CHUNK = 20_000;

/**
 * Removes what a submission that will never be current leaves behind: its
 * staged records (in chunks, each under the submission's row lock so a retry
 * cannot interleave), and for cancelled and failed ones also issues and
 * refused rows. Returns false if the submission was not in a purgeable state.
 */
export async function purgeSubmission(sequelize: Sequelize, id: number): Promise<boolean> {
  for (;;) {
    const more = await sequelize.transaction(async (transaction) => {
      const [row] = await sequelize.query<{ status: SubmissionStatus }>(
        'SELECT status FROM submissions WHERE id = ? FOR UPDATE',
        { replacements: [id], type: QueryTypes.SELECT, transaction },
      );
      if (!row || !['rejected', 'cancelled', 'failed'].includes(row.status)) return null;
      const deleted = await execute(
        sequelize,
        `DELETE FROM care_records WHERE submission_id = ? LIMIT ${PURGE_CHUNK}`,
        [id],
        transaction,
      );
      if (deleted >= PURGE_CHUNK) return true;
      if (row.status !== 'rejected') {
        await sequelize.query('DELETE FROM submission_issues WHERE submission_id = ?', {
          replacements: [id],
          type: QueryTypes.DELETE,
          transaction,
        });
        await sequelize.query('DELETE FROM submission_rejected_rows WHERE submission_id = ?', {
          replacements: [id],
          type: QueryTypes.DELETE,
          transaction,
        });
      }
      await sequelize.query('UPDATE submissions SET records_purged_at = NOW(3) WHERE id = ?', {
        replacements: [id],
        type: QueryTypes.UPDATE,
        transaction,
      });
      return false;
    });
    if (more === null) return false;
    if (!more) return true;
  }
}

/** Deletes the uploaded file's bytes (kept only while the extract is processed). */
export async function deleteFile(
  sequelize: Sequelize,
  id: number,
  transaction?: Transaction,
): Promise<void> {
  await sequelize.query('DELETE FROM extract_file_chunks WHERE submission_id = ?', {
    replacements: [id],
    type: QueryTypes.DELETE,
    transaction,
  });
  await sequelize.query(
    'UPDATE submissions SET file_deleted_at = COALESCE(file_deleted_at, NOW(3)) WHERE id = ?',
    {
      replacements: [id],
      type: QueryTypes.UPDATE,
      transaction,
    },
  );
}

export async function readFile(sequelize: Sequelize, id: number): Promise<Buffer> {
  const rows = await sequelize.query<{ data: Buffer }>(
    'SELECT data FROM extract_file_chunks WHERE submission_id = ? ORDER BY seq',
    { replacements: [id], type: QueryTypes.SELECT },
  );
  // One copy: the chunks are Buffers already, and are let go as soon as they are joined.
  const total = rows.reduce((sum, r) => sum + r.data.length, 0);
  const bytes = Buffer.allocUnsafe(total);
  let offset = 0;
  for (const row of rows) offset += (row.data as Buffer).copy(bytes, offset);
  rows.length = 0;
  return bytes;
}
