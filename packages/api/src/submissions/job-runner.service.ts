/**
 * Runs extract jobs in this API process. Jobs live in MariaDB (submissions
 * in status 'processing'), so any number of stateless API processes can
 * share the work:
 *
 * - claim: SELECT … FOR UPDATE SKIP LOCKED the oldest queued job (no lease),
 *   then take a lease that the processor renews while it reads;
 * - sweep: a lease that ran out means its process died (or stalled): the job
 *   is marked failed (retry possible), and what it staged is removed;
 * - shut down: jobs in progress are handed back to the queue.
 */
import { randomBytes } from 'node:crypto';
import { hostname } from 'node:os';
import {
  Inject,
  Injectable,
  Logger,
  type OnApplicationBootstrap,
  type OnApplicationShutdown,
} from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { QueryTypes } from 'sequelize';
import { Sequelize } from 'sequelize-typescript';
import { AuditTrailService } from '../audit-trail/audit-trail.service.js';
import type { CairnConfig } from '../config/config.schema.js';
import { ExtractProcessor } from './extract-processor.js';
import { deleteFile, execute, purgeSubmission } from './submission-store.js';

export const UPLOAD_LEASE_PREFIX = 'upload:';

@Injectable()
export class JobRunner implements OnApplicationBootstrap, OnApplicationShutdown {
  private readonly logger = new Logger('ExtractJobs');
  readonly processId = `${hostname().slice(0, 30)}:${process.pid}:${randomBytes(3).toString('hex')}`;
  private readonly running = new Map<number, Promise<void>>();
  /** Callers of waitFor(), woken when a job of this process settles */
  private readonly waiters = new Set<() => void>();
  private timer: NodeJS.Timeout | null = null;
  private ticking = false;
  private again = false;
  private stopping = false;
  private lastSweep = 0;

  constructor(
    @Inject(Sequelize) private readonly sequelize: Sequelize,
    @Inject(ConfigService) private readonly config: ConfigService<CairnConfig, true>,
    @Inject(ExtractProcessor) private readonly processor: ExtractProcessor,
    @Inject(AuditTrailService) private readonly audit: AuditTrailService,
  ) {}

  private get settings() {
    return this.config.get('extracts', { infer: true });
  }

  onApplicationBootstrap(): void {
    if (this.settings.workers === 0) return;
    this.timer = setInterval(() => void this.tick(), this.settings.pollIntervalMs);
    this.timer.unref();
    this.kick();
  }

  async onApplicationShutdown(): Promise<void> {
    this.stopping = true;
    if (this.timer) clearInterval(this.timer);
    const inFlight = [...this.running.values()];
    if (inFlight.length === 0) return;
    let timer: NodeJS.Timeout | undefined;
    await Promise.race([
      Promise.allSettled(inFlight),
      new Promise((resolve) => {
        timer = setTimeout(resolve, 10_000);
        timer.unref();
      }),
    ]);
    clearTimeout(timer);
  }

  /** Look for work now (after an upload or a retry in this process). */
  kick(): void {
    if (this.settings.workers === 0 || this.stopping) return;
    setImmediate(() => void this.tick());
  }

  get busy(): number {
    return this.running.size;
  }

  async tick(): Promise<void> {
    if (this.stopping) return;
    if (this.ticking) {
      this.again = true;
      return;
    }
    this.ticking = true;
    try {
      do {
        this.again = false;
        if (Date.now() - this.lastSweep > Math.min(2000, this.settings.leaseSeconds * 500)) {
          this.lastSweep = Date.now();
          await this.sweep();
        }
        while (!this.stopping && this.running.size < this.settings.workers) {
          const id = await this.claim();
          if (id === null) break;
          const job = this.processor
            .run(id, this.processId, () => this.stopping)
            .catch((error: unknown) =>
              this.logger.error({ err: error, submissionId: id }, 'extract job crashed'),
            )
            .finally(() => {
              this.running.delete(id);
              for (const wake of this.waiters) wake();
              this.kick();
            });
          this.running.set(id, job);
        }
      } while (this.again && !this.stopping);
    } catch (error) {
      if (!this.stopping)
        this.logger.warn({ err: error }, 'extract queue check failed; will try again');
    } finally {
      this.ticking = false;
    }
  }

  /** Claims the oldest queued extract, if any, for this process. */
  async claim(): Promise<number | null> {
    return this.sequelize.transaction(async (transaction) => {
      const [row] = await this.sequelize.query<{ id: number }>(
        `SELECT id FROM submissions WHERE status = 'processing' AND lease_owner IS NULL
          ORDER BY id LIMIT 1 FOR UPDATE SKIP LOCKED`,
        { type: QueryTypes.SELECT, transaction },
      );
      if (!row) return null;
      await execute(
        this.sequelize,
        `UPDATE submissions SET lease_owner = ?, lease_expires_at = NOW(3) + INTERVAL ? SECOND,
           attempts = attempts + 1, processing_started_at = NOW(3), rows_done = 0, rows_total = NULL
         WHERE id = ?`,
        [this.processId, this.settings.leaseSeconds, row.id],
        transaction,
      );
      return row.id;
    });
  }

  /** Declares jobs whose lease ran out failed, removes what they staged, and tidies old files. */
  async sweep(): Promise<void> {
    const expired = await this.sequelize.query<{
      id: number;
      lease_owner: string;
      practice_id: number;
      region_id: number;
    }>(
      `SELECT s.id, s.lease_owner, s.practice_id, p.region_id FROM submissions s JOIN practices p ON p.id = s.practice_id
        WHERE s.status = 'processing' AND s.lease_owner IS NOT NULL AND s.lease_expires_at < NOW(3) LIMIT 20`,
      { type: QueryTypes.SELECT },
    );
    for (const job of expired) {
      const interruptedUpload = job.lease_owner.startsWith(UPLOAD_LEASE_PREFIX);
      const message = interruptedUpload
        ? 'The upload was interrupted before the whole file arrived, so Cairn did not check it. Nothing from it was kept. Upload the file again.'
        : 'Cairn stopped while checking this file (the server processing it stopped). Nothing from it was kept. Retry to check it again.';
      await this.sequelize.transaction(async (transaction) => {
        const changed = await execute(
          this.sequelize,
          `UPDATE submissions SET status = 'failed', failed_at = NOW(3), failure_message = ?, lease_owner = NULL, lease_expires_at = NULL
            WHERE id = ? AND status = 'processing' AND lease_owner = ? AND lease_expires_at < NOW(3)`,
          [message, job.id, job.lease_owner],
          transaction,
        );
        if (changed === 0) return;
        if (interruptedUpload) await deleteFile(this.sequelize, job.id, transaction);
        await this.audit.append(
          {
            action: 'submission.failed',
            outcome: 'failed',
            summary: interruptedUpload
              ? 'Upload interrupted before the file was complete'
              : 'Checking the extract stopped when its server stopped; it can be retried',
            actor: { id: null, label: 'system' },
            regionId: job.region_id,
            practiceId: job.practice_id,
            subjectType: 'submission',
            subjectId: job.id,
            detail: { leaseOwner: job.lease_owner },
          },
          transaction,
        );
      });
      this.logger.warn(
        { submissionId: job.id, leaseOwner: job.lease_owner },
        'extract lease expired: marked failed',
      );
    }
    const leftovers = await this.sequelize.query<{ id: number }>(
      `SELECT id FROM submissions WHERE status IN ('rejected', 'cancelled', 'failed') AND records_purged_at IS NULL LIMIT 10`,
      { type: QueryTypes.SELECT },
    );
    for (const { id } of leftovers) await purgeSubmission(this.sequelize, id);
    // Files of failed jobs are kept for a retry, but not for ever.
    const stale = await this.sequelize.query<{ id: number }>(
      `SELECT id FROM submissions WHERE status = 'failed' AND file_deleted_at IS NULL AND failed_at < NOW(3) - INTERVAL 7 DAY LIMIT 10`,
      { type: QueryTypes.SELECT },
    );
    for (const { id } of stale) await deleteFile(this.sequelize, id);
  }

  /**
   * Waits until no job of `ids` is processing (for the demo seeding and the benchmark). A job
   * of this process wakes the wait as soon as it settles; one another process runs is seen at
   * the next look, every quarter of a second.
   */
  async waitFor(ids: number[], timeoutMs = 300_000): Promise<void> {
    const deadline = Date.now() + timeoutMs;
    for (;;) {
      const [row] = await this.sequelize.query<{ n: number }>(
        `SELECT COUNT(*) AS n FROM submissions WHERE id IN (?) AND status = 'processing'`,
        { replacements: [ids], type: QueryTypes.SELECT },
      );
      if (Number(row?.n) === 0) return;
      if (Date.now() > deadline) throw new Error('extracts still processing after the timeout');
      this.kick();
      await new Promise<void>((resolve) => {
        const wake = () => {
          clearTimeout(timer);
          this.waiters.delete(wake);
          resolve();
        };
        const timer = setTimeout(wake, 250);
        this.waiters.add(wake);
      });
    }
  }
}
