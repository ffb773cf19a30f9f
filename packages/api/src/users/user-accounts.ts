/**
 * The users module's account store, for sign-in and sessions (auth): finding
 * a person with their practices, provisioning from the identity provider,
 * bringing role and practices in line, recording a sign-in. Auth calls these
 * methods and never touches the users or memberships tables itself.
 */
import { Injectable } from '@nestjs/common';
import { InjectModel } from '@nestjs/sequelize';
import type { Transaction } from 'sequelize';
import type { Sequelize } from 'sequelize-typescript';
import { selectRows } from '../database/raw-select.js';
import { Membership } from './models/membership.model.js';
import { User } from './models/user.model.js';
import type { Role, UserStatus } from './roles.js';

export interface Account {
  id: number;
  email: string;
  displayName: string;
  role: Role;
  status: UserStatus;
  regionId: number;
  /** Practices led (memberships), ascending */
  practiceIds: number[];
}

function toAccount(user: User): Account {
  return {
    id: user.id,
    email: user.email,
    displayName: user.displayName,
    role: user.role,
    status: user.status,
    regionId: user.regionId,
    practiceIds: (user.memberships ?? []).map((m) => m.practiceId).sort((a, b) => a - b),
  };
}

@Injectable()
export class UserAccounts {
  constructor(
    @InjectModel(User) private readonly users: typeof User,
    @InjectModel(Membership) private readonly memberships: typeof Membership,
  ) {}

  /** Runs `work` in one transaction of the application's database. */
  transaction<T>(work: (transaction: Transaction) => Promise<T>): Promise<T> {
    return (this.users.sequelize as Sequelize).transaction(work);
  }

  async find(id: number, transaction?: Transaction): Promise<Account | null> {
    if (!transaction) return this.findNow(id);
    const user = await this.users.findByPk(id, {
      include: [{ model: Membership, attributes: ['practiceId'] }],
      transaction,
    });
    return user ? toAccount(user) : null;
  }

  /**
   * The person as they are now, with their practices, in one SELECT on a pooled connection
   * (no model instances): every signed-in request reads this (SessionService).
   */
  private async findNow(id: number): Promise<Account | null> {
    if (!Number.isSafeInteger(id)) return null;
    const [row] = await selectRows<{
      id: number;
      email: string;
      display_name: string;
      role: Role;
      status: UserStatus;
      region_id: number;
      practice_ids: string | null;
    }>(
      this.users.sequelize as Sequelize,
      `SELECT u.id, u.email, u.display_name, u.role, u.status, u.region_id,
              GROUP_CONCAT(m.practice_id ORDER BY m.practice_id) AS practice_ids
         FROM users u LEFT JOIN memberships m ON m.user_id = u.id
        WHERE u.id = ?
        GROUP BY u.id`,
      [id],
    );
    if (!row) return null;
    return {
      id: Number(row.id),
      email: row.email,
      displayName: row.display_name,
      role: row.role,
      status: row.status,
      regionId: Number(row.region_id),
      practiceIds: row.practice_ids ? row.practice_ids.split(',').map(Number) : [],
    };
  }

  /**
   * The person whose id is `userIdSql` (a column of the caller's statement, written in the
   * caller's code: never a value from a request) as a scalar
   * subquery: a JSON object, or NULL when there is no such person. Lets auth read a session and
   * its person in one statement (session-store.ts): this module writes the SQL of its own tables,
   * the caller only embeds it. Decode the value with `accountOfJson`.
   */
  accountJsonSql(userIdSql: string): string {
    return `(SELECT JSON_OBJECT('id', u.id, 'email', u.email, 'displayName', u.display_name,
        'role', u.role, 'status', u.status, 'regionId', u.region_id,
        'practiceIds', (SELECT JSON_ARRAYAGG(m.practice_id ORDER BY m.practice_id)
                          FROM memberships m WHERE m.user_id = u.id))
      FROM users u WHERE u.id = ${userIdSql})`;
  }

  /** The Account of a value read by `accountJsonSql` (null: no such person). */
  accountOfJson(value: unknown): Account | null {
    if (value === null || value === undefined) return null;
    const row = (typeof value === 'string' ? JSON.parse(value) : value) as Omit<
      Account,
      'practiceIds'
    > & { practiceIds: number[] | null };
    return {
      id: Number(row.id),
      email: row.email,
      displayName: row.displayName,
      role: row.role,
      status: row.status,
      regionId: Number(row.regionId),
      practiceIds: (row.practiceIds ?? []).map(Number),
    };
  }

  /** The person with this (lower-cased) e-mail address, their row locked for the transaction. */
  async findByEmailForUpdate(email: string, transaction: Transaction): Promise<Account | null> {
    const user = await this.users.findOne({
      where: { email },
      include: [Membership],
      transaction,
      lock: transaction.LOCK.UPDATE,
    });
    return user ? toAccount(user) : null;
  }

  async provision(
    input: { regionId: number; email: string; displayName: string; role: Role; externalId: string },
    transaction: Transaction,
  ): Promise<Account> {
    const user = await this.users.create({ ...input, status: 'active' }, { transaction });
    return { ...toAccount(user), practiceIds: [] };
  }

  async setRole(userId: number, role: Role, transaction: Transaction): Promise<void> {
    await this.users.update({ role }, { where: { id: userId }, transaction });
  }

  async addMembership(userId: number, practiceId: number, transaction: Transaction): Promise<void> {
    await this.memberships.create({ userId, practiceId, role: 'practice_lead' }, { transaction });
  }

  async removeMembership(
    userId: number,
    practiceId: number,
    transaction: Transaction,
  ): Promise<void> {
    await this.memberships.destroy({ where: { userId, practiceId }, transaction });
  }

  async recordSignIn(userId: number, externalId: string, transaction: Transaction): Promise<void> {
    await this.users.update(
      { externalId: externalId.slice(0, 255), lastSignInAt: new Date() },
      { where: { id: userId }, transaction },
    );
  }
}
