/**
 * The one owner of `benchmark_upkeep` (migration 0303): the lease of an upkeep job (pruning), so
 * that of several API processes one at a time runs it. A process that dies holding the lease
 * loses it when it expires.
 */
import { Inject, Injectable } from '@nestjs/common';
import { QueryTypes } from 'sequelize';
import { Sequelize } from 'sequelize-typescript';

@Injectable()
export class BenchmarkUpkeepRepository {
  constructor(@Inject(Sequelize) private readonly sequelize: Sequelize) {}

  private async changed(sql: string, replacements: unknown[]): Promise<number> {
    const [, affected] = (await this.sequelize.query(sql, {
      replacements,
      type: QueryTypes.UPDATE,
    })) as unknown as [unknown, number];
    return Number(affected ?? 0);
  }

  /** True when `owner` now holds the lease of `job` (no other process holds a live one). */
  async claim(job: string, owner: string, leaseSeconds: number): Promise<boolean> {
    await this.sequelize.query('INSERT IGNORE INTO benchmark_upkeep (job) VALUES (?)', {
      replacements: [job],
      type: QueryTypes.INSERT,
    });
    return (
      (await this.changed(
        `UPDATE benchmark_upkeep SET lease_owner = ?, lease_expires_at = NOW(3) + INTERVAL ? SECOND,
           last_started_at = NOW(3)
         WHERE job = ? AND (lease_owner IS NULL OR lease_expires_at < NOW(3))`,
        [owner, leaseSeconds, job],
      )) > 0
    );
  }

  /** Gives the lease back, with the outcome in words. */
  async release(job: string, owner: string, outcome: string): Promise<void> {
    await this.changed(
      `UPDATE benchmark_upkeep SET lease_owner = NULL, lease_expires_at = NULL,
         last_finished_at = NOW(3), last_outcome = ?
       WHERE job = ? AND lease_owner = ?`,
      [outcome.slice(0, 500), job, owner],
    );
  }
}
