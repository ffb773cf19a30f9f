/**
 * The one owner of the submissions tables: every write to `submissions`
 * (status, lease, counts, file), `practice_quarters` (which submission is
 * current), `extract_file_chunks`, `submission_issues` and
 * `submission_rejected_rows` goes through this class, and so does every
 * status change. Services, the job runner and the processor call it; none of
 * them writes SQL of its own. Each state-changing UPDATE checks the state it
 * leaves (and, for a job, the lease) in its WHERE clause, so that two
 * processes cannot both win; callers learn from the count of changed rows.
 *
 * Practices and audit quarters belong to other modules: a record carries
 * their ids only (ask OrganisationsService and QuartersService).
 */
import { Inject, Injectable } from '@nestjs/common';
import { QueryTypes, type Transaction } from 'sequelize';
import { Sequelize } from 'sequelize-typescript';
import { type RawConnection, withRaw } from '../database/bulk-load/raw-connection.js';
import { selectRows } from '../database/raw-select.js';
import type { DateConvention, SubmissionStatus } from './dto/submission.dto.js';
import type { Issue } from './format/issue-codes.js';
import { CARE_RECORD_SELECT, type CareRecordRow } from '../database/bulk-load/care-record-row.js';
import type { RejectedRow } from './pipeline/process-extract.js';
import { CANCELLABLE, RETRYABLE } from './submission-policy.js';
import { SUMS_SELECT } from './sums/sums-rows.js';
import { submissionsKey } from './current-set-key.js';

/** A row of `submissions`, with the practice-quarter's current submission. */
export interface SubmissionRecord {
  id: number;
  practice_id: number;
  quarter_id: number;
  status: SubmissionStatus;
  file_name: string;
  file_size_bytes: number;
  file_sha256: string | null;
  file_kind: string | null;
  sheet_name: string | null;
  date_convention: DateConvention | null;
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
  /** The practice-quarter's current submission (joined) */
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
  /** Every reason the file was refused, when several were found at once (the primary first) */
  refusalProblems?:
    { code: string; message: string; fix: string; detail?: Record<string, unknown> }[] | null;
}

export function summaryJson(row: Pick<SubmissionRecord, 'summary'>): SubmissionSummaryJson {
  if (!row.summary) return {};
  return typeof row.summary === 'string'
    ? (JSON.parse(row.summary) as SubmissionSummaryJson)
    : row.summary;
}

/** A row of `submission_sums`. */
export interface SumsRow {
  submission_id: number;
  measure_set_id: string;
  format_version: number;
  records: number;
  bytes: Buffer;
}

/** Which records a streamed read of sums columns covers. */
/** Records to read: one submission's, several submissions', or every current record of a quarter. */
/** A quarter's current set as its row names it (quarter_current_sets). */
export interface CurrentSetRow {
  quarterId: number;
  /** SHA-256 (hex) of the sorted ids of the current submissions */
  key: string;
  count: number;
  /** Grows with every change of the set (0: not yet made from the pointers) */
  version: number;
}

export type RecordScope =
  { submissionId: number } | { submissionIds: readonly number[] } | { quarterId: number };

/** What a check found, for the row that ends it. */
export interface CheckedFields {
  kind: string | null;
  sheetName: string | null;
  /** rows read, accepted, refused, blank; errors, warnings, flags (null where not kept) */
  counts: (number | null)[];
  summary: string;
}

export interface IssueRow {
  seq: number;
  severity: 'error' | 'warning' | 'flag';
  code: string;
  source_row: number | null;
  column_name: string | null;
  column_key: string | null;
  value_given: string | null;
  message: string;
  fix: string;
}

export interface IssueFilter {
  severity?: string;
  code?: string;
  column?: string;
  row?: number;
}

const SELECT = `
  SELECT s.*, pq.current_submission_id
    FROM submissions s
    LEFT JOIN practice_quarters pq ON pq.practice_id = s.practice_id AND pq.quarter_id = s.quarter_id`;

const ISSUE_SORTS: Record<string, string> = {
  row: 'source_row IS NULL DESC, source_row, seq',
  '-row': 'source_row DESC, seq',
  severity: "FIELD(severity, 'error', 'flag', 'warning'), source_row, seq",
  '-severity': "FIELD(severity, 'warning', 'flag', 'error'), source_row, seq",
  code: 'code, source_row, seq',
  '-code': 'code DESC, source_row, seq',
  column: 'column_name IS NULL, column_name, source_row, seq',
  '-column': 'column_name DESC, source_row, seq',
};

const ISSUE_SQL =
  'INSERT INTO submission_issues (submission_id, seq, severity, code, source_row, column_key, column_name, value_given, message, fix) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?)';
const REJECTED_SQL =
  'INSERT INTO submission_rejected_rows (submission_id, source_row, cells) VALUES (?, ?, ?)';
const CHUNK_SQL = 'INSERT INTO extract_file_chunks (submission_id, seq, data) VALUES (?, ?, ?)';

const PURGE_CHUNK = 20_000;
/** Sums rows per batch when many are stored at once (a full recompute). */
const SUMS_BATCH = 500;
const REPLACE_SUMS_SQL = `INSERT INTO submission_sums (submission_id, measure_set_id, format_version, records, bytes, computed_at)
  VALUES (?, ?, ?, ?, ?, NOW(3))
  ON DUPLICATE KEY UPDATE format_version = VALUES(format_version), records = VALUES(records),
    bytes = VALUES(bytes), computed_at = VALUES(computed_at)`;
/** One stored chunk of an uploaded file: far below MariaDB's max_allowed_packet. */
export const FILE_CHUNK_BYTES = 1 << 20;

const placeholders = (values: readonly unknown[]) => values.map(() => '?').join(', ');

@Injectable()
export class SubmissionRepository {
  constructor(@Inject(Sequelize) private readonly sequelize: Sequelize) {}

  /** Runs `work` in one transaction. */
  transaction<T>(work: (transaction: Transaction) => Promise<T>): Promise<T> {
    return this.sequelize.transaction(work);
  }

  /** Runs an UPDATE or DELETE and returns the number of rows it changed. */
  private async execute(sql: string, replacements: unknown[], transaction?: Transaction) {
    const [, affected] = (await this.sequelize.query(sql, {
      replacements,
      type: QueryTypes.UPDATE,
      transaction,
    })) as unknown as [unknown, number];
    return Number(affected ?? 0);
  }

  private select<T extends object>(
    sql: string,
    replacements: unknown[],
    transaction?: Transaction,
  ) {
    return this.sequelize.query<T>(sql, { replacements, type: QueryTypes.SELECT, transaction });
  }

  // ── reading ──

  async find(id: number, transaction?: Transaction): Promise<SubmissionRecord | null> {
    if (!Number.isSafeInteger(id)) return null;
    const [row] = await this.select<SubmissionRecord>(
      `${SELECT} WHERE s.id = ?`,
      [id],
      transaction,
    );
    return row ?? null;
  }

  /** A practice's submissions, latest first. */
  listForPractice(practiceId: number): Promise<SubmissionRecord[]> {
    return this.select<SubmissionRecord>(`${SELECT} WHERE s.practice_id = ? ORDER BY s.id DESC`, [
      practiceId,
    ]);
  }

  /** How many of these submissions are still processing. */
  async countProcessing(ids: readonly number[]): Promise<number> {
    const [row] = await this.select<{ n: number }>(
      `SELECT COUNT(*) AS n FROM submissions WHERE id IN (?) AND status = 'processing'`,
      [ids],
    );
    return Number(row?.n ?? 0);
  }

  /** One page of a validation report's issues, with the total and the counts per column. */
  async issuePage(
    submissionId: number,
    filter: IssueFilter,
    sort: string,
    limit: number,
    offset: number,
  ) {
    const where: string[] = ['submission_id = ?'];
    const params: unknown[] = [submissionId];
    const add = (clause: string, value: unknown) => {
      where.push(clause);
      params.push(value);
    };
    if (filter.severity) add('severity = ?', filter.severity);
    if (filter.code) add('code = ?', filter.code);
    if (filter.column) add('column_name = ?', filter.column);
    if (filter.row !== undefined) add('source_row = ?', filter.row);
    const order = ISSUE_SORTS[sort] ?? ISSUE_SORTS.row!;
    const [countRow] = await this.select<{ n: number }>(
      `SELECT COUNT(*) AS n FROM submission_issues WHERE ${where.join(' AND ')}`,
      params,
    );
    const items = await this.select<IssueRow>(
      `SELECT seq, severity, code, source_row, column_name, column_key, value_given, message, fix
         FROM submission_issues WHERE ${where.join(' AND ')} ORDER BY ${order} LIMIT ? OFFSET ?`,
      [...params, limit, offset],
    );
    const columns = await this.select<{ column_name: string | null; n: number }>(
      'SELECT column_name, COUNT(*) AS n FROM submission_issues WHERE submission_id = ? GROUP BY column_name ORDER BY column_name',
      [submissionId],
    );
    return { total: Number(countRow?.n ?? 0), items, columns };
  }

  /** The current submission of each practice of a quarter that has one. */
  currentOfQuarter(quarterId: number) {
    return this.select<{
      practice_id: number;
      current_id: number;
      current_rows: number | null;
      confirmed_at: Date | null;
      confirmed_by: string | null;
    }>(
      `SELECT pq.practice_id, pq.current_submission_id AS current_id, cs.rows_accepted AS current_rows,
              cs.confirmed_at, cs.confirmed_by_label AS confirmed_by
         FROM practice_quarters pq
         JOIN submissions cs ON cs.id = pq.current_submission_id
        WHERE pq.quarter_id = ?`,
      [quarterId],
    );
  }

  /** The accepted submission a practice-quarter's pointer names, if any. */
  async currentOf(practiceId: number, quarterId: number) {
    const [row] = await this.select<{
      id: number;
      practice_id: number;
      quarter_id: number;
      rows_accepted: number | null;
      confirmed_at: Date;
      confirmed_by_label: string | null;
    }>(
      `SELECT s.id, s.practice_id, s.quarter_id, s.rows_accepted, s.confirmed_at, s.confirmed_by_label
         FROM practice_quarters pq
         JOIN submissions s ON s.id = pq.current_submission_id AND s.status = 'accepted'
        WHERE pq.practice_id = ? AND pq.quarter_id = ?`,
      [practiceId, quarterId],
    );
    return row ?? null;
  }

  /** Up to `limit` of a submission's stored records after extract row `after`, in row order. */
  recordBatch(submissionId: number, after: number, limit: number): Promise<CareRecordRow[]> {
    return this.select<CareRecordRow>(
      `SELECT ${CARE_RECORD_SELECT} FROM care_records
        WHERE submission_id = ? AND source_row > ? ORDER BY source_row LIMIT ?`,
      [submissionId, after, limit],
    );
  }

  /** A submission's stored records at these extract rows, in row order. */
  recordsAt(submissionId: number, rows: readonly number[]): Promise<CareRecordRow[]> {
    return this.select<CareRecordRow>(
      `SELECT ${CARE_RECORD_SELECT} FROM care_records
        WHERE submission_id = ? AND source_row IN (?) ORDER BY source_row`,
      [submissionId, [...rows]],
    );
  }

  /** The current submission of each practice of a quarter (the pointers only). */
  async currentPointers(
    quarterId: number,
  ): Promise<{ practiceId: number; submissionId: number }[]> {
    const rows = await this.select<{ practice_id: number; current_submission_id: number }>(
      `SELECT practice_id, current_submission_id FROM practice_quarters
        WHERE quarter_id = ? AND current_submission_id IS NOT NULL`,
      [quarterId],
    );
    return rows.map((r) => ({
      practiceId: Number(r.practice_id),
      submissionId: Number(r.current_submission_id),
    }));
  }

  /** The current pointers of several quarters at once. */
  async currentPointersOf(
    quarterIds: readonly number[],
  ): Promise<{ quarterId: number; practiceId: number; submissionId: number }[]> {
    if (quarterIds.length === 0) return [];
    const rows = await this.select<{
      quarter_id: number;
      practice_id: number;
      current_submission_id: number;
    }>(
      `SELECT quarter_id, practice_id, current_submission_id FROM practice_quarters
        WHERE quarter_id IN (?) AND current_submission_id IS NOT NULL`,
      [[...quarterIds]],
    );
    return rows.map((r) => ({
      quarterId: Number(r.quarter_id),
      practiceId: Number(r.practice_id),
      submissionId: Number(r.current_submission_id),
    }));
  }

  // ── the current set of a quarter (quarter_current_sets, migration 0302) ──

  /** The current-set rows of these quarters (quarters without a row are left out). */
  /**
   * A quarter's current-set row as one JSON value (null: no row), for a read that embeds it:
   * `quarterIdSql` is SQL of the quarter's id written by the caller's code, never a request's
   * value. Read back by SubmissionsService.currentSetRowsOf.
   */
  currentSetJsonSql(quarterIdSql: string): string {
    return `(SELECT JSON_OBJECT('key', submissions_key, 'count', submission_count, 'version', version)
       FROM quarter_current_sets WHERE quarter_id = ${quarterIdSql})`;
  }

  async currentSetRows(quarterIds: readonly number[]): Promise<CurrentSetRow[]> {
    if (quarterIds.length === 0) return [];
    // Read by every results route: one SELECT on a pooled connection, no Sequelize pipeline.
    const rows = await selectRows<{
      quarter_id: number;
      submissions_key: string;
      submission_count: number;
      version: number;
    }>(
      this.sequelize,
      `SELECT quarter_id, submissions_key, submission_count, version FROM quarter_current_sets
        WHERE quarter_id IN (?)`,
      [[...quarterIds]],
    );
    return rows.map((r) => ({
      quarterId: Number(r.quarter_id),
      key: r.submissions_key,
      count: Number(r.submission_count),
      version: Number(r.version),
    }));
  }

  /**
   * Creates the current-set row of a quarter that has none (its pointers written before the
   * table existed), outside any transaction, so that later locks of it are plain row locks.
   * The row is made from the pointers as they are, under the row's lock (as a confirm does).
   */
  async ensureCurrentSet(quarterId: number): Promise<void> {
    await this.sequelize.query(
      `INSERT IGNORE INTO quarter_current_sets (quarter_id, submissions_key, submission_count, version, changed_at)
       VALUES (?, '', 0, 0, NOW(3))`,
      { replacements: [quarterId], type: QueryTypes.INSERT },
    );
    await this.transaction(async (transaction) => {
      const version = await this.lockCurrentSet(quarterId, transaction);
      if (version === 0) await this.writeCurrentSet(quarterId, transaction);
    });
  }

  /** Locks a quarter's current-set row (ensureCurrentSet made it); returns its version. */
  async lockCurrentSet(quarterId: number, transaction: Transaction): Promise<number> {
    const [row] = await this.select<{ version: number }>(
      'SELECT version FROM quarter_current_sets WHERE quarter_id = ? FOR UPDATE',
      [quarterId],
      transaction,
    );
    if (!row) throw new Error(`quarter ${quarterId} has no current-set row to lock`);
    return Number(row.version);
  }

  /**
   * Writes a quarter's current-set row from its pointers as they now are (the caller holds the
   * row's lock; the pointers are read with a shared lock, so committed switches of other
   * transactions are seen whatever this transaction read before).
   */
  async writeCurrentSet(quarterId: number, transaction: Transaction): Promise<void> {
    const pointers = await this.select<{ current_submission_id: number }>(
      `SELECT current_submission_id FROM practice_quarters
        WHERE quarter_id = ? AND current_submission_id IS NOT NULL LOCK IN SHARE MODE`,
      [quarterId],
      transaction,
    );
    const ids = pointers.map((p) => Number(p.current_submission_id));
    await this.execute(
      `UPDATE quarter_current_sets SET submissions_key = ?, submission_count = ?, version = version + 1,
         changed_at = NOW(3) WHERE quarter_id = ?`,
      [submissionsKey(ids), ids.length, quarterId],
      transaction,
    );
  }

  /** Facts of confirmed submissions that never change: records, when confirmed, issue counts. */
  confirmedFacts(ids: readonly number[]) {
    if (ids.length === 0) return Promise.resolve([]);
    return this.select<{
      id: number;
      practice_id: number;
      rows_accepted: number | null;
      confirmed_at: Date | null;
      summary: SubmissionSummaryJson | string | null;
    }>(
      `SELECT id, practice_id, rows_accepted, confirmed_at, summary FROM submissions
        WHERE id IN (?) AND confirmed_at IS NOT NULL`,
      [[...ids]],
    );
  }

  /** The stored sums of these submissions under one measure set. */
  sums(submissionIds: readonly number[], measureSetId: string): Promise<SumsRow[]> {
    if (submissionIds.length === 0) return Promise.resolve([]);
    return this.select<SumsRow>(
      `SELECT submission_id, measure_set_id, format_version, records, bytes FROM submission_sums
        WHERE measure_set_id = ? AND submission_id IN (?)`,
      [measureSetId, [...submissionIds]],
    );
  }

  /**
   * Streams the sums columns of a submission's records, or of every current record of a quarter,
   * each row an array [submission id, SUMS_SELECT's text] given to `onRow`; resolves with the
   * number of rows. One streamed SELECT on a connection of the pool, in the connector's fastest
   * form: rows as arrays, no type cast function.
   */
  async streamSumsRows(scope: RecordScope, onRow: (row: unknown[]) => void): Promise<number> {
    let sql: string;
    let values: unknown[];
    if ('submissionId' in scope) {
      sql = `SELECT r.submission_id, ${SUMS_SELECT} FROM care_records r WHERE r.submission_id = ?`;
      values = [scope.submissionId];
    } else if ('submissionIds' in scope) {
      if (scope.submissionIds.length === 0) return 0;
      sql = `SELECT r.submission_id, ${SUMS_SELECT} FROM care_records r
              WHERE r.submission_id IN (${scope.submissionIds.map(() => '?').join(', ')})`;
      values = [...scope.submissionIds];
    } else {
      sql = `SELECT r.submission_id, ${SUMS_SELECT}
               FROM practice_quarters pq
               JOIN care_records r ON r.submission_id = pq.current_submission_id
              WHERE pq.quarter_id = ?`;
      values = [scope.quarterId];
    }
    return withRaw(this.sequelize, (connection) => {
      let rows = 0;
      return new Promise<number>((resolve, reject) => {
        const stream = connection.queryStream({ sql, rowsAsArray: true, typeCast: null }, values);
        stream.on('data', (row: unknown[]) => {
          rows++;
          try {
            onRow(row);
          } catch (error) {
            stream.destroy(error as Error);
          }
        });
        stream.on('end', () => resolve(rows));
        stream.on('error', reject);
      });
    });
  }

  /** A quarter's submissions still in play or refused, latest first. */
  outstandingOfQuarter(quarterId: number) {
    return this.select<{
      practice_id: number;
      id: number;
      status: SubmissionStatus;
      uploaded_at: Date;
      refusal_code: string | null;
    }>(
      `SELECT practice_id, id, status, uploaded_at, refusal_code FROM submissions
        WHERE quarter_id = ? AND status IN ('processing', 'awaiting_confirmation', 'rejected', 'failed')
        ORDER BY id DESC`,
      [quarterId],
    );
  }

  async readFile(id: number): Promise<Buffer> {
    const rows = await this.select<{ data: Buffer }>(
      'SELECT data FROM extract_file_chunks WHERE submission_id = ? ORDER BY seq',
      [id],
    );
    // One copy: the chunks are Buffers already, and are let go as soon as they are joined.
    const total = rows.reduce((sum, r) => sum + r.data.length, 0);
    const bytes = Buffer.allocUnsafe(total);
    let offset = 0;
    for (const row of rows) offset += (row.data as Buffer).copy(bytes, offset);
    rows.length = 0;
    return bytes;
  }

  // ── receiving an upload ──

  /** A new submission, processing, held by the upload that is storing its file. */
  async createUpload(input: {
    practiceId: number;
    quarterId: number;
    fileName: string;
    dateConvention: DateConvention | null;
    uploadedBy: { id: number | null; label: string };
    leaseOwner: string;
  }): Promise<number> {
    const [insertId] = await this.sequelize.query(
      `INSERT INTO submissions (practice_id, quarter_id, status, file_name, file_size_bytes, date_convention,
         uploaded_by_user_id, uploaded_by_label, uploaded_at, lease_owner, lease_expires_at)
       VALUES (?, ?, 'processing', ?, 0, ?, ?, ?, NOW(3), ?, NOW(3) + INTERVAL 10 MINUTE)`,
      {
        replacements: [
          input.practiceId,
          input.quarterId,
          input.fileName,
          input.dateConvention,
          input.uploadedBy.id,
          input.uploadedBy.label,
          input.leaseOwner,
        ],
        type: QueryTypes.INSERT,
      },
    );
    return Number(insertId);
  }

  /**
   * Stores a piece of an uploaded file as chunks from `seq` on; returns the next seq.
   * The connector's batch sends a Buffer as it is (binary protocol); a replacement would
   * write it into the SQL text as X'hex', a string twice its size.
   */
  async appendFile(id: number, seq: number, data: Buffer): Promise<number> {
    return withRaw(this.sequelize, async (connection) => {
      for (let at = 0; at < data.length; at += FILE_CHUNK_BYTES) {
        await connection.batch(CHUNK_SQL, [[id, seq++, data.subarray(at, at + FILE_CHUNK_BYTES)]]);
      }
      return seq;
    });
  }

  /** Removes a submission that never became one (its upload failed, or the file was already sent). */
  async deleteUnfinishedUpload(id: number): Promise<void> {
    await this.sequelize.query('DELETE FROM submissions WHERE id = ?', {
      replacements: [id],
      type: QueryTypes.DELETE,
    });
  }

  /** Refuses an upload over the size limit (kept as a rejected submission, so history shows it). */
  async rejectTooLarge(
    id: number,
    refusal: { size: number; message: string; fix: string; maxBytes: number },
    transaction: Transaction,
  ): Promise<void> {
    await this.execute(
      `UPDATE submissions SET status = 'rejected', processed_at = NOW(3), file_size_bytes = ?, refusal_code = 'file_too_large',
         refusal_message = ?, refusal_fix = ?, lease_owner = NULL, lease_expires_at = NULL, records_purged_at = NOW(3),
         summary = JSON_OBJECT('refusalDetail', JSON_OBJECT('maxBytes', ?))
       WHERE id = ?`,
      [refusal.size, refusal.message, refusal.fix, refusal.maxBytes, id],
      transaction,
    );
    await this.deleteFile(id, transaction);
  }

  /**
   * Locks the practice-quarter for this transaction (creating its row first, outside it, so that
   * the lock is a plain row lock) and returns its current submission. Uploads of the same file
   * and confirms of one practice and quarter are decided one after the other this way.
   */
  async ensurePracticeQuarter(practiceId: number, quarterId: number): Promise<void> {
    await this.sequelize.query(
      'INSERT IGNORE INTO practice_quarters (practice_id, quarter_id) VALUES (?, ?)',
      { replacements: [practiceId, quarterId], type: QueryTypes.INSERT },
    );
  }

  async lockPracticeQuarter(
    practiceId: number,
    quarterId: number,
    transaction: Transaction,
  ): Promise<number | null> {
    const [pointer] = await this.select<{ current_submission_id: number | null }>(
      'SELECT current_submission_id FROM practice_quarters WHERE practice_id = ? AND quarter_id = ? FOR UPDATE',
      [practiceId, quarterId],
      transaction,
    );
    return pointer?.current_submission_id ?? null;
  }

  /** Another submission of this practice and quarter with the same file, still in play or refused. */
  async findIdentical(
    upload: { id: number; practiceId: number; quarterId: number; sha256: string },
    transaction: Transaction,
  ) {
    const [found] = await this.select<{
      id: number;
      status: SubmissionStatus;
      uploaded_at: Date;
      uploaded_by_label: string;
      refusal_message: string | null;
    }>(
      `SELECT id, status, uploaded_at, uploaded_by_label, refusal_message FROM submissions
        WHERE practice_id = ? AND quarter_id = ? AND file_sha256 = ? AND id <> ?
          AND status IN ('processing', 'awaiting_confirmation', 'accepted', 'rejected')
        ORDER BY id DESC LIMIT 1 LOCK IN SHARE MODE`,
      [upload.practiceId, upload.quarterId, upload.sha256, upload.id],
      transaction,
    );
    return found ?? null;
  }

  /** The whole file has arrived: its hash and size are recorded and the job is queued (no lease). */
  async queueStored(id: number, sha256: string, size: number, transaction: Transaction) {
    await this.execute(
      `UPDATE submissions SET file_sha256 = ?, file_size_bytes = ?, lease_owner = NULL, lease_expires_at = NULL WHERE id = ?`,
      [sha256, size, id],
      transaction,
    );
  }

  // ── jobs: claim, lease, finish ──

  /** Claims the oldest queued extract for `owner`; returns its id, or null when none waits. */
  claimNext(owner: string, leaseSeconds: number): Promise<number | null> {
    return this.transaction(async (transaction) => {
      const [row] = await this.select<{ id: number }>(
        `SELECT id FROM submissions WHERE status = 'processing' AND lease_owner IS NULL
          ORDER BY id LIMIT 1 FOR UPDATE SKIP LOCKED`,
        [],
        transaction,
      );
      if (!row) return null;
      await this.execute(
        `UPDATE submissions SET lease_owner = ?, lease_expires_at = NOW(3) + INTERVAL ? SECOND,
           attempts = attempts + 1, processing_started_at = NOW(3), rows_done = 0, rows_total = NULL
         WHERE id = ?`,
        [owner, leaseSeconds, row.id],
        transaction,
      );
      return row.id;
    });
  }

  /** Jobs whose lease ran out (their process died or stalled). */
  expiredLeases(limit: number) {
    return this.select<{ id: number; lease_owner: string; practice_id: number }>(
      `SELECT id, lease_owner, practice_id FROM submissions
        WHERE status = 'processing' AND lease_owner IS NOT NULL AND lease_expires_at < NOW(3) LIMIT ?`,
      [limit],
    );
  }

  /** Fails a job whose lease ran out, if it still has; returns whether it did. */
  async failExpired(
    id: number,
    leaseOwner: string,
    message: string,
    transaction: Transaction,
  ): Promise<boolean> {
    const changed = await this.execute(
      `UPDATE submissions SET status = 'failed', failed_at = NOW(3), failure_message = ?, lease_owner = NULL, lease_expires_at = NULL
        WHERE id = ? AND status = 'processing' AND lease_owner = ? AND lease_expires_at < NOW(3)`,
      [message, id, leaseOwner],
      transaction,
    );
    return changed > 0;
  }

  /** Ended submissions whose staged rows are still to be removed. */
  async unpurged(limit: number): Promise<number[]> {
    const rows = await this.select<{ id: number }>(
      `SELECT id FROM submissions WHERE status IN ('rejected', 'cancelled', 'failed') AND records_purged_at IS NULL LIMIT ?`,
      [limit],
    );
    return rows.map((r) => r.id);
  }

  /** Failed submissions whose file has been kept for a retry for more than a week. */
  async staleFailedFiles(limit: number): Promise<number[]> {
    const rows = await this.select<{ id: number }>(
      `SELECT id FROM submissions WHERE status = 'failed' AND file_deleted_at IS NULL AND failed_at < NOW(3) - INTERVAL 7 DAY LIMIT ?`,
      [limit],
    );
    return rows.map((r) => r.id);
  }

  /** A new attempt starts clean: nothing of an earlier one may remain. */
  async clearAttempt(id: number): Promise<void> {
    await this.clearReport(id);
    await this.sequelize.query('DELETE FROM care_records WHERE submission_id = ?', {
      replacements: [id],
      type: QueryTypes.DELETE,
    });
  }

  /** Removes a submission's issues and refused rows. */
  async clearReport(id: number, transaction?: Transaction): Promise<void> {
    for (const table of ['submission_issues', 'submission_rejected_rows']) {
      await this.sequelize.query(`DELETE FROM ${table} WHERE submission_id = ?`, {
        replacements: [id],
        type: QueryTypes.DELETE,
        transaction,
      });
    }
  }

  /**
   * Progress of a job and its lease renewed, on the processor's own connection (sent while the
   * next rows are checked). Changes nothing, and says so, once the job is no longer this owner's.
   */
  renewLease(
    connection: RawConnection,
    job: { id: number; owner: string; leaseSeconds: number },
    rowsDone: number,
    rowsTotal: number | null,
  ): Promise<{ affectedRows: number }> {
    return connection.query<{ affectedRows: number }>(
      `UPDATE submissions SET rows_done = ?, rows_total = ?, lease_expires_at = NOW(3) + INTERVAL ? SECOND
        WHERE id = ? AND status = 'processing' AND lease_owner = ?`,
      [rowsDone, rowsTotal, job.leaseSeconds, job.id, job.owner],
    );
  }

  /** Adds issues to a validation report, numbered from `firstSeq`. */
  async writeIssues(connection: RawConnection, id: number, firstSeq: number, issues: Issue[]) {
    await connection.batch(
      ISSUE_SQL,
      issues.map((i, n) => [
        id,
        firstSeq + n,
        i.severity,
        i.code,
        i.row,
        i.key,
        i.column,
        i.value,
        i.message,
        i.fix,
      ]),
    );
  }

  async writeRejectedRows(connection: RawConnection, id: number, rows: RejectedRow[]) {
    await connection.batch(
      REJECTED_SQL,
      rows.map((r) => [id, r.row, JSON.stringify(r.cells)]),
    );
  }

  /** The job is checked: awaiting confirmation. Returns false when it was no longer this owner's. */
  async finishValidated(
    id: number,
    leaseOwner: string,
    fields: CheckedFields & { rowsRead: number },
    transaction: Transaction,
  ): Promise<boolean> {
    const changed = await this.execute(
      `UPDATE submissions SET status = 'awaiting_confirmation', processed_at = NOW(3),
         file_kind = ?, sheet_name = ?, rows_read = ?, rows_accepted = ?, rows_rejected = ?, rows_blank = ?,
         error_count = ?, warning_count = ?, flag_count = ?, rows_done = ?, rows_total = ?, summary = ?,
         lease_owner = NULL, lease_expires_at = NULL
       WHERE id = ? AND status = 'processing' AND lease_owner = ?`,
      [
        fields.kind,
        fields.sheetName,
        ...fields.counts,
        fields.rowsRead,
        fields.rowsRead,
        fields.summary,
        id,
        leaseOwner,
      ],
      transaction,
    );
    if (changed === 0) return false;
    await this.deleteFile(id, transaction);
    return true;
  }

  /** The job's file is refused as a whole. Returns false when it was no longer this owner's. */
  async finishRejected(
    id: number,
    leaseOwner: string,
    fields: CheckedFields & { refusal: { code: string; message: string; fix: string } },
    keepReport: boolean,
    transaction: Transaction,
  ): Promise<boolean> {
    const changed = await this.execute(
      `UPDATE submissions SET status = 'rejected', processed_at = NOW(3), file_kind = ?, sheet_name = ?,
         rows_read = ?, rows_accepted = ?, rows_rejected = ?, rows_blank = ?, error_count = ?, warning_count = ?, flag_count = ?,
         refusal_code = ?, refusal_message = ?, refusal_fix = ?, summary = ?, lease_owner = NULL, lease_expires_at = NULL
       WHERE id = ? AND status = 'processing' AND lease_owner = ?`,
      [
        fields.kind,
        fields.sheetName,
        ...fields.counts,
        fields.refusal.code,
        fields.refusal.message,
        fields.refusal.fix,
        fields.summary,
        id,
        leaseOwner,
      ],
      transaction,
    );
    if (changed === 0) return false;
    if (!keepReport) await this.clearReport(id, transaction);
    await this.deleteFile(id, transaction);
    return true;
  }

  /** Hands a job back to the queue (its process is stopping). */
  async requeue(id: number, leaseOwner: string): Promise<void> {
    await this.clearReport(id);
    await this.execute(
      `UPDATE submissions SET lease_owner = NULL, lease_expires_at = NULL, rows_done = 0, attempts = GREATEST(attempts - 1, 0)
        WHERE id = ? AND status = 'processing' AND lease_owner = ?`,
      [id, leaseOwner],
    );
  }

  /** The job failed on an unexpected error (its file is kept for a retry). */
  async markFailed(
    id: number,
    leaseOwner: string,
    message: string,
    transaction: Transaction,
  ): Promise<boolean> {
    const changed = await this.execute(
      `UPDATE submissions SET status = 'failed', failed_at = NOW(3), failure_message = ?, lease_owner = NULL, lease_expires_at = NULL
        WHERE id = ? AND status = 'processing' AND lease_owner = ?`,
      [message, id, leaseOwner],
      transaction,
    );
    return changed > 0;
  }

  // ── sums ──

  /** Stores a submission's sums in the transaction that confirms it (kept if already there). */
  async insertSums(
    row: Omit<SumsRow, 'measure_set_id'> & { measure_set_id: string },
    transaction: Transaction,
  ): Promise<void> {
    await this.sequelize.query(
      `INSERT IGNORE INTO submission_sums (submission_id, measure_set_id, format_version, records, bytes, computed_at)
       VALUES (?, ?, ?, ?, ?, NOW(3))`,
      {
        replacements: [
          row.submission_id,
          row.measure_set_id,
          row.format_version,
          row.records,
          row.bytes,
        ],
        type: QueryTypes.INSERT,
        transaction,
      },
    );
  }

  /**
   * Stores sums computed again from records (missing, of another format, or a full recompute),
   * replacing what a submission had under that measure set. A batch of rows, one statement.
   */
  async replaceSums(rows: readonly SumsRow[]): Promise<void> {
    if (rows.length === 0) return;
    // The connector's batch sends the bytes as they are (binary protocol).
    await withRaw(this.sequelize, async (connection) => {
      for (let from = 0; from < rows.length; from += SUMS_BATCH) {
        await connection.batch(
          REPLACE_SUMS_SQL,
          rows
            .slice(from, from + SUMS_BATCH)
            .map((r) => [r.submission_id, r.measure_set_id, r.format_version, r.records, r.bytes]),
        );
      }
    });
  }

  // ── decisions: confirm, cancel, retry ──

  /** The submission's status, its row locked for the transaction. */
  async lockStatus(id: number, transaction: Transaction): Promise<SubmissionStatus | null> {
    const [row] = await this.select<{ status: SubmissionStatus }>(
      'SELECT status FROM submissions WHERE id = ? FOR UPDATE',
      [id],
      transaction,
    );
    return row?.status ?? null;
  }

  /**
   * Makes `id` the current submission of its practice and quarter: the previous one (if any)
   * is superseded, this one accepted, the pointer switched. The caller holds the
   * practice-quarter's lock (lockPracticeQuarter) and has checked the state.
   */
  async switchCurrent(
    submission: { id: number; practiceId: number; quarterId: number },
    previous: number | null,
    confirmedBy: { id: number | null; label: string },
    transaction: Transaction,
  ): Promise<void> {
    if (previous !== null) {
      await this.execute(
        `UPDATE submissions SET status = 'superseded', superseded_at = NOW(3), superseded_by_submission_id = ? WHERE id = ?`,
        [submission.id, previous],
        transaction,
      );
    }
    await this.execute(
      `UPDATE submissions SET status = 'accepted', confirmed_at = NOW(3), confirmed_by_user_id = ?, confirmed_by_label = ? WHERE id = ?`,
      [confirmedBy.id, confirmedBy.label, submission.id],
      transaction,
    );
    await this.execute(
      'UPDATE practice_quarters SET current_submission_id = ?, switched_at = NOW(3) WHERE practice_id = ? AND quarter_id = ?',
      [submission.id, submission.practiceId, submission.quarterId],
      transaction,
    );
  }

  /** Cancels a submission still in a cancellable state (its file goes); returns whether it did. */
  async cancel(id: number, cancelledBy: string, transaction: Transaction): Promise<boolean> {
    const changed = await this.execute(
      `UPDATE submissions SET status = 'cancelled', cancelled_at = NOW(3), cancelled_by_label = ?, lease_owner = NULL, lease_expires_at = NULL
        WHERE id = ? AND status IN (${placeholders(CANCELLABLE)})`,
      [cancelledBy, id, ...CANCELLABLE],
      transaction,
    );
    if (changed === 0) return false;
    await this.deleteFile(id, transaction);
    return true;
  }

  /** Queues a failed submission whose file is kept again; returns whether it did. */
  async retry(id: number, transaction: Transaction): Promise<boolean> {
    const changed = await this.execute(
      `UPDATE submissions SET status = 'processing', failed_at = NULL, failure_message = NULL, lease_owner = NULL,
         lease_expires_at = NULL, rows_done = 0, rows_total = NULL, records_purged_at = NULL
       WHERE id = ? AND status IN (${placeholders(RETRYABLE)}) AND file_deleted_at IS NULL AND file_sha256 IS NOT NULL`,
      [id, ...RETRYABLE],
      transaction,
    );
    return changed > 0;
  }

  // ── clean-up ──

  /**
   * Removes what a submission that will never be current leaves behind: its
   * staged records (in chunks, each under the submission's row lock so a retry
   * cannot interleave), and for cancelled and failed ones also issues and
   * refused rows. Returns false if the submission was not in a purgeable state.
   */
  async purge(id: number): Promise<boolean> {
    for (;;) {
      const more = await this.transaction(async (transaction) => {
        const status = await this.lockStatus(id, transaction);
        if (!status || !['rejected', 'cancelled', 'failed'].includes(status)) return null;
        const deleted = await this.execute(
          `DELETE FROM care_records WHERE submission_id = ? LIMIT ${PURGE_CHUNK}`,
          [id],
          transaction,
        );
        if (deleted >= PURGE_CHUNK) return true;
        if (status !== 'rejected') await this.clearReport(id, transaction);
        await this.execute(
          'UPDATE submissions SET records_purged_at = NOW(3) WHERE id = ?',
          [id],
          transaction,
        );
        return false;
      });
      if (more === null) return false;
      if (!more) return true;
    }
  }

  /** Deletes the uploaded file's bytes (kept only while the extract is processed). */
  async deleteFile(id: number, transaction?: Transaction): Promise<void> {
    await this.sequelize.query('DELETE FROM extract_file_chunks WHERE submission_id = ?', {
      replacements: [id],
      type: QueryTypes.DELETE,
      transaction,
    });
    await this.execute(
      'UPDATE submissions SET file_deleted_at = COALESCE(file_deleted_at, NOW(3)) WHERE id = ?',
      [id],
      transaction,
    );
  }
}
