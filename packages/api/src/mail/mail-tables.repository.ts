/**
 * The one owner of the mail module's small tables: `mail_extra_recipients`
 * (addresses the regional lead adds to a practice) and `mail_schedule` (which
 * process runs a scheduled mail job now).
 */
import { Inject, Injectable } from '@nestjs/common';
import { QueryTypes, type Transaction } from 'sequelize';
import { Sequelize } from 'sequelize-typescript';
import { JobLeases } from '../database/job-leases.js';

export interface ExtraRecipientRow {
  id: number;
  practice_id: number;
  address: string;
  note: string | null;
  added_by_user_id: number | null;
  added_by_label: string;
  created_at: Date;
}

@Injectable()
export class MailTablesRepository {
  private readonly leases: JobLeases;

  constructor(@Inject(Sequelize) private readonly sequelize: Sequelize) {
    this.leases = new JobLeases(sequelize, 'mail_schedule');
  }

  transaction<T>(work: (transaction: Transaction) => Promise<T>): Promise<T> {
    return this.sequelize.transaction(work);
  }

  private select<T extends object>(
    sql: string,
    replacements: unknown[],
    transaction?: Transaction,
  ) {
    return this.sequelize.query<T>(sql, { replacements, type: QueryTypes.SELECT, transaction });
  }

  private async execute(sql: string, replacements: unknown[], transaction?: Transaction) {
    const [, affected] = (await this.sequelize.query(sql, {
      replacements,
      type: QueryTypes.UPDATE,
      transaction,
    })) as unknown as [unknown, number];
    return Number(affected ?? 0);
  }

  // ── extra recipients ──

  extraRecipients(practiceIds: readonly number[]): Promise<ExtraRecipientRow[]> {
    if (practiceIds.length === 0) return Promise.resolve([]);
    return this.select<ExtraRecipientRow>(
      'SELECT * FROM mail_extra_recipients WHERE practice_id IN (?) ORDER BY practice_id, address',
      [[...new Set(practiceIds)]],
    );
  }

  /** A practice's extra addresses, locked for the caller's transaction (adding, removing). */
  lockedExtraRecipients(practiceId: number, transaction: Transaction) {
    return this.select<ExtraRecipientRow>(
      'SELECT * FROM mail_extra_recipients WHERE practice_id = ? ORDER BY address FOR UPDATE',
      [practiceId],
      transaction,
    );
  }

  async addExtraRecipient(
    input: {
      practiceId: number;
      address: string;
      note: string | null;
      addedBy: { id: number | null; label: string };
    },
    transaction: Transaction,
  ): Promise<number> {
    const [id] = await this.sequelize.query(
      `INSERT INTO mail_extra_recipients (practice_id, address, note, added_by_user_id, added_by_label)
       VALUES (?, ?, ?, ?, ?)`,
      {
        replacements: [
          input.practiceId,
          input.address,
          input.note,
          input.addedBy.id,
          input.addedBy.label,
        ],
        type: QueryTypes.INSERT,
        transaction,
      },
    );
    return Number(id);
  }

  removeExtraRecipient(practiceId: number, id: number, transaction: Transaction): Promise<number> {
    return this.execute(
      'DELETE FROM mail_extra_recipients WHERE practice_id = ? AND id = ?',
      [practiceId, id],
      transaction,
    );
  }

  // ── scheduled jobs ──

  /**
   * Takes the lease of scheduled job `job` for `owner` if no other process holds a live one;
   * true when this process may run the job now.
   */
  claimJob(job: string, owner: string, leaseSeconds: number): Promise<boolean> {
    return this.leases.claim(job, owner, leaseSeconds);
  }

  releaseJob(job: string, owner: string, outcome: string): Promise<void> {
    return this.leases.release(job, owner, outcome);
  }
}
