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
import { Sequelize } from 'sequelize-typescript';
import { AuditTrailService } from '../audit-trail/audit-trail.service.js';
import type { CairnConfig, CairnSecrets } from '../config/config.schema.js';
import { CAIRN_SECRETS } from '../config/config.module.js';
import { OrganisationsService } from '../organisations/organisations.service.js';
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
import { type CheckedFields, SubmissionRepository } from './submission.repository.js';
import { SubmissionLoader } from './submission-view.js';

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

/** Keyed pseudonym of a record reference (docs/methods.md §9), as @cairn/metrics defines it. */
export function pseudonymiser(secret: string): (practiceCode: string, recordRef: string) => string {
  return (practiceCode, recordRef) =>
    createHmac('sha256', Buffer.from(secret, 'utf8'))
      .update(pseudonymMessage(practiceCode, recordRef), 'utf8')
      .digest('hex')
      .slice(0, PSEUDONYM_LENGTH);
}

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
    @Inject(SubmissionRepository) private readonly submissions: SubmissionRepository,
    @Inject(SubmissionLoader) private readonly loader: SubmissionLoader,
    @Inject(OrganisationsService) private readonly organisations: OrganisationsService,
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
    const loaded = await this.loader.load(id);
    if (!loaded) return;
    const { record: submission, practice, quarter } = loaded;
    const extracts = this.config.get('extracts', { infer: true });
    const leaseSeconds = extracts.leaseSeconds;
    // A retry starts clean: nothing of an earlier attempt may remain.
    await this.submissions.clearAttempt(id);

    // Usually this process received the upload a moment ago and still holds its bytes.
    const bytes = this.handoff.take(id) ?? (await this.submissions.readFile(id));
    const now = new Date();
    const context = {
      practiceCode: practice.code,
      windowStartIndex: monthIndex(quarter.windowStart),
      windowEndIndex: monthIndex(quarter.windowEnd),
      windowEnd: quarter.windowEnd,
      endYear: Number(quarter.windowEnd.slice(0, 4)),
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
      const update = this.submissions.renewLease(
        aux,
        { id, owner: leaseOwner, leaseSeconds },
        rowsDone,
        rowsTotal,
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
              practiceCode: practice.code,
              secret: this.secret,
            });
            await loader.write(rows);
          },
          issues: async (issues: Issue[]) => {
            const first = seq + 1;
            seq += issues.length;
            await this.submissions.writeIssues(aux, id, first, issues);
          },
          rejectedRows: (rows: RejectedRow[]) => this.submissions.writeRejectedRows(aux, id, rows),
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
        await this.submissions.purge(id);
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
        await this.finishRejected(id, leaseOwner, practice.id, practice.regionId, outcome);
      else
        await this.finishValidated(id, leaseOwner, practice.id, practice.regionId, outcome, staged);
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
      refusalProblems: outcome.refusal?.problems ?? null,
    });
  }

  private checked(outcome: ExtractOutcome, keepCounts: boolean): CheckedFields {
    const c = outcome.counts;
    return {
      kind: outcome.kind,
      sheetName: outcome.sheetName,
      counts: keepCounts
        ? [c.rowsRead, c.rowsAccepted, c.rowsRejected, c.rowsBlank, c.errors, c.warnings, c.flags]
        : [c.rowsRead, 0, null, null, null, null, null],
      summary: this.summaryOf(outcome),
    };
  }

  private async finishValidated(
    id: number,
    leaseOwner: string,
    practiceId: number,
    regionId: number,
    outcome: ExtractOutcome,
    staged: number,
  ): Promise<void> {
    const won = await this.submissions.transaction(async (transaction) => {
      const changed = await this.submissions.finishValidated(
        id,
        leaseOwner,
        { ...this.checked(outcome, true), rowsRead: outcome.counts.rowsRead },
        transaction,
      );
      if (!changed) return false;
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
    if (!won) await this.submissions.purge(id);
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
    await this.submissions.transaction(async (transaction) => {
      const changed = await this.submissions.finishRejected(
        id,
        leaseOwner,
        { ...this.checked(outcome, keepRows), refusal },
        keepRows,
        transaction,
      );
      if (!changed) return;
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
    await this.submissions.purge(id);
  }

  /** Hands a job back to the queue (this process is stopping). */
  private async requeue(id: number, leaseOwner: string): Promise<void> {
    await this.submissions.requeue(id, leaseOwner);
  }

  /** An unexpected error: the job fails, the file is kept for a retry, staged rows go. */
  private async fail(id: number, leaseOwner: string, error: Error): Promise<void> {
    this.logger.error({ err: error, submissionId: id }, `extract ${id} failed: ${error.message}`);
    const submission = await this.submissions.find(id);
    const practice = submission ? await this.organisations.practice(submission.practice_id) : null;
    await this.submissions.transaction(async (transaction) => {
      const changed = await this.submissions.markFailed(
        id,
        leaseOwner,
        'Cairn stopped while checking this file because of a problem on its side. Nothing from it was kept. Retry, and tell the Cairn team if it happens again.',
        transaction,
      );
      if (!changed || !submission) return;
      await this.audit.append(
        {
          action: 'submission.failed',
          outcome: 'failed',
          summary: 'Checking the extract stopped on an unexpected error; it can be retried',
          actor: { id: null, label: 'system' },
          regionId: practice?.regionId ?? null,
          practiceId: submission.practice_id,
          subjectType: 'submission',
          subjectId: id,
          detail: { error: error.message.slice(0, 300) },
        },
        transaction,
      );
    });
    await this.submissions.purge(id);
  }
}
