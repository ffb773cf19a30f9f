/** The command-line set-up of a new deployment: first region and first users. */
import { QueryTypes } from 'sequelize';
import { addRegion, addUser, flags } from '../src/users/operator-commands.js';
import { freshDatabase, testConfig } from './support/test-app.js';

describe('operator commands', () => {
  let fresh: Awaited<ReturnType<typeof freshDatabase>>;

  beforeAll(async () => {
    const { config, secrets } = testConfig();
    fresh = await freshDatabase(config, secrets);
  });
  afterAll(async () => {
    await fresh?.drop();
  });

  it('creates a region and its first regional lead, each with an audit event', async () => {
    await addRegion(fresh.db, 'NORTH', 'North Vale');
    const id = await addUser(fresh.db, {
      region: 'NORTH',
      email: 'First.Lead@Example.org',
      name: 'First Lead',
      role: 'regional_lead',
      practices: [],
    });
    const [user] = await fresh.db.query<{ email: string; role: string; status: string }>(
      'SELECT email, role, status FROM users WHERE id = ?',
      { replacements: [id], type: QueryTypes.SELECT },
    );
    expect(user).toEqual({
      email: 'first.lead@example.org',
      role: 'regional_lead',
      status: 'active',
    });
    const events = await fresh.db.query<{ action: string; actor_label: string }>(
      'SELECT action, actor_label FROM audit_events ORDER BY id',
      { type: QueryTypes.SELECT },
    );
    expect(events).toEqual([
      { action: 'region.created', actor_label: 'operator' },
      { action: 'user.created', actor_label: 'operator' },
    ]);
  });

  it('refuses bad input with a specific message and stores nothing', async () => {
    const count = async () =>
      Number(
        (
          await fresh.db.query<{ n: number }>('SELECT COUNT(*) AS n FROM users', {
            type: QueryTypes.SELECT,
          })
        )[0]?.n,
      );
    const before = await count();
    const base = {
      region: 'NORTH',
      email: 'x@example.org',
      name: 'X',
      role: 'auditor',
      practices: [],
    };
    await expect(addRegion(fresh.db, 'NORTH', 'Again')).rejects.toThrow(
      'a region with code NORTH already exists',
    );
    await expect(addRegion(fresh.db, 'north vale', 'x')).rejects.toThrow(/--code must be/);
    await expect(addUser(fresh.db, { ...base, region: 'SOUTH' })).rejects.toThrow(
      'no region with code SOUTH: create it first with add-region',
    );
    await expect(addUser(fresh.db, { ...base, email: 'not-an-address' })).rejects.toThrow(
      /--email must be/,
    );
    await expect(addUser(fresh.db, { ...base, role: 'admin' })).rejects.toThrow(
      '--role must be one of regional_lead, practice_lead, auditor (got "admin")',
    );
    await expect(addUser(fresh.db, { ...base, role: 'practice_lead' })).rejects.toThrow(
      'a practice lead needs --practices',
    );
    await expect(
      addUser(fresh.db, { ...base, role: 'practice_lead', practices: ['P404'] }),
    ).rejects.toThrow('no practice P404 in region NORTH');
    await expect(addUser(fresh.db, { ...base, email: 'first.lead@example.org' })).rejects.toThrow(
      /already a Cairn user/,
    );
    expect(await count()).toBe(before);
  });

  it('reads --flag value pairs and names a flag without a value', () => {
    expect(flags(['--code', 'A', '--name', 'B C'])).toEqual({ code: 'A', name: 'B C' });
    expect(() => flags(['--code'])).toThrow('--code needs a value');
  });
});
