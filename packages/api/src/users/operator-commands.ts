/**
 * Operator commands for a new deployment (cli.js add-region / add-user):
 * the first region and its first regional lead, before anyone can sign in.
 * Each runs in one transaction and writes an audit event (actor "operator").
 * Regions and practices are the organisations module's (add-region lives there).
 */
import type { Sequelize } from 'sequelize';
import { appendCommandLineEvent } from '../audit-trail/command-line.js';
import {
  addRegion,
  OperatorError,
  practiceIdsByCode,
  regionIdByCode,
} from '../organisations/command-line.js';
import { insertUser, userIdByEmail } from './command-line.js';
import { ROLES, type Role } from './roles.js';

export { addRegion, OperatorError };

const email = /^[^\s@]+@[^\s@]+\.[^\s@]+$/;

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
    const regionId = await regionIdByCode(sequelize, input.region, transaction);
    if (regionId === null)
      throw new OperatorError(
        `no region with code ${input.region}: create it first with add-region`,
      );
    if ((await userIdByEmail(sequelize, address, transaction)) !== null)
      throw new OperatorError(
        `${address} is already a Cairn user; change them on the Users screen`,
      );
    const found = await practiceIdsByCode(sequelize, regionId, input.practices, transaction);
    const missing = input.practices.find((code) => !found.has(code));
    if (missing !== undefined)
      throw new OperatorError(`no practice ${missing} in region ${input.region}`);
    const userId = await insertUser(
      sequelize,
      {
        regionId,
        email: address,
        displayName: input.name.trim(),
        role,
        practiceIds: input.practices.map((code) => found.get(code)!),
      },
      transaction,
    );
    await appendCommandLineEvent(
      sequelize,
      {
        action: 'user.created',
        summary: `${input.name.trim()} <${address}> added as ${role} from the command line`,
        actorLabel: 'operator',
        regionId,
        subjectType: 'user',
        subjectId: userId,
      },
      transaction,
    );
    return userId;
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
