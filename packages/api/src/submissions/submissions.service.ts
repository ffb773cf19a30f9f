/**
 * Submissions after upload: reading them (report, history, coverage, where
 * one may upload) and the three decisions on one — confirm, cancel, retry.
 * Who may decide is submission-policy.ts; every write is SubmissionRepository's.
 *
 * Confirm is one short transaction: lock the practice-quarter pointer, check
 * the submission still awaits confirmation and that the pointer is still what
 * the request read (two confirms at once: the second is refused with 409
 * current-submission-changed), mark the previous current one superseded,
 * switch the pointer, append the audit event. The records were
 * staged while the extract was read, so readers (who always go through the
 * pointer) see the old set or the new set, never a mix.
 */
import type { Writable } from 'node:stream';
import { HttpStatus, Inject, Injectable } from '@nestjs/common';
import type { PracticeSums } from '@cairn/metrics';
import { AuditTrailService } from '../audit-trail/audit-trail.service.js';
import type { Actor } from '../auth/actor.js';
import { ProblemException } from '../common/problem.js';
import { CAIRN_SECRETS } from '../config/config.module.js';
import type { CairnSecrets } from '../config/config.schema.js';
import {
  type MeasureSetVersion,
  MeasureSetsService,
} from '../measure-sets/measure-sets.service.js';
import { OrganisationsService } from '../organisations/organisations.service.js';
import type { QuarterDto } from '../quarters/dto/quarter.dto.js';
import { QuartersService } from '../quarters/quarters.service.js';
import { PeopleNames } from '../users/people-names.js';
import type {
  CoverageDto,
  IssuePageDto,
  IssueQueryDto,
  SubmissionDto,
  SubmissionHistoryDto,
  UploadOptionsDto,
} from './dto/submission.dto.js';
import { faultPause, pseudonymiser } from './extract-processor.js';
import { ISSUE_CODES, type IssueCodeKey } from './format/issue-codes.js';
import { JobRunner } from './job-runner.service.js';
import { ValidationReportService } from './validation-report/validation-report.service.js';
import { assertMay, mayWrite, seesRecordRefs, type SubmissionAction } from './submission-policy.js';
import { type CurrentSetRow, SubmissionRepository, summaryJson } from './submission.repository.js';
import { issueTitle, type LoadedSubmission, SubmissionLoader, toView } from './submission-view.js';
import { type StoredRecord, toStoredRecord } from '../database/bulk-load/care-record-row.js';
import { SubmissionSums, type SumsSubject } from './sums/submission-sums.js';

export type { SumsSubject } from './sums/submission-sums.js';
export type { CurrentSetRow } from './submission.repository.js';
export { submissionsKey } from './current-set-key.js';

/** A practice's current submission for a quarter, as its pointer names it. */
export interface CurrentPointer {
  practiceId: number;
  submissionId: number;
}

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

const notAwaiting = (id: number, status: string | null) =>
  new ProblemException(
    HttpStatus.CONFLICT,
    'submission-not-awaiting-confirmation',
    status === 'accepted' ? 'Already confirmed' : 'This submission cannot be confirmed',
    status === 'accepted'
      ? `Submission ${id} is already confirmed and current.`
      : `Submission ${id} is ${String(status).replace(/_/g, ' ')}; only a submission awaiting confirmation can be confirmed.`,
    { submissionStatus: status ?? undefined },
  );

/** A download of a validation report: what to call it, and how to write it. */
export interface ReportDownload {
  fileName: string;
  contentType: string;
  write(out: Writable): Promise<void>;
}

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

/** What results show of a confirmed submission (none of it changes once confirmed). */
export interface ConfirmedFacts {
  id: number;
  practiceId: number;
  records: number;
  confirmedAt: string;
  dataQuality: DataQualityFlagCount[];
}

/** Confirmed submissions' facts kept in memory at most. */
const FACTS_CACHE = 50_000;

/** Every clinical data-quality check (docs/methods.md §7) with its count among `counts` (0 included). */
function dataQualityCounts(counts: Record<string, number>): DataQualityFlagCount[] {
  return (Object.keys(ISSUE_CODES) as IssueCodeKey[])
    .filter((code) => ISSUE_CODES[code].severity === 'flag')
    .map((code) => ({ code, title: ISSUE_CODES[code].title, count: counts[code] ?? 0 }));
}

/** Records read per query when a submission's records are read in batches. */
const RECORD_BATCH = 5000;

@Injectable()
export class SubmissionsService {
  private readonly pseudonym: (practiceCode: string, ref: string) => string;
  private readonly sums: SubmissionSums;
  private readonly facts = new Map<number, ConfirmedFacts>();

  private readonly confirmedListeners: ((quarter: QuarterDto) => void)[] = [];

  constructor(
    @Inject(SubmissionRepository) private readonly submissions: SubmissionRepository,
    @Inject(SubmissionLoader) private readonly loader: SubmissionLoader,
    @Inject(AuditTrailService) private readonly audit: AuditTrailService,
    @Inject(QuartersService) private readonly quarters: QuartersService,
    @Inject(OrganisationsService) private readonly organisations: OrganisationsService,
    @Inject(JobRunner) private readonly runner: JobRunner,
    @Inject(ValidationReportService) private readonly reports: ValidationReportService,
    @Inject(PeopleNames) private readonly people: PeopleNames,
    @Inject(MeasureSetsService) private readonly measureSets: MeasureSetsService,
    @Inject(CAIRN_SECRETS) secrets: CairnSecrets,
  ) {
    this.pseudonym = pseudonymiser(secrets.CAIRN_PSEUDONYM_SECRET);
    this.sums = new SubmissionSums(submissions);
  }

  /** The submission, if it is this practice's; 404 otherwise. */
  private async find(practiceId: number, submissionId: number): Promise<LoadedSubmission> {
    const record = await this.submissions.find(submissionId);
    if (!record || record.practice_id !== practiceId) throw notFound(submissionId);
    return this.loader.complete(record);
  }

  async get(actor: Actor, practiceId: number, submissionId: number): Promise<SubmissionDto> {
    return toView(await this.find(practiceId, submissionId), actor);
  }

  /** A practice's submissions, grouped by audit quarter (latest quarter first). */
  async history(actor: Actor, practiceId: number): Promise<SubmissionHistoryDto> {
    const practice = (await this.organisations.practice(practiceId))!;
    const quarters = await this.quarters.list(practice.regionId);
    const records = await this.submissions.listForPractice(practiceId);
    const byId = new Map(quarters.map((q) => [q.id, q]));
    const names = await this.loader.names(practice.regionId, records);
    const views = records.map((record) =>
      toView({ record, practice, quarter: byId.get(record.quarter_id)!, names }, actor),
    );
    return {
      practice: { id: practice.id, code: practice.code, name: practice.name },
      quarters: quarters.map((quarter) => {
        const submissions = views.filter((v) => v.quarter.id === quarter.id);
        return {
          quarter,
          currentSubmissionId: submissions.find((s) => s.isCurrent)?.id ?? null,
          submissions,
          actions: {
            upload: mayWrite(actor, {
              practiceId,
              practiceRegionId: practice.regionId,
              quarterStatus: quarter.status,
            }),
          },
        };
      }),
    };
  }

  /** Where the actor may send extracts: each practice with the quarters it may take one for. */
  async uploadOptions(actor: Actor): Promise<UploadOptionsDto> {
    const quarters = await this.quarters.list(actor.regionId);
    const practices = await this.organisations.regionPractices(actor.regionId);
    return {
      quarters,
      practices: practices
        .map((p) => ({
          practice: { id: p.id, code: p.code, name: p.name, localityName: p.localityName },
          quarterIds: quarters
            .filter((q) =>
              mayWrite(actor, {
                practiceId: p.id,
                practiceRegionId: p.regionId,
                quarterStatus: q.status,
              }),
            )
            .map((q) => q.id),
        }))
        // Listed when an extract may be sent for it in an open quarter, even if none is open now.
        .filter((p) =>
          mayWrite(actor, {
            practiceId: p.practice.id,
            practiceRegionId: actor.regionId,
            quarterStatus: 'open',
          }),
        ),
    };
  }

  async issues(
    actor: Actor,
    practiceId: number,
    submissionId: number,
    query: IssueQueryDto,
  ): Promise<IssuePageDto> {
    const { practice } = await this.find(practiceId, submissionId);
    const limit = Math.min(Math.max(query.limit ?? 200, 1), 2000);
    const offset = Math.max(query.offset ?? 0, 0);
    const page = await this.submissions.issuePage(
      submissionId,
      query,
      query.sort ?? 'row',
      limit,
      offset,
    );
    const refs = seesRecordRefs(actor, practiceId);
    return {
      total: page.total,
      offset,
      limit,
      recordRefsShown: refs,
      columns: page.columns
        .filter((c) => c.column_name !== null)
        .map((c) => ({ column: c.column_name!, count: Number(c.n) })),
      items: page.items.map((i) => ({
        seq: i.seq,
        severity: i.severity,
        code: i.code,
        title: ISSUE_CODES[i.code as IssueCodeKey]?.title ?? i.code,
        row: i.source_row,
        column: i.column_name,
        columnKey: i.column_key,
        value:
          !refs && i.column_key === 'record_ref' && i.value_given
            ? this.pseudonym(practice.code, i.value_given)
            : i.value_given,
        message: i.message,
        fix: i.fix,
      })),
    };
  }

  /** The whole validation report (JSON) or its refused rows (XLSX), streamed. */
  async download(
    actor: Actor,
    practiceId: number,
    submissionId: number,
    kind: 'report.json' | 'rejected-rows.xlsx',
  ): Promise<ReportDownload> {
    const loaded = await this.find(practiceId, submissionId);
    const name = `${loaded.practice.code}-${loaded.quarter.year}Q${loaded.quarter.quarter}-${submissionId}`;
    return kind === 'report.json'
      ? {
          fileName: `cairn-report-${name}.json`,
          contentType: 'application/json; charset=utf-8',
          write: (out) => this.reports.writeJson(loaded, actor, out),
        }
      : {
          fileName: `cairn-refused-rows-${name}.xlsx`,
          contentType: 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet',
          write: (out) => this.reports.writeRejectedRowsXlsx(loaded, actor, out),
        };
  }

  private assertMay(actor: Actor, action: SubmissionAction, loaded: LoadedSubmission): void {
    assertMay(
      actor,
      action,
      {
        practiceId: loaded.practice.id,
        practiceRegionId: loaded.practice.regionId,
        quarterStatus: loaded.quarter.status,
      },
      loaded.quarter,
    );
  }

  /**
   * The current (accepted) submission of a practice for a quarter, or null when
   * it has none: readers go through the practice-quarter pointer, never by status.
   */
  async current(practiceId: number, quarterId: number): Promise<CurrentSubmission | null> {
    const row = await this.submissions.currentOf(practiceId, quarterId);
    if (!row) return null;
    const practice = await this.organisations.practice(row.practice_id);
    if (!practice) return null;
    return {
      id: row.id,
      practiceId: row.practice_id,
      practiceCode: practice.code,
      practiceName: practice.name,
      quarterId: row.quarter_id,
      records: Number(row.rows_accepted ?? 0),
      confirmedAt: new Date(row.confirmed_at).toISOString(),
      confirmedBy: row.confirmed_by_label,
    };
  }

  /**
   * The current submission of every practice of a quarter that has one (the pointers, read in
   * one SELECT): the set of submissions results of the quarter are built from.
   */
  currentSet(quarterId: number): Promise<CurrentPointer[]> {
    return this.submissions.currentPointers(quarterId);
  }

  /**
   * The current set of each of these quarters as its row names it (one SELECT of at most one
   * row a quarter; a quarter without a row gets one made from its pointers first). Changed in
   * the confirm's transaction, so it always names the set the pointers make.
   */
  async currentSetRows(quarterIds: readonly number[]): Promise<Map<number, CurrentSetRow>> {
    let rows = await this.submissions.currentSetRows(quarterIds);
    const missing = quarterIds.filter(
      (id) => !rows.some((r) => r.quarterId === id && r.version > 0),
    );
    if (missing.length > 0) {
      for (const id of missing) await this.submissions.ensureCurrentSet(id);
      rows = await this.submissions.currentSetRows(quarterIds);
    }
    return new Map(rows.map((r) => [r.quarterId, r]));
  }

  /**
   * SQL of a quarter's current-set row as one JSON value, for a read that gathers everything a
   * results route's answer depends on in one statement (see `currentSetRowsOf`).
   */
  currentSetSql(quarterIdSql: string): string {
    return this.submissions.currentSetJsonSql(quarterIdSql);
  }

  /**
   * The current-set rows of the values read by `currentSetSql`, by quarter id; a quarter whose
   * row is not made yet gets it now, as `currentSetRows` does.
   */
  async currentSetRowsOf(
    values: ReadonlyMap<number, unknown>,
  ): Promise<Map<number, CurrentSetRow>> {
    const out = new Map<number, CurrentSetRow>();
    const missing: number[] = [];
    for (const [quarterId, value] of values) {
      const row = (typeof value === 'string' ? JSON.parse(value) : value) as {
        key: string;
        count: number;
        version: number;
      } | null;
      if (!row || Number(row.version) <= 0) missing.push(quarterId);
      else {
        out.set(quarterId, {
          quarterId,
          key: row.key,
          count: Number(row.count),
          version: Number(row.version),
        });
      }
    }
    if (missing.length > 0) {
      for (const [id, row] of await this.currentSetRows(missing)) out.set(id, row);
    }
    return out;
  }

  /** The current pointers of several quarters, read in one SELECT. */
  currentSets(quarterIds: readonly number[]): Promise<(CurrentPointer & { quarterId: number })[]> {
    return this.submissions.currentPointersOf(quarterIds);
  }

  /**
   * The key of each quarter's current set (SHA-256 hex of the sorted submission ids, as the
   * benchmark store keys it), read from the quarters' current-set rows; absent for a quarter
   * without current submissions.
   */
  async currentSetKeys(quarterIds: readonly number[]): Promise<Map<number, string>> {
    const rows = await this.currentSetRows(quarterIds);
    return new Map([...rows].filter(([, row]) => row.count > 0).map(([id, row]) => [id, row.key]));
  }

  /**
   * The decoded sums of current submissions under a measure-set version, by submission id.
   * Sums missing or unreadable (an older database, another measure set) are computed again from
   * the submission's records and stored.
   */
  sumsOfCurrent(
    subjects: readonly SumsSubject[],
    version: MeasureSetVersion,
    quarter: { year: number; quarter: 1 | 2 | 3 | 4 },
  ): Promise<Map<number, PracticeSums>> {
    return this.sums.ofCurrent(subjects, version, { year: quarter.year, quarter: quarter.quarter });
  }

  /**
   * A full recompute of a quarter's sums from records: every current record in one streamed
   * read, every current submission's sums under `version` stored again. `subjects` must be the
   * quarter's current submissions (currentSet) with their practices' codes.
   */
  recomputeSums(
    quarterId: number,
    subjects: readonly SumsSubject[],
    version: MeasureSetVersion,
    quarter: { year: number; quarter: 1 | 2 | 3 | 4 },
  ): Promise<Map<number, PracticeSums>> {
    return this.sums.recomputeQuarter(quarterId, subjects, version, {
      year: quarter.year,
      quarter: quarter.quarter,
    });
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
      const rows = await this.submissions.recordBatch(submission.id, after, batchSize);
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
    const found = await this.submissions.recordsAt(submission.id, rows);
    return found.map((r) => toStoredRecord(r, submission.practiceCode));
  }

  /**
   * The clinical data-quality flags of a submission (docs/methods.md §7): every
   * flag check Cairn has, with the number of records it flagged (0 included),
   * from the issue counts stored when the extract was checked.
   */
  async dataQualityFlags(submissionId: number): Promise<DataQualityFlagCount[]> {
    const row = Number.isSafeInteger(submissionId)
      ? await this.submissions.find(submissionId)
      : null;
    if (!row) throw notFound(submissionId);
    return dataQualityCounts(summaryJson(row).issueCounts ?? {});
  }

  /**
   * Facts of confirmed submissions (records, when confirmed, data-quality flag counts), by id,
   * read in one SELECT for those not already known (they never change once confirmed).
   */
  async confirmedFacts(ids: readonly number[]): Promise<Map<number, ConfirmedFacts>> {
    const out = new Map<number, ConfirmedFacts>();
    const wanted = ids.filter((id) => {
      const known = this.facts.get(id);
      if (known) out.set(id, known);
      return !known;
    });
    for (const row of await this.submissions.confirmedFacts(wanted)) {
      const counts = summaryJson(row).issueCounts ?? {};
      const facts: ConfirmedFacts = {
        id: Number(row.id),
        practiceId: Number(row.practice_id),
        records: Number(row.rows_accepted ?? 0),
        confirmedAt: new Date(row.confirmed_at!).toISOString(),
        dataQuality: dataQualityCounts(counts),
      };
      out.set(facts.id, facts);
      if (this.facts.size >= FACTS_CACHE) this.facts.clear();
      this.facts.set(facts.id, facts);
    }
    return out;
  }

  /** Called with the quarter after each confirm's transaction has committed. */
  onConfirmed(listener: (quarter: QuarterDto) => void): void {
    this.confirmedListeners.push(listener);
  }

  /** Makes a submission current for its practice and quarter (atomically). */
  async confirm(actor: Actor, practiceId: number, submissionId: number): Promise<SubmissionDto> {
    const loaded = await this.find(practiceId, submissionId);
    this.assertMay(actor, 'confirm', loaded);
    const { record: row, quarter } = loaded;
    /** What was current when this request read the practice-quarter */
    const expected = row.current_submission_id ?? null;
    if (row.status !== 'awaiting_confirmation') throw notAwaiting(submissionId, row.status);
    // The submission's sums under the quarter's measure set, from its own records (they never
    // change once staged): computed before the transaction, inserted inside it, so that a
    // current submission always has them.
    const sums = await this.sums.forConfirm(
      {
        submissionId,
        practiceCode: loaded.practice.code,
        records: Number(row.rows_accepted ?? 0),
      },
      await this.measureSets.get(quarter.measureSetId),
      { year: quarter.year, quarter: quarter.quarter },
    );
    // The pointer row and the quarter's current-set row exist before the transaction, so the
    // locks below are plain row locks.
    await this.submissions.ensurePracticeQuarter(row.practice_id, row.quarter_id);
    await this.submissions.ensureCurrentSet(row.quarter_id);
    for (let attempt = 0; ; attempt++) {
      try {
        await this.submissions.transaction(async (transaction) => {
          // The quarter's current set first: confirms of one quarter change it one at a time.
          await this.submissions.lockCurrentSet(row.quarter_id, transaction);
          const previous = await this.submissions.lockPracticeQuarter(
            row.practice_id,
            row.quarter_id,
            transaction,
          );
          const status = await this.submissions.lockStatus(submissionId, transaction);
          if (status !== 'awaiting_confirmation') throw notAwaiting(submissionId, status);
          // Someone else switched this practice-quarter after this request read it (two confirms
          // at once): refuse rather than silently replace what they just made current.
          if (previous !== expected) {
            throw new ProblemException(
              HttpStatus.CONFLICT,
              'current-submission-changed',
              'Another submission was just made current',
              `While this confirm was being handled, ${previous === null ? 'the current submission was withdrawn' : `submission ${previous} was made current`} for ${quarter.label}, so submission ${submissionId} was not confirmed. Look at the practice's submissions again, then confirm this one if it should replace it.`,
              { currentSubmissionId: previous },
            );
          }
          if (previous !== null && previous > submissionId) {
            throw new ProblemException(
              HttpStatus.CONFLICT,
              'newer-submission-current',
              'A newer submission is current',
              `Submission ${previous}, uploaded after this one, is already current for ${quarter.label}; confirming this older one would replace newer data. Upload the file again if it is the right one.`,
              { currentSubmissionId: previous },
            );
          }
          await this.submissions.switchCurrent(
            { id: submissionId, practiceId: row.practice_id, quarterId: row.quarter_id },
            previous,
            actor,
            transaction,
          );
          await this.submissions.writeCurrentSet(row.quarter_id, transaction);
          await this.submissions.insertSums(sums, transaction);
          await this.audit.append(
            {
              action: 'submission.confirmed',
              summary: `Submission ${submissionId} confirmed: now current for ${quarter.label} with ${row.rows_accepted ?? 0} records${previous !== null ? ` (replaces submission ${previous}, now superseded)` : ''}`,
              actor,
              regionId: loaded.practice.regionId,
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
    for (const listener of this.confirmedListeners) listener(quarter);
    return this.get(actor, practiceId, submissionId);
  }

  async cancel(actor: Actor, practiceId: number, submissionId: number): Promise<SubmissionDto> {
    const loaded = await this.find(practiceId, submissionId);
    this.assertMay(actor, 'cancel', loaded);
    const row = loaded.record;
    const cancelled = await this.submissions.transaction(async (transaction) => {
      if (!(await this.submissions.cancel(submissionId, actor.label, transaction))) return false;
      await this.audit.append(
        {
          action: 'submission.cancelled',
          summary: `Submission ${submissionId} cancelled (was ${row.status.replace(/_/g, ' ')}); nothing from it is used`,
          actor,
          regionId: loaded.practice.regionId,
          practiceId: row.practice_id,
          subjectType: 'submission',
          subjectId: submissionId,
        },
        transaction,
      );
      return true;
    });
    if (!cancelled) {
      const fresh = (await this.submissions.find(submissionId))!;
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
    await this.submissions.purge(submissionId);
    return this.get(actor, practiceId, submissionId);
  }

  async retry(actor: Actor, practiceId: number, submissionId: number): Promise<SubmissionDto> {
    const loaded = await this.find(practiceId, submissionId);
    this.assertMay(actor, 'retry', loaded);
    const row = loaded.record;
    const retried = await this.submissions.transaction(async (transaction) => {
      if (!(await this.submissions.retry(submissionId, transaction))) return false;
      await this.audit.append(
        {
          action: 'submission.retried',
          summary: `Checking submission ${submissionId} again after it failed`,
          actor,
          regionId: loaded.practice.regionId,
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
    return this.get(actor, practiceId, submissionId);
  }

  /** The region's coverage for one quarter: which practices have a current submission, which are waiting, which have none. */
  async coverage(actor: Actor, quarterId: number): Promise<CoverageDto> {
    const quarter = await this.quarters.get(actor, quarterId);
    const practices = await this.organisations.regionPractices(actor.regionId, {
      activeOnly: true,
    });
    const currents = await this.submissions.currentOfQuarter(quarterId);
    const current = new Map(currents.map((c) => [c.practice_id, c]));
    const names = await this.people.byEmail(
      actor.regionId,
      currents.map((c) => c.confirmed_by),
    );
    const others = await this.submissions.outstandingOfQuarter(quarterId);
    const latestOther = new Map<number, (typeof others)[number][]>();
    for (const o of others)
      latestOther.set(o.practice_id, [...(latestOther.get(o.practice_id) ?? []), o]);
    const rows = practices.map((p) => {
      const cur = current.get(p.id) ?? null;
      const pending = latestOther.get(p.id) ?? [];
      const awaiting = pending.find(
        (o) => o.status === 'awaiting_confirmation' || o.status === 'processing',
      );
      const state = cur !== null ? 'current' : awaiting ? 'awaiting_confirmation' : 'none';
      const lastProblem =
        pending.find((o) => o.status === 'rejected' || o.status === 'failed') ?? null;
      return {
        practice: { id: p.id, code: p.code, name: p.name, localityName: p.localityName },
        state: state as 'current' | 'awaiting_confirmation' | 'none',
        current:
          cur === null
            ? null
            : {
                submissionId: cur.current_id,
                records: cur.current_rows,
                confirmedAt: cur.confirmed_at ? new Date(cur.confirmed_at).toISOString() : null,
                confirmedBy: cur.confirmed_by
                  ? (names.get(cur.confirmed_by) ?? cur.confirmed_by)
                  : null,
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
              reason:
                lastProblem.status === 'failed'
                  ? 'Cairn could not finish checking it'
                  : lastProblem.refusal_code
                    ? issueTitle(lastProblem.refusal_code)
                    : 'Refused',
              uploadedAt: new Date(lastProblem.uploaded_at).toISOString(),
            }
          : null,
      };
    });
    // The three states are a partition: every practice is counted once.
    const count = (state: string) => rows.filter((r) => r.state === state).length;
    return {
      quarter,
      totals: {
        practices: rows.length,
        current: count('current'),
        currentWithWaiting: rows.filter((r) => r.state === 'current' && r.waiting.length > 0)
          .length,
        awaitingConfirmation: count('awaiting_confirmation'),
        none: count('none'),
        records: rows.reduce((n, r) => n + (r.current?.records ?? 0), 0),
      },
      practices: rows,
    };
  }
}
