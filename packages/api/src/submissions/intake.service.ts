/**
 * Receiving an extract: the multipart upload is streamed (busboy) into
 * extract_file_chunks under a new submission, hashed on the way, and counted
 * against the size limit. When it has all arrived the submission is queued for
 * any API process to check. A bounded copy of the bytes may stay in memory
 * for a minute (UploadHandoff), so that this process, which is kicked to
 * check it at once, need not read the file back from MariaDB.
 *
 * Refused here, before any checking: a file over the size limit (a rejected
 * submission, so history shows it), and a file identical (SHA-256) to one
 * already current, awaiting confirmation, being checked or refused for the
 * same practice and quarter (nothing is created).
 */
import { createHash } from 'node:crypto';
import { HttpStatus, Inject, Injectable } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import busboy from 'busboy';
import type { Request } from 'express';
import { QueryTypes } from 'sequelize';
import { Sequelize } from 'sequelize-typescript';
import { AuditTrailService } from '../audit-trail/audit-trail.service.js';
import type { AuthUser } from '../auth/index.js';
import { ProblemException } from '../common/problem.js';
import type { CairnConfig } from '../config/config.schema.js';
import type { QuarterRow } from '../quarters/quarters.service.js';
import { QuartersService } from '../quarters/quarters.service.js';
import { JobRunner, UPLOAD_LEASE_PREFIX } from './job-runner.service.js';
import { withRaw } from '../database/bulk-load/raw-connection.js';
import { deleteFile, execute, findSubmission, type SubmissionStatus } from './submission-store.js';
import { type HandoffCollector, UploadHandoff } from './upload-handoff.js';

const CHUNK_BYTES = 1 << 20;

export interface UploadActor {
  id: number | null;
  label: string;
  role: AuthUser['role'] | 'system';
  regionId: number;
}

export interface ExtractUpload {
  fileName: string;
  /** The file's bytes, as an async stream of chunks */
  chunks: AsyncIterable<Buffer>;
  /** Set when the stream was cut at the size limit */
  truncated: () => boolean;
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

const fmtMb = (bytes: number) =>
  `${(bytes / 1_048_576).toFixed(bytes < 10 * 1_048_576 ? 1 : 0)} MB`;

@Injectable()
export class IntakeService {
  constructor(
    @Inject(Sequelize) private readonly sequelize: Sequelize,
    @Inject(ConfigService) private readonly config: ConfigService<CairnConfig, true>,
    @Inject(AuditTrailService) private readonly audit: AuditTrailService,
    @Inject(QuartersService) private readonly quarters: QuartersService,
    @Inject(JobRunner) private readonly runner: JobRunner,
    @Inject(UploadHandoff) private readonly handoff: UploadHandoff,
  ) {}

  /** The quarter, checked: in the practice's region, and open (regional leads may also send to a closed one). */
  async quarterFor(actor: UploadActor, practiceId: number, quarterId: number): Promise<QuarterRow> {
    const [practice] = await this.sequelize.query<{ region_id: number }>(
      'SELECT region_id FROM practices WHERE id = ?',
      { replacements: [practiceId], type: QueryTypes.SELECT },
    );
    const quarter = await this.quarters.find(quarterId);
    if (!practice || !quarter || quarter.regionId !== practice.region_id) {
      throw new ProblemException(
        HttpStatus.NOT_FOUND,
        'quarter-not-found',
        'No such audit quarter',
        `There is no audit quarter ${quarterId} for this practice's region.`,
        { quarterId },
      );
    }
    if (quarter.status === 'closed' && actor.role !== 'regional_lead' && actor.role !== 'system') {
      throw new ProblemException(
        HttpStatus.CONFLICT,
        'quarter-closed',
        'This audit quarter is closed',
        `${quarter.label} is closed to uploads (its deadline was ${quarter.submissionDeadline}). Ask your regional lead if a late extract should still be accepted.`,
        { quarterId },
      );
    }
    return quarter;
  }

  /** Reads a multipart request with one file part into an ExtractUpload, then stores it. */
  async receiveRequest(
    req: Request,
    actor: UploadActor,
    practiceId: number,
    quarterId: number,
    dateConvention: 'day_first' | 'month_first' | null,
  ): Promise<number> {
    await this.quarterFor(actor, practiceId, quarterId);
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
      limits: { files: 1, fileSize: maxBytes, fields: 20, parts: 30 },
    });
    let result: Promise<number> | null = null;
    const finished = new Promise<void>((resolve, reject) => {
      parser.on('file', (field, stream, info) => {
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
        });
        // Keep the request flowing even when storing fails, so the answer can be sent.
        result.catch(() => stream.resume());
      });
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
    actor: UploadActor,
    practiceId: number,
    quarterId: number,
    dateConvention: 'day_first' | 'month_first' | null,
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
    actor: UploadActor,
    practiceId: number,
    quarterId: number,
    dateConvention: 'day_first' | 'month_first' | null,
    upload: ExtractUpload,
    kept: HandoffCollector,
  ): Promise<number> {
    const maxBytes = this.config.get('extracts', { infer: true }).maxBytes;
    const fileName = cleanFileName(upload.fileName);
    const [insertId] = await this.sequelize.query(
      `INSERT INTO submissions (practice_id, quarter_id, status, file_name, file_size_bytes, date_convention,
         uploaded_by_user_id, uploaded_by_label, uploaded_at, lease_owner, lease_expires_at)
       VALUES (?, ?, 'processing', ?, 0, ?, ?, ?, NOW(3), ?, NOW(3) + INTERVAL 10 MINUTE)`,
      {
        replacements: [
          practiceId,
          quarterId,
          fileName,
          dateConvention,
          actor.id,
          actor.label,
          `${UPLOAD_LEASE_PREFIX}${this.runner.processId}`,
        ],
        type: QueryTypes.INSERT,
      },
    );
    const id = Number(insertId);
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
      // The connector's batch sends a Buffer as it is (binary protocol); a replacement would
      // write it into the SQL text as X'hex', a string twice its size. One chunk per statement
      // keeps every packet far below MariaDB's max_allowed_packet.
      await withRaw(this.sequelize, async (connection) => {
        for (let at = 0; at < data.length; at += CHUNK_BYTES) {
          await connection.batch(
            'INSERT INTO extract_file_chunks (submission_id, seq, data) VALUES (?, ?, ?)',
            [[id, seq++, data.subarray(at, at + CHUNK_BYTES)]],
          );
        }
      });
    };
    try {
      for await (const chunk of upload.chunks) {
        size += chunk.length;
        if (size > maxBytes) continue; // counted, not kept
        hash.update(chunk);
        pending.push(chunk);
        pendingBytes += chunk.length;
        if (pendingBytes >= CHUNK_BYTES) await flush();
      }
      if (upload.truncated()) size = Math.max(size, maxBytes + 1);
      if (size <= maxBytes) await flush();
    } catch (error) {
      await this.sequelize.query('DELETE FROM submissions WHERE id = ?', {
        replacements: [id],
        type: QueryTypes.DELETE,
      });
      throw error;
    }
    const [practice] = await this.sequelize.query<{ region_id: number }>(
      'SELECT region_id FROM practices WHERE id = ?',
      {
        replacements: [practiceId],
        type: QueryTypes.SELECT,
      },
    );
    const regionId = practice?.region_id ?? actor.regionId;

    if (size > maxBytes) {
      const message = `The file is larger than ${fmtMb(maxBytes)}, the most Cairn accepts for one extract${upload.truncated() ? '' : ` (it is ${fmtMb(size)})`}.`;
      const fix =
        'Check that it holds only the extract (one sheet, no pictures); save it as CSV UTF-8, which is much smaller; or ask your regional lead about the limit.';
      await this.sequelize.transaction(async (transaction) => {
        await execute(
          this.sequelize,
          `UPDATE submissions SET status = 'rejected', processed_at = NOW(3), file_size_bytes = ?, refusal_code = 'file_too_large',
             refusal_message = ?, refusal_fix = ?, lease_owner = NULL, lease_expires_at = NULL, records_purged_at = NOW(3),
             summary = JSON_OBJECT('refusalDetail', JSON_OBJECT('maxBytes', ?))
           WHERE id = ?`,
          [size, message, fix, maxBytes, id],
          transaction,
        );
        await deleteFile(this.sequelize, id, transaction);
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
    // holds the practice's row: two uploads of the same file at the same moment are decided one
    // after the other, so the second sees the first (a check, then a separate write, let both in).
    const identical = await this.sequelize.transaction(async (transaction) => {
      await this.sequelize.query('SELECT id FROM practices WHERE id = ? FOR UPDATE', {
        replacements: [practiceId],
        type: QueryTypes.SELECT,
        transaction,
      });
      const [found] = await this.sequelize.query<{
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
        { replacements: [practiceId, quarterId, sha256, id], type: QueryTypes.SELECT, transaction },
      );
      if (found) return found;
      await execute(
        this.sequelize,
        `UPDATE submissions SET file_sha256 = ?, file_size_bytes = ?, lease_owner = NULL, lease_expires_at = NULL WHERE id = ?`,
        [sha256, size, id],
        transaction,
      );
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
      await this.sequelize.query('DELETE FROM submissions WHERE id = ?', {
        replacements: [id],
        type: QueryTypes.DELETE,
      });
      const earlier = await findSubmission(this.sequelize, identical.id);
      const when = new Date(identical.uploaded_at).toISOString().slice(0, 16).replace('T', ' ');
      const quarterLabel = earlier ? `${earlier.year} Q${earlier.quarter}` : 'this quarter';
      const state: Record<string, string> = {
        accepted: `which is already the current submission for ${quarterLabel}. Nothing was changed`,
        awaiting_confirmation: 'which is waiting for confirmation. Open it to confirm or cancel it',
        processing: 'which Cairn is still checking. Wait for its report',
        rejected: `which was refused${identical.refusal_message ? ` (${identical.refusal_message.replace(/\.$/, '')})` : ''}. Fix the problems in its report before uploading again`,
      };
      const message = `This file is identical to the extract uploaded on ${when} UTC by ${identical.uploaded_by_label} (submission ${identical.id}), ${state[identical.status] ?? 'already received'}.`;
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
