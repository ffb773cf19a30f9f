/**
 * Loads the invented demo organisation (seed-data/out/organisation.json,
 * written by seed-data/generate.ts) into an empty database, in one transaction.
 */
import { readFileSync } from 'node:fs';
import { QueryTypes, type Sequelize } from 'sequelize';

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
  const [existing] = await sequelize.query<{ n: number }>('SELECT COUNT(*) AS n FROM regions', {
    type: QueryTypes.SELECT,
  });
  if (Number(existing?.n) > 0) return false;
  await sequelize.transaction(async (transaction) => {
    const insert = async (sql: string, replacements: unknown[]) => {
      const [id] = await sequelize.query(sql, {
        replacements,
        type: QueryTypes.INSERT,
        transaction,
      });
      return Number(id);
    };
    const regionId = await insert('INSERT INTO regions (code, name) VALUES (?, ?)', [
      org.region.code,
      org.region.name,
    ]);
    const localityIds = new Map<string, number>();
    for (const locality of org.localities) {
      localityIds.set(
        locality.code,
        await insert('INSERT INTO localities (region_id, code, name) VALUES (?, ?, ?)', [
          regionId,
          locality.code,
          locality.name,
        ]),
      );
    }
    const practiceIds = new Map<string, number>();
    for (const practice of org.practices) {
      const localityId = localityIds.get(practice.locality);
      if (localityId === undefined)
        throw new Error(`practice ${practice.code} names unknown locality ${practice.locality}`);
      practiceIds.set(
        practice.code,
        await insert(
          'INSERT INTO practices (region_id, locality_id, code, name, list_size) VALUES (?, ?, ?, ?, ?)',
          [regionId, localityId, practice.code, practice.name, practice.listSize],
        ),
      );
    }
    for (const user of org.users) {
      const userId = await insert(
        'INSERT INTO users (region_id, email, display_name, role, status) VALUES (?, ?, ?, ?, ?)',
        [regionId, user.email.toLowerCase(), user.displayName, user.role, user.status ?? 'active'],
      );
      for (const code of user.practices ?? []) {
        const practiceId = practiceIds.get(code);
        if (practiceId === undefined)
          throw new Error(`user ${user.email} names unknown practice ${code}`);
        await insert('INSERT INTO memberships (user_id, practice_id, role) VALUES (?, ?, ?)', [
          userId,
          practiceId,
          'practice_lead',
        ]);
      }
    }
    await insert(
      "INSERT INTO audit_events (occurred_at, action, outcome, actor_label, region_id, subject_type, subject_id, summary) VALUES (NOW(3), 'demo.seeded', 'success', 'system', ?, 'region', ?, ?)",
      [
        regionId,
        String(regionId),
        `Demo organisation ${org.region.name} created: ${org.localities.length} localities, ${org.practices.length} practices, ${org.users.length} users`,
      ],
    );
  });
  return true;
}
