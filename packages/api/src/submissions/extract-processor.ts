/**
 * Processes one claimed extract: reads the stored file, runs the pipeline,
 * stages records (RecordLoader), writes issues and refused rows, and ends
 * the job in 'awaiting_confirmation' or 'rejected' (or 'failed' on an
 * unexpected error, with the file kept so that it can be retried).
 *
 * Every write that ends the job checks that this process still holds the
 * lease: a job cancelled meanwhile, or declared failed after a stall, is not
 * brought back, and whatever it staged is removed.
 */
import { createHmac } from 'node:crypto';
import { Inject, Injectable, Logger } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { monthIndex, pseudonymMessage, PSEUDONYM_LENGTH } from '@cairn/metrics';
import { QueryTypes } from 'sequelize';
import { Sequelize } from 'sequelize-typescript';
import { AuditTrailService } from '../audit-trail/audit-trail.service.js';
import type { CairnConfig, CairnSecrets } from '../config/config.schema.js';
import { CAIRN_SECRETS } from '../config/config.module.js';
import {
  acquireRaw,
  releaseRaw,
  type RawConnection,
} from '../database/bulk-load/raw-connection.js';
import { RecordLoader } from '../database/bulk-load/record-loader.js';
import type { Issue } from './format/issue-codes.js';
import { UploadHandoff } from './upload-handoff.js';
import {
  type ExtractOutcome,
  processExtract,
  type RejectedRow,
} from './pipeline/process-extract.js';
import {
  deleteFile,
  execute,
  findSubmission,
  purgeSubmission,
  readFile,
} from './submission-store.js';

export class LeaseLostError extends Error {
  constructor() {
    super('the extract is no longer held by this process');
  }
}

/** This process is shutting down: the job goes back to the queue for another process. */
export class ShuttingDownError extends Error {
  constructor() {
    super('the API process is shutting down');
  }
}

/** Keyed pseudonym of a record reference (methods.md §9), as @cairn/metrics defines it. */
export function pseudonymiser(secret: string): (practiceCode: string, recordRef: string) => string {
  return (practiceCode, recordRef) =>
    createHmac('sha256', Buffer.from(secret, 'utf8'))
      .update(pseudonymMessage(practiceCode, recordRef), 'utf8')
      .digest('hex')
      .slice(0, PSEUDONYM_LENGTH);
}

const ISSUE_SQL =
  'INSERT INTO submission_issues (submission_id, seq, severity, code, source_row, column_key, column_name, value_given, message, fix) VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?)';
const REJECTED_SQL =
  'INSERT INTO submission_rejected_rows (submission_id, source_row, cells) VALUES (?, ?, ?)';

/** Test-only fault injection: pause inside a step so that a test can kill the process there. */
export async function faultPause(step: 'processing' | 'confirm'): Promise<void> {
  if (process.env.CAIRN_PROFILE !== 'test') return;
  const ms = Number(process.env[`CAIRN_TEST_PAUSE_${step.toUpperCase()}_MS`] ?? 0);
  if (ms > 0) await new Promise((resolve) => setTimeout(resolve, ms));
}

@Injectable()
export class ExtractProcessor {
  private readonly logger = new Logger('Extracts');

  constructor(
    @Inject(Sequelize) private readonly sequelize: Sequelize,
    @Inject(ConfigService) private readonly config: ConfigService<CairnConfig, true>,
    @Inject(CAIRN_SECRETS) secrets: CairnSecrets,
    @Inject(AuditTrailService) private readonly audit: AuditTrailService,
    @Inject(UploadHandoff) private readonly handoff: UploadHandoff,
  ) {
    this.secret = secrets.CAIRN_PSEUDONYM_SECRET;
  }

  private readonly secret: string;

  async run(
    id: number,
    leaseOwner: string,
    shouldStop: () => boolean = () => false,
  ): Promise<void> {
    const submission = await findSubmission(this.sequelize, id);
    if (!submission) return;
    const extracts = this.config.get('extracts', { infer: true });
    const leaseSeconds = extracts.leaseSeconds;
    // A retry starts clean: nothing of an earlier attempt may remain.
    await this.sequelize.query('DELETE FROM submission_issues WHERE submission_id = ?', {
      replacements: [id],
      type: QueryTypes.DELETE,
    });
    await this.sequelize.query('DELETE FROM submission_rejected_rows WHERE submission_id = ?', {
      replacements: [id],
      type: QueryTypes.DELETE,
    });
    await this.sequelize.query('DELETE FROM care_records WHERE submission_id = ?', {
      replacements: [id],
      type: QueryTypes.DELETE,
    });

    // Usually this process received the upload a moment ago and still holds its bytes.
    const bytes = this.handoff.take(id) ?? (await readFile(this.sequelize, id));
    const now = new Date();
    const context = {
      practiceCode: submission.practice_code,
      windowStartIndex: monthIndex(submission.window_start),
      windowEndIndex: monthIndex(submission.window_end),
      windowEnd: submission.window_end,
      endYear: Number(submission.window_end.slice(0, 4)),
      currentMonthIndex: now.getUTCFullYear() * 12 + now.getUTCMonth(),
      dateConvention: submission.date_convention,
      date1904: false,
    };

    let loader: RecordLoader | null = null;
    const aux: RawConnection = await acquireRaw(this.sequelize);
    let seq = 0;
    let lastBeat = 0;
    // The beat before this one: sent, and checked here rather than waited for when it was sent.
    let lastUpdate: Promise<{ affectedRows: number }> | null = null;
    const heartbeat = async (rowsDone: number, rowsTotal: number | null, force = false) => {
      if (shouldStop()) throw new ShuttingDownError();
      const nowMs = Date.now();
      if (!force && nowMs - lastBeat < 250) return;
      lastBeat = nowMs;
      // Progress and lease renewal go out while the next rows are checked; the reader waits
      // only for the previous beat's answer, a quarter of a second old by now. (Waiting for each
      // answer cost a round trip to a MariaDB busy staging rows, four times a second.)
      const previous = lastUpdate;
      lastUpdate = null;
      if (previous && (await previous).affectedRows === 0) throw new LeaseLostError();
      const update = aux.query<{ affectedRows: number }>(
        `UPDATE submissions SET rows_done = ?, rows_total = ?, lease_expires_at = NOW(3) + INTERVAL ? SECOND
          WHERE id = ? AND status = 'processing' AND lease_owner = ?`,
        [rowsDone, rowsTotal, leaseSeconds, id, leaseOwner],
      );
      if (force) {
        if ((await update).affectedRows === 0) throw new LeaseLostError();
      } else {
        update.catch(() => undefined); // its failure is seen at the next beat
        lastUpdate = update;
      }
    };

    let outcome: ExtractOutcome;
    try {
      await heartbeat(0, null, true);
      outcome = await processExtract(
        bytes,
        submission.file_name,
        context,
        id,
        {
          maxRows: extracts.maxRows,
          maxUncompressedBytes: extracts.maxUncompressedBytes,
          maxZipEntries: extracts.maxZipEntries,
        },
        {
          records: async (rows) => {
            loader ??= await RecordLoader.open(this.sequelize, {
              practiceCode: submission.practice_code,
              secret: this.secret,
            });
            await loader.write(rows);
          },
          issues: async (issues: Issue[]) => {
            await aux.batch(
              ISSUE_SQL,
              issues.map((i) => [
                id,
                ++seq,
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
          },
          rejectedRows: async (rows: RejectedRow[]) => {
            await aux.batch(
              REJECTED_SQL,
              rows.map((r) => [id, r.row, JSON.stringify(r.cells)]),
            );
          },
          progress: (done, total) => heartbeat(done, total),
          checkpoint: () => faultPause('processing'),
        },
      );
      const unchecked = lastUpdate as Promise<{ affectedRows: number }> | null;
      lastUpdate = null;
      if (unchecked && (await unchecked).affectedRows === 0) throw new LeaseLostError();
    } catch (error) {
      await (lastUpdate as Promise<unknown> | null)?.catch(() => undefined);
      await (loader as RecordLoader | null)?.abort();
      await releaseRaw(this.sequelize, aux);
      if (error instanceof LeaseLostError) {
        await purgeSubmission(this.sequelize, id);
        return;
      }
      if (error instanceof ShuttingDownError) {
        await this.requeue(id, leaseOwner);
        return;
      }
      await this.fail(id, leaseOwner, error as Error);
      return;
    }
    try {
      const staged = loader ? await (loader as RecordLoader).finish() : 0;
      loader = null;
      await releaseRaw(this.sequelize, aux);
      if (outcome.refusal)
        await this.finishRejected(
          id,
          leaseOwner,
          submission.practice_id,
          submission.region_id,
          outcome,
        );
      else
        await this.finishValidated(
          id,
          leaseOwner,
          submission.practice_id,
          submission.region_id,
          outcome,
          staged,
        );
    } catch (error) {
      await (loader as RecordLoader | null)?.abort();
      await this.fail(id, leaseOwner, error as Error);
    }
  }

  private summaryOf(outcome: ExtractOutcome) {
    return JSON.stringify({
      issueCounts: outcome.issueCounts,
      headerRow: outcome.headerRow,
      header: outcome.header.slice(0, 200),
      columnsFound: outcome.columnsFound,
      columnsIgnored: outcome.columnsIgnored,
      refColumnIndex: outcome.refColumnIndex,
      delimiter: outcome.delimiter,
      encoding: outcome.encoding,
      refusalDetail: outcome.refusal?.detail ?? null,
    });
  }

  private countParams(outcome: ExtractOutcome) {
    const c = outcome.counts;
    return [c.rowsRead, c.rowsAccepted, c.rowsRejected, c.rowsBlank, c.errors, c.warnings, c.flags];
  }

  private async finishValidated(
    id: number,
    leaseOwner: string,
    practiceId: number,
    regionId: number,
    outcome: ExtractOutcome,
    staged: number,
  ): Promise<void> {
    const won = await this.sequelize.transaction(async (transaction) => {
      const changed = await execute(
        this.sequelize,
        `UPDATE submissions SET status = 'awaiting_confirmation', processed_at = NOW(3),
           file_kind = ?, sheet_name = ?, rows_read = ?, rows_accepted = ?, rows_rejected = ?, rows_blank = ?,
           error_count = ?, warning_count = ?, flag_count = ?, rows_done = ?, rows_total = ?, summary = ?,
           lease_owner = NULL, lease_expires_at = NULL
         WHERE id = ? AND status = 'processing' AND lease_owner = ?`,
        [
          outcome.kind,
          outcome.sheetName,
          ...this.countParams(outcome),
          outcome.counts.rowsRead,
          outcome.counts.rowsRead,
          this.summaryOf(outcome),
          id,
          leaseOwner,
        ],
        transaction,
      );
      if (changed === 0) return false;
      await deleteFile(this.sequelize, id, transaction);
      const c = outcome.counts;
      await this.audit.append(
        {
          action: 'submission.validated',
          summary: `Extract checked: ${c.rowsAccepted} of ${c.rowsRead} rows accepted, ${c.rowsRejected} refused, ${c.warnings} warnings, ${c.flags} data-quality flags; awaiting confirmation`,
          actor: { id: null, label: 'system' },
          regionId,
          practiceId,
          subjectType: 'submission',
          subjectId: id,
          detail: { ...c, staged },
        },
        transaction,
      );
      return true;
    });
    if (!won) await purgeSubmission(this.sequelize, id);
  }

  private async finishRejected(
    id: number,
    leaseOwner: string,
    practiceId: number,
    regionId: number,
    outcome: ExtractOutcome,
  ): Promise<void> {
    const refusal = outcome.refusal!;
    const keepRows = refusal.code === 'no_valid_rows';
    await this.sequelize.transaction(async (transaction) => {
      const changed = await execute(
        this.sequelize,
        `UPDATE submissions SET status = 'rejected', processed_at = NOW(3), file_kind = ?, sheet_name = ?,
           rows_read = ?, rows_accepted = ?, rows_rejected = ?, rows_blank = ?, error_count = ?, warning_count = ?, flag_count = ?,
           refusal_code = ?, refusal_message = ?, refusal_fix = ?, summary = ?, lease_owner = NULL, lease_expires_at = NULL
         WHERE id = ? AND status = 'processing' AND lease_owner = ?`,
        [
          outcome.kind,
          outcome.sheetName,
          ...(keepRows
            ? this.countParams(outcome)
            : [outcome.counts.rowsRead, 0, null, null, null, null, null]),
          refusal.code,
          refusal.message,
          refusal.fix,
          this.summaryOf(outcome),
          id,
          leaseOwner,
        ],
        transaction,
      );
      if (changed === 0) return;
      if (!keepRows) {
        await this.sequelize.query('DELETE FROM submission_issues WHERE submission_id = ?', {
          replacements: [id],
          type: QueryTypes.DELETE,
          transaction,
        });
        await this.sequelize.query('DELETE FROM submission_rejected_rows WHERE submission_id = ?', {
          replacements: [id],
          type: QueryTypes.DELETE,
          transaction,
        });
      }
      await deleteFile(this.sequelize, id, transaction);
      await this.audit.append(
        {
          action: 'submission.rejected',
          outcome: 'refused',
          summary: `Extract refused (${refusal.code}): ${refusal.message}`,
          actor: { id: null, label: 'system' },
          regionId,
          practiceId,
          subjectType: 'submission',
          subjectId: id,
          detail: { code: refusal.code },
        },
        transaction,
      );
    });
    await purgeSubmission(this.sequelize, id);
  }

  /** Hands a job back to the queue (this process is stopping). */
  private async requeue(id: number, leaseOwner: string): Promise<void> {
    await this.sequelize.query('DELETE FROM submission_issues WHERE submission_id = ?', {
      replacements: [id],
      type: QueryTypes.DELETE,
    });
    await this.sequelize.query('DELETE FROM submission_rejected_rows WHERE submission_id = ?', {
      replacements: [id],
      type: QueryTypes.DELETE,
    });
    await execute(
      this.sequelize,
      `UPDATE submissions SET lease_owner = NULL, lease_expires_at = NULL, rows_done = 0, attempts = GREATEST(attempts - 1, 0)
        WHERE id = ? AND status = 'processing' AND lease_owner = ?`,
      [id, leaseOwner],
    );
  }

  /** An unexpected error: the job fails, the file is kept for a retry, staged rows go. */
  private async fail(id: number, leaseOwner: string, error: Error): Promise<void> {
    this.logger.error({ err: error, submissionId: id }, `extract ${id} failed: ${error.message}`);
    const submission = await findSubmission(this.sequelize, id);
    await this.sequelize.transaction(async (transaction) => {
      const changed = await execute(
        this.sequelize,
        `UPDATE submissions SET status = 'failed', failed_at = NOW(3), failure_message = ?, lease_owner = NULL, lease_expires_at = NULL
          WHERE id = ? AND status = 'processing' AND lease_owner = ?`,
        [
          'Cairn stopped while checking this file because of a problem on its side. Nothing from it was kept. Retry, and tell the Cairn team if it happens again.',
          id,
          leaseOwner,
        ],
        transaction,
      );
      if (changed === 0 || !submission) return;
      await this.audit.append(
        {
          action: 'submission.failed',
          outcome: 'failed',
          summary: 'Checking the extract stopped on an unexpected error; it can be retried',
          actor: { id: null, label: 'system' },
          regionId: submission.region_id,
          practiceId: submission.practice_id,
          subjectType: 'submission',
          subjectId: id,
          detail: { error: error.message.slice(0, 300) },
        },
        transaction,
      );
    });
    await purgeSubmission(this.sequelize, id);
  }
}
