/**
 * Review cases through the real HTTP stack and MariaDB: an auditor opens a
 * case on a practice × measure (its figures frozen), asks the practice (the
 * question's e-mail lands in the outbox), the practice's lead answers with an
 * attachment, the auditor closes it with a finding; who sees what (internal
 * notes), every step in the audit trail, and every bad input refused with
 * nothing stored: a closed case's answer, wrong type, too large, misleading
 * name, empty text, two state changes at once.
 */
import ExcelJS from 'exceljs';
import { QueryTypes } from 'sequelize';
import { submissionsKey } from '../src/benchmarks/benchmark-store.service.js';
import { SubmissionsService } from '../src/submissions/submissions.service.js';
import { arrange, type ExtractsWorld, uploadAndWait } from './extracts-fixtures/api.js';
import { csvOf, goodRows } from './extracts-fixtures/rows.js';
import { signInAs, type SignedInAgent } from './support/auth.js';
import { createTestApp, type TestApp } from './support/test-app.js';

const PDF = Buffer.from('%PDF-1.4\n1 0 obj\n<<>>\nendobj\ntrailer\n<<>>\n%%EOF\n');
const PNG = Buffer.from([
  0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13, 73, 72, 68, 82,
]);

describe('review cases', () => {
  let t: TestApp;
  let w: ExtractsWorld;
  let auditor: SignedInAgent;
  let lead: SignedInAgent;
  let otherLead: SignedInAgent;
  let regional: SignedInAgent;
  let quarterId: number;
  let practiceId: number;
  let measureKey: string;
  let caseId: number;

  const count = async (sql: string, params: unknown[] = []) =>
    Number(
      (await t.db.query<{ n: number }>(sql, { replacements: params, type: QueryTypes.SELECT }))[0]!
        .n,
    );
  const stored = async () => ({
    entries: await count('SELECT COUNT(*) AS n FROM review_case_entries WHERE case_id = ?', [
      caseId,
    ]),
    files: await count('SELECT COUNT(*) AS n FROM review_case_files WHERE case_id = ?', [caseId]),
    chunks: await count('SELECT COUNT(*) AS n FROM review_case_file_chunks'),
  });
  const current = async () => (await auditor.get(`/api/review-cases/${caseId}`).expect(200)).body;
  const answer = (text: string, version: number, files: [Buffer, string][] = []) => {
    let req = lead
      .post(`/api/review-cases/${caseId}/answers`)
      .field('text', text)
      .field('expectedVersion', String(version));
    for (const [bytes, name] of files) req = req.attach('files', bytes, name);
    return req;
  };

  beforeAll(async () => {
    t = await createTestApp();
    w = await arrange(t);
    quarterId = w.quarter('2026 Q3');
    practiceId = w.practice('OV102');
    lead = await signInAs(t, 'practice_lead_one');
    otherLead = await signInAs(t, 'practice_lead_two');
    auditor = await signInAs(t, 'auditor');
    regional = await signInAs(t, 'regional_lead');
    for (const [agent, code, rows] of [
      [lead, 'OV102', 12],
      [regional, 'OV201', 9],
    ] as const) {
      const id = w.practice(code);
      const done = await uploadAndWait(agent, id, quarterId, csvOf(goodRows(rows)), {
        name: `${code}.csv`,
      });
      await agent.post(`/api/practices/${id}/submissions/${done.id}/confirm`).expect(200);
    }
  }, 120_000);
  afterAll(async () => {
    await t?.close();
  });

  it('lists outliers from the stored benchmark, and refuses practice leads', async () => {
    const res = await auditor.get(`/api/quarters/${quarterId}/outliers?level=inner`).expect(200);
    expect(res.body.state).toBe('results');
    expect(res.body.basis.origin).toBe('draft');
    expect(res.body.practices).toBe(2);
    expect(res.body.mayOpenCases).toBe(true);
    expect(res.body.caution).toMatch(/not clinical advice/);
    measureKey = res.body.measures[0].key;
    await auditor.get(`/api/quarters/${quarterId}/outliers?level=middle`).expect(400);
    const unknown = await auditor
      .get(`/api/quarters/${quarterId}/outliers?measure=nope`)
      .expect(404);
    expect(unknown.body.type).toBe('/api/problems/measure-not-found');
    await lead.get(`/api/quarters/${quarterId}/outliers`).expect(403);
    const drill = await auditor
      .get(`/api/quarters/${quarterId}/outliers/practices/${practiceId}/measures/${measureKey}`)
      .expect(200);
    expect(drill.body.splits.map((s: { split: string }) => s.split)).toEqual([
      'all',
      'type1',
      'type2_other',
    ]);
    expect(drill.body.breakdowns.length).toBeGreaterThan(0);
    expect(drill.body.evidence.n).toBeGreaterThan(0);
    // The drill-down reads only its measure from the stored results, and shows what the
    // practice's results page shows the region's side for that measure.
    const page = (
      await auditor.get(`/api/practices/${practiceId}/quarters/${quarterId}/results`).expect(200)
    ).body;
    const own = page.measures.find(
      (m: { measure: { key: string } }) => m.measure.key === measureKey,
    );
    const withoutPeers = (x: Record<string, unknown>) =>
      Object.fromEntries(Object.entries(x).filter(([k]) => k !== 'peers'));
    expect(drill.body.splits).toEqual(own.splits.map(withoutPeers));
    expect(drill.body.trendQuarters).toEqual(
      page.quarters.map((q: { quarterLabel: string }) => q.quarterLabel),
    );
    expect(drill.body.dataQuality).toEqual(page.dataQuality);
    const { detail } = (
      await auditor
        .get(`/api/practices/${practiceId}/quarters/${quarterId}/results/detail`)
        .expect(200)
    ).body;
    const cells = detail.measures
      .find((m: { measure: string }) => m.measure === measureKey)
      .splits.find((x: { split: string }) => x.split === 'all');
    expect(drill.body.everyone).toEqual(cells.everyone);
    expect(drill.body.breakdowns.map((b: { cells: unknown }) => b.cells)).toEqual(cells.breakdowns);
    expect(detail.values).toContainEqual(drill.body.histogram);
    // Asked again, the answer kept by what it was built from is the same.
    const again = await auditor
      .get(`/api/quarters/${quarterId}/outliers/practices/${practiceId}/measures/${measureKey}`)
      .expect(200);
    expect(again.body).toEqual(drill.body);
    // A confirm of another practice changes the set: the next drill-down is built from it.
    const ov201 = w.practice('OV201');
    const replaced = await uploadAndWait(regional, ov201, quarterId, csvOf(goodRows(11)), {
      name: 'OV201-again.csv',
    });
    await regional.post(`/api/practices/${ov201}/submissions/${replaced.id}/confirm`).expect(200);
    const after = await auditor
      .get(`/api/quarters/${quarterId}/outliers/practices/${practiceId}/measures/${measureKey}`)
      .expect(200);
    expect(after.body.basis.key).not.toBe(drill.body.basis.key);
    expect(after.body.basis.resultId).not.toBe(drill.body.basis.resultId);
    expect(after.body.splits[0].region.n.value).not.toBe(drill.body.splits[0].region.n.value);
    // The key of the quarter's current-set row is the benchmark store's key of its pointers.
    const submissions = t.app.get(SubmissionsService);
    const ids = (await submissions.currentSet(quarterId)).map(
      (p: { submissionId: number }) => p.submissionId,
    );
    expect(await submissions.currentSetKeys([quarterId])).toEqual(
      new Map([[quarterId, submissionsKey(ids)]]),
    );
  });

  it('pages the records behind a result under pseudonyms, and exports the evidence as XLSX', async () => {
    const base = `/api/quarters/${quarterId}/outliers/practices/${practiceId}/measures/${measureKey}`;
    const page = await auditor.get(`${base}/records?pageSize=5`).expect(200);
    expect(page.body.total).toBeGreaterThan(0);
    expect(page.body.records.length).toBe(Math.min(5, page.body.total));
    const refs = await t.db.query<{ record_ref: string; pseudonym: string }>(
      'SELECT r.record_ref, r.pseudonym FROM care_records r JOIN practice_quarters pq ON pq.current_submission_id = r.submission_id WHERE pq.practice_id = ?',
      { replacements: [practiceId], type: QueryTypes.SELECT },
    );
    const text = JSON.stringify(page.body);
    for (const r of refs) expect(text).not.toContain(`"${r.record_ref}"`);
    expect(refs.map((r) => r.pseudonym)).toEqual(
      expect.arrayContaining(page.body.records.map((r: { pseudonym: string }) => r.pseudonym)),
    );
    await auditor.get(`${base}/records?pageSize=500`).expect(400);
    const xlsx = await auditor
      .get(`${base}/evidence.xlsx`)
      .buffer(true)
      .parse((r, cb) => {
        const chunks: Buffer[] = [];
        r.on('data', (c: Buffer) => chunks.push(c));
        r.on('end', () => cb(null, Buffer.concat(chunks)));
      })
      .expect(200);
    const workbook = new ExcelJS.Workbook();
    await workbook.xlsx.load(xlsx.body as unknown as ArrayBuffer);
    expect(workbook.worksheets.map((w) => w.name)).toEqual([
      'About',
      'By diabetes type',
      'Breakdowns',
      'Trend',
      'Data quality',
      'Records',
    ]);
    expect(workbook.getWorksheet('Records')!.rowCount).toBe(page.body.total + 1);
    await lead.get(`${base}/evidence.xlsx`).expect(403);
  });

  it('opens a case with its figures frozen; only auditors open', async () => {
    const body = { quarterId, practiceId, measureKey, note: 'Rate far below peers; check coding.' };
    await regional.post('/api/review-cases').send(body).expect(403);
    await lead.post('/api/review-cases').send(body).expect(403);
    const res = await auditor.post('/api/review-cases').send(body).expect(201);
    caseId = res.body.id;
    expect(res.body.status).toBe('open');
    expect(res.body.version).toBe(1);
    expect(res.body.evidence).toMatchObject({ origin: 'draft', n: expect.any(Number) });
    expect(res.body.actions).toMatchObject({ ask: true, answer: false, close: true });
    const again = await auditor.post('/api/review-cases').send(body).expect(409);
    expect(again.body).toMatchObject({ type: '/api/problems/case-already-open', caseId });
  });

  it('shows internal notes to the region’s side only, and the case only to its practice’s leads', async () => {
    const asRegional = await regional.get(`/api/review-cases/${caseId}`).expect(200);
    expect(asRegional.body.timeline.map((e: { visibility: string }) => e.visibility)).toEqual([
      'internal',
    ]);
    expect(asRegional.body.actions).toEqual({
      ask: false,
      answer: false,
      comment: false,
      note: false,
      close: false,
      reopen: false,
    });
    const asLead = await lead.get(`/api/review-cases/${caseId}`).expect(200);
    expect(asLead.body.timeline).toEqual([]);
    const refused = await otherLead.get(`/api/review-cases/${caseId}`).expect(403);
    expect(refused.body.type).toBe('/api/problems/practice-not-yours');
    expect((await otherLead.get('/api/review-cases').expect(200)).body.cases).toEqual([]);
    expect((await lead.get('/api/review-cases').expect(200)).body.cases).toHaveLength(1);
  });

  it('asks the practice, queueing the e-mail to its leads with the change', async () => {
    const empty = await auditor
      .post(`/api/review-cases/${caseId}/transitions`)
      .send({ action: 'ask', expectedVersion: 1, message: '   ' })
      .expect(422);
    expect(empty.body.type).toBe('/api/problems/empty-text');
    expect((await current()).version).toBe(1);
    const res = await auditor
      .post(`/api/review-cases/${caseId}/transitions`)
      .send({
        action: 'ask',
        expectedVersion: 1,
        message: 'Could you check how foot checks are coded?',
      })
      .expect(200);
    expect(res.body).toMatchObject({ status: 'awaiting_practice', version: 2 });
    const mail = await t.db.query<{ recipient_address: string; practice_id: number }>(
      "SELECT recipient_address, practice_id FROM outbox_messages WHERE kind = 'review_case_question'",
      { type: QueryTypes.SELECT },
    );
    expect(mail.map((m) => m.recipient_address)).toEqual([lead.user.email.toLowerCase()]);
    const asLead = await lead.get(`/api/review-cases/${caseId}`).expect(200);
    expect(asLead.body.timeline.map((e: { kind: string }) => e.kind)).toEqual(['question']);
    expect(asLead.body.actions).toMatchObject({ answer: true, note: false, close: false });
  });

  it('refuses a wrong, misnamed or too large attachment and an empty answer, storing nothing', async () => {
    const before = await stored();
    const cases: [ReturnType<typeof answer>, number, string][] = [
      [
        answer('Here it is', 2, [[Buffer.from([0x4d, 0x5a, 0x90, 0]), 'tool.pdf']]),
        415,
        'attachment-type-not-allowed',
      ],
      [answer('Here it is', 2, [[PNG, 'chart.pdf']]), 415, 'attachment-name-misleading'],
      [
        answer('Here it is', 2, [
          [Buffer.concat([PDF, Buffer.alloc(10 * 1024 * 1024)]), 'big.pdf'],
        ]),
        413,
        'attachment-too-large',
      ],
      [answer('   ', 2, [[PDF, 'plan.pdf']]), 422, 'empty-text'],
      [answer('Here it is', 1, [[PDF, 'plan.pdf']]), 409, 'case-changed'],
    ];
    for (const [req, status, slug] of cases) {
      const res = await req;
      expect([res.status, res.body.type]).toEqual([status, `/api/problems/${slug}`]);
      expect(res.body.detail).toMatch(/Nothing was stored|nothing was stored|empty/);
    }
    const changed = await answer('Here it is', 1);
    expect(changed.body.case).toMatchObject({
      id: caseId,
      version: 2,
      status: 'awaiting_practice',
    });
    expect(await stored()).toEqual(before);
    expect((await current()).version).toBe(2);
  });

  it('takes the practice’s answer with its attachment; the auditor downloads it byte for byte', async () => {
    const res = await answer('We found a coding problem; see the attached plan.', 2, [
      [PDF, 'plan.pdf'],
    ]).expect(200);
    expect(res.body).toMatchObject({ status: 'responded', version: 3 });
    const entry = res.body.timeline.find((e: { kind: string }) => e.kind === 'answer');
    expect(entry.files).toEqual([
      expect.objectContaining({
        fileName: 'plan.pdf',
        mediaType: 'application/pdf',
        sizeBytes: PDF.length,
      }),
    ]);
    const download = await auditor
      .get(entry.files[0].path)
      .buffer(true)
      .parse((r, cb) => {
        const chunks: Buffer[] = [];
        r.on('data', (c: Buffer) => chunks.push(c));
        r.on('end', () => cb(null, Buffer.concat(chunks)));
      })
      .expect(200);
    expect(Buffer.compare(download.body as Buffer, PDF)).toBe(0);
    await otherLead.get(entry.files[0].path).expect(403);
  });

  it('keeps internal notes from the practice and refuses them from practice leads', async () => {
    await auditor
      .post(`/api/review-cases/${caseId}/comments`)
      .send({ body: 'Coding explanation is plausible.', visibility: 'internal' })
      .expect(200);
    const refused = await lead
      .post(`/api/review-cases/${caseId}/comments`)
      .send({ body: 'A note', visibility: 'internal' })
      .expect(403);
    expect(refused.body.type).toBe('/api/problems/case-action-not-allowed');
    await lead
      .post(`/api/review-cases/${caseId}/comments`)
      .send({ body: '', visibility: 'practice' })
      .expect(422);
    const asLead = (await lead.get(`/api/review-cases/${caseId}`).expect(200)).body;
    expect(asLead.timeline.some((e: { visibility: string }) => e.visibility === 'internal')).toBe(
      false,
    );
  });

  it('lets one of two state changes at once win; the other gets 409 with the case as it is', async () => {
    const version = (await current()).version;
    const [a, b] = await Promise.all([
      auditor.post(`/api/review-cases/${caseId}/transitions`).send({
        action: 'close',
        expectedVersion: version,
        message: 'Closing.',
        finding: 'data_quality_issue',
      }),
      auditor
        .post(`/api/review-cases/${caseId}/transitions`)
        .send({ action: 'ask', expectedVersion: version, message: 'One more thing?' }),
    ]);
    const statuses = [a.status, b.status].sort();
    expect(statuses).toEqual([200, 409]);
    const loser = a.status === 409 ? a : b;
    const winner = a.status === 200 ? a : b;
    expect(loser.body.type).toBe('/api/problems/case-changed');
    expect(loser.body.case).toMatchObject({ version: version + 1, status: winner.body.status });
    if (winner.body.status !== 'closed') {
      await auditor
        .post(`/api/review-cases/${caseId}/transitions`)
        .send({
          action: 'close',
          expectedVersion: version + 1,
          message: 'Closing.',
          finding: 'data_quality_issue',
        })
        .expect(200);
    }
  });

  it('refuses an answer to a closed case; reopening opens it again', async () => {
    const c = await current();
    expect(c).toMatchObject({
      status: 'closed',
      finding: 'data_quality_issue',
      findingLabel: 'Data quality issue',
    });
    const before = await stored();
    const res = await answer('Late answer', c.version, [[PDF, 'late.pdf']]);
    expect([res.status, res.body.type]).toEqual([409, '/api/problems/case-closed']);
    expect(res.body.case.status).toBe('closed');
    expect(await stored()).toEqual(before);
    await auditor
      .post(`/api/review-cases/${caseId}/transitions`)
      .send({
        action: 'close',
        expectedVersion: c.version,
        message: 'again',
        finding: 'no_concern',
      })
      .expect(409);
    const reopened = await auditor
      .post(`/api/review-cases/${caseId}/transitions`)
      .send({ action: 'reopen', expectedVersion: c.version, message: 'New figures arrived.' })
      .expect(200);
    expect(reopened.body).toMatchObject({ status: 'open', finding: null, closedAt: null });
    // The close it undid stays on the case, for the auditor and the practice lead alike.
    const undone = {
      by: auditor.user.displayName,
      previousFinding: 'data_quality_issue',
      previousFindingLabel: 'Data quality issue',
      previousClosedAt: c.closedAt,
    };
    expect(c.closedAt).toEqual(expect.any(String));
    expect(reopened.body.reopened).toMatchObject(undone);
    expect(Date.parse(reopened.body.reopened.at)).toBeGreaterThanOrEqual(Date.parse(c.closedAt));
    const seenByLead = (await lead.get(`/api/review-cases/${caseId}`).expect(200)).body;
    expect(seenByLead.reopened).toEqual(reopened.body.reopened);
    const listed = (await lead.get('/api/review-cases').expect(200)).body.cases.find(
      (x: { id: number }) => x.id === caseId,
    );
    expect(listed.reopened).toEqual(reopened.body.reopened);
  });

  it('answers every case route × role × own/other practice as the policy says (a real case)', async () => {
    // The case is open again (reopened above). Requests that would change it send bodies the
    // service refuses after access is decided (empty text), so nothing changes.
    const fileId = (
      await t.db.query<{ id: number }>('SELECT id FROM review_case_files WHERE case_id = ?', {
        replacements: [caseId],
        type: QueryTypes.SELECT,
      })
    )[0]!.id;
    const callers = {
      'lead of practice': lead,
      'lead of another': otherLead,
      'regional lead': regional,
      auditor,
    };
    const routes: [
      string,
      (a: SignedInAgent) => Promise<{ status: number; body: { type?: string } }>,
      string[],
    ][] = [
      [
        'GET case',
        (a) => a.get(`/api/review-cases/${caseId}`),
        ['200', '403 practice-not-yours', '200', '200'],
      ],
      [
        'GET file',
        (a) => a.get(`/api/review-cases/${caseId}/files/${fileId}`),
        ['200', '403 practice-not-yours', '200', '200'],
      ],
      [
        'POST transitions',
        (a) =>
          a
            .post(`/api/review-cases/${caseId}/transitions`)
            .send({ action: 'ask', expectedVersion: 1, message: ' ' }),
        ['403 role-not-allowed', '403 role-not-allowed', '403 role-not-allowed', '422 empty-text'],
      ],
      [
        'POST comments',
        (a) =>
          a
            .post(`/api/review-cases/${caseId}/comments`)
            .send({ body: ' ', visibility: 'practice' }),
        ['422 empty-text', '403 practice-not-yours', '403 role-not-allowed', '422 empty-text'],
      ],
      [
        'POST answers',
        (a) =>
          a
            .post(`/api/review-cases/${caseId}/answers`)
            .field('text', ' ')
            .field('expectedVersion', '1'),
        [
          '409 case-wrong-state',
          '403 practice-not-yours',
          '403 role-not-allowed',
          '403 role-not-allowed',
        ],
      ],
    ];
    const got = [];
    for (const [name, send] of routes) {
      const row = [];
      for (const agent of Object.values(callers)) {
        const res = await send(agent);
        row.push(
          res.status < 300
            ? String(res.status)
            : `${res.status} ${res.body.type?.replace('/api/problems/', '')}`,
        );
      }
      got.push([name, row]);
    }
    expect(got).toEqual(routes.map(([name, , want]) => [name, want]));
    expect(await current()).toMatchObject({ status: 'open' });
  });

  it('records every step in the audit trail and keeps the timeline append-only', async () => {
    const events = await t.db.query<{ action: string }>(
      "SELECT action FROM audit_events WHERE subject_type = 'review_case' AND subject_id = ? ORDER BY id",
      { replacements: [String(caseId)], type: QueryTypes.SELECT },
    );
    const actions = events.map((e) => e.action);
    for (const a of [
      'review_case.opened',
      'review_case.asked',
      'mail.queued',
      'review_case.answered',
      'review_case.file_added',
      'review_case.noted',
      'review_case.closed',
      'review_case.reopened',
    ])
      expect(actions).toContain(a);
    await expect(
      t.db.query("UPDATE review_case_entries SET body = 'changed'", { type: QueryTypes.UPDATE }),
    ).rejects.toThrow(/append-only/);
    await expect(
      t.db.query('DELETE FROM review_case_file_chunks', { type: QueryTypes.DELETE }),
    ).rejects.toThrow(/append-only/);
  });
});
