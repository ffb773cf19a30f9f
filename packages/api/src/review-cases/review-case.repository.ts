/**
 * The one owner of the review-case tables (migration 0500): review_cases,
 * review_case_entries, review_case_files and review_case_file_chunks. Every
 * status change goes through `changeStatus`, an UPDATE that names the version
 * and status it read: of two changes made at once from the same version, one
 * changes the row and the other changes nothing (and is answered 409 by the
 * service). Entries and files are only ever inserted (the tables' triggers
 * refuse UPDATE and DELETE).
 */
import { Inject, Injectable } from '@nestjs/common';
import { QueryTypes, type Transaction } from 'sequelize';
import { Sequelize } from 'sequelize-typescript';
import type { TypeSplit } from '@cairn/metrics';
import type { CaseStatus, Finding } from './review-case-policy.js';

/** Bytes per stored chunk of an attachment (as extracts are kept). */
export const CASE_FILE_CHUNK_BYTES = 1 << 20;

export interface CaseRow {
  id: number;
  region_id: number;
  practice_id: number;
  quarter_id: number;
  measure_key: string;
  split: TypeSplit;
  status: CaseStatus;
  version: number;
  title: string;
  evidence: unknown;
  finding: Finding | null;
  opened_by_user_id: number | null;
  opened_by_label: string;
  opened_at: Date;
  updated_at: Date;
  closed_at: Date | null;
  /** What the case was closed with before its last reopen (null when never reopened) */
  previous_finding: Finding | null;
  previous_closed_at: Date | null;
  reopened_at: Date | null;
  reopened_by_name: string | null;
}

export type EntryKind = 'opened' | 'question' | 'answer' | 'note' | 'state';
export type Visibility = 'practice' | 'internal';

export interface EntryRow {
  id: number;
  case_id: number;
  kind: EntryKind;
  visibility: Visibility;
  body: string;
  from_status: CaseStatus | null;
  to_status: CaseStatus | null;
  finding: Finding | null;
  author_user_id: number | null;
  author_label: string;
  author_name: string;
  author_role: string;
  created_at: Date;
}

export interface FileRow {
  id: number;
  case_id: number;
  entry_id: number;
  file_name: string;
  media_type: string;
  size_bytes: number;
  sha256: string;
  created_at: Date;
}

export interface NewCase {
  regionId: number;
  practiceId: number;
  quarterId: number;
  measureKey: string;
  split: TypeSplit;
  title: string;
  evidence: unknown;
  openedBy: { id: number | null; label: string };
}

export interface NewEntry {
  caseId: number;
  kind: EntryKind;
  visibility: Visibility;
  body: string;
  fromStatus?: CaseStatus | null;
  toStatus?: CaseStatus | null;
  finding?: Finding | null;
  author: { id: number | null; label: string; name: string; role: string };
}

export interface CaseFilter {
  regionId: number;
  practiceIds?: readonly number[];
  quarterId?: number;
  practiceId?: number;
  status?: CaseStatus;
}

const CASE_COLUMNS =
  'id, region_id, practice_id, quarter_id, measure_key, split, status, version, title, evidence, finding, opened_by_user_id, opened_by_label, opened_at, updated_at, closed_at, previous_finding, previous_closed_at, reopened_at, reopened_by_name';

const parseCase = (r: CaseRow): CaseRow => ({
  ...r,
  id: Number(r.id),
  practice_id: Number(r.practice_id),
  region_id: Number(r.region_id),
  quarter_id: Number(r.quarter_id),
  version: Number(r.version),
  evidence: typeof r.evidence === 'string' ? JSON.parse(r.evidence) : r.evidence,
});

@Injectable()
export class ReviewCaseRepository {
  constructor(@Inject(Sequelize) private readonly sequelize: Sequelize) {}

  transaction<T>(work: (transaction: Transaction) => Promise<T>): Promise<T> {
    return this.sequelize.transaction(work);
  }

  /** How many of a practice's cases wait for its answer (the practice's digest says so). */
  async countAwaitingPractice(practiceId: number, regionId: number): Promise<number> {
    const rows = await this.sequelize.query<{ n: number | string }>(
      `SELECT COUNT(*) AS n FROM review_cases
        WHERE practice_id = ? AND region_id = ? AND status = 'awaiting_practice'`,
      { replacements: [practiceId, regionId], type: QueryTypes.SELECT },
    );
    return Number(rows[0]?.n ?? 0);
  }

  async insertCase(c: NewCase, transaction: Transaction): Promise<number> {
    const [id] = await this.sequelize.query(
      `INSERT INTO review_cases (region_id, practice_id, quarter_id, measure_key, split, status, version, title, evidence,
         opened_by_user_id, opened_by_label, opened_at, updated_at)
       VALUES (?, ?, ?, ?, ?, 'open', 1, ?, ?, ?, ?, NOW(3), NOW(3))`,
      {
        replacements: [
          c.regionId,
          c.practiceId,
          c.quarterId,
          c.measureKey,
          c.split,
          c.title,
          JSON.stringify(c.evidence),
          c.openedBy.id,
          c.openedBy.label,
        ],
        type: QueryTypes.INSERT,
        transaction,
      },
    );
    return Number(id);
  }

  async find(id: number, transaction?: Transaction): Promise<CaseRow | null> {
    if (!Number.isSafeInteger(id)) return null;
    const [row] = await this.sequelize.query<CaseRow>(
      `SELECT ${CASE_COLUMNS} FROM review_cases WHERE id = ?`,
      { replacements: [id], type: QueryTypes.SELECT, transaction },
    );
    return row ? parseCase(row) : null;
  }

  async list(filter: CaseFilter): Promise<CaseRow[]> {
    const where = ['region_id = ?'];
    const values: unknown[] = [filter.regionId];
    if (filter.practiceIds) {
      if (filter.practiceIds.length === 0) return [];
      where.push(`practice_id IN (${filter.practiceIds.map(() => '?').join(', ')})`);
      values.push(...filter.practiceIds);
    }
    if (filter.quarterId !== undefined) {
      where.push('quarter_id = ?');
      values.push(filter.quarterId);
    }
    if (filter.practiceId !== undefined) {
      where.push('practice_id = ?');
      values.push(filter.practiceId);
    }
    if (filter.status !== undefined) {
      where.push('status = ?');
      values.push(filter.status);
    }
    const rows = await this.sequelize.query<CaseRow>(
      `SELECT ${CASE_COLUMNS} FROM review_cases WHERE ${where.join(' AND ')} ORDER BY updated_at DESC, id DESC LIMIT 1000`,
      { replacements: values, type: QueryTypes.SELECT },
    );
    return rows.map(parseCase);
  }

  /** Cases not closed of a quarter: (practice id, measure key, split) → case id. */
  async unclosedOf(quarterId: number): Promise<Map<string, { id: number; status: CaseStatus }>> {
    const rows = await this.sequelize.query<{
      id: number;
      practice_id: number;
      measure_key: string;
      split: string;
      status: CaseStatus;
    }>(
      `SELECT id, practice_id, measure_key, split, status FROM review_cases
        WHERE quarter_id = ? AND status <> 'closed' ORDER BY id`,
      { replacements: [quarterId], type: QueryTypes.SELECT },
    );
    return new Map(
      rows.map((r) => [
        caseSubjectKey(Number(r.practice_id), r.measure_key, r.split),
        { id: Number(r.id), status: r.status },
      ]),
    );
  }

  /**
   * Moves a case from the state and version read to `to` (and records a finding when closing).
   * Reopening keeps the finding and close time it leaves as the previous ones, with who reopened
   * it (`reopenedBy`). False when the case has changed since it was read: nothing is changed.
   */
  async changeStatus(
    id: number,
    read: { version: number; status: CaseStatus },
    to: CaseStatus,
    finding: Finding | null,
    transaction: Transaction,
    reopenedBy: string | null = null,
  ): Promise<boolean> {
    // MariaDB assigns left to right: the previous close is copied before it is cleared.
    const reopening = read.status === 'closed' && to !== 'closed';
    const [, affected] = await this.sequelize.query(
      `UPDATE review_cases
          SET previous_finding = IF(?, finding, previous_finding),
              previous_closed_at = IF(?, closed_at, previous_closed_at),
              reopened_at = IF(?, NOW(3), reopened_at),
              reopened_by_name = IF(?, ?, reopened_by_name),
              status = ?, version = version + 1, updated_at = NOW(3),
              finding = ?, closed_at = IF(? = 'closed', NOW(3), NULL)
        WHERE id = ? AND version = ? AND status = ?`,
      {
        replacements: [
          reopening,
          reopening,
          reopening,
          reopening,
          reopenedBy ?? '',
          to,
          finding,
          to,
          id,
          read.version,
          read.status,
        ],
        type: QueryTypes.UPDATE,
        transaction,
      },
    );
    return Number(affected) === 1;
  }

  /** Marks a case as changed now (a comment or note): its version stays. */
  async touch(id: number, transaction: Transaction): Promise<void> {
    await this.sequelize.query('UPDATE review_cases SET updated_at = NOW(3) WHERE id = ?', {
      replacements: [id],
      type: QueryTypes.UPDATE,
      transaction,
    });
  }

  async appendEntry(e: NewEntry, transaction: Transaction): Promise<number> {
    const [id] = await this.sequelize.query(
      `INSERT INTO review_case_entries (case_id, kind, visibility, body, from_status, to_status, finding,
         author_user_id, author_label, author_name, author_role, created_at)
       VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?, ?, NOW(3))`,
      {
        replacements: [
          e.caseId,
          e.kind,
          e.visibility,
          e.body,
          e.fromStatus ?? null,
          e.toStatus ?? null,
          e.finding ?? null,
          e.author.id,
          e.author.label,
          e.author.name,
          e.author.role,
        ],
        type: QueryTypes.INSERT,
        transaction,
      },
    );
    return Number(id);
  }

  /** Stores an attachment of an entry, its bytes in chunks, in the caller's transaction. */
  async insertFile(
    file: {
      caseId: number;
      entryId: number;
      fileName: string;
      mediaType: string;
      sha256: string;
      bytes: Buffer;
    },
    transaction: Transaction,
  ): Promise<number> {
    const [id] = await this.sequelize.query(
      `INSERT INTO review_case_files (case_id, entry_id, file_name, media_type, size_bytes, sha256, created_at)
       VALUES (?, ?, ?, ?, ?, ?, NOW(3))`,
      {
        replacements: [
          file.caseId,
          file.entryId,
          file.fileName,
          file.mediaType,
          file.bytes.length,
          file.sha256,
        ],
        type: QueryTypes.INSERT,
        transaction,
      },
    );
    let seq = 0;
    for (let at = 0; at < file.bytes.length; at += CASE_FILE_CHUNK_BYTES) {
      await this.sequelize.query(
        'INSERT INTO review_case_file_chunks (file_id, seq, data) VALUES (?, ?, ?)',
        {
          replacements: [Number(id), seq++, file.bytes.subarray(at, at + CASE_FILE_CHUNK_BYTES)],
          type: QueryTypes.INSERT,
          transaction,
        },
      );
    }
    return Number(id);
  }

  async entries(caseId: number, internal: boolean): Promise<EntryRow[]> {
    const rows = await this.sequelize.query<EntryRow>(
      `SELECT id, case_id, kind, visibility, body, from_status, to_status, finding, author_user_id, author_label,
              author_name, author_role, created_at
         FROM review_case_entries WHERE case_id = ? ${internal ? '' : "AND visibility = 'practice'"} ORDER BY id`,
      { replacements: [caseId], type: QueryTypes.SELECT },
    );
    return rows.map((r) => ({ ...r, id: Number(r.id), case_id: Number(r.case_id) }));
  }

  async entry(id: number): Promise<EntryRow | null> {
    const [row] = await this.sequelize.query<EntryRow>(
      `SELECT id, case_id, kind, visibility, body, from_status, to_status, finding, author_user_id, author_label,
              author_name, author_role, created_at
         FROM review_case_entries WHERE id = ?`,
      { replacements: [id], type: QueryTypes.SELECT },
    );
    return row ? { ...row, id: Number(row.id), case_id: Number(row.case_id) } : null;
  }

  async files(caseId: number): Promise<FileRow[]> {
    const rows = await this.sequelize.query<FileRow>(
      `SELECT id, case_id, entry_id, file_name, media_type, size_bytes, sha256, created_at
         FROM review_case_files WHERE case_id = ? ORDER BY id`,
      { replacements: [caseId], type: QueryTypes.SELECT },
    );
    return rows.map((r) => ({
      ...r,
      id: Number(r.id),
      case_id: Number(r.case_id),
      entry_id: Number(r.entry_id),
      size_bytes: Number(r.size_bytes),
    }));
  }

  async file(
    caseId: number,
    fileId: number,
  ): Promise<(FileRow & { visibility: Visibility }) | null> {
    if (!Number.isSafeInteger(fileId)) return null;
    const [row] = await this.sequelize.query<FileRow & { visibility: Visibility }>(
      `SELECT f.id, f.case_id, f.entry_id, f.file_name, f.media_type, f.size_bytes, f.sha256, f.created_at, e.visibility
         FROM review_case_files f JOIN review_case_entries e ON e.id = f.entry_id
        WHERE f.case_id = ? AND f.id = ?`,
      { replacements: [caseId, fileId], type: QueryTypes.SELECT },
    );
    return row ? { ...row, id: Number(row.id), size_bytes: Number(row.size_bytes) } : null;
  }

  async fileBytes(fileId: number): Promise<Buffer> {
    const rows = await this.sequelize.query<{ data: Buffer }>(
      'SELECT data FROM review_case_file_chunks WHERE file_id = ? ORDER BY seq',
      { replacements: [fileId], type: QueryTypes.SELECT },
    );
    return Buffer.concat(rows.map((r) => r.data));
  }
}

export const caseSubjectKey = (practiceId: number, measureKey: string, split: string): string =>
  `${practiceId}/${measureKey}/${split}`;
