/**
 * Review cases: an auditor opens one from a flagged practice × measure
 * (freezing the figures that prompted it), asks the practice, the practice's
 * leads are told by e-mail and answer in Cairn with text and attachments, and
 * the auditor closes it with a finding. Who may do what is review-case-policy.ts;
 * every write is one transaction with its audit-trail events (and, for a
 * question, its e-mail in the outbox); every state change names the version it
 * was made from, and the loser of two changes at once gets 409 with the case
 * as it now is.
 */
import { createHash } from 'node:crypto';
import { HttpStatus, Inject, Injectable } from '@nestjs/common';
import type { Transaction } from 'sequelize';
import { AuditTrailService } from '../audit-trail/audit-trail.service.js';
import type { Actor } from '../auth/actor.js';
import { ProblemException } from '../common/problem.js';
import { MeasureSetsService } from '../measure-sets/measure-sets.service.js';
import {
  CLINICAL_CAUTION,
  OrganisationsService,
  type PracticeInfo,
} from '../organisations/organisations.service.js';
import type { QuarterDto } from '../quarters/dto/quarter.dto.js';
import { QuartersService } from '../quarters/quarters.service.js';
import { ATTACHMENT_KINDS, type AttachmentKind } from './attachment-check.js';
import type {
  CaseEntryDto,
  CommentDto,
  ListCasesQueryDto,
  OpenCaseDto,
  ReviewCaseDto,
  ReviewCaseListDto,
  ReviewCaseSummaryDto,
  TransitionDto,
} from './dto/review-case.dto.js';
import { evidenceOf } from './outliers/evidence.js';
import { OUTLIER_SOURCE, type OutlierSource } from './outliers/outlier-source.js';
import { ReviewCaseMail } from './review-case-mail.js';
import {
  actionsFor,
  assertMay,
  type CaseAction,
  FINDING_LABELS,
  FINDINGS,
  maySee,
  mayOpen,
  NEXT_STATUS,
  refusal,
  seesInternal,
  STATUS_LABELS,
} from './review-case-policy.js';
import {
  type CaseRow,
  type EntryRow,
  type FileRow,
  ReviewCaseRepository,
} from './review-case.repository.js';

/** An attachment as received, already checked. */
export interface ReceivedFile {
  fileName: string;
  kind: AttachmentKind;
  bytes: Buffer;
}

const iso = (d: Date | string | null) => (d === null ? null : new Date(d).toISOString());

@Injectable()
export class ReviewCasesService {
  constructor(
    @Inject(ReviewCaseRepository) private readonly cases: ReviewCaseRepository,
    @Inject(QuartersService) private readonly quarters: QuartersService,
    @Inject(OrganisationsService) private readonly organisations: OrganisationsService,
    @Inject(MeasureSetsService) private readonly measureSets: MeasureSetsService,
    @Inject(AuditTrailService) private readonly audit: AuditTrailService,
    @Inject(OUTLIER_SOURCE) private readonly source: OutlierSource,
    @Inject(ReviewCaseMail) private readonly mail: ReviewCaseMail,
  ) {}

  // ── reading ──

  async list(actor: Actor, query: ListCasesQueryDto): Promise<ReviewCaseListDto> {
    const rows = await this.cases.list({
      regionId: actor.regionId,
      practiceIds: actor.role === 'practice_lead' ? actor.practiceIds : undefined,
      quarterId: query.quarterId,
      practiceId: query.practiceId,
      status: query.status,
    });
    const summaries: ReviewCaseSummaryDto[] = [];
    const context = this.contextCache();
    for (const row of rows) summaries.push(await this.summary(row, context));
    return {
      cases: summaries,
      findings: FINDINGS.map((key) => ({ key, label: FINDING_LABELS[key] })),
      mayOpen: mayOpen(actor),
    };
  }

  async get(actor: Actor, id: number): Promise<ReviewCaseDto> {
    const row = await this.visible(actor, id);
    return this.view(actor, row);
  }

  /** An attachment's name, type and bytes (never one of an internal entry for a practice lead). */
  async file(
    actor: Actor,
    caseId: number,
    fileId: number,
  ): Promise<{ fileName: string; mediaType: string; bytes: Buffer }> {
    await this.visible(actor, caseId);
    const file = await this.cases.file(caseId, fileId);
    if (!file || (file.visibility === 'internal' && !seesInternal(actor))) {
      throw new ProblemException(
        HttpStatus.NOT_FOUND,
        'case-file-not-found',
        'No such attachment',
        `Review case ${caseId} has no attachment ${fileId}.`,
      );
    }
    return {
      fileName: file.file_name,
      mediaType: file.media_type,
      bytes: await this.cases.fileBytes(file.id),
    };
  }

  // ── writing ──

  async open(actor: Actor, input: OpenCaseDto): Promise<ReviewCaseDto> {
    if (!mayOpen(actor)) {
      throw new ProblemException(
        HttpStatus.FORBIDDEN,
        'case-action-not-allowed',
        'Not allowed',
        'Only auditors open review cases.',
      );
    }
    const quarter = await this.quarters.get(actor, input.quarterId);
    const practice = await this.organisations.practice(input.practiceId);
    if (!practice || practice.regionId !== actor.regionId) {
      throw new ProblemException(
        HttpStatus.NOT_FOUND,
        'practice-not-found',
        'No such practice',
        `There is no practice ${input.practiceId} in your region.`,
        { errors: [{ field: 'practiceId', message: 'no such practice in your region' }] },
      );
    }
    const version = await this.measureSets.get(quarter.measureSetId);
    const measure = version.measures.find((m) => m.key === input.measureKey);
    if (!measure) {
      throw new ProblemException(
        HttpStatus.NOT_FOUND,
        'measure-not-found',
        'No such measure',
        `The measure set of ${quarter.label} (${version.id}) has no measure "${input.measureKey}". Its measures are: ${version.measures.map((m) => m.key).join(', ')}.`,
        { errors: [{ field: 'measureKey', message: 'not in the quarter’s measure set' }] },
      );
    }
    const split = input.split ?? 'all';
    const basis = await this.source.basisOf(quarter);
    if (!basis || !basis.submissionOf.has(practice.code)) {
      throw new ProblemException(
        HttpStatus.CONFLICT,
        'no-figures-to-review',
        'No figures to review',
        `${practice.name} (${practice.code}) has no current submission for ${quarter.label}, so there are no figures to open a review case on.`,
      );
    }
    const { evidence } = evidenceOf(basis, practice.code, measure.key, split, {
      level: 'inner',
      caseMix: input.caseMix ?? false,
    });
    const existing = (await this.cases.unclosedOf(quarter.id)).get(
      `${practice.id}/${measure.key}/${split}`,
    );
    if (existing) {
      throw new ProblemException(
        HttpStatus.CONFLICT,
        'case-already-open',
        'A review case is already open',
        `Review case ${existing.id} about ${practice.code} on ${measure.label} in ${quarter.label} is not closed yet: continue there.`,
        { caseId: existing.id },
      );
    }
    const title = `${practice.code} · ${measure.label} · ${quarter.label}`;
    const id = await this.cases.transaction(async (transaction) => {
      const caseId = await this.cases.insertCase(
        {
          regionId: actor.regionId,
          practiceId: practice.id,
          quarterId: quarter.id,
          measureKey: measure.key,
          split,
          title,
          evidence,
          openedBy: { id: actor.id, label: actor.label },
        },
        transaction,
      );
      await this.cases.appendEntry(
        {
          caseId,
          kind: 'opened',
          visibility: 'internal',
          body: input.note?.trim() || `Opened on: ${evidence.reason}`,
          toStatus: 'open',
          author: this.author(actor),
        },
        transaction,
      );
      await this.event(actor, 'review_case.opened', `Review case ${caseId} opened: ${title}`, {
        caseId,
        practiceId: practice.id,
        regionId: actor.regionId,
        detail: { quarterId: quarter.id, measure: measure.key, split, resultId: basis.resultId },
        transaction,
      });
      return caseId;
    });
    return this.get(actor, id);
  }

  async transition(actor: Actor, id: number, input: TransitionDto): Promise<ReviewCaseDto> {
    const row = await this.visible(actor, id);
    const action: CaseAction = input.action;
    await this.guard(actor, row, action);
    const message = input.message.trim();
    if (action === 'ask' && message === '') throw emptyText('message', 'The question is empty');
    if (action === 'close' && !input.finding) {
      throw new ProblemException(
        HttpStatus.BAD_REQUEST,
        'validation',
        'The request is not valid',
        'Choose a finding to close the case with.',
        { errors: [{ field: 'finding', message: `one of ${FINDINGS.join(', ')}` }] },
      );
    }
    await this.assertVersion(row, input.expectedVersion, actor);
    const to = NEXT_STATUS[action]!;
    const finding = action === 'close' ? input.finding! : null;
    const practice = (await this.organisations.practice(row.practice_id))!;
    await this.cases.transaction(async (transaction) => {
      await this.change(actor, row, to, finding, transaction);
      const entryId = await this.cases.appendEntry(
        {
          caseId: row.id,
          kind: action === 'ask' ? 'question' : 'state',
          visibility: 'practice',
          body: message,
          fromStatus: row.status,
          toStatus: to,
          finding,
          author: this.author(actor),
        },
        transaction,
      );
      const words = {
        ask: 'question sent to the practice',
        close: `closed: ${finding ? FINDING_LABELS[finding] : ''}`,
        reopen: 'reopened',
      }[input.action];
      await this.event(
        actor,
        `review_case.${input.action === 'ask' ? 'asked' : input.action === 'close' ? 'closed' : 'reopened'}`,
        `Review case ${row.id} ${words}`,
        {
          caseId: row.id,
          practiceId: row.practice_id,
          regionId: row.region_id,
          detail: { from: row.status, to, entryId, ...(finding ? { finding } : {}) },
          transaction,
        },
      );
      if (action === 'ask') {
        await this.mail.queueQuestion(actor, row, practice, entryId, transaction);
      }
    });
    return this.get(actor, id);
  }

  async comment(actor: Actor, id: number, input: CommentDto): Promise<ReviewCaseDto> {
    const row = await this.visible(actor, id);
    const action: CaseAction = input.visibility === 'internal' ? 'note' : 'comment';
    await this.guard(actor, row, action);
    const body = input.body.trim();
    if (body === '') throw emptyText('body', 'The comment is empty');
    await this.cases.transaction(async (transaction) => {
      const entryId = await this.cases.appendEntry(
        {
          caseId: row.id,
          kind: action === 'note' ? 'note' : 'question',
          visibility: input.visibility,
          body,
          author: this.author(actor),
        },
        transaction,
      );
      await this.cases.touch(row.id, transaction);
      await this.event(
        actor,
        action === 'note' ? 'review_case.noted' : 'review_case.commented',
        `Review case ${row.id}: ${action === 'note' ? 'internal note' : 'comment the practice sees'} added`,
        {
          caseId: row.id,
          practiceId: row.practice_id,
          regionId: row.region_id,
          detail: { entryId, visibility: input.visibility },
          transaction,
        },
      );
    });
    return this.get(actor, id);
  }

  /** The practice's answer, with its attachments (already checked by content and size). */
  async answer(
    actor: Actor,
    id: number,
    input: { text: string; expectedVersion: number | null; files: ReceivedFile[] },
  ): Promise<ReviewCaseDto> {
    const row = await this.visible(actor, id);
    await this.guard(actor, row, 'answer');
    const text = input.text.trim();
    if (text === '') throw emptyText('text', 'The answer is empty');
    if (input.expectedVersion === null) {
      throw new ProblemException(
        HttpStatus.BAD_REQUEST,
        'validation',
        'The request is not valid',
        'Send the case’s version as expectedVersion.',
        { errors: [{ field: 'expectedVersion', message: 'a whole number' }] },
      );
    }
    await this.assertVersion(row, input.expectedVersion, actor);
    await this.cases.transaction(async (transaction) => {
      await this.change(actor, row, 'responded', null, transaction);
      const entryId = await this.cases.appendEntry(
        {
          caseId: row.id,
          kind: 'answer',
          visibility: 'practice',
          body: text,
          fromStatus: row.status,
          toStatus: 'responded',
          author: this.author(actor),
        },
        transaction,
      );
      await this.event(
        actor,
        'review_case.answered',
        `Review case ${row.id} answered by the practice`,
        {
          caseId: row.id,
          practiceId: row.practice_id,
          regionId: row.region_id,
          detail: { from: row.status, to: 'responded', entryId, files: input.files.length },
          transaction,
        },
      );
      for (const f of input.files) {
        const sha256 = createHash('sha256').update(f.bytes).digest('hex');
        const fileId = await this.cases.insertFile(
          {
            caseId: row.id,
            entryId,
            fileName: f.fileName,
            mediaType: ATTACHMENT_KINDS[f.kind].mediaType,
            sha256,
            bytes: f.bytes,
          },
          transaction,
        );
        await this.event(
          actor,
          'review_case.file_added',
          `Review case ${row.id}: attachment "${f.fileName}" (${ATTACHMENT_KINDS[f.kind].label}, ${f.bytes.length} bytes)`,
          {
            caseId: row.id,
            practiceId: row.practice_id,
            regionId: row.region_id,
            detail: {
              entryId,
              fileId,
              sha256,
              size: f.bytes.length,
              mediaType: ATTACHMENT_KINDS[f.kind].mediaType,
            },
            transaction,
          },
        );
      }
    });
    return this.get(actor, id);
  }

  // ── steps ──

  /** The case, if the actor may see it: 404 outside the region, 403 another practice's. */
  private async visible(actor: Actor, id: number): Promise<CaseRow> {
    const row = await this.cases.find(id);
    if (!row || row.region_id !== actor.regionId) {
      throw new ProblemException(
        HttpStatus.NOT_FOUND,
        'case-not-found',
        'No such review case',
        `There is no review case ${id} in your region.`,
      );
    }
    if (!maySee(actor, { regionId: row.region_id, practiceId: row.practice_id })) {
      throw new ProblemException(
        HttpStatus.FORBIDDEN,
        'practice-not-yours',
        'Not your practice',
        `Review case ${id} is about a practice you do not lead.`,
      );
    }
    return row;
  }

  private policyCase(row: CaseRow) {
    return { regionId: row.region_id, practiceId: row.practice_id, status: row.status };
  }

  private async currentView(
    actor: Actor,
    id: number,
    transaction?: Transaction,
  ): Promise<ReviewCaseDto | null> {
    // Read outside the caller's transaction: the other change has committed.
    void transaction;
    const row = await this.cases.find(id);
    return row ? this.view(actor, row) : null;
  }

  /** Refuses (with the case as it is) an action the policy does not allow now. */
  private async guard(actor: Actor, row: CaseRow, action: CaseAction): Promise<void> {
    if (refusal(actor, this.policyCase(row), action) === null) return;
    assertMay(actor, this.policyCase(row), action, await this.currentView(actor, row.id));
  }

  private async assertVersion(row: CaseRow, expected: number, actor: Actor): Promise<void> {
    if (row.version === expected) return;
    throw changed(row, await this.currentView(actor, row.id));
  }

  /** The status change itself; 409 with the current case when someone else changed it first. */
  private async change(
    actor: Actor,
    row: CaseRow,
    to: CaseRow['status'],
    finding: CaseRow['finding'],
    transaction: Transaction,
  ): Promise<void> {
    const done = await this.cases.changeStatus(
      row.id,
      { version: row.version, status: row.status },
      to,
      finding,
      transaction,
      actor.displayName,
    );
    if (!done) throw changed(row, await this.currentView(actor, row.id, transaction));
  }

  private author(actor: Actor) {
    return { id: actor.id, label: actor.label, name: actor.displayName, role: actor.role };
  }

  private event(
    actor: Actor,
    action: string,
    summary: string,
    o: {
      caseId: number;
      practiceId: number;
      regionId: number;
      detail?: Record<string, unknown>;
      transaction: Transaction;
    },
  ) {
    return this.audit.append(
      {
        action,
        summary,
        actor: { id: actor.id, label: actor.label },
        regionId: o.regionId,
        practiceId: o.practiceId,
        subjectType: 'review_case',
        subjectId: o.caseId,
        detail: o.detail ?? null,
        requestId: actor.requestId,
        ipAddress: actor.ipAddress,
      },
      o.transaction,
    );
  }

  // ── views ──

  private contextCache() {
    const quarters = new Map<number, Promise<QuarterDto | null>>();
    const practices = new Map<number, Promise<PracticeInfo | null>>();
    return {
      quarter: (id: number) => {
        let q = quarters.get(id);
        if (!q) quarters.set(id, (q = this.quarters.find(id)));
        return q;
      },
      practice: (id: number) => {
        let p = practices.get(id);
        if (!p) practices.set(id, (p = this.organisations.practice(id)));
        return p;
      },
    };
  }

  private async summary(
    row: CaseRow,
    context = this.contextCache(),
  ): Promise<ReviewCaseSummaryDto> {
    const [quarter, practice] = await Promise.all([
      context.quarter(row.quarter_id),
      context.practice(row.practice_id),
    ]);
    const version = quarter ? await this.measureSets.get(quarter.measureSetId) : null;
    const measure = version?.measures.find((m) => m.key === row.measure_key);
    return {
      id: row.id,
      title: row.title,
      practice: {
        id: row.practice_id,
        code: practice?.code ?? '',
        name: practice?.name ?? '',
        localityName: practice?.localityName ?? null,
      },
      quarter: { id: row.quarter_id, label: quarter?.label ?? '' },
      measure: {
        key: row.measure_key,
        label: measure?.label ?? row.measure_key,
        source: measure?.source ?? '',
      },
      split: row.split,
      status: row.status,
      statusLabel: STATUS_LABELS[row.status],
      version: row.version,
      finding: row.finding,
      findingLabel: row.finding ? FINDING_LABELS[row.finding] : null,
      openedBy: row.opened_by_label,
      openedAt: iso(row.opened_at)!,
      updatedAt: iso(row.updated_at)!,
      closedAt: iso(row.closed_at),
      reopened: row.reopened_at
        ? {
            at: iso(row.reopened_at)!,
            by: row.reopened_by_name ?? '',
            previousFinding: row.previous_finding,
            previousFindingLabel: row.previous_finding
              ? FINDING_LABELS[row.previous_finding]
              : null,
            previousClosedAt: iso(row.previous_closed_at),
          }
        : null,
    };
  }

  private async view(actor: Actor, row: CaseRow): Promise<ReviewCaseDto> {
    const internal = seesInternal(actor);
    const [summary, entries, files] = await Promise.all([
      this.summary(row),
      this.cases.entries(row.id, internal),
      this.cases.files(row.id),
    ]);
    return {
      ...summary,
      evidence: row.evidence as ReviewCaseDto['evidence'],
      actions: actionsFor(actor, this.policyCase(row)),
      timeline: entries.map((e) => entryDto(e, files)),
      caution: CLINICAL_CAUTION,
    };
  }
}

function entryDto(e: EntryRow, files: readonly FileRow[]): CaseEntryDto {
  return {
    id: e.id,
    kind: e.kind,
    visibility: e.visibility,
    body: e.body,
    fromStatus: e.from_status,
    toStatus: e.to_status,
    finding: e.finding,
    authorName: e.author_name,
    authorRole: e.author_role,
    at: iso(e.created_at)!,
    files: files
      .filter((f) => f.entry_id === e.id)
      .map((f) => ({
        id: f.id,
        fileName: f.file_name,
        mediaType: f.media_type,
        sizeBytes: f.size_bytes,
        path: `/api/review-cases/${e.case_id}/files/${f.id}`,
      })),
  };
}

function emptyText(field: string, title: string): ProblemException {
  return new ProblemException(
    HttpStatus.UNPROCESSABLE_ENTITY,
    'empty-text',
    title,
    'Write something first: an empty text is not stored.',
    { errors: [{ field, message: 'must not be empty' }] },
  );
}

/**
 * 409: the case changed since the caller read it. The current case is sent along (as the
 * caller may see it) so that the page can show what happened.
 */
function changed(row: CaseRow, current: ReviewCaseDto | null): ProblemException {
  return new ProblemException(
    HttpStatus.CONFLICT,
    'case-changed',
    'The review case has changed',
    `Someone changed review case ${row.id} since you read it; nothing was stored. Read it again and decide whether your change still applies.`,
    { case: current },
  );
}
