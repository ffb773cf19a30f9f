/**
 * The one owner of `benchmark_results` (migration 0301): built benchmarks of
 * an audit quarter, one row per (quarter, measure-set version, result format,
 * set of current submissions). Rows are never changed: a reader finds the row
 * of the set it read, or builds it and inserts it with INSERT IGNORE (two
 * processes building the same set at once make identical bytes; the first row
 * stays).
 */
import { Inject, Injectable } from '@nestjs/common';
import { QueryTypes } from 'sequelize';
import { Sequelize } from 'sequelize-typescript';
import { withRaw } from '../database/bulk-load/raw-connection.js';

/** What identifies a built benchmark: the quarter, the measure set, the format and the set. */
export interface ResultKey {
  quarterId: number;
  measureSetId: string;
  formatVersion: number;
  /** SHA-256 (hex) of the sorted ids of the current submissions */
  submissionsKey: string;
}

/** A stored result as pruning sees it. */
export interface StoredResultInfo {
  id: number;
  quarterId: number;
  submissionsKey: string;
  /** Seconds since it was built (by the database's clock) */
  ageSeconds: number;
}

/** A stored result without its body. */
export interface ResultRow {
  id: number;
  submissionCount: number;
  builtAt: string;
  buildMs: number;
}

interface DbRow {
  id: number;
  submission_count: number;
  built_at: Date | string;
  build_ms: number;
}

const toRow = (r: DbRow): ResultRow => ({
  id: Number(r.id),
  submissionCount: Number(r.submission_count),
  builtAt: new Date(r.built_at).toISOString(),
  buildMs: Number(r.build_ms),
});

@Injectable()
export class BenchmarkResultsRepository {
  constructor(@Inject(Sequelize) private readonly sequelize: Sequelize) {}

  /** The stored result of exactly this set, if any (its body not read). */
  async find(key: ResultKey): Promise<ResultRow | null> {
    const [row] = await this.sequelize.query<DbRow>(
      `SELECT id, submission_count, built_at, build_ms FROM benchmark_results
        WHERE quarter_id = ? AND measure_set_id = ? AND format_version = ? AND submissions_key = ?`,
      {
        replacements: [key.quarterId, key.measureSetId, key.formatVersion, key.submissionsKey],
        type: QueryTypes.SELECT,
      },
    );
    return row ? toRow(row) : null;
  }

  /** A stored result's body. */
  async body(id: number): Promise<Buffer | null> {
    const [row] = await this.sequelize.query<{ body: Buffer }>(
      'SELECT body FROM benchmark_results WHERE id = ?',
      { replacements: [id], type: QueryTypes.SELECT },
    );
    return row?.body ?? null;
  }

  /** Every stored result without its body, for pruning: its quarter, set and age. */
  async listAll(): Promise<StoredResultInfo[]> {
    const rows = await this.sequelize.query<{
      id: number;
      quarter_id: number;
      submissions_key: string;
      age_seconds: number;
    }>(
      `SELECT id, quarter_id, submissions_key, TIMESTAMPDIFF(SECOND, built_at, NOW(3)) AS age_seconds
         FROM benchmark_results`,
      { type: QueryTypes.SELECT },
    );
    return rows.map((r) => ({
      id: Number(r.id),
      quarterId: Number(r.quarter_id),
      submissionsKey: r.submissions_key,
      ageSeconds: Number(r.age_seconds),
    }));
  }

  /**
   * Removes these stored results, except any a published report names (its foreign key keeps
   * the row: DELETE IGNORE skips it). The number removed.
   */
  async deleteIds(ids: readonly number[]): Promise<number> {
    if (ids.length === 0) return 0;
    // BULKDELETE: the dialect answers with the number of rows deleted.
    const affected = (await this.sequelize.query(
      'DELETE IGNORE FROM benchmark_results WHERE id IN (?)',
      { replacements: [ids], type: QueryTypes.BULKDELETE },
    )) as unknown as number;
    return Number(affected ?? 0);
  }

  /**
   * Stores a built result unless one of the same key is there already (built by another
   * process at the same time: the same bytes). Returns the stored row, ours or the other.
   */
  async insert(
    key: ResultKey,
    content: { submissionCount: number; body: Buffer; buildMs: number },
  ): Promise<ResultRow> {
    // The connector's batch sends the body's bytes as they are (binary protocol).
    await withRaw(this.sequelize, (connection) =>
      connection.batch(
        `INSERT IGNORE INTO benchmark_results
           (quarter_id, measure_set_id, format_version, submissions_key, submission_count, body, built_at, build_ms)
         VALUES (?, ?, ?, ?, ?, ?, NOW(3), ?)`,
        [
          [
            key.quarterId,
            key.measureSetId,
            key.formatVersion,
            key.submissionsKey,
            content.submissionCount,
            content.body,
            Math.round(content.buildMs),
          ],
        ],
      ),
    );
    const stored = await this.find(key);
    if (!stored) throw new Error('a stored benchmark result could not be read back');
    return stored;
  }
}
