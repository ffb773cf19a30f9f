/**
 * Coverage of an audit quarter through the real HTTP stack: every practice is in exactly one
 * state (current, awaiting confirmation, none), so the totals add up to the practices; those
 * with a current submission and another extract waiting are counted apart; the last refusal is
 * given in words. People are named by their names, not their e-mail addresses.
 */
import { signInAs, type SignedInAgent } from './support/auth.js';
import { createTestApp, type TestApp } from './support/test-app.js';
import { arrange, uploadAndWait, type ExtractsWorld } from './extracts-fixtures/api.js';
import { csvOf, goodRows, HEADINGS } from './extracts-fixtures/rows.js';

interface CoverageRow {
  practice: { code: string };
  state: string;
  current: { submissionId: number; confirmedBy: string | null } | null;
  waiting: { submissionId: number; status: string }[];
  lastProblem: { submissionId: number; code: string | null; reason: string } | null;
}

describe('coverage of an audit quarter', () => {
  let t: TestApp;
  let w: ExtractsWorld;
  let priya: SignedInAgent;
  let imogen: SignedInAgent;
  let q3: number;

  beforeAll(async () => {
    t = await createTestApp();
    w = await arrange(t);
    q3 = w.quarter('2026 Q3');
    priya = await signInAs(t, 'practice_lead_one');
    imogen = await signInAs(t, 'regional_lead');

    // OV102: current, and a newer extract waiting.
    const ov102 = w.practice('OV102');
    const first = await uploadAndWait(priya, ov102, q3, csvOf(goodRows(12, 100)), {
      name: 'first.csv',
    });
    await priya.post(`/api/practices/${ov102}/submissions/${first.id}/confirm`).expect(200);
    await uploadAndWait(priya, ov102, q3, csvOf(goodRows(10, 300)), { name: 'second.csv' });
    // OV104: current only. OV105: waiting only. OV106: refused only.
    const ov104 = await uploadAndWait(imogen, w.practice('OV104'), q3, csvOf(goodRows(5, 500)), {
      name: 'ov104.csv',
    });
    await imogen
      .post(`/api/practices/${w.practice('OV104')}/submissions/${ov104.id}/confirm`)
      .expect(200);
    await uploadAndWait(imogen, w.practice('OV105'), q3, csvOf(goodRows(4, 600)), {
      name: 'ov105.csv',
    });
    const refused = await uploadAndWait(
      imogen,
      w.practice('OV106'),
      q3,
      csvOf(
        goodRows(3, 700),
        HEADINGS.filter((h) => h !== 'sex'),
      ),
      { name: 'ov106.csv' },
    );
    expect(refused.status).toBe('rejected');
  });
  afterAll(async () => {
    await t?.close();
  });

  it('counts each practice once: current + awaiting confirmation + none = practices', async () => {
    const res = await imogen.get(`/api/quarters/${q3}/coverage`).expect(200);
    const { totals } = res.body;
    expect(totals.current + totals.awaitingConfirmation + totals.none).toBe(totals.practices);
    expect(totals).toMatchObject({ current: 2, currentWithWaiting: 1, awaitingConfirmation: 1 });
    const rows = res.body.practices as CoverageRow[];
    for (const state of ['current', 'awaiting_confirmation', 'none'])
      expect(rows.filter((r) => r.state === state).length).toBe(
        {
          current: totals.current,
          awaiting_confirmation: totals.awaitingConfirmation,
          none: totals.none,
        }[state],
      );
    const byCode = new Map(rows.map((r) => [r.practice.code, r]));
    expect(byCode.get('OV102')).toMatchObject({ state: 'current' });
    expect(byCode.get('OV102')!.waiting).toHaveLength(1);
    expect(byCode.get('OV105')).toMatchObject({ state: 'awaiting_confirmation' });
    expect(byCode.get('OV106')).toMatchObject({
      state: 'none',
      lastProblem: { code: 'missing_columns', reason: 'Required columns missing' },
    });
  });

  it('names who confirmed and who uploaded, not their e-mail addresses', async () => {
    const coverage = await imogen.get(`/api/quarters/${q3}/coverage`).expect(200);
    const rows = coverage.body.practices as CoverageRow[];
    expect(rows.find((r) => r.practice.code === 'OV102')!.current!.confirmedBy).toBe(
      'Priya Calloway',
    );
    expect(rows.find((r) => r.practice.code === 'OV104')!.current!.confirmedBy).toBe(
      'Imogen Varley',
    );
    const history = await priya
      .get(`/api/practices/${w.practice('OV102')}/submissions`)
      .expect(200);
    const q = history.body.quarters.find((x: { quarter: { id: number } }) => x.quarter.id === q3);
    for (const s of q.submissions as { uploadedBy: string }[])
      expect(s.uploadedBy).toBe('Priya Calloway');
    const current = q.submissions.find((s: { isCurrent: boolean }) => s.isCurrent);
    expect(current.confirmedBy).toBe('Priya Calloway');
  });

  it('gives a refusal its words and every reason found in the heading row', async () => {
    const ov106 = w.practice('OV106');
    const history = await imogen.get(`/api/practices/${ov106}/submissions`).expect(200);
    const refused = history.body.quarters[0].submissions[0];
    expect(refused.refusal).toMatchObject({
      code: 'missing_columns',
      title: 'Required columns missing',
      problems: [{ code: 'missing_columns', title: 'Required columns missing' }],
    });
  });
});
