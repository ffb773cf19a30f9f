/**
 * Leases of scheduled jobs, so that of several API processes one at a time runs a job: a table
 * of (job, lease_owner, lease_expires_at, last_started_at, last_finished_at, last_outcome), one
 * per module that owns such jobs (`mail_schedule`, `benchmark_upkeep`), its SQL written here
 * once. The owning module's repository makes one with its table's name. A process that dies
 * holding a lease loses it when the lease expires.
 */
import { QueryTypes, type Sequelize } from 'sequelize';

export class JobLeases {
  constructor(
    private readonly sequelize: Sequelize,
    private readonly table: string,
  ) {}

  private async changed(sql: string, replacements: unknown[]): Promise<number> {
    const [, affected] = (await this.sequelize.query(sql, {
      replacements,
      type: QueryTypes.UPDATE,
    })) as unknown as [unknown, number];
    return Number(affected ?? 0);
  }

  /** True when `owner` now holds the lease of `job` (no other process holds a live one). */
  async claim(job: string, owner: string, leaseSeconds: number): Promise<boolean> {
    await this.sequelize.query(`INSERT IGNORE INTO ${this.table} (job) VALUES (?)`, {
      replacements: [job],
      type: QueryTypes.INSERT,
    });
    return (
      (await this.changed(
        `UPDATE ${this.table} SET lease_owner = ?, lease_expires_at = NOW(3) + INTERVAL ? SECOND,
           last_started_at = NOW(3)
         WHERE job = ? AND (lease_owner IS NULL OR lease_expires_at < NOW(3))`,
        [owner, leaseSeconds, job],
      )) > 0
    );
  }

  /** Gives the lease back, with the outcome in words (at most 500 characters kept). */
  async release(job: string, owner: string, outcome: string): Promise<void> {
    await this.changed(
      `UPDATE ${this.table} SET lease_owner = NULL, lease_expires_at = NULL,
         last_finished_at = NOW(3), last_outcome = ?
       WHERE job = ? AND lease_owner = ?`,
      [outcome.slice(0, 500), job, owner],
    );
  }
}
