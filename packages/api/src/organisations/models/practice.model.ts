// Association attributes use type-only imports so that decorator metadata does not
// reference a class before its module has run (ESM import cycles).
import { BelongsTo, Column, DataType, ForeignKey, Model, Table } from 'sequelize-typescript';
import { Locality } from './locality.model.js';
import { Region } from './region.model.js';
import type { Region as RegionRow } from './region.model.js';
import type { Locality as LocalityRow } from './locality.model.js';

/** A practice (or diabetes clinic) that sends one extract per audit quarter. */
@Table({ tableName: 'practices' })
export class Practice extends Model {
  declare id: number;

  @ForeignKey(() => Region)
  @Column({ type: DataType.INTEGER, allowNull: false })
  declare regionId: number;

  @ForeignKey(() => Locality)
  @Column({ type: DataType.INTEGER, allowNull: true })
  declare localityId: number | null;

  /** The practice's code in Cairn, unique within its region */
  @Column({ type: DataType.STRING(32), allowNull: false })
  declare code: string;

  @Column({ type: DataType.STRING(200), allowNull: false })
  declare name: string;

  /** Registered list size, where the region records it (context only, never a denominator) */
  @Column({ type: DataType.INTEGER, allowNull: true })
  declare listSize: number | null;

  @Column({ type: DataType.BOOLEAN, allowNull: false, defaultValue: true })
  declare active: boolean;

  @BelongsTo(() => Region)
  declare region?: RegionRow;

  @BelongsTo(() => Locality)
  declare locality?: LocalityRow;
}
