/** digest_schedules (migration 0650): when each report's digests are to be sent. */
import { Inject, Injectable } from '@nestjs/common';
import { QueryTypes } from 'sequelize';
import { Sequelize } from 'sequelize-typescript';

export interface DigestScheduleRow {
  source_id: number;
  region_id: number;
  send_at: Date;
  state: 'scheduled' | 'sent' | 'cancelled';
  scheduled_by_user_id: number | null;
  scheduled_by_label: string;
  scheduled_at: Date;
  ran_at: Date | null;
  outcome: string | null;
}

@Injectable()
export class DigestSchedulesRepository {
  constructor(@Inject(Sequelize) private readonly sequelize: Sequelize) {}

  async find(sourceId: number): Promise<DigestScheduleRow | null> {
    const rows = await this.sequelize.query<DigestScheduleRow>(
      'SELECT * FROM digest_schedules WHERE source_id = ?',
      { replacements: [sourceId], type: QueryTypes.SELECT },
    );
    return rows[0] ?? null;
  }

  /** Sets (or moves) the time; false when the digests were sent already. */
  async schedule(
    sourceId: number,
    regionId: number,
    sendAt: Date,
    by: { userId: number | null; label: string },
  ): Promise<boolean> {
    await this.sequelize.query(
      `INSERT INTO digest_schedules (source_id, region_id, send_at, scheduled_by_user_id, scheduled_by_label)
         VALUES (?, ?, ?, ?, ?)
       ON DUPLICATE KEY UPDATE
         send_at = IF(state = 'sent', send_at, VALUES(send_at)),
         scheduled_by_user_id = IF(state = 'sent', scheduled_by_user_id, VALUES(scheduled_by_user_id)),
         scheduled_by_label = IF(state = 'sent', scheduled_by_label, VALUES(scheduled_by_label)),
         scheduled_at = IF(state = 'sent', scheduled_at, NOW(3)),
         state = IF(state = 'sent', 'sent', 'scheduled')`,
      { replacements: [sourceId, regionId, sendAt, by.userId, by.label], type: QueryTypes.UPSERT },
    );
    return (await this.find(sourceId))?.state === 'scheduled';
  }

  async cancel(sourceId: number): Promise<boolean> {
    const [, affected] = (await this.sequelize.query(
      "UPDATE digest_schedules SET state = 'cancelled' WHERE source_id = ? AND state = 'scheduled'",
      { replacements: [sourceId], type: QueryTypes.UPDATE },
    )) as unknown as [unknown, number];
    return affected > 0;
  }

  due(now: Date): Promise<DigestScheduleRow[]> {
    return this.sequelize.query<DigestScheduleRow>(
      "SELECT * FROM digest_schedules WHERE state = 'scheduled' AND send_at <= ? ORDER BY send_at",
      { replacements: [now], type: QueryTypes.SELECT },
    );
  }

  async markRan(sourceId: number, outcome: string): Promise<void> {
    await this.sequelize.query(
      "UPDATE digest_schedules SET state = 'sent', ran_at = NOW(3), outcome = ? WHERE source_id = ? AND state = 'scheduled'",
      { replacements: [outcome.slice(0, 500), sourceId], type: QueryTypes.UPDATE },
    );
  }
}
