/**
 * Regions and practices for code that runs without the Nest container (the
 * operator commands and the demo seeding of cli.ts). Like OrganisationsService,
 * the only place outside the migrations that writes or reads these tables in SQL.
 */
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';
import { appendCommandLineEvent } from '../audit-trail/command-line.js';
import type { DemoOrganisation } from './demo-seed.js';

export class OperatorError extends Error {}

export async function regionIdByCode(
  sequelize: Sequelize,
  code: string,
  transaction: Transaction,
): Promise<number | null> {
  const [region] = await sequelize.query<{ id: number }>('SELECT id FROM regions WHERE code = ?', {
    replacements: [code],
    type: QueryTypes.SELECT,
    transaction,
  });
  return region ? Number(region.id) : null;
}

/** The region's practices with these codes, by code; unknown codes are left out. */
export async function practiceIdsByCode(
  sequelize: Sequelize,
  regionId: number,
  codes: readonly string[],
  transaction: Transaction,
): Promise<Map<string, number>> {
  if (codes.length === 0) return new Map();
  const rows = await sequelize.query<{ id: number; code: string }>(
    'SELECT id, code FROM practices WHERE region_id = ? AND code IN (?)',
    { replacements: [regionId, [...new Set(codes)]], type: QueryTypes.SELECT, transaction },
  );
  return new Map(rows.map((r) => [r.code, Number(r.id)]));
}

/** Whether any region exists yet. */
export async function hasRegion(sequelize: Sequelize): Promise<boolean> {
  const [existing] = await sequelize.query<{ n: number }>('SELECT COUNT(*) AS n FROM regions', {
    type: QueryTypes.SELECT,
  });
  return Number(existing?.n) > 0;
}

/** `cli.js add-region`: a new deployment's first region (one transaction, audited). */
export async function addRegion(sequelize: Sequelize, code: string, name: string): Promise<number> {
  if (!/^[A-Z0-9][A-Z0-9-]{0,31}$/.test(code)) {
    throw new OperatorError(
      `--code must be 1–32 capital letters, digits or dashes, e.g. NORTH (got "${code}")`,
    );
  }
  if (!name.trim()) throw new OperatorError('--name must not be empty');
  return sequelize.transaction(async (transaction) => {
    if ((await regionIdByCode(sequelize, code, transaction)) !== null)
      throw new OperatorError(`a region with code ${code} already exists`);
    const id = await insertRegion(sequelize, { code, name: name.trim() }, transaction);
    await appendCommandLineEvent(
      sequelize,
      {
        action: 'region.created',
        summary: `Region ${name.trim()} (${code}) created from the command line`,
        actorLabel: 'operator',
        regionId: id,
        subjectType: 'region',
        subjectId: id,
      },
      transaction,
    );
    return id;
  });
}

async function insert(
  sequelize: Sequelize,
  sql: string,
  replacements: unknown[],
  transaction: Transaction,
): Promise<number> {
  const [id] = await sequelize.query(sql, { replacements, type: QueryTypes.INSERT, transaction });
  return Number(id);
}

function insertRegion(
  sequelize: Sequelize,
  region: { code: string; name: string },
  transaction: Transaction,
): Promise<number> {
  return insert(
    sequelize,
    'INSERT INTO regions (code, name) VALUES (?, ?)',
    [region.code, region.name],
    transaction,
  );
}

/** The demo region, its localities and practices; returns the region id and practice ids by code. */
export async function insertDemoRegion(
  sequelize: Sequelize,
  org: Pick<DemoOrganisation, 'region' | 'localities' | 'practices'>,
  transaction: Transaction,
): Promise<{ regionId: number; practiceIds: Map<string, number> }> {
  const regionId = await insertRegion(sequelize, org.region, transaction);
  const localityIds = new Map<string, number>();
  for (const locality of org.localities) {
    localityIds.set(
      locality.code,
      await insert(
        sequelize,
        'INSERT INTO localities (region_id, code, name) VALUES (?, ?, ?)',
        [regionId, locality.code, locality.name],
        transaction,
      ),
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
        sequelize,
        'INSERT INTO practices (region_id, locality_id, code, name, list_size) VALUES (?, ?, ?, ?, ?)',
        [regionId, localityId, practice.code, practice.name, practice.listSize],
        transaction,
      ),
    );
  }
  return { regionId, practiceIds };
}
