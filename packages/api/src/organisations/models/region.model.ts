// Association attributes use type-only imports so that decorator metadata does not
// reference a class before its module has run (ESM import cycles).
import { Column, DataType, HasMany, Model, Table } from 'sequelize-typescript';
import { Locality } from './locality.model.js';
import { Practice } from './practice.model.js';
import type { Practice as PracticeRow } from './practice.model.js';
import type { Locality as LocalityRow } from './locality.model.js';

/** A region: the programme's whole area, with its own regional lead(s) and peers. */
@Table({ tableName: 'regions' })
export class Region extends Model {
  declare id: number;

  @Column({ type: DataType.STRING(32), allowNull: false, unique: true })
  declare code: string;

  @Column({ type: DataType.STRING(200), allowNull: false })
  declare name: string;

  @HasMany(() => Locality)
  declare localities?: LocalityRow[];

  @HasMany(() => Practice)
  declare practices?: PracticeRow[];
}
