/**
 * Submissions after upload: reading them (report, history, coverage) and the
 * three decisions a practice lead takes — confirm, cancel, retry.
 *
 * Confirm is one short transaction: lock the practice-quarter pointer, check
 * the submission still awaits confirmation and that the pointer is still what
 * the request read (two confirms at once: the second is refused with 409
 * current-submission-changed), mark the previous current one superseded,
 * switch the pointer, append the audit event. The records were
 * staged while the extract was read, so readers (who always go through the
 * pointer) see the old set or the new set, never a mix.
 */
import { HttpStatus, Inject, Injectable } from '@nestjs/common';
import { QueryTypes } from 'sequelize';
import { Sequelize } from 'sequelize-typescript';
import { AuditTrailService } from '../audit-trail/audit-trail.service.js';
import type { AuthUser } from '../auth/index.js';
import { ProblemException } from '../common/problem.js';
import { QuartersService } from '../quarters/quarters.service.js';
import { faultPause } from './extract-processor.js';
import { ISSUE_CODES, type IssueCodeKey } from './format/issue-codes.js';
import { JobRunner } from './job-runner.service.js';
import {
  deleteFile,
  execute,
  findSubmission,
  purgeSubmission,
  SELECT_SUBMISSION,
  type SubmissionRow,
  summaryJson,
} from './submission-store.js';
import { canWrite, seesRecordRefs, type SubmissionView, toView } from './submission-view.js';
import { pseudonymiser } from './extract-processor.js';
import { CAIRN_SECRETS } from '../config/config.module.js';
import type { CairnSecrets } from '../config/config.schema.js';
import {
  CARE_RECORD_SELECT,
  type CareRecordRow,
  type StoredRecord,
  toStoredRecord,
} from '../records/care-record-row.js';

export interface Actor {
  id: number | null;
  label: string;
  role: AuthUser['role'] | 'system';
  /** Practices a practice lead leads */
  practiceIds?: number[];
}

export interface IssueQuery {
  offset?: number;
  limit?: number;
  severity?: string;
  code?: string;
  column?: string;
  row?: number;
  sort?: string;
}

export interface IssueItem {
  seq: number;
  severity: string;
  code: string;
  title: string;
  row: number | null;
  column: string | null;
  columnKey: string | null;
  value: string | null;
  message: string;
  fix: string;
}

const SORTS: Record<string, string> = {
  row: 'source_row IS NULL DESC, source_row, seq',
  '-row': 'source_row DESC, seq',
  severity: "FIELD(severity, 'error', 'flag', 'warning'), source_row, seq",
  '-severity': "FIELD(severity, 'warning', 'flag', 'error'), source_row, seq",
  code: 'code, source_row, seq',
  '-code': 'code DESC, source_row, seq',
  column: 'column_name IS NULL, column_name, source_row, seq',
  '-column': 'column_name DESC, source_row, seq',
};

const notFound = (id: number) =>
  new ProblemException(
    HttpStatus.NOT_FOUND,
    'submission-not-found',
    'No such submission',
    `There is no submission ${id} for this practice.`,
    {
      submissionId: id,
    },
  );

const DEADLOCK = /deadlock|lock wait timeout/i;

/** The submission a practice-quarter's pointer names: what results are read from. */
export interface CurrentSubmission {
  id: number;
  practiceId: number;
  practiceCode: string;
  practiceName: string;
  quarterId: number;
  /** Records accepted (and stored) */
  records: number;
  confirmedAt: string;
  confirmedBy: string | null;
}

/** One clinical data-quality check and how many records of a submission it flagged. */
export interface DataQualityFlagCount {
  code: string;
  title: string;
  count: number;
}

/** Records read per query when a submission's records are read in batches. */
const RECORD_BATCH = 5000;

@Injectable()
export class SubmissionsService {
  private readonly pseudonym: (practiceCode: string, ref: string) => string;

  constructor(
    @Inject(Sequelize) private readonly sequelize: Sequelize,
    @Inject(AuditTrailService) private readonly audit: AuditTrailService,
    @Inject(QuartersService) private readonly quarters: QuartersService,
    @Inject(JobRunner) private readonly runner: JobRunner,
    @Inject(CAIRN_SECRETS) secrets: CairnSecrets,
  ) {
    this.pseudonym = pseudonymiser(secrets.CAIRN_PSEUDONYM_SECRET);
  }

  async row(practiceId: number, submissionId: number): Promise<SubmissionRow> {
    const row = Number.isSafeInteger(submissionId)
      ? await findSubmission(this.sequelize, submissionId)
      : null;
    if (!row || row.practice_id !== practiceId) throw notFound(submissionId);
    return row;
  }

  async get(user: AuthUser, practiceId: number, submissionId: number): Promise<SubmissionView> {
    return toView(await this.row(practiceId, submissionId), user);
  }

  /** A practice's submissions, grouped by audit quarter (latest quarter first). */
  async history(user: AuthUser, practiceId: number) {
    const [practice] = await this.sequelize.query<{
      id: number;
      code: string;
      name: string;
      region_id: number;
    }>('SELECT id, code, name, region_id FROM practices WHERE id = ?', {
      replacements: [practiceId],
      type: QueryTypes.SELECT,
    });
    const quarters = await this.quarters.list(practice!.region_id);
    const rows = await this.sequelize.query<SubmissionRow>(
      `${SELECT_SUBMISSION} WHERE s.practice_id = ? ORDER BY s.id DESC`,
      {
        replacements: [practiceId],
        type: QueryTypes.SELECT,
      },
    );
    const views = rows.map((r) => toView(r, user));
    return {
      practice: { id: practice!.id, code: practice!.code, name: practice!.name },
      canUpload: canWrite(user, practiceId),
      quarters: quarters.map((q) => {
        const submissions = views.filter((v) => v.quarter.id === q.id);
        return {
          quarter: q,
          currentSubmissionId: submissions.find((s) => s.isCurrent)?.id ?? null,
          submissions,
        };
      }),
    };
  }

  async issues(user: AuthUser, practiceId: number, submissionId: number, query: IssueQuery) {
    const row = await this.row(practiceId, submissionId);
    const where: string[] = ['submission_id = ?'];
    const params: unknown[] = [submissionId];
    if (query.severity) {
      where.push('severity = ?');
      params.push(query.severity);
    }
    if (query.code) {
      where.push('code = ?');
      params.push(query.code);
    }
    if (query.column) {
      where.push('column_name = ?');
      params.push(query.column);
    }
    if (query.row !== undefined) {
      where.push('source_row = ?');
      params.push(query.row);
    }
    const order = SORTS[query.sort ?? 'row'] ?? SORTS.row!;
    const limit = Math.min(Math.max(query.limit ?? 200, 1), 2000);
    const offset = Math.max(query.offset ?? 0, 0);
    const [countRow] = await this.sequelize.query<{ n: number }>(
      `SELECT COUNT(*) AS n FROM submission_issues WHERE ${where.join(' AND ')}`,
      { replacements: params, type: QueryTypes.SELECT },
    );
    const items = await this.sequelize.query<{
      seq: number;
      severity: string;
      code: string;
      source_row: number | null;
      column_name: string | null;
      column_key: string | null;
      value_given: string | null;
      message: string;
      fix: string;
    }>(
      `SELECT seq, severity, code, source_row, column_name, column_key, value_given, message, fix
         FROM submission_issues WHERE ${where.join(' AND ')} ORDER BY ${order} LIMIT ? OFFSET ?`,
      { replacements: [...params, limit, offset], type: QueryTypes.SELECT },
    );
    const refs = seesRecordRefs(user, practiceId);
    const columns = await this.sequelize.query<{ column_name: string | null; n: number }>(
      'SELECT column_name, COUNT(*) AS n FROM submission_issues WHERE submission_id = ? GROUP BY column_name ORDER BY column_name',
      { replacements: [submissionId], type: QueryTypes.SELECT },
    );
    return {
      total: Number(countRow?.n ?? 0),
      offset,
      limit,
      recordRefsShown: refs,
      columns: columns
        .filter((c) => c.column_name !== null)
        .map((c) => ({ column: c.column_name!, count: Number(c.n) })),
      items: items.map((i): IssueItem => ({
        seq: i.seq,
        severity: i.severity,
        code: i.code,
        title: ISSUE_CODES[i.code as IssueCodeKey]?.title ?? i.code,
        row: i.source_row,
        column: i.column_name,
        columnKey: i.column_key,
        value:
          !refs && i.column_key === 'record_ref' && i.value_given
            ? this.pseudonym(row.practice_code, i.value_given)
            : i.value_given,
        message: i.message,
        fix: i.fix,
      })),
    };
  }

  /**
   * The current (accepted) submission of a practice for a quarter, or null when
   * it has none: readers go through the practice-quarter pointer, never by status.
   */
  async current(practiceId: number, quarterId: number): Promise<CurrentSubmission | null> {
    const [row] = await this.sequelize.query<{
      id: number;
      practice_id: number;
      practice_code: string;
      practice_name: string;
      quarter_id: number;
      rows_accepted: number | null;
      confirmed_at: Date;
      confirmed_by_label: string | null;
    }>(
      `SELECT s.id, s.practice_id, p.code AS practice_code, p.name AS practice_name, s.quarter_id,
              s.rows_accepted, s.confirmed_at, s.confirmed_by_label
         FROM practice_quarters pq
         JOIN submissions s ON s.id = pq.current_submission_id AND s.status = 'accepted'
         JOIN practices p ON p.id = s.practice_id
        WHERE pq.practice_id = ? AND pq.quarter_id = ?`,
      { replacements: [practiceId, quarterId], type: QueryTypes.SELECT },
    );
    if (!row) return null;
    return {
      id: row.id,
      practiceId: row.practice_id,
      practiceCode: row.practice_code,
      practiceName: row.practice_name,
      quarterId: row.quarter_id,
      records: Number(row.rows_accepted ?? 0),
      confirmedAt: new Date(row.confirmed_at).toISOString(),
      confirmedBy: row.confirmed_by_label,
    };
  }

  /**
   * A submission's stored records in extract order, in batches of up to
   * `batchSize` (a practice may have 200,000: never all in memory at once).
   */
  async *records(
    submission: Pick<CurrentSubmission, 'id' | 'practiceCode'>,
    batchSize = RECORD_BATCH,
  ): AsyncGenerator<StoredRecord[]> {
    let after = 0;
    for (;;) {
      const rows = await this.sequelize.query<CareRecordRow>(
        `SELECT ${CARE_RECORD_SELECT} FROM care_records
          WHERE submission_id = ? AND source_row > ? ORDER BY source_row LIMIT ?`,
        { replacements: [submission.id, after, batchSize], type: QueryTypes.SELECT },
      );
      if (rows.length === 0) return;
      yield rows.map((r) => toStoredRecord(r, submission.practiceCode));
      after = Number(rows[rows.length - 1]!.source_row);
      if (rows.length < batchSize) return;
    }
  }

  /** Some of a submission's stored records, by extract row, in row order. */
  async recordsAt(
    submission: Pick<CurrentSubmission, 'id' | 'practiceCode'>,
    rows: readonly number[],
  ): Promise<StoredRecord[]> {
    if (rows.length === 0) return [];
    const found = await this.sequelize.query<CareRecordRow>(
      `SELECT ${CARE_RECORD_SELECT} FROM care_records
        WHERE submission_id = ? AND source_row IN (?) ORDER BY source_row`,
      { replacements: [submission.id, [...rows]], type: QueryTypes.SELECT },
    );
    return found.map((r) => toStoredRecord(r, submission.practiceCode));
  }

  /**
   * The clinical data-quality flags of a submission (methods.md §7): every
   * flag check Cairn has, with the number of records it flagged (0 included),
   * from the issue counts stored when the extract was checked.
   */
  async dataQualityFlags(submissionId: number): Promise<DataQualityFlagCount[]> {
    const row = Number.isSafeInteger(submissionId)
      ? await findSubmission(this.sequelize, submissionId)
      : null;
    if (!row) throw notFound(submissionId);
    const counts = summaryJson(row).issueCounts ?? {};
    return (Object.keys(ISSUE_CODES) as IssueCodeKey[])
      .filter((code) => ISSUE_CODES[code].severity === 'flag')
      .map((code) => ({ code, title: ISSUE_CODES[code].title, count: counts[code] ?? 0 }));
  }

  private assertWriter(user: Actor, row: SubmissionRow): void {
    if (user.role === 'system') return;
    if (
      user.role === 'auditor' ||
      (user.role === 'practice_lead' && !(user.practiceIds ?? []).includes(row.practice_id))
    ) {
      throw new ProblemException(
        HttpStatus.FORBIDDEN,
        'practice-not-yours',
        'Not one of your practices',
        'Only the practice’s own leads and regional leads can change its submissions.',
      );
    }
    if (row.quarter_status === 'closed' && user.role !== 'regional_lead') {
      throw new ProblemException(
        HttpStatus.CONFLICT,
        'quarter-closed',
        'This audit quarter is closed',
        `${row.year} Q${row.quarter} is closed, so its submissions can no longer be changed. Ask your regional lead if this one should still be confirmed.`,
      );
    }
  }

  /** Makes a submission current for its practice and quarter (atomically). */
  async confirm(user: Actor, practiceId: number, submissionId: number): Promise<SubmissionRow> {
    const row = await this.row(practiceId, submissionId);
    this.assertWriter(user, row);
    /** What was current when this request read the practice-quarter */
    const expected = row.current_submission_id ?? null;
    // The pointer row exists before the transaction, so the lock below is a plain row lock.
    await this.sequelize.query(
      'INSERT IGNORE INTO practice_quarters (practice_id, quarter_id) VALUES (?, ?)',
      {
        replacements: [row.practice_id, row.quarter_id],
        type: QueryTypes.INSERT,
      },
    );
    for (let attempt = 0; ; attempt++) {
      try {
        await this.sequelize.transaction(async (transaction) => {
          const [pointer] = await this.sequelize.query<{ current_submission_id: number | null }>(
            'SELECT current_submission_id FROM practice_quarters WHERE practice_id = ? AND quarter_id = ? FOR UPDATE',
            {
              replacements: [row.practice_id, row.quarter_id],
              type: QueryTypes.SELECT,
              transaction,
            },
          );
          const [fresh] = await this.sequelize.query<{ status: string }>(
            'SELECT status FROM submissions WHERE id = ? FOR UPDATE',
            {
              replacements: [submissionId],
              type: QueryTypes.SELECT,
              transaction,
            },
          );
          if (fresh?.status !== 'awaiting_confirmation') {
            throw new ProblemException(
              HttpStatus.CONFLICT,
              'submission-not-awaiting-confirmation',
              fresh?.status === 'accepted'
                ? 'Already confirmed'
                : 'This submission cannot be confirmed',
              fresh?.status === 'accepted'
                ? `Submission ${submissionId} is already confirmed and current.`
                : `Submission ${submissionId} is ${String(fresh?.status).replace(/_/g, ' ')}; only a submission awaiting confirmation can be confirmed.`,
              { submissionStatus: fresh?.status },
            );
          }
          const previous = pointer?.current_submission_id ?? null;
          // Someone else switched this practice-quarter after this request read it (two confirms
          // at once): refuse rather than silently replace what they just made current.
          if (previous !== expected) {
            throw new ProblemException(
              HttpStatus.CONFLICT,
              'current-submission-changed',
              'Another submission was just made current',
              `While this confirm was being handled, ${previous === null ? 'the current submission was withdrawn' : `submission ${previous} was made current`} for ${row.year} Q${row.quarter}, so submission ${submissionId} was not confirmed. Look at the practice's submissions again, then confirm this one if it should replace it.`,
              { currentSubmissionId: previous },
            );
          }
          if (previous !== null && previous > submissionId) {
            throw new ProblemException(
              HttpStatus.CONFLICT,
              'newer-submission-current',
              'A newer submission is current',
              `Submission ${previous}, uploaded after this one, is already current for ${row.year} Q${row.quarter}; confirming this older one would replace newer data. Upload the file again if it is the right one.`,
              { currentSubmissionId: previous },
            );
          }
          if (previous !== null) {
            await execute(
              this.sequelize,
              `UPDATE submissions SET status = 'superseded', superseded_at = NOW(3), superseded_by_submission_id = ? WHERE id = ?`,
              [submissionId, previous],
              transaction,
            );
          }
          await execute(
            this.sequelize,
            `UPDATE submissions SET status = 'accepted', confirmed_at = NOW(3), confirmed_by_user_id = ?, confirmed_by_label = ? WHERE id = ?`,
            [user.id, user.label, submissionId],
            transaction,
          );
          await execute(
            this.sequelize,
            'UPDATE practice_quarters SET current_submission_id = ?, switched_at = NOW(3) WHERE practice_id = ? AND quarter_id = ?',
            [submissionId, row.practice_id, row.quarter_id],
            transaction,
          );
          await this.audit.append(
            {
              action: 'submission.confirmed',
              summary: `Submission ${submissionId} confirmed: now current for ${row.year} Q${row.quarter} with ${row.rows_accepted ?? 0} records${previous !== null ? ` (replaces submission ${previous}, now superseded)` : ''}`,
              actor: { id: user.id, label: user.label },
              regionId: row.region_id,
              practiceId: row.practice_id,
              subjectType: 'submission',
              subjectId: submissionId,
              detail: { previous, records: row.rows_accepted },
            },
            transaction,
          );
          // Test-only (CAIRN_TEST_PAUSE_CONFIRM_MS, refused outside the test profile): every
          // write of the switch is done but not committed, so a test can kill the process here.
          await faultPause('confirm');
        });
        break;
      } catch (error) {
        if (attempt < 3 && DEADLOCK.test((error as Error)?.message ?? '')) continue;
        throw error;
      }
    }
    return (await findSubmission(this.sequelize, submissionId))!;
  }

  async cancel(user: Actor, practiceId: number, submissionId: number): Promise<SubmissionRow> {
    const row = await this.row(practiceId, submissionId);
    this.assertWriter(user, row);
    const cancelled = await this.sequelize.transaction(async (transaction) => {
      const changed = await execute(
        this.sequelize,
        `UPDATE submissions SET status = 'cancelled', cancelled_at = NOW(3), cancelled_by_label = ?, lease_owner = NULL, lease_expires_at = NULL
          WHERE id = ? AND status IN ('processing', 'awaiting_confirmation', 'failed')`,
        [user.label, submissionId],
        transaction,
      );
      if (changed === 0) return false;
      await deleteFile(this.sequelize, submissionId, transaction);
      await this.audit.append(
        {
          action: 'submission.cancelled',
          summary: `Submission ${submissionId} cancelled (was ${row.status.replace(/_/g, ' ')}); nothing from it is used`,
          actor: { id: user.id, label: user.label },
          regionId: row.region_id,
          practiceId: row.practice_id,
          subjectType: 'submission',
          subjectId: submissionId,
        },
        transaction,
      );
      return true;
    });
    if (!cancelled) {
      const fresh = await this.row(practiceId, submissionId);
      throw new ProblemException(
        HttpStatus.CONFLICT,
        'submission-not-cancellable',
        'This submission cannot be cancelled',
        fresh.status === 'accepted'
          ? `Submission ${submissionId} is confirmed and current. To replace it, upload a new extract and confirm that.`
          : `Submission ${submissionId} is ${fresh.status.replace(/_/g, ' ')}, so there is nothing to cancel.`,
        { submissionStatus: fresh.status },
      );
    }
    await purgeSubmission(this.sequelize, submissionId);
    return (await findSubmission(this.sequelize, submissionId))!;
  }

  async retry(user: Actor, practiceId: number, submissionId: number): Promise<SubmissionRow> {
    const row = await this.row(practiceId, submissionId);
    this.assertWriter(user, row);
    const retried = await this.sequelize.transaction(async (transaction) => {
      const changed = await execute(
        this.sequelize,
        `UPDATE submissions SET status = 'processing', failed_at = NULL, failure_message = NULL, lease_owner = NULL,
           lease_expires_at = NULL, rows_done = 0, rows_total = NULL, records_purged_at = NULL
         WHERE id = ? AND status = 'failed' AND file_deleted_at IS NULL AND file_sha256 IS NOT NULL`,
        [submissionId],
        transaction,
      );
      if (changed === 0) return false;
      await this.audit.append(
        {
          action: 'submission.retried',
          summary: `Checking submission ${submissionId} again after it failed`,
          actor: { id: user.id, label: user.label },
          regionId: row.region_id,
          practiceId: row.practice_id,
          subjectType: 'submission',
          subjectId: submissionId,
        },
        transaction,
      );
      return true;
    });
    if (!retried) {
      throw new ProblemException(
        HttpStatus.CONFLICT,
        'submission-not-retryable',
        'This submission cannot be retried',
        row.status === 'failed'
          ? 'The file of this submission is no longer kept (the upload was interrupted, or it failed more than 7 days ago). Upload the file again.'
          : `Submission ${submissionId} is ${row.status.replace(/_/g, ' ')}; only a failed submission can be retried.`,
        { submissionStatus: row.status },
      );
    }
    this.runner.kick();
    return (await findSubmission(this.sequelize, submissionId))!;
  }

  /** The region's coverage for one quarter: which practices have a current submission, which are waiting, which have none. */
  async coverage(user: AuthUser, quarterId: number) {
    const quarter = await this.quarters.get(user, quarterId);
    const practices = await this.sequelize.query<{
      id: number;
      code: string;
      name: string;
      locality: string | null;
      current_id: number | null;
      current_rows: number | null;
      confirmed_at: Date | null;
      confirmed_by: string | null;
    }>(
      `SELECT p.id, p.code, p.name, l.name AS locality, pq.current_submission_id AS current_id, cs.rows_accepted AS current_rows,
              cs.confirmed_at, cs.confirmed_by_label AS confirmed_by
         FROM practices p
         LEFT JOIN localities l ON l.id = p.locality_id
         LEFT JOIN practice_quarters pq ON pq.practice_id = p.id AND pq.quarter_id = ?
         LEFT JOIN submissions cs ON cs.id = pq.current_submission_id
        WHERE p.region_id = ? AND p.active = 1
        ORDER BY p.code`,
      { replacements: [quarterId, user.regionId], type: QueryTypes.SELECT },
    );
    const others = await this.sequelize.query<{
      practice_id: number;
      id: number;
      status: string;
      uploaded_at: Date;
      refusal_code: string | null;
    }>(
      `SELECT practice_id, id, status, uploaded_at, refusal_code FROM submissions
        WHERE quarter_id = ? AND status IN ('processing', 'awaiting_confirmation', 'rejected', 'failed')
        ORDER BY id DESC`,
      { replacements: [quarterId], type: QueryTypes.SELECT },
    );
    const latestOther = new Map<number, (typeof others)[number][]>();
    for (const o of others)
      latestOther.set(o.practice_id, [...(latestOther.get(o.practice_id) ?? []), o]);
    const rows = practices.map((p) => {
      const pending = latestOther.get(p.id) ?? [];
      const awaiting = pending.find(
        (o) => o.status === 'awaiting_confirmation' || o.status === 'processing',
      );
      const state = p.current_id !== null ? 'current' : awaiting ? 'awaiting_confirmation' : 'none';
      const lastProblem =
        pending.find((o) => o.status === 'rejected' || o.status === 'failed') ?? null;
      return {
        practice: { id: p.id, code: p.code, name: p.name, locality: p.locality },
        state,
        current:
          p.current_id === null
            ? null
            : {
                submissionId: p.current_id,
                records: p.current_rows,
                confirmedAt: p.confirmed_at ? new Date(p.confirmed_at).toISOString() : null,
                confirmedBy: p.confirmed_by,
              },
        waiting: pending
          .filter((o) => o.status === 'awaiting_confirmation' || o.status === 'processing')
          .map((o) => ({
            submissionId: o.id,
            status: o.status,
            uploadedAt: new Date(o.uploaded_at).toISOString(),
          })),
        lastProblem: lastProblem
          ? {
              submissionId: lastProblem.id,
              status: lastProblem.status,
              code: lastProblem.refusal_code,
              uploadedAt: new Date(lastProblem.uploaded_at).toISOString(),
            }
          : null,
      };
    });
    return {
      quarter,
      totals: {
        practices: rows.length,
        current: rows.filter((r) => r.state === 'current').length,
        // Every practice with an extract waiting, whether or not it already has a current one.
        awaitingConfirmation: rows.filter((r) => r.waiting.length > 0).length,
        none: rows.filter((r) => r.state === 'none').length,
        records: rows.reduce((n, r) => n + (r.current?.records ?? 0), 0),
      },
      practices: rows,
    };
  }
}
