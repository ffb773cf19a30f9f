/**
 * Receiving an extract: the multipart upload is streamed (busboy) into
 * extract_file_chunks under a new submission, hashed on the way, and counted
 * against the size limit. When it has all arrived the submission is queued for
 * any API process to check. A bounded copy of the bytes may stay in memory
 * for a minute (UploadHandoff), so that this process, which is kicked to
 * check it at once, need not read the file back from MariaDB.
 *
 * Refused here, before any checking: an upload carrying more than one file
 * (nothing is kept), a file over the size limit (a rejected submission, so
 * history shows it), and a file identical (SHA-256) to one already current,
 * awaiting confirmation, being checked or refused for the same practice and
 * quarter (nothing is created).
 */
import { createHash } from 'node:crypto';
import { HttpStatus, Inject, Injectable } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import busboy from 'busboy';
import type { Request } from 'express';
import { AuditTrailService } from '../audit-trail/audit-trail.service.js';
import type { Actor } from '../auth/actor.js';
import { ProblemException } from '../common/problem.js';
import type { CairnConfig } from '../config/config.schema.js';
import { OrganisationsService, type PracticeInfo } from '../organisations/organisations.service.js';
import type { QuarterDto } from '../quarters/dto/quarter.dto.js';
import { QuartersService } from '../quarters/quarters.service.js';
import { PeopleNames } from '../users/people-names.js';
import type { DateConvention } from './dto/submission.dto.js';
import { JobRunner, UPLOAD_LEASE_PREFIX } from './job-runner.service.js';
import { assertMay } from './submission-policy.js';
import { FILE_CHUNK_BYTES, SubmissionRepository } from './submission.repository.js';
import { type HandoffCollector, UploadHandoff } from './upload-handoff.js';

export interface ExtractUpload {
  fileName: string;
  /** The file's bytes, as an async stream of chunks */
  chunks: AsyncIterable<Buffer>;
  /** Set when the stream was cut at the size limit */
  truncated: () => boolean;
  /**
   * Settles once the whole request has been read, after the file's last byte: rejects when the
   * upload turns out not to be acceptable (a second file in it), so that nothing is kept.
   */
  complete?: () => Promise<void>;
}

export function cleanFileName(name: string): string {
  // eslint-disable-next-line no-control-regex
  const control = /[\u0000-\u001f\u007f]/g;
  const base = name
    .replace(/^.*[\\/]/, '')
    .replace(control, '')
    .trim();
  return (base || 'extract').slice(0, 255);
}

/** An upload with more than one file: which one is the extract cannot be known, so none is taken. */
const severalFiles = (parts: number) =>
  new ProblemException(
    HttpStatus.BAD_REQUEST,
    'upload-several-files',
    'Send one file at a time',
    `The upload carried ${parts > 10 ? 'more than 10' : parts} files; Cairn takes one extract per upload, so none of them was kept. Send the extract alone, in a part named "file".`,
  );

const fmtMb = (bytes: number) =>
  `${(bytes / 1_048_576).toFixed(bytes < 10 * 1_048_576 ? 1 : 0)} MB`;

@Injectable()
export class IntakeService {
  constructor(
    @Inject(SubmissionRepository) private readonly submissions: SubmissionRepository,
    @Inject(OrganisationsService) private readonly organisations: OrganisationsService,
    @Inject(ConfigService) private readonly config: ConfigService<CairnConfig, true>,
    @Inject(AuditTrailService) private readonly audit: AuditTrailService,
    @Inject(QuartersService) private readonly quarters: QuartersService,
    @Inject(JobRunner) private readonly runner: JobRunner,
    @Inject(UploadHandoff) private readonly handoff: UploadHandoff,
    @Inject(PeopleNames) private readonly people: PeopleNames,
  ) {}

  /** The practice and quarter, checked: the quarter is the practice's region's, and the actor may upload to it. */
  async destination(
    actor: Actor,
    practiceId: number,
    quarterId: number,
  ): Promise<{ practice: PracticeInfo; quarter: QuarterDto }> {
    const practice = await this.organisations.practice(practiceId);
    const quarter = await this.quarters.find(quarterId);
    if (!practice || !quarter || quarter.regionId !== practice.regionId) {
      throw new ProblemException(
        HttpStatus.NOT_FOUND,
        'quarter-not-found',
        'No such audit quarter',
        `There is no audit quarter ${quarterId} for this practice's region.`,
        { quarterId },
      );
    }
    assertMay(
      actor,
      'upload',
      { practiceId, practiceRegionId: practice.regionId, quarterStatus: quarter.status },
      quarter,
    );
    return { practice, quarter };
  }

  /** Reads a multipart request with one file part into an ExtractUpload, then stores it. */
  async receiveRequest(
    req: Request,
    actor: Actor,
    practiceId: number,
    quarterId: number,
    dateConvention: DateConvention | null,
  ): Promise<number> {
    await this.destination(actor, practiceId, quarterId);
    const type = req.headers['content-type'] ?? '';
    if (!/^multipart\/form-data/i.test(type)) {
      throw new ProblemException(
        HttpStatus.UNSUPPORTED_MEDIA_TYPE,
        'upload-not-multipart',
        'Send the extract as a file upload',
        'The extract must be sent as multipart/form-data with the file in a part named "file".',
      );
    }
    const maxBytes = this.config.get('extracts', { infer: true }).maxBytes;
    const parser = busboy({
      headers: req.headers,
      limits: { files: 10, fileSize: maxBytes, fields: 20, parts: 30 },
    });
    let result: Promise<number> | null = null;
    let fileParts = 0;
    const finished = new Promise<void>((resolve, reject) => {
      parser.on('file', (field, stream, info) => {
        fileParts++;
        if (field !== 'file' || result) {
          stream.resume();
          return;
        }
        let truncated = false;
        stream.on('limit', () => (truncated = true));
        result = this.store(actor, practiceId, quarterId, dateConvention, {
          fileName: info.filename ?? 'extract',
          chunks: stream as AsyncIterable<Buffer>,
          truncated: () => truncated,
          complete: async () => {
            await finished;
            if (fileParts > 1) throw severalFiles(fileParts);
          },
        });
        // Keep the request flowing even when storing fails, so the answer can be sent.
        result.catch(() => stream.resume());
      });
      parser.on('filesLimit', () => (fileParts = Math.max(fileParts, 11)));
      parser.on('close', () => resolve());
      parser.on('error', (error) => reject(error));
    });
    req.pipe(parser);
    try {
      await finished;
    } catch {
      throw new ProblemException(
        HttpStatus.BAD_REQUEST,
        'upload-malformed',
        'The upload could not be read',
        'The upload was cut off or is not valid multipart/form-data. Try again.',
      );
    }
    if (fileParts > 1 && !result) throw severalFiles(fileParts);
    if (!result) {
      throw new ProblemException(
        HttpStatus.BAD_REQUEST,
        'upload-no-file',
        'No file in the upload',
        'Choose the extract file (.xlsx or .csv) and send it in a part named "file".',
      );
    }
    return result;
  }

  /**
   * Stores an extract's bytes under a new submission and queues it. Returns
   * the submission id. Used by the upload route and by the demo seeding.
   */
  async store(
    actor: Actor,
    practiceId: number,
    quarterId: number,
    dateConvention: DateConvention | null,
    upload: ExtractUpload,
  ): Promise<number> {
    // What is written, in order, for this process's job runner to check without reading it back.
    const kept = this.handoff.collector(this.config.get('extracts', { infer: true }).workers > 0);
    try {
      const id = await this.storeParts(actor, practiceId, quarterId, dateConvention, upload, kept);
      kept.commit(id);
      this.runner.kick();
      return id;
    } finally {
      kept.close();
    }
  }

  private async storeParts(
    actor: Actor,
    practiceId: number,
    quarterId: number,
    dateConvention: DateConvention | null,
    upload: ExtractUpload,
    kept: HandoffCollector,
  ): Promise<number> {
    const maxBytes = this.config.get('extracts', { infer: true }).maxBytes;
    const fileName = cleanFileName(upload.fileName);
    const { practice, quarter } = await this.destination(actor, practiceId, quarterId);
    const id = await this.submissions.createUpload({
      practiceId,
      quarterId,
      fileName,
      dateConvention,
      uploadedBy: actor,
      leaseOwner: `${UPLOAD_LEASE_PREFIX}${this.runner.processId}`,
    });
    const hash = createHash('sha256');
    let size = 0;
    let seq = 0;
    let pending: Buffer[] = [];
    let pendingBytes = 0;
    const flush = async () => {
      if (pendingBytes === 0) return;
      const data = Buffer.concat(pending, pendingBytes);
      pending = [];
      pendingBytes = 0;
      kept.add(data);
      seq = await this.submissions.appendFile(id, seq, data);
    };
    try {
      for await (const chunk of upload.chunks) {
        size += chunk.length;
        if (size > maxBytes) continue; // counted, not kept
        hash.update(chunk);
        pending.push(chunk);
        pendingBytes += chunk.length;
        if (pendingBytes >= FILE_CHUNK_BYTES) await flush();
      }
      if (upload.truncated()) size = Math.max(size, maxBytes + 1);
      if (size <= maxBytes) await flush();
      // The rest of the request: an upload carrying a second file is refused, and nothing kept.
      await upload.complete?.();
    } catch (error) {
      await this.submissions.deleteUnfinishedUpload(id);
      throw error;
    }
    const regionId = practice.regionId;

    if (size > maxBytes) {
      const message = `The file is larger than ${fmtMb(maxBytes)}, the most Cairn accepts for one extract${upload.truncated() ? '' : ` (it is ${fmtMb(size)})`}.`;
      const fix =
        'Check that it holds only the extract (one sheet, no pictures); save it as CSV UTF-8, which is much smaller; or ask your regional lead about the limit.';
      await this.submissions.transaction(async (transaction) => {
        await this.submissions.rejectTooLarge(id, { size, message, fix, maxBytes }, transaction);
        await this.audit.append(
          {
            action: 'submission.rejected',
            outcome: 'refused',
            summary: `Extract “${fileName}” refused on upload: larger than ${fmtMb(maxBytes)}`,
            actor: { id: actor.id, label: actor.label },
            regionId,
            practiceId,
            subjectType: 'submission',
            subjectId: id,
            detail: { code: 'file_too_large', size },
          },
          transaction,
        );
      });
      throw new ProblemException(
        HttpStatus.PAYLOAD_TOO_LARGE,
        'extract-too-large',
        'The file is too large',
        message,
        {
          code: 'file_too_large',
          fix,
          submissionId: id,
          maxBytes,
        },
      );
    }

    const sha256 = hash.digest('hex');
    // The identical-file check and the recording of this file's hash are one transaction that
    // holds the practice-quarter's row: two uploads of the same file at the same moment are
    // decided one after the other, so the second sees the first (a check, then a separate write,
    // let both in).
    await this.submissions.ensurePracticeQuarter(practiceId, quarterId);
    const identical = await this.submissions.transaction(async (transaction) => {
      await this.submissions.lockPracticeQuarter(practiceId, quarterId, transaction);
      const found = await this.submissions.findIdentical(
        { id, practiceId, quarterId, sha256 },
        transaction,
      );
      if (found) return found;
      await this.submissions.queueStored(id, sha256, size, transaction);
      await this.audit.append(
        {
          action: 'submission.uploaded',
          summary: `Extract “${fileName}” (${fmtMb(size)}) uploaded; queued for checking`,
          actor: { id: actor.id, label: actor.label },
          regionId,
          practiceId,
          subjectType: 'submission',
          subjectId: id,
          detail: { sha256, size, dateConvention },
        },
        transaction,
      );
      return null;
    });
    if (identical) {
      await this.submissions.deleteUnfinishedUpload(id);
      const when = new Date(identical.uploaded_at).toISOString().slice(0, 16).replace('T', ' ');
      const quarterLabel = quarter.label;
      const state: Record<string, string> = {
        accepted: `which is already the current submission for ${quarterLabel}. Nothing was changed`,
        awaiting_confirmation: 'which is waiting for confirmation. Open it to confirm or cancel it',
        processing: 'which Cairn is still checking. Wait for its report',
        rejected: `which was refused${identical.refusal_message ? ` (${identical.refusal_message.replace(/\.$/, '')})` : ''}. Fix the problems in its report before uploading again`,
      };
      const uploader =
        (await this.people.byEmail(regionId, [identical.uploaded_by_label])).get(
          identical.uploaded_by_label,
        ) ?? identical.uploaded_by_label;
      const message = `This file is identical to the extract uploaded on ${when} UTC by ${uploader} (submission ${identical.id}), ${state[identical.status] ?? 'already received'}.`;
      await this.audit.append({
        action: 'submission.identical_refused',
        outcome: 'refused',
        summary: `Upload of “${fileName}” refused: identical to submission ${identical.id}`,
        actor: { id: actor.id, label: actor.label },
        regionId,
        practiceId,
        subjectType: 'submission',
        subjectId: identical.id,
        detail: { sha256 },
      });
      throw new ProblemException(
        HttpStatus.CONFLICT,
        'identical-extract',
        'This file was already uploaded',
        message,
        {
          code: 'identical_extract',
          submissionId: identical.id,
          submissionStatus: identical.status,
          sha256,
        },
      );
    }

    return id;
  }
}
