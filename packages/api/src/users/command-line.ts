/**
 * People for code that runs without the Nest container (the operator commands
 * and the demo seeding of cli.ts): the users module's own SQL for them.
 */
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import type { Role, UserStatus } from './roles.js';

export async function userIdByEmail(
  sequelize: Sequelize,
  email: string,
  transaction: Transaction,
): Promise<number | null> {
  const [taken] = await sequelize.query<{ id: number }>('SELECT id FROM users WHERE email = ?', {
    replacements: [email],
    type: QueryTypes.SELECT,
    transaction,
  });
  return taken ? Number(taken.id) : null;
}

/** A person and the practices they lead; returns their id. */
export async function insertUser(
  sequelize: Sequelize,
  user: {
    regionId: number;
    email: string;
    displayName: string;
    role: Role;
    status?: UserStatus;
    practiceIds: readonly number[];
  },
  transaction: Transaction,
): Promise<number> {
  const [userId] = await sequelize.query(
    'INSERT INTO users (region_id, email, display_name, role, status) VALUES (?, ?, ?, ?, ?)',
    {
      replacements: [
        user.regionId,
        user.email,
        user.displayName,
        user.role,
        user.status ?? 'active',
      ],
      type: QueryTypes.INSERT,
      transaction,
    },
  );
  for (const practiceId of user.practiceIds) {
    await sequelize.query('INSERT INTO memberships (user_id, practice_id, role) VALUES (?, ?, ?)', {
      replacements: [userId, practiceId, 'practice_lead'],
      type: QueryTypes.INSERT,
      transaction,
    });
  }
  return Number(userId);
}
