// Association attributes use type-only imports so that decorator metadata does not
// reference a class before its module has run (ESM import cycles).
import {
  BelongsTo,
  Column,
  DataType,
  ForeignKey,
  HasMany,
  Model,
  Table,
} from 'sequelize-typescript';
import { Practice } from './practice.model.js';
import { Region } from './region.model.js';
import type { Region as RegionRow } from './region.model.js';
import type { Practice as PracticeRow } from './practice.model.js';

/** A locality: a group of neighbouring practices within a region. */
@Table({ tableName: 'localities' })
export class Locality extends Model {
  declare id: number;

  @ForeignKey(() => Region)
  @Column({ type: DataType.INTEGER, allowNull: false })
  declare regionId: number;

  @Column({ type: DataType.STRING(32), allowNull: false })
  declare code: string;

  @Column({ type: DataType.STRING(200), allowNull: false })
  declare name: string;

  @BelongsTo(() => Region)
  declare region?: RegionRow;

  @HasMany(() => Practice)
  declare practices?: PracticeRow[];
}
