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
    const user = await this.users.findByPk(id, {
      include: [{ model: Membership, attributes: ['practiceId'] }],
      transaction,
    });
    return user ? toAccount(user) : null;
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
