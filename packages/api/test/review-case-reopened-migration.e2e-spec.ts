/**
 * Migration 0501's fill from the timeline, over review cases written as the review-case module
 * writes them before 0501 existed (rows and timeline entries, state entries carrying the close's
 * finding and the reopen's author): a case never reopened, one reopened once and open again, one
 * reopened twice and closed again, one closed, reopened and closed again, their entries
 * interleaved by id. The migration is taken back (its columns dropped) and applied again over
 * them; each case gets the last reopen and the close just before it.
 */
import { QueryTypes } from 'sequelize';
import * as reopened from '../src/database/migrations/0501-review-case-reopened.js';
import type { MigrationContext } from '../src/database/migrator.js';
import { arrange, type ExtractsWorld } from './extracts-fixtures/api.js';
import { createTestApp, type TestApp } from './support/test-app.js';

type Entry = [
  caseKey: string,
  kind: 'opened' | 'state' | 'note' | 'answer',
  from: string | null,
  to: string | null,
  finding: string | null,
  author: string,
  at: string,
];

describe('migration 0501 fills reopened cases from their timelines', () => {
  let t: TestApp;
  let w: ExtractsWorld;
  const ids = new Map<string, number>();

  const context = (): { context: MigrationContext } => ({
    context: {
      sequelize: t.db,
      exec: async (sql) => {
        await t.db.query(sql, { type: QueryTypes.RAW, raw: true });
      },
    },
  });

  beforeAll(async () => {
    t = await createTestApp();
    w = await arrange(t);
  }, 120_000);
  afterAll(async () => {
    await t?.close();
  });

  it('gives each case its last reopen and the close before it, and leaves the others empty', async () => {
    const [region] = await t.db.query<{ id: number }>('SELECT id FROM regions', {
      type: QueryTypes.SELECT,
    });
    const q3 = w.quarter('2026 Q3');
    // [case, status now, finding now, closed_at now]
    const cases: [string, string, string | null, string | null][] = [
      ['never', 'closed', 'no_concern', '2026-10-02 09:00:00.000'],
      ['once', 'open', null, null],
      ['twice', 'closed', 'genuine_variation_improving', '2026-10-09 16:00:00.000'],
      ['again', 'closed', 'data_quality_issue', '2026-10-08 12:00:00.000'],
    ];
    for (const [key, status, finding, closedAt] of cases) {
      await t.db.query(
        `INSERT INTO review_cases (region_id, practice_id, quarter_id, measure_key, split, status,
           version, title, evidence, finding, opened_by_label, opened_at, updated_at, closed_at)
         VALUES (?, ?, ?, 'hba1c', 'all', ?, 1, ?, '{}', ?, 'tobias.renwick@example', ?, ?, ?)`,
        {
          replacements: [
            region!.id,
            w.practice('OV102'),
            q3,
            status,
            `Case ${key}`,
            finding,
            '2026-10-01 08:00:00.000',
            closedAt ?? '2026-10-09 17:00:00.000',
            closedAt,
          ],
          type: QueryTypes.INSERT,
        },
      );
      const [row] = await t.db.query<{ id: number }>(
        'SELECT id FROM review_cases WHERE title = ?',
        {
          replacements: [`Case ${key}`],
          type: QueryTypes.SELECT,
        },
      );
      ids.set(key, Number(row!.id));
    }

    // In id order, the cases' entries interleaved.
    const entries: Entry[] = [
      ['never', 'opened', null, 'open', null, 'Tobias Renwick', '2026-10-01 08:00:00.000'],
      ['once', 'opened', null, 'open', null, 'Tobias Renwick', '2026-10-01 08:00:00.000'],
      ['twice', 'opened', null, 'open', null, 'Tobias Renwick', '2026-10-01 08:00:00.000'],
      ['again', 'opened', null, 'open', null, 'Tobias Renwick', '2026-10-01 08:00:00.000'],
      [
        'twice',
        'state',
        'open',
        'closed',
        'explained_by_case_mix',
        'Tobias Renwick',
        '2026-10-02 10:00:00.000',
      ],
      [
        'never',
        'state',
        'open',
        'closed',
        'no_concern',
        'Tobias Renwick',
        '2026-10-02 09:00:00.000',
      ],
      [
        'once',
        'state',
        'open',
        'awaiting_practice',
        null,
        'Tobias Renwick',
        '2026-10-02 11:00:00.000',
      ],
      ['once', 'answer', null, null, null, 'Priya Calloway', '2026-10-03 09:00:00.000'],
      [
        'once',
        'state',
        'responded',
        'closed',
        'genuine_variation_action_agreed',
        'Tobias Renwick',
        '2026-10-04 09:00:00.000',
      ],
      ['twice', 'state', 'closed', 'open', null, 'Imogen Varley', '2026-10-05 09:00:00.000'],
      [
        'again',
        'state',
        'open',
        'closed',
        'no_concern',
        'Tobias Renwick',
        '2026-10-05 10:00:00.000',
      ],
      ['once', 'state', 'closed', 'open', null, 'Imogen Varley', '2026-10-06 09:00:00.000'],
      ['twice', 'note', null, null, null, 'Tobias Renwick', '2026-10-06 10:00:00.000'],
      [
        'twice',
        'state',
        'open',
        'closed',
        'data_quality_issue',
        'Tobias Renwick',
        '2026-10-07 09:00:00.000',
      ],
      ['again', 'state', 'closed', 'open', null, 'Tobias Renwick', '2026-10-07 11:00:00.000'],
      [
        'again',
        'state',
        'open',
        'closed',
        'data_quality_issue',
        'Tobias Renwick',
        '2026-10-08 12:00:00.000',
      ],
      ['twice', 'state', 'closed', 'open', null, 'Tobias Renwick', '2026-10-08 15:00:00.000'],
      [
        'twice',
        'state',
        'open',
        'closed',
        'genuine_variation_improving',
        'Tobias Renwick',
        '2026-10-09 16:00:00.000',
      ],
    ];
    for (const [key, kind, from, to, finding, author, at] of entries) {
      await t.db.query(
        `INSERT INTO review_case_entries (case_id, kind, visibility, body, from_status, to_status,
           finding, author_label, author_name, author_role, created_at)
         VALUES (?, ?, 'practice', '', ?, ?, ?, ?, ?, 'auditor', ?)`,
        {
          replacements: [ids.get(key), kind, from, to, finding, author, author, at],
          type: QueryTypes.INSERT,
        },
      );
    }

    // The migration taken back and applied again over these rows.
    await reopened.down!(context());
    await reopened.up(context());

    const rows = await t.db.query<{
      title: string;
      previous_finding: string | null;
      previous_closed_at: string | null;
      reopened_at: string | null;
      reopened_by_name: string | null;
    }>(
      `SELECT title, previous_finding,
              DATE_FORMAT(previous_closed_at, '%Y-%m-%d %H:%i') AS previous_closed_at,
              DATE_FORMAT(reopened_at, '%Y-%m-%d %H:%i') AS reopened_at, reopened_by_name
         FROM review_cases ORDER BY id`,
      { type: QueryTypes.SELECT },
    );
    expect(rows).toEqual([
      {
        title: 'Case never',
        previous_finding: null,
        previous_closed_at: null,
        reopened_at: null,
        reopened_by_name: null,
      },
      {
        title: 'Case once',
        previous_finding: 'genuine_variation_action_agreed',
        previous_closed_at: '2026-10-04 09:00',
        reopened_at: '2026-10-06 09:00',
        reopened_by_name: 'Imogen Varley',
      },
      {
        title: 'Case twice',
        previous_finding: 'data_quality_issue',
        previous_closed_at: '2026-10-07 09:00',
        reopened_at: '2026-10-08 15:00',
        reopened_by_name: 'Tobias Renwick',
      },
      {
        title: 'Case again',
        previous_finding: 'no_concern',
        previous_closed_at: '2026-10-05 10:00',
        reopened_at: '2026-10-07 11:00',
        reopened_by_name: 'Tobias Renwick',
      },
    ]);
  });
});
