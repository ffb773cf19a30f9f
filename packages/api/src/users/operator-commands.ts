/**
 * Operator commands for a new deployment (cli.js add-region / add-user):
 * the first region and its first regional lead, before anyone can sign in.
 * Each runs in one transaction and writes an audit event (actor "operator").
 */
import { QueryTypes, type Sequelize } from 'sequelize';
import { ROLES, type Role } from './roles.js';

export class OperatorError extends Error {}

const email = /^[^\s@]+@[^\s@]+\.[^\s@]+$/;

export async function addRegion(sequelize: Sequelize, code: string, name: string): Promise<number> {
  if (!/^[A-Z0-9][A-Z0-9-]{0,31}$/.test(code)) {
    throw new OperatorError(
      `--code must be 1–32 capital letters, digits or dashes, e.g. NORTH (got "${code}")`,
    );
  }
  if (!name.trim()) throw new OperatorError('--name must not be empty');
  return sequelize.transaction(async (transaction) => {
    const [existing] = await sequelize.query<{ id: number }>(
      'SELECT id FROM regions WHERE code = ?',
      {
        replacements: [code],
        type: QueryTypes.SELECT,
        transaction,
      },
    );
    if (existing) throw new OperatorError(`a region with code ${code} already exists`);
    const [id] = await sequelize.query('INSERT INTO regions (code, name) VALUES (?, ?)', {
      replacements: [code, name.trim()],
      type: QueryTypes.INSERT,
      transaction,
    });
    await sequelize.query(
      "INSERT INTO audit_events (occurred_at, action, outcome, actor_label, region_id, subject_type, subject_id, summary) VALUES (NOW(3), 'region.created', 'success', 'operator', ?, 'region', ?, ?)",
      {
        replacements: [
          id,
          String(id),
          `Region ${name.trim()} (${code}) created from the command line`,
        ],
        type: QueryTypes.INSERT,
        transaction,
      },
    );
    return Number(id);
  });
}

export interface AddUserInput {
  region: string;
  email: string;
  name: string;
  role: string;
  practices: string[];
}

export async function addUser(sequelize: Sequelize, input: AddUserInput): Promise<number> {
  const address = input.email.trim().toLowerCase();
  if (!email.test(address))
    throw new OperatorError(`--email must be an e-mail address (got "${input.email}")`);
  if (!input.name.trim()) throw new OperatorError('--name must not be empty');
  if (!(ROLES as readonly string[]).includes(input.role)) {
    throw new OperatorError(`--role must be one of ${ROLES.join(', ')} (got "${input.role}")`);
  }
  const role = input.role as Role;
  if (role === 'practice_lead' && input.practices.length === 0) {
    throw new OperatorError('a practice lead needs --practices CODE[,CODE…]');
  }
  if (role !== 'practice_lead' && input.practices.length > 0) {
    throw new OperatorError('--practices applies to practice leads only');
  }
  return sequelize.transaction(async (transaction) => {
    const [region] = await sequelize.query<{ id: number }>(
      'SELECT id FROM regions WHERE code = ?',
      {
        replacements: [input.region],
        type: QueryTypes.SELECT,
        transaction,
      },
    );
    if (!region)
      throw new OperatorError(
        `no region with code ${input.region}: create it first with add-region`,
      );
    const [taken] = await sequelize.query<{ id: number }>('SELECT id FROM users WHERE email = ?', {
      replacements: [address],
      type: QueryTypes.SELECT,
      transaction,
    });
    if (taken)
      throw new OperatorError(
        `${address} is already a Cairn user; change them on the Users screen`,
      );
    const practiceIds: number[] = [];
    for (const code of input.practices) {
      const [practice] = await sequelize.query<{ id: number }>(
        'SELECT id FROM practices WHERE region_id = ? AND code = ?',
        { replacements: [region.id, code], type: QueryTypes.SELECT, transaction },
      );
      if (!practice) throw new OperatorError(`no practice ${code} in region ${input.region}`);
      practiceIds.push(practice.id);
    }
    const [userId] = await sequelize.query(
      'INSERT INTO users (region_id, email, display_name, role, status) VALUES (?, ?, ?, ?, ?)',
      {
        replacements: [region.id, address, input.name.trim(), role, 'active'],
        type: QueryTypes.INSERT,
        transaction,
      },
    );
    for (const practiceId of practiceIds) {
      await sequelize.query(
        'INSERT INTO memberships (user_id, practice_id, role) VALUES (?, ?, ?)',
        {
          replacements: [userId, practiceId, 'practice_lead'],
          type: QueryTypes.INSERT,
          transaction,
        },
      );
    }
    await sequelize.query(
      "INSERT INTO audit_events (occurred_at, action, outcome, actor_label, region_id, subject_type, subject_id, summary) VALUES (NOW(3), 'user.created', 'success', 'operator', ?, 'user', ?, ?)",
      {
        replacements: [
          region.id,
          String(userId),
          `${input.name.trim()} <${address}> added as ${role} from the command line`,
        ],
        type: QueryTypes.INSERT,
        transaction,
      },
    );
    return Number(userId);
  });
}

/** Parses `--flag value` pairs. */
export function flags(args: string[]): Record<string, string> {
  const out: Record<string, string> = {};
  for (let i = 0; i < args.length; i++) {
    const arg = args[i]!;
    if (arg.startsWith('--')) {
      const value = args[i + 1];
      if (value === undefined || value.startsWith('--'))
        throw new OperatorError(`${arg} needs a value`);
      out[arg.slice(2)] = value;
      i++;
    }
  }
  return out;
}
