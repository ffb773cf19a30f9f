/**
 * Audit quarters through the API: the quarters page (GET /api/quarter-overview)
 * for every role, opening the next quarter with a checked deadline, moving a
 * deadline, changing the measure-set version (only while open and before any
 * report), closing and reopening — every refusal naming its field, and
 * nothing stored when refused.
 */
import { QueryTypes } from 'sequelize';
import { QuarterReports } from '../src/quarters/quarter-reports.js';
import { arrange, type ExtractsWorld, uploadAndWait } from './extracts-fixtures/api.js';
import { csvOf, goodRows } from './extracts-fixtures/rows.js';
import { signInAs, type SignedInAgent } from './support/auth.js';
import { createTestApp, type TestApp } from './support/test-app.js';

const DEFAULT = 'cairn-default-2026.1';

describe('audit quarters', () => {
  let t: TestApp;
  let world: ExtractsWorld;
  let lead: SignedInAgent;
  let auditor: SignedInAgent;
  let practiceLead: SignedInAgent;
  /** Reports of quarters, as a report module would register them (none by default). */
  const reports = new Map<
    number,
    { id: number; label: string; status: string; publishedAt: string }[]
  >();

  const stored = async () =>
    t.db.query<{ year: number; quarter: number; status: string; deadline: string; set: string }>(
      `SELECT year, quarter, status, DATE_FORMAT(submission_deadline, '%Y-%m-%d') AS deadline,
         measure_set_id AS \`set\` FROM audit_quarters ORDER BY year, quarter`,
      { type: QueryTypes.SELECT },
    );
  const events = async (prefix: string) => {
    const [r] = await t.db.query<{ n: number }>(
      'SELECT COUNT(*) AS n FROM audit_events WHERE action LIKE ?',
      { replacements: [`${prefix}%`], type: QueryTypes.SELECT },
    );
    return Number(r!.n);
  };

  beforeAll(async () => {
    t = await createTestApp();
    world = await arrange(t);
    t.app.get(QuarterReports).register({
      reportsOf: async (_regionId, ids) =>
        new Map(ids.filter((id) => reports.has(id)).map((id) => [id, reports.get(id)!])),
    });
    lead = await signInAs(t, 'regional_lead');
    auditor = await signInAs(t, 'auditor');
    practiceLead = await signInAs(t, 'practice_lead_one');
    // One practice with a current submission in 2026 Q3, one with an extract awaiting confirmation.
    const q3 = world.quarter('2026 Q3');
    const done = await uploadAndWait(
      practiceLead,
      world.practice('OV102'),
      q3,
      csvOf(goodRows(6)),
      {
        name: 'q3.csv',
      },
    );
    await practiceLead
      .post(`/api/practices/${world.practice('OV102')}/submissions/${done.id}/confirm`)
      .expect(200);
    await uploadAndWait(lead, world.practice('OV103'), q3, csvOf(goodRows(4)), { name: 'q3.csv' });
  });
  afterAll(async () => {
    await t?.close();
  });

  describe('the quarters page', () => {
    it('gives the regional lead every quarter with coverage, reports and actions, and the next quarter', async () => {
      const res = await lead.get('/api/quarter-overview').expect(200);
      const body = res.body;
      expect(body.quarters.map((q: { quarter: { label: string } }) => q.quarter.label)).toEqual([
        '2026 Q3',
        '2026 Q2',
      ]);
      expect(body.quarters[0]).toMatchObject({
        quarter: { status: 'open', measureSetId: DEFAULT },
        measureSet: { id: DEFAULT, label: 'Cairn default measure set 2026.1' },
        coverage: { practices: 30, current: 1, awaitingConfirmation: 1, none: 28, records: 6 },
        reports: [],
        actions: { close: true, reopen: false, changeDeadline: true, changeMeasureSet: true },
      });
      expect(body.quarters[1]).toMatchObject({
        quarter: { status: 'closed' },
        coverage: { current: 0, none: 30 },
        actions: { close: false, reopen: true, changeDeadline: true, changeMeasureSet: false },
      });
      expect(body.next).toEqual({
        year: 2026,
        quarter: 4,
        label: '2026 Q4',
        windowStart: '2026-01',
        windowEnd: '2026-12',
        quarterEnd: '2026-12-31',
        defaultDeadline: expect.stringMatching(/^2027-/),
        defaultMeasureSetId: DEFAULT,
      });
      expect(body.measureSets).toEqual([
        { id: DEFAULT, label: 'Cairn default measure set 2026.1' },
      ]);
      expect(body.actions).toEqual({ open: true });
    });

    it('lets the auditor read coverage and change nothing', async () => {
      const body = (await auditor.get('/api/quarter-overview').expect(200)).body;
      expect(body.actions).toEqual({ open: false });
      expect(body.quarters[0].coverage.current).toBe(1);
      expect(body.quarters[0].actions).toEqual({
        close: false,
        reopen: false,
        changeDeadline: false,
        changeMeasureSet: false,
      });
    });

    it('shows practice leads the quarters and deadlines, not the region’s coverage', async () => {
      const body = (await practiceLead.get('/api/quarter-overview').expect(200)).body;
      expect(body.quarters[0].coverage).toBeNull();
      expect(body.quarters[0].quarter.submissionDeadline).toMatch(/^\d{4}-\d{2}-\d{2}$/);
      expect(body.actions).toEqual({ open: false });
    });
  });

  describe('opening a quarter', () => {
    it.each([
      [
        'a deadline before the quarter ends',
        { submissionDeadline: '2026-12-30' },
        422,
        {
          field: 'submissionDeadline',
          message:
            'must fall after the quarter ends: 2026 Q4 ends on 31 December 2026, and its extracts cannot be complete before then',
        },
      ],
      [
        'a deadline on the last day of the quarter',
        { submissionDeadline: '2026-12-31' },
        422,
        {
          field: 'submissionDeadline',
          message: expect.stringMatching(/^must fall after the quarter ends/),
        },
      ],
      [
        'a date that is not in the calendar',
        { submissionDeadline: '2027-02-30' },
        400,
        { field: 'submissionDeadline', message: 'must be a date written YYYY-MM-DD' },
      ],
      [
        'a date in another format',
        { submissionDeadline: '14/02/2027' },
        400,
        { field: 'submissionDeadline', message: 'must be a date written YYYY-MM-DD' },
      ],
      [
        'a measure set Cairn does not know',
        { measureSetId: 'regional-2030.1' },
        422,
        {
          field: 'measureSetId',
          message: expect.stringMatching(/^is not a measure set Cairn knows/),
        },
      ],
    ])('refuses %s, naming the field, storing nothing', async (_, extra, status, error) => {
      const before = [await stored(), await events('quarter.')];
      const res = await lead
        .post('/api/quarters')
        .send({ year: 2026, quarter: 4, ...extra })
        .expect(status);
      expect(res.body.errors).toEqual([error]);
      expect([await stored(), await events('quarter.')]).toEqual(before);
    });

    it('refuses auditors and practice leads', async () => {
      await auditor.post('/api/quarters').send({ year: 2026, quarter: 4 }).expect(403);
      await practiceLead.post('/api/quarters').send({ year: 2026, quarter: 4 }).expect(403);
    });

    it('opens the next quarter with the chosen deadline and measure set', async () => {
      const res = await lead
        .post('/api/quarters')
        .send({ year: 2026, quarter: 4, submissionDeadline: '2027-02-14', measureSetId: DEFAULT })
        .expect(201);
      expect(res.body).toMatchObject({
        label: '2026 Q4',
        status: 'open',
        submissionDeadline: '2027-02-14',
        measureSetId: DEFAULT,
      });
      const page = (await lead.get('/api/quarter-overview').expect(200)).body;
      expect(page.quarters[0].quarter.label).toBe('2026 Q4');
      expect(page.next.label).toBe('2027 Q1');
    });
  });

  describe('changing a quarter', () => {
    const q4 = async () =>
      (await lead.get('/api/quarter-overview').expect(200)).body.quarters[0].quarter.id as number;

    it('moves the deadline, and refuses one before the quarter ends without storing it', async () => {
      const id = await q4();
      const early = await lead
        .patch(`/api/quarters/${id}`)
        .send({ submissionDeadline: '2026-11-01' })
        .expect(422);
      expect(early.body).toMatchObject({
        type: '/api/problems/deadline-too-early',
        errors: [{ field: 'submissionDeadline' }],
      });
      expect((await stored()).find((q) => q.quarter === 4)!.deadline).toBe('2027-02-14');
      const res = await lead
        .patch(`/api/quarters/${id}`)
        .send({ submissionDeadline: '2027-02-21' })
        .expect(200);
      expect(res.body.submissionDeadline).toBe('2027-02-21');
      expect(await events('quarter.deadline_changed')).toBe(1);
    });

    it('refuses a change that names nothing, and a draft measure set', async () => {
      const id = await q4();
      const nothing = await lead.patch(`/api/quarters/${id}`).send({}).expect(422);
      expect(nothing.body.type).toBe('/api/problems/nothing-to-change');
      await lead
        .post(`/api/measure-sets/${DEFAULT}/drafts`)
        .send({ id: 'cairn-default-2026.2', label: 'Ostrevale 2026.2' })
        .expect(201);
      const draft = await lead
        .patch(`/api/quarters/${id}`)
        .send({ measureSetId: 'cairn-default-2026.2' })
        .expect(422);
      expect(draft.body.type).toBe('/api/problems/measure-set-draft');
      expect((await stored()).find((q) => q.quarter === 4)!.set).toBe(DEFAULT);
    });

    it('changes the measure set of an open quarter to another published version', async () => {
      const id = await q4();
      const current = (await lead.get('/api/measure-sets/cairn-default-2026.2').expect(200)).body;
      await lead
        .post('/api/measure-sets/cairn-default-2026.2/publish')
        .send({ revision: current.revision })
        .expect(200);
      const res = await lead
        .patch(`/api/quarters/${id}`)
        .send({ measureSetId: 'cairn-default-2026.2' })
        .expect(200);
      expect(res.body.measureSetId).toBe('cairn-default-2026.2');
      expect(await events('quarter.measure_set_changed')).toBe(1);
      const used = (await lead.get('/api/measure-sets/cairn-default-2026.2').expect(200)).body;
      expect(used.usedBy).toEqual([{ kind: 'quarter', id, label: '2026 Q4', status: 'open' }]);
    });

    it('keeps the measure set of a quarter that has a published report', async () => {
      const id = await q4();
      reports.set(id, [
        {
          id: 1,
          label: '2026 Q4 report',
          status: 'published',
          publishedAt: '2027-03-01T09:00:00.000Z',
        },
      ]);
      try {
        const page = (await lead.get('/api/quarter-overview').expect(200)).body;
        expect(page.quarters[0].reports).toEqual(reports.get(id));
        expect(page.quarters[0].actions.changeMeasureSet).toBe(false);
        const res = await lead
          .patch(`/api/quarters/${id}`)
          .send({ measureSetId: DEFAULT })
          .expect(409);
        expect(res.body).toMatchObject({
          type: '/api/problems/quarter-measure-set-fixed',
          detail: `A report has been published from 2026 Q4 with cairn-default-2026.2; its figures stay tied to that version.`,
        });
        // The deadline may still move.
        await lead
          .patch(`/api/quarters/${id}`)
          .send({ submissionDeadline: '2027-02-28' })
          .expect(200);
      } finally {
        reports.delete(id);
      }
    });

    it('closes a quarter, keeps its measure set while closed, and reopens it with a new deadline', async () => {
      const id = await q4();
      const closed = await lead.post(`/api/quarters/${id}/close`).expect(200);
      expect(closed.body.status).toBe('closed');
      const fixed = await lead
        .patch(`/api/quarters/${id}`)
        .send({ measureSetId: DEFAULT })
        .expect(409);
      expect(fixed.body.detail).toBe('2026 Q4 is closed. Reopen it to change its measure set.');
      const early = await lead
        .post(`/api/quarters/${id}/reopen`)
        .send({ submissionDeadline: '2026-10-01' })
        .expect(422);
      expect(early.body.errors[0].field).toBe('submissionDeadline');
      expect((await stored()).find((q) => q.quarter === 4)!.status).toBe('closed');
      const reopened = await lead
        .post(`/api/quarters/${id}/reopen`)
        .send({ submissionDeadline: '2027-03-07' })
        .expect(200);
      expect(reopened.body).toMatchObject({ status: 'open', submissionDeadline: '2027-03-07' });
      // Reopening without a body keeps the deadline.
      await lead.post(`/api/quarters/${id}/close`).expect(200);
      const again = await lead.post(`/api/quarters/${id}/reopen`).expect(200);
      expect(again.body.submissionDeadline).toBe('2027-03-07');
    });

    it('refuses changes from auditors and practice leads', async () => {
      const id = await q4();
      await auditor
        .patch(`/api/quarters/${id}`)
        .send({ submissionDeadline: '2027-04-01' })
        .expect(403);
      await practiceLead
        .patch(`/api/quarters/${id}`)
        .send({ submissionDeadline: '2027-04-01' })
        .expect(403);
      await practiceLead.post(`/api/quarters/${id}/close`).expect(403);
    });
  });
});
