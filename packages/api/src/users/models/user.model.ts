// Association attributes use type-only imports so that decorator metadata does not
// reference a class before its module has run (ESM import cycles).
import { Column, DataType, HasMany, Model, Table } from 'sequelize-typescript';
import { Membership } from './membership.model.js';
import { ROLES, type Role, USER_STATUSES, type UserStatus } from '../roles.js';
import type { Membership as MembershipRow } from './membership.model.js';

export { ROLES, type Role, USER_STATUSES, type UserStatus };

/** A person who signs in to Cairn. Their practices are their memberships. */
@Table({ tableName: 'users' })
export class User extends Model {
  declare id: number;

  /** The region (organisations module) this person belongs to */
  @Column({ type: DataType.INTEGER, allowNull: false })
  declare regionId: number;

  /** Lower-cased e-mail address: the identity the sign-in assertion names */
  @Column({ type: DataType.STRING(254), allowNull: false, unique: true })
  declare email: string;

  @Column({ type: DataType.STRING(200), allowNull: false })
  declare displayName: string;

  @Column({ type: DataType.ENUM(...ROLES), allowNull: false })
  declare role: Role;

  @Column({ type: DataType.ENUM(...USER_STATUSES), allowNull: false, defaultValue: 'active' })
  declare status: UserStatus;

  /** Subject (NameID) of the last sign-in assertion, when one has been seen */
  @Column({ type: DataType.STRING(255), allowNull: true })
  declare externalId: string | null;

  @Column({ type: DataType.DATE(3), allowNull: true })
  declare lastSignInAt: Date | null;

  /** Kinds of e-mail this person chose not to receive, comma-separated ('' for none) */
  @Column({ type: DataType.STRING(255), allowNull: false, defaultValue: '' })
  declare mailOptOuts: string;

  @HasMany(() => Membership)
  declare memberships?: MembershipRow[];
}
