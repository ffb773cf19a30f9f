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
import { AuditTrailService } from '../audit-trail/audit-trail.service.js';
import type { CairnConfig } from '../config/config.schema.js';
import { OrganisationsService } from '../organisations/organisations.service.js';
import { ExtractProcessor } from './extract-processor.js';
import { SubmissionRepository } from './submission.repository.js';

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
    @Inject(SubmissionRepository) private readonly submissions: SubmissionRepository,
    @Inject(OrganisationsService) private readonly organisations: OrganisationsService,
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
  claim(): Promise<number | null> {
    return this.submissions.claimNext(this.processId, this.settings.leaseSeconds);
  }

  /** Declares jobs whose lease ran out failed, removes what they staged, and tidies old files. */
  async sweep(): Promise<void> {
    const expired = await this.submissions.expiredLeases(20);
    for (const job of expired) {
      const practice = await this.organisations.practice(job.practice_id);
      const interruptedUpload = job.lease_owner.startsWith(UPLOAD_LEASE_PREFIX);
      const message = interruptedUpload
        ? 'The upload was interrupted before the whole file arrived, so Cairn did not check it. Nothing from it was kept. Upload the file again.'
        : 'Cairn stopped while checking this file (the server processing it stopped). Nothing from it was kept. Retry to check it again.';
      await this.submissions.transaction(async (transaction) => {
        if (!(await this.submissions.failExpired(job.id, job.lease_owner, message, transaction)))
          return;
        if (interruptedUpload) await this.submissions.deleteFile(job.id, transaction);
        await this.audit.append(
          {
            action: 'submission.failed',
            outcome: 'failed',
            summary: interruptedUpload
              ? 'Upload interrupted before the file was complete'
              : 'Checking the extract stopped when its server stopped; it can be retried',
            actor: { id: null, label: 'system' },
            regionId: practice?.regionId ?? null,
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
    for (const id of await this.submissions.unpurged(10)) await this.submissions.purge(id);
    // Files of failed jobs are kept for a retry, but not for ever.
    for (const id of await this.submissions.staleFailedFiles(10))
      await this.submissions.deleteFile(id);
  }

  /**
   * Waits until no job of `ids` is processing (for the demo seeding and the benchmark). A job
   * of this process wakes the wait as soon as it settles; one another process runs is seen at
   * the next look, every quarter of a second.
   */
  async waitFor(ids: number[], timeoutMs = 300_000): Promise<void> {
    const deadline = Date.now() + timeoutMs;
    for (;;) {
      if ((await this.submissions.countProcessing(ids)) === 0) return;
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
