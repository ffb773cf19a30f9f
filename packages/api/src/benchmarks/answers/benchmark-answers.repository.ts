/**
 * The one owner of `benchmark_answers` (migration 0302): finished responses
 * of the results routes, gzip of their JSON, keyed by the SHA-256 of what
 * each was built from. Rows never change; INSERT IGNORE keeps the first of
 * two identical builds.
 */
import { Inject, Injectable } from '@nestjs/common';
import { QueryTypes } from 'sequelize';
import { Sequelize } from 'sequelize-typescript';
import { withRaw } from '../../database/bulk-load/raw-connection.js';

@Injectable()
export class BenchmarkAnswersRepository {
  constructor(@Inject(Sequelize) private readonly sequelize: Sequelize) {}

  /** The stored gzip body of this answer key, if any. */
  async find(answerKey: string): Promise<Buffer | null> {
    const [row] = await this.sequelize.query<{ body: Buffer }>(
      'SELECT body FROM benchmark_answers WHERE answer_key = ?',
      { replacements: [answerKey], type: QueryTypes.SELECT },
    );
    return row?.body ?? null;
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
