/**
 * The one owner of `benchmark_answers` (migrations 0302–0304): finished
 * responses of the results routes, gzip of their JSON (and its brotli form once
 * made), keyed by the SHA-256 of what each was built from. Rows never change
 * but for the brotli form, set once; INSERT IGNORE keeps the first of two
 * identical builds.
 */
import { Inject, Injectable } from '@nestjs/common';
import { QueryTypes } from 'sequelize';
import { Sequelize } from 'sequelize-typescript';
import { withRaw } from '../../database/bulk-load/raw-connection.js';

/** An answer's row is marked used (`used_at`, which pruning reads) at most this often. */
export const MARK_USED_MS = 60 * 60_000;

@Injectable()
export class BenchmarkAnswersRepository {
  constructor(@Inject(Sequelize) private readonly sequelize: Sequelize) {}

  /**
   * The stored gzip body of this answer key and its brotli form (null until made), if any
   * (marked used, at most once an hour).
   */
  async find(answerKey: string): Promise<{ gzip: Buffer; brotli: Buffer | null } | null> {
    const [row] = await this.sequelize.query<{
      body: Buffer;
      body_br: Buffer | null;
      stale: number;
    }>(
      `SELECT body, body_br, (used_at IS NULL OR used_at < NOW(3) - INTERVAL ? SECOND) AS stale
         FROM benchmark_answers WHERE answer_key = ?`,
      { replacements: [MARK_USED_MS / 1000, answerKey], type: QueryTypes.SELECT },
    );
    // Not awaited: the reader need not wait for the mark (pruning reads it days later).
    if (row && Number(row.stale) === 1) void this.markUsed(answerKey).catch(() => undefined);
    return row ? { gzip: row.body, brotli: row.body_br ?? null } : null;
  }

  /**
   * Marks an answer used now, unless it was marked within MARK_USED_MS (so that pruning, which
   * removes answers unused for days, keeps those a process serves from its memory).
   */
  async markUsed(answerKey: string): Promise<void> {
    await this.sequelize.query(
      `UPDATE benchmark_answers SET used_at = NOW(3)
        WHERE answer_key = ? AND (used_at IS NULL OR used_at < NOW(3) - INTERVAL ? SECOND)`,
      { replacements: [answerKey, MARK_USED_MS / 1000], type: QueryTypes.UPDATE },
    );
  }

  /** Stores the brotli form of an answer unless it has one already (the same bytes). */
  async setBrotli(answerKey: string, brotli: Buffer): Promise<void> {
    await withRaw(this.sequelize, (connection) =>
      connection.batch(
        'UPDATE benchmark_answers SET body_br = ? WHERE answer_key = ? AND body_br IS NULL',
        [[brotli, answerKey]],
      ),
    );
  }

  /** The quarters that have stored answers. */
  async quarters(): Promise<number[]> {
    const rows = await this.sequelize.query<{ quarter_id: number }>(
      'SELECT DISTINCT quarter_id FROM benchmark_answers',
      { type: QueryTypes.SELECT },
    );
    return rows.map((r) => Number(r.quarter_id));
  }

  /**
   * Removes a quarter's answers last used (read, or built if never read) more than
   * `unusedDays` ago, except those that may be built from one of `keptResultIds` (the quarter's
   * current results): built at or after the earliest of them. The number removed.
   */
  async deleteUnused(
    quarterId: number,
    unusedDays: number,
    keptResultIds: readonly number[],
  ): Promise<number> {
    // BULKDELETE: the dialect answers with the number of rows deleted.
    const affected = (await this.sequelize.query(
      `DELETE FROM benchmark_answers
        WHERE quarter_id = ?
          AND COALESCE(used_at, built_at) < NOW(3) - INTERVAL ? DAY
          AND NOT built_at >= COALESCE(
            (SELECT MIN(built_at) FROM benchmark_results WHERE id IN (?)), '9999-12-31')`,
      {
        replacements: [quarterId, unusedDays, keptResultIds.length > 0 ? keptResultIds : [0]],
        type: QueryTypes.BULKDELETE,
      },
    )) as unknown as number;
    return Number(affected ?? 0);
  }

  /** Stores an answer unless one of the same key is there already (the same bytes). */
  async insert(answer: {
    answerKey: string;
    kind: string;
    quarterId: number;
    plainBytes: number;
    gzip: Buffer;
  }): Promise<void> {
    // The connector's batch sends the body's bytes as they are (binary protocol).
    await withRaw(this.sequelize, (connection) =>
      connection.batch(
        `INSERT IGNORE INTO benchmark_answers (answer_key, kind, quarter_id, plain_bytes, body, built_at)
         VALUES (?, ?, ?, ?, ?, NOW(3))`,
        [[answer.answerKey, answer.kind, answer.quarterId, answer.plainBytes, answer.gzip]],
      ),
    );
  }
}
