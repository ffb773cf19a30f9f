/** Test helpers for the extracts API: arrange practices and quarters, upload and wait. */
import { QueryTypes } from 'sequelize';
import type TestAgent from 'supertest/lib/agent.js';
import { systemActor } from '../../src/auth/actor.js';
import { QuartersService } from '../../src/quarters/quarters.service.js';
import { demoIds, seedDemoOrganisation } from '../support/auth.js';
import type { TestApp } from '../support/test-app.js';

export interface ExtractsWorld {
  practice: (code: string) => number;
  quarter: (label: string) => number;
}

/** The demo organisation, and audit quarters 2026 Q2 (closed) and 2026 Q3 (open). */
export async function arrange(t: TestApp, labels = ['2026 Q2', '2026 Q3']): Promise<ExtractsWorld> {
  await seedDemoOrganisation(t);
  const ids = await demoIds(t);
  const [region] = await t.db.query<{ id: number }>('SELECT id FROM regions', {
    type: QueryTypes.SELECT,
  });
  const quarters = t.app.get(QuartersService);
  const byLabel = new Map<string, number>();
  labels.forEach((label, i) => void i);
  for (const [i, label] of labels.entries()) {
    const [year, q] = label.split(' Q').map(Number) as [number, number];
    const row = await quarters.open(systemActor('system', region!.id), {
      year,
      quarter: q,
      status: i === labels.length - 1 ? 'open' : 'closed',
    });
    byLabel.set(label, row.id);
  }
  return {
    practice: ids.practice,
    quarter: (label) => {
      const id = byLabel.get(label);
      if (id === undefined) throw new Error(`no quarter ${label}`);
      return id;
    },
  };
}

export interface UploadOptions {
  name: string;
  dateConvention?: 'day_first' | 'month_first';
}

export async function upload(
  agent: TestAgent,
  practiceId: number,
  quarterId: number,
  file: Buffer,
  options: UploadOptions,
) {
  const req = agent
    .post(`/api/practices/${practiceId}/quarters/${quarterId}/extracts`)
    .query(options.dateConvention ? { dateConvention: options.dateConvention } : {})
    .attach('file', file, options.name);
  return req;
}

/** Polls a submission until it is no longer processing. */
export async function waitDone(
  agent: TestAgent,
  practiceId: number,
  submissionId: number,
  timeoutMs = 60_000,
) {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const res = await agent
      .get(`/api/practices/${practiceId}/submissions/${submissionId}`)
      .expect(200);
    if (res.body.status !== 'processing') return res.body;
    if (Date.now() > deadline) throw new Error(`submission ${submissionId} still processing`);
    await new Promise((r) => setTimeout(r, 50));
  }
}

export async function uploadAndWait(
  agent: TestAgent,
  practiceId: number,
  quarterId: number,
  file: Buffer,
  options: UploadOptions,
) {
  const res = await upload(agent, practiceId, quarterId, file, options);
  if (res.status !== 202)
    throw new Error(`upload answered ${res.status}: ${JSON.stringify(res.body)}`);
  return waitDone(agent, practiceId, res.body.id);
}

/** What readers see for a practice-quarter: the current submission and a checksum of its records. */
export async function currentState(t: TestApp, practiceId: number, quarterId: number) {
  const [row] = await t.db.query<{ current: number | null; n: number; checksum: string | null }>(
    `SELECT pq.current_submission_id AS current, COUNT(r.source_row) AS n,
            SHA2(GROUP_CONCAT(CONCAT_WS('|', r.source_row, r.record_ref, r.hba1c_mmol_mol, r.systolic) ORDER BY r.source_row SEPARATOR ';'), 256) AS checksum
       FROM practice_quarters pq LEFT JOIN care_records r ON r.submission_id = pq.current_submission_id
      WHERE pq.practice_id = ? AND pq.quarter_id = ? GROUP BY pq.current_submission_id`,
    { replacements: [practiceId, quarterId], type: QueryTypes.SELECT },
  );
  return {
    current: row?.current ?? null,
    records: Number(row?.n ?? 0),
    checksum: row?.checksum ?? null,
  };
}
