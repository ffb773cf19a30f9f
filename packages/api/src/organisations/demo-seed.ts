/**
 * Loads the invented demo organisation (seed-data/out/organisation.json,
 * written by seed-data/generate.ts) into an empty database, in one transaction.
 */
import { readFileSync } from 'node:fs';
import type { Sequelize } from 'sequelize';
import { appendCommandLineEvent } from '../audit-trail/command-line.js';
import { insertUser } from '../users/command-line.js';
import { hasRegion, insertDemoRegion } from './command-line.js';

export interface DemoOrganisation {
  region: { code: string; name: string };
  localities: { code: string; name: string }[];
  practices: { code: string; name: string; locality: string; listSize: number }[];
  users: {
    email: string;
    displayName: string;
    role: 'regional_lead' | 'practice_lead' | 'auditor';
    status?: 'active' | 'deactivated';
    practices?: string[];
  }[];
}

export function readDemoOrganisation(file: string): DemoOrganisation {
  return JSON.parse(readFileSync(file, 'utf8')) as DemoOrganisation;
}

/** Returns false (and changes nothing) when the database already holds a region. */
export async function seedDemoOrganisation(
  sequelize: Sequelize,
  org: DemoOrganisation,
): Promise<boolean> {
  if (await hasRegion(sequelize)) return false;
  await sequelize.transaction(async (transaction) => {
    const { regionId, practiceIds } = await insertDemoRegion(sequelize, org, transaction);
    for (const user of org.users) {
      await insertUser(
        sequelize,
        {
          regionId,
          email: user.email.toLowerCase(),
          displayName: user.displayName,
          role: user.role,
          status: user.status ?? 'active',
          practiceIds: (user.practices ?? []).map((code) => {
            const practiceId = practiceIds.get(code);
            if (practiceId === undefined)
              throw new Error(`user ${user.email} names unknown practice ${code}`);
            return practiceId;
          }),
        },
        transaction,
      );
    }
    await appendCommandLineEvent(
      sequelize,
      {
        action: 'demo.seeded',
        summary: `Demo organisation ${org.region.name} created: ${org.localities.length} localities, ${org.practices.length} practices, ${org.users.length} users`,
        actorLabel: 'system',
        regionId,
        subjectType: 'region',
        subjectId: regionId,
      },
      transaction,
    );
  });
  return true;
}
