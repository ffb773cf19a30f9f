/**
 * The one owner of `measure_sets`: every read and write of the table, and
 * every status change, goes through this class. A draft's UPDATE and DELETE
 * check that it is still a draft at the revision the caller read, so that
 * two editors (or two API processes) cannot both win; callers learn from the
 * count of changed rows. Published rows never change (the table's triggers
 * refuse it too).
 */
import { Inject, Injectable } from '@nestjs/common';
import { QueryTypes, type Transaction } from 'sequelize';
import { Sequelize } from 'sequelize-typescript';
import type { MeasureSetStatus } from './dto/measure-set.dto.js';

export interface MeasureSetRow {
  id: string;
  region_id: number | null;
  label: string;
  status: MeasureSetStatus;
  based_on: string | null;
  /** Canonical JSON of the validated definition */
  definition: string;
  content_hash: string;
  revision: number;
  seed_file: string | null;
  created_by_user_id: number | null;
  created_by: string;
  created_at: Date;
  updated_at: Date;
  published_by_user_id: number | null;
  published_by: string | null;
  published_at: Date | null;
}

const COLUMNS = `id, region_id, label, status, based_on, definition, content_hash, revision, seed_file,
  created_by_user_id, created_by, created_at, updated_at, published_by_user_id, published_by, published_at`;

export interface Author {
  userId: number | null;
  name: string;
}

@Injectable()
export class MeasureSetRepository {
  constructor(@Inject(Sequelize) private readonly sequelize: Sequelize) {}

  async find(id: string, transaction?: Transaction): Promise<MeasureSetRow | null> {
    const [row] = await this.sequelize.query<MeasureSetRow>(
      `SELECT ${COLUMNS} FROM measure_sets WHERE id = ?${transaction ? ' FOR UPDATE' : ''}`,
      { replacements: [id], type: QueryTypes.SELECT, transaction },
    );
    return row ?? null;
  }

  /** The versions a region reads (shipped ones and its own), drafts included, by id. */
  async ofRegion(regionId: number): Promise<MeasureSetRow[]> {
    return this.sequelize.query<MeasureSetRow>(
      `SELECT ${COLUMNS} FROM measure_sets WHERE region_id IS NULL OR region_id = ? ORDER BY id`,
      { replacements: [regionId], type: QueryTypes.SELECT },
    );
  }

  /** Ids of every published version, of every region, sorted. */
  async publishedIds(): Promise<string[]> {
    const rows = await this.sequelize.query<{ id: string }>(
      "SELECT id FROM measure_sets WHERE status = 'published' ORDER BY id",
      { type: QueryTypes.SELECT },
    );
    return rows.map((r) => r.id);
  }

  /** Ids that begin with `prefix` (to suggest the next free one). */
  async idsStartingWith(prefix: string): Promise<string[]> {
    const rows = await this.sequelize.query<{ id: string }>(
      'SELECT id FROM measure_sets WHERE id LIKE ?',
      { replacements: [`${prefix.replace(/[\\%_]/g, (c) => `\\${c}`)}%`], type: QueryTypes.SELECT },
    );
    return rows.map((r) => r.id);
  }

  /**
   * A version shipped with Cairn, published as it is seeded; a second
   * process seeding the same file at once, or a later start, changes nothing.
   */
  async seed(version: {
    id: string;
    label: string;
    definition: string;
    contentHash: string;
    seedFile: string;
  }): Promise<void> {
    await this.sequelize.query(
      `INSERT IGNORE INTO measure_sets (id, region_id, label, status, based_on, definition, content_hash,
         revision, seed_file, created_by_user_id, created_by, created_at, updated_at,
         published_by_user_id, published_by, published_at)
       VALUES (?, NULL, ?, 'published', NULL, ?, ?, 1, ?, NULL, 'Cairn', NOW(3), NOW(3), NULL, 'Cairn', NOW(3))`,
      {
        replacements: [
          version.id,
          version.label,
          version.definition,
          version.contentHash,
          version.seedFile,
        ],
        type: QueryTypes.INSERT,
      },
    );
  }

  async insertDraft(
    draft: {
      id: string;
      regionId: number;
      label: string;
      basedOn: string;
      definition: string;
      contentHash: string;
      author: Author;
    },
    transaction: Transaction,
  ): Promise<void> {
    await this.sequelize.query(
      `INSERT INTO measure_sets (id, region_id, label, status, based_on, definition, content_hash,
         revision, seed_file, created_by_user_id, created_by, created_at, updated_at)
       VALUES (?, ?, ?, 'draft', ?, ?, ?, 1, NULL, ?, ?, NOW(3), NOW(3))`,
      {
        replacements: [
          draft.id,
          draft.regionId,
          draft.label,
          draft.basedOn,
          draft.definition,
          draft.contentHash,
          draft.author.userId,
          draft.author.name,
        ],
        type: QueryTypes.INSERT,
        transaction,
      },
    );
  }

  /** Replaces a draft's definition if it is still a draft at `revision`; 1 when saved, else 0. */
  async saveDraft(
    change: {
      id: string;
      revision: number;
      label: string;
      definition: string;
      contentHash: string;
    },
    transaction: Transaction,
  ): Promise<number> {
    return this.changed(
      `UPDATE measure_sets SET label = ?, definition = ?, content_hash = ?, revision = revision + 1,
         updated_at = NOW(3)
       WHERE id = ? AND status = 'draft' AND revision = ?`,
      [change.label, change.definition, change.contentHash, change.id, change.revision],
      transaction,
    );
  }

  /** Publishes a draft still at `revision`; 1 when published, else 0. */
  async publish(
    id: string,
    revision: number,
    author: Author,
    transaction: Transaction,
  ): Promise<number> {
    return this.changed(
      `UPDATE measure_sets SET status = 'published', published_by_user_id = ?, published_by = ?,
         published_at = NOW(3), updated_at = NOW(3)
       WHERE id = ? AND status = 'draft' AND revision = ?`,
      [author.userId, author.name, id, revision],
      transaction,
    );
  }

  /** Deletes a draft; 1 when deleted, 0 when it is no longer a draft (or gone). */
  async discard(id: string, transaction: Transaction): Promise<number> {
    // BULKDELETE: the dialect answers with the number of rows deleted.
    const affected = (await this.sequelize.query(
      "DELETE FROM measure_sets WHERE id = ? AND status = 'draft'",
      { replacements: [id], type: QueryTypes.BULKDELETE, transaction },
    )) as unknown as number;
    return Number(affected ?? 0);
  }

  private async changed(
    sql: string,
    replacements: unknown[],
    transaction: Transaction,
  ): Promise<number> {
    const [, affected] = (await this.sequelize.query(sql, {
      replacements,
      type: QueryTypes.UPDATE,
      transaction,
    })) as unknown as [unknown, number];
    return Number(affected ?? 0);
  }
}
