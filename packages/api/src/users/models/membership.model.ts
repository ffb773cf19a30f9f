// Association attributes use type-only imports so that decorator metadata does not
// reference a class before its module has run (ESM import cycles).
import { BelongsTo, Column, DataType, ForeignKey, Model, Table } from 'sequelize-typescript';
import { type Role, ROLES } from '../roles.js';
import { User } from './user.model.js';
import type { User as UserRow } from './user.model.js';

/**
 * A user's role at one practice (a practice lead may lead several practices).
 * The practice itself belongs to the organisations module: ask OrganisationsService.
 */
@Table({ tableName: 'memberships' })
export class Membership extends Model {
  declare id: number;

  @ForeignKey(() => User)
  @Column({ type: DataType.INTEGER, allowNull: false })
  declare userId: number;

  @Column({ type: DataType.INTEGER, allowNull: false })
  declare practiceId: number;

  @Column({ type: DataType.ENUM(...ROLES), allowNull: false, defaultValue: 'practice_lead' })
  declare role: Role;

  @BelongsTo(() => User)
  declare user?: UserRow;
}
