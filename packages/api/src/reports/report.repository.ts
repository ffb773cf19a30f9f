/**
 * The one owner of `reports` (migration 0450). A report's row is written once
 * when it is published; afterwards only its standing changes, each UPDATE
 * checking the state it leaves: published → replaced (a later report of the
 * same quarter) or → withdrawn (a tombstone with the reason and who withdrew
 * it). The triggers refuse any change to what was published.
 */
import { Inject, Injectable } from '@nestjs/common';
import { QueryTypes, type Transaction } from 'sequelize';
import { Sequelize } from 'sequelize-typescript';
import type { ReportStatus } from './dto/report.dto.js';

export interface ReportRow {
  id: number;
  regionId: number;
  quarterId: number;
  sequence: number;
  measureSetId: string;
  benchmarkResultId: number;
  submissionsKey: string;
  submissionCount: number;
  status: ReportStatus;
  publishedAt: string;
  publishedByUserId: number | null;
  publishedBy: string;
  releaseNote: string;
  contentHash: string;
  snapshotBytes: number;
  replacedById: number | null;
  replacedAt: string | null;
  withdrawnAt: string | null;
  withdrawnBy: string | null;
  withdrawnReason: string | null;
}

interface DbRow {
  id: number;
  region_id: number;
  quarter_id: number;
  sequence: number;
  measure_set_id: string;
  benchmark_result_id: number;
  submissions_key: string;
  submission_count: number;
  status: ReportStatus;
  published_at: Date | string;
  published_by_user_id: number | null;
  published_by: string;
  release_note: string;
  content_hash: string;
  snapshot_bytes: number;
  replaced_by_id: number | null;
  replaced_at: Date | string | null;
  withdrawn_at: Date | string | null;
  withdrawn_by: string | null;
  withdrawn_reason: string | null;
}

const iso = (d: Date | string | null): string | null =>
  d === null ? null : new Date(d).toISOString();

const toRow = (r: DbRow): ReportRow => ({
  id: Number(r.id),
  regionId: Number(r.region_id),
  quarterId: Number(r.quarter_id),
  sequence: Number(r.sequence),
  measureSetId: r.measure_set_id,
  benchmarkResultId: Number(r.benchmark_result_id),
  submissionsKey: r.submissions_key,
  submissionCount: Number(r.submission_count),
  status: r.status,
  publishedAt: iso(r.published_at)!,
  publishedByUserId: r.published_by_user_id === null ? null : Number(r.published_by_user_id),
  publishedBy: r.published_by,
  releaseNote: r.release_note,
  contentHash: r.content_hash,
  snapshotBytes: Number(r.snapshot_bytes),
  replacedById: r.replaced_by_id === null ? null : Number(r.replaced_by_id),
  replacedAt: iso(r.replaced_at),
  withdrawnAt: iso(r.withdrawn_at),
  withdrawnBy: r.withdrawn_by,
  withdrawnReason: r.withdrawn_reason,
});

const COLUMNS = `id, region_id, quarter_id, sequence, measure_set_id, benchmark_result_id, submissions_key,
  submission_count, status, published_at, published_by_user_id, published_by, release_note, content_hash,
  snapshot_bytes, replaced_by_id, replaced_at, withdrawn_at, withdrawn_by, withdrawn_reason`;

export interface NewReport {
  regionId: number;
  quarterId: number;
  sequence: number;
  measureSetId: string;
  benchmarkResultId: number;
  submissionsKey: string;
  submissionCount: number;
  publishedAt: Date;
  publishedByUserId: number | null;
  publishedBy: string;
  releaseNote: string;
  contentHash: string;
  snapshotBytes: number;
  snapshot: Buffer;
}

@Injectable()
export class ReportRepository {
  constructor(@Inject(Sequelize) private readonly sequelize: Sequelize) {}

  transaction<T>(work: (t: Transaction) => Promise<T>): Promise<T> {
    return this.sequelize.transaction(work);
  }

  async get(id: number, transaction?: Transaction): Promise<ReportRow | null> {
    const [row] = await this.sequelize.query<DbRow>(
      `SELECT ${COLUMNS} FROM reports WHERE id = ?${transaction ? ' FOR UPDATE' : ''}`,
      { replacements: [id], type: QueryTypes.SELECT, transaction },
    );
    return row ? toRow(row) : null;
  }

  /** A region's reports (of some quarters, or all), newest first. */
  async list(regionId: number, quarterIds?: readonly number[]): Promise<ReportRow[]> {
    if (quarterIds && quarterIds.length === 0) return [];
    const rows = await this.sequelize.query<DbRow>(
      `SELECT ${COLUMNS} FROM reports WHERE region_id = ?${quarterIds ? ' AND quarter_id IN (?)' : ''}
        ORDER BY published_at DESC, id DESC`,
      {
        replacements: quarterIds ? [regionId, quarterIds] : [regionId],
        type: QueryTypes.SELECT,
      },
    );
    return rows.map(toRow);
  }

  /** The reports of a region that use these measure-set versions. */
  async usingMeasureSets(regionId: number, ids: readonly string[]): Promise<ReportRow[]> {
    if (ids.length === 0) return [];
    const rows = await this.sequelize.query<DbRow>(
      `SELECT ${COLUMNS} FROM reports WHERE region_id = ? AND measure_set_id IN (?) ORDER BY id DESC`,
      { replacements: [regionId, ids], type: QueryTypes.SELECT },
    );
    return rows.map(toRow);
  }

  /** The quarter's reports, locked for a publish (the next sequence and the one to replace). */
  async ofQuarterForUpdate(quarterId: number, transaction: Transaction): Promise<ReportRow[]> {
    const rows = await this.sequelize.query<DbRow>(
      `SELECT ${COLUMNS} FROM reports WHERE quarter_id = ? ORDER BY sequence FOR UPDATE`,
      { replacements: [quarterId], type: QueryTypes.SELECT, transaction },
    );
    return rows.map(toRow);
  }

  /** The stored (compressed) snapshot. */
  async snapshot(id: number): Promise<Buffer | null> {
    const [row] = await this.sequelize.query<{ snapshot: Buffer }>(
      'SELECT snapshot FROM reports WHERE id = ?',
      { replacements: [id], type: QueryTypes.SELECT },
    );
    return row ? row.snapshot : null;
  }

  async insert(report: NewReport, transaction: Transaction): Promise<number> {
    const [id] = await this.sequelize.query(
      `INSERT INTO reports (region_id, quarter_id, sequence, measure_set_id, benchmark_result_id,
          submissions_key, submission_count, status, published_at, published_by_user_id, published_by,
          release_note, content_hash, snapshot_bytes, snapshot)
        VALUES (?, ?, ?, ?, ?, ?, ?, 'published', ?, ?, ?, ?, ?, ?, ?)`,
      {
        replacements: [
          report.regionId,
          report.quarterId,
          report.sequence,
          report.measureSetId,
          report.benchmarkResultId,
          report.submissionsKey,
          report.submissionCount,
          report.publishedAt,
          report.publishedByUserId,
          report.publishedBy,
          report.releaseNote,
          report.contentHash,
          report.snapshotBytes,
          report.snapshot,
        ],
        type: QueryTypes.INSERT,
        transaction,
      },
    );
    return Number(id);
  }

  /** published → replaced by a later report of its quarter. */
  async markReplaced(id: number, by: number, at: Date, transaction: Transaction): Promise<void> {
    await this.sequelize.query(
      `UPDATE reports SET status = 'replaced', replaced_by_id = ?, replaced_at = ?
        WHERE id = ? AND status = 'published'`,
      { replacements: [by, at, id], type: QueryTypes.UPDATE, transaction },
    );
  }

  /** published or replaced → withdrawn; false when it was already withdrawn. */
  async withdraw(
    id: number,
    w: { at: Date; userId: number | null; by: string; reason: string },
    transaction: Transaction,
  ): Promise<boolean> {
    const [, affected] = (await this.sequelize.query(
      `UPDATE reports SET status = 'withdrawn', withdrawn_at = ?, withdrawn_by_user_id = ?,
          withdrawn_by = ?, withdrawn_reason = ?
        WHERE id = ? AND status IN ('published', 'replaced')`,
      {
        replacements: [w.at, w.userId, w.by, w.reason, id],
        type: QueryTypes.UPDATE,
        transaction,
      },
    )) as unknown as [unknown, number];
    return affected === 1;
  }
}
