/**
 * Every page each role can reach, in headless Chromium against the built app with the demo
 * region, checked with axe-core (tests/support/a11y.ts): no serious or critical violation, one
 * h1, no skipped heading level, everything inside landmarks, and a document title that names the
 * page ("Coverage · Cairn"). Minor and moderate findings are printed. The console must stay free
 * of errors and of React Router warnings.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { type A11yViolation, auditA11y, describeViolations } from '../support/a11y.ts';
import { type BrowserSession, openBrowser, waitForLanding } from '../support/browser.ts';
import { type CairnServer, startCairn } from '../support/cairn-server.ts';

/** Page structure rules (moderate in axe) that Cairn holds as strictly as the serious ones. */
const STRUCTURE = [
  'page-has-heading-one',
  'heading-order',
  'region',
  'landmark-one-main',
  'landmark-unique',
  'landmark-no-duplicate-banner',
  'landmark-no-duplicate-contentinfo',
  'landmark-no-duplicate-main',
  'document-title',
];

interface Visit {
  /** What the page is, for messages */
  name: string;
  path: string;
  /** The document title expected (without " · Cairn") */
  title: string;
  /** Console errors the visit causes on purpose (a refusal the page explains) */
  expectedErrors?: string[];
}

describe('accessibility of every page, for every role', () => {
  let server: CairnServer;
  let browser: BrowserSession;
  const warnings: string[] = [];
  const minor = new Map<string, A11yViolation & { pages: string[] }>();

  beforeAll(async () => {
    server = await startCairn();
    browser = await openBrowser();
    browser.page.on('console', (message) => {
      if (message.type() === 'warning') warnings.push(message.text());
    });
  });
  afterAll(async () => {
    const list = [...minor.values()];
    console.log(`Accessibility: ${list.length} kinds of minor or moderate finding.`);
    if (list.length > 0) {
      console.log(
        `Minor and moderate accessibility findings (not failing):\n${list
          .map((v) => `${describeViolations([v])} on ${v.pages.join(', ')}`)
          .join('\n')}`,
      );
    }
    await browser?.close();
    await server?.stop();
  });

  async function signIn(name: string) {
    const { page } = browser;
    await browser.context.clearCookies();
    await page.goto(server.baseUrl + '/sign-in', { waitUntil: 'networkidle' });
    await page.getByRole('button', { name: "Continue to your organisation's sign-in" }).click();
    await page.getByRole('button', { name: `Sign in as ${name}` }).click();
    await waitForLanding(page, name);
  }

  /** Reads the API as the signed-in person (the page's own session). */
  async function api<T>(path: string): Promise<T> {
    return browser.page.evaluate(async (url) => {
      const res = await fetch(url);
      if (!res.ok) throw new Error(`${url} answered ${res.status}`);
      return (await res.json()) as T;
    }, path);
  }

  /** Sends JSON as the signed-in person (with the session's CSRF token), as the pages do. */
  async function post<T>(path: string, body: unknown): Promise<T> {
    return browser.page.evaluate(
      async ({ path, body }) => {
        const session = (await (await fetch('/api/session')).json()) as { csrfToken: string };
        const res = await fetch(path, {
          method: 'POST',
          headers: { 'Content-Type': 'application/json', 'X-CSRF-Token': session.csrfToken },
          body: JSON.stringify(body),
        });
        if (!res.ok) throw new Error(`${path} answered ${res.status}: ${await res.text()}`);
        return (await res.json()) as T;
      },
      { path, body },
    );
  }

  /** The open audit quarter, and practices' ids by code (never a hard-coded database id). */
  async function region() {
    const quarters = await api<{ id: number; status: string }[]>('/api/quarters');
    const open = quarters.find((q) => q.status === 'open')!;
    const coverage = await api<{ practices: { practice: { id: number; code: string } }[] }>(
      `/api/quarters/${open.id}/coverage`,
    );
    const id = (code: string) =>
      coverage.practices.find((p) => p.practice.code === code)!.practice.id;
    return { open, id };
  }

  /** Set by the newer pages' visits below: the report published, the review case opened. */
  let reportId = 0;
  let caseId = 0;
  let ov201 = 0;

  /** Sends an extract as the signed-in person, as the upload page does. */
  async function uploadCsv(practiceId: number, quarterId: number, name: string, text: string) {
    return browser.page.evaluate(
      async ({ practiceId, quarterId, name, text }) => {
        const session = (await (await fetch('/api/session')).json()) as { csrfToken: string };
        const form = new FormData();
        form.append('file', new File([text], name, { type: 'text/csv' }));
        const res = await fetch(`/api/practices/${practiceId}/quarters/${quarterId}/extracts`, {
          method: 'POST',
          body: form,
          headers: { 'X-CSRF-Token': session.csrfToken },
        });
        return (await res.json()) as { id: number };
      },
      { practiceId, quarterId, name, text },
    );
  }

  /** A CSV of one clean row (each column's example value from the format), for a waiting extract. */
  async function cleanCsv(ref: string): Promise<string> {
    const format = await api<{ columns: { key: string; example: string }[] }>(
      '/api/extracts/format',
    );
    const cells = format.columns.map((c) => (c.key === 'record_ref' ? ref : c.example));
    return `${format.columns.map((c) => c.key).join(',')}\n${cells.join(',')}\n`;
  }

  async function check(who: string, visit: Visit) {
    const { page } = browser;
    const errorsBefore = browser.errors.length;
    const where = `${who}: ${visit.name} (${visit.path})`;
    await page.goto(server.baseUrl + visit.path, { waitUntil: 'networkidle' });
    await page
      .locator('h1')
      .first()
      .waitFor({ timeout: 15_000 })
      .catch((error: Error) => {
        throw new Error(`${where}: no h1 (${error.message})`);
      });
    // Lazy icons and late queries settle.
    await page.waitForTimeout(250);
    // Every page as it was checked, for a person to look at (tests/artifacts/a11y-…).
    await browser.screenshot(
      `a11y-${who}-${visit.name}`
        .replace(/[^a-z0-9]+/gi, '-')
        .toLowerCase()
        .slice(0, 80),
    );
    const report = await auditA11y(page);
    expect(report.blocking, `${where}\n${describeViolations(report.blocking)}`).toEqual([]);
    const structure = report.other.filter((v) => STRUCTURE.includes(v.id));
    expect(structure, `${where}\n${describeViolations(structure)}`).toEqual([]);
    for (const v of report.other) {
      const seen = minor.get(v.id) ?? { ...v, pages: [] };
      seen.pages.push(`${who} ${visit.path}`);
      minor.set(v.id, seen);
    }
    expect(await page.locator('h1').count(), `${where}: one h1`).toBe(1);
    expect(await page.title(), where).toBe(visit.title ? `${visit.title} · Cairn` : 'Cairn');
    expect(browser.errors.slice(errorsBefore), where).toEqual(visit.expectedErrors ?? []);
  }

  /** Pages every role reads: audit quarters, measure sets and one of them, the profile. */
  async function everyone(): Promise<Visit[]> {
    const sets = await api<{ id: string; label: string }[]>('/api/measure-sets');
    const set = sets[0]!;
    return [
      { name: 'audit quarters', path: '/quarters', title: 'Audit quarters' },
      { name: 'measure sets', path: '/measure-sets', title: 'Measure sets' },
      {
        name: 'a measure set',
        path: `/measure-sets/${encodeURIComponent(set.id)}`,
        title: set.label,
      },
      { name: 'profile', path: '/profile', title: 'Your profile' },
      { name: 'not found', path: '/no-such-page', title: 'Page not found' },
      { name: 'sign-in (signed in)', path: '/sign-in', title: 'Sign in' },
    ];
  }

  /** The regional lead's mail pages, as another role meets them (not for their role). */
  const mailPages = (): Visit[] => [
    { name: 'mail deliveries (not for this role)', path: '/deliveries', title: 'Mail deliveries' },
    {
      name: 'mail recipients (not for this role)',
      path: '/mail-recipients',
      title: 'Mail recipients',
    },
  ];

  it('signed out: the landing page, sign-in, sign-out and a page that does not exist', async () => {
    await browser.context.clearCookies();
    for (const visit of [
      { name: 'landing', path: '/', title: '' },
      { name: 'sign-in', path: '/sign-in', title: 'Sign in' },
      { name: 'signed out', path: '/sign-in?signedOut=1', title: 'Sign in' },
      { name: 'sign-in refused', path: '/sign-in?refused=unknown-user', title: 'Sign in' },
      { name: 'not found', path: '/no-such-page', title: 'Page not found' },
      { name: 'a page that needs sign-in (sent to sign in)', path: '/coverage', title: 'Sign in' },
    ])
      await check('signed out', visit);
  });

  it('regional lead: every page, a report, a refusal and sign-out', async () => {
    await signIn('Imogen Varley');
    const quarters = await api<{ id: number; status: string }[]>('/api/quarters');
    const open = quarters.find((q) => q.status === 'open')!;
    const coverage = await api<{ practices: { practice: { id: number; code: string } }[] }>(
      `/api/quarters/${open.id}/coverage`,
    );
    const ov105 = coverage.practices.find((p) => p.practice.code === 'OV105')!.practice.id;
    const refused = await uploadCsv(
      ov105,
      open.id,
      'refused.csv',
      'record_ref,birth_year,sex,NHS number\nA-1,1950,F,\n',
    );
    const history = await api<{
      quarters: { submissions: { id: number; status: string; counts: unknown }[] }[];
    }>(`/api/practices/${ov105}/submissions`);
    const report = history.quarters
      .flatMap((q) => q.submissions)
      .find((s) => s.status === 'accepted')!;
    for (const visit of [
      { name: 'home', path: '/', title: 'Home' },
      { name: 'upload', path: '/extracts/upload', title: 'Upload extract' },
      { name: 'submissions, no practice chosen', path: '/submissions', title: 'Submissions' },
      { name: 'submissions', path: `/practices/${ov105}/submissions`, title: 'Submissions' },
      {
        name: 'a report',
        path: `/practices/${ov105}/submissions/${report.id}`,
        title: `Submission ${report.id}`,
      },
      {
        name: 'a refusal',
        path: `/practices/${ov105}/submissions/${refused.id}`,
        title: `Submission ${refused.id}`,
      },
      { name: 'coverage', path: '/coverage', title: 'Coverage' },
      { name: 'users', path: '/users', title: 'Users' },
      { name: 'audit trail', path: '/audit-trail', title: 'Audit trail' },
      { name: 'mail deliveries', path: '/deliveries', title: 'Mail deliveries' },
      { name: 'mail recipients', path: '/mail-recipients', title: 'Mail recipients' },
      ...(await everyone()),
    ])
      await check('regional lead', visit);
    // Signing out ends on the signed-out sign-in page.
    await check('regional lead', { name: 'sign-out', path: '/sign-out', title: 'Sign in' });
  });

  it('regional lead: results, benchmark, a published report, outliers, digests, a measure-set draft', async () => {
    await signIn('Imogen Varley');
    const { open, id } = await region();
    ov201 = id('OV201');
    const ov303 = id('OV303');
    const before: Visit[] = [
      { name: 'sign-in landing', path: '/start', title: 'Home' },
      { name: 'digests, none yet', path: '/digests', title: 'Digests' },
      {
        name: 'reports of the open quarter, none yet',
        path: `/reports?quarter=${open.id}`,
        title: 'Reports',
      },
    ];
    for (const visit of before) await check('regional lead', visit);
    // Publish the open quarter's report, as the quarter's reports page does.
    const report = await post<{ id: number; label: string }>(`/api/quarters/${open.id}/reports`, {
      releaseNote: 'Report published for the accessibility walk.',
    });
    reportId = report.id;
    const [set] = await api<{ id: string }[]>('/api/measure-sets');
    const draft = await post<{ id: string; label: string }>(
      `/api/measure-sets/${encodeURIComponent(set!.id)}/drafts`,
      // A versioned id, as the form asks for (the set's own, one version on).
      {
        id: set!.id.replace(/\.(\d+)$/, (_, v: string) => `.${Number(v) + 1}`),
        label: 'Draft for the walk',
      },
    );
    const outliers = await api<{
      rows: { practice: { id: number; code: string }; measure: { key: string; label: string } }[];
    }>(`/api/quarters/${open.id}/outliers`);
    const outlier = outliers.rows[0]!;
    for (const visit of [
      { name: 'region benchmark', path: '/benchmark', title: 'Region benchmark' },
      {
        name: 'region benchmark, adjusted limits, case mix, a locality',
        path: `/benchmark?quarter=${open.id}&limits=adjusted&casemix=on&split=type2_other`,
        title: 'Region benchmark',
      },
      { name: 'results (sent to the benchmark)', path: '/results', title: 'Region benchmark' },
      { name: 'practice results', path: `/practices/${ov201}/results`, title: 'Results · OV201' },
      ...['peers', 'values', 'breakdowns', 'kidney', 'insulin', 'quality', 'recall'].map((tab) => ({
        name: `practice results, ${tab}`,
        path: `/practices/${ov201}/results?tab=${tab}`,
        title: 'Results · OV201',
      })),
      {
        name: 'practice results, no current submission',
        path: `/practices/${ov303}/results`,
        title: 'Results · OV303',
      },
      { name: 'reports', path: '/reports', title: 'Reports' },
      { name: 'a report', path: `/reports/${reportId}`, title: report.label },
      { name: 'outlier list', path: '/outliers', title: 'Outlier list' },
      {
        name: 'an outlier drilled into',
        path: `/outliers/${open.id}/practices/${outlier.practice.id}/measures/${outlier.measure.key}`,
        title: `${outlier.practice.code} · ${outlier.measure.label}`,
      },
      { name: 'review cases, none yet', path: '/review-cases', title: 'Review cases' },
      { name: 'digests', path: '/digests', title: 'Digests' },
      {
        name: 'a digest previewed',
        path: `/digests?report=${reportId}&practice=${ov201}`,
        title: 'Digests',
      },
      {
        name: 'a measure-set draft, edited in forms',
        path: `/measure-sets/${encodeURIComponent(draft.id)}`,
        title: draft.label,
      },
    ])
      await check('regional lead', visit);
  }, 600_000);

  it('auditor: every page it can reach, and the ones it cannot', async () => {
    await signIn('Tobias Renwick');
    const [latest] = await api<{ id: number }[]>('/api/quarters');
    const coverage = await api<{ practices: { practice: { id: number; code: string } }[] }>(
      `/api/quarters/${latest!.id}/coverage`,
    );
    const ov101 = coverage.practices.find((p) => p.practice.code === 'OV101')!.practice.id;
    const history = await api<{ quarters: { submissions: { id: number }[] }[] }>(
      `/api/practices/${ov101}/submissions`,
    );
    const report = history.quarters.flatMap((q) => q.submissions)[0]!;
    for (const visit of [
      { name: 'home', path: '/', title: 'Home' },
      { name: 'coverage', path: '/coverage', title: 'Coverage' },
      { name: 'submissions', path: `/practices/${ov101}/submissions`, title: 'Submissions' },
      {
        name: 'a report',
        path: `/practices/${ov101}/submissions/${report.id}`,
        title: `Submission ${report.id}`,
      },
      { name: 'audit trail', path: '/audit-trail', title: 'Audit trail' },
      ...(await auditorNewerPages()),
      { name: 'upload (not for auditors)', path: '/extracts/upload', title: 'Upload extract' },
      { name: 'users (not for auditors)', path: '/users', title: 'Users' },
      ...mailPages(),
      ...(await everyone()),
    ])
      await check('auditor', visit);
  }, 600_000);

  /**
   * The auditor's newer pages: benchmark, results, the report, outliers and a drill-down, and a
   * review case opened on OV201 and asked of the practice (for its lead's visit below).
   */
  async function auditorNewerPages(): Promise<Visit[]> {
    const { open } = await region();
    const outliers = await api<{
      rows: { practice: { id: number; code: string }; measure: { key: string; label: string } }[];
    }>(`/api/quarters/${open.id}/outliers`);
    const outlier = outliers.rows.find((r) => r.practice.id === ov201) ?? outliers.rows[0]!;
    const opened = await post<{ id: number; version: number }>('/api/review-cases', {
      quarterId: open.id,
      practiceId: outlier.practice.id,
      measureKey: outlier.measure.key,
      split: 'all',
      note: 'Opened for the accessibility walk.',
    });
    caseId = opened.id;
    await post(`/api/review-cases/${caseId}/transitions`, {
      action: 'ask',
      expectedVersion: opened.version,
      message: 'Could you tell us how these records were coded?',
    });
    return [
      { name: 'region benchmark', path: '/benchmark', title: 'Region benchmark' },
      { name: 'results (sent to the benchmark)', path: '/results', title: 'Region benchmark' },
      {
        name: 'practice results',
        path: `/practices/${outlier.practice.id}/results`,
        title: `Results · ${outlier.practice.code}`,
      },
      { name: 'reports', path: '/reports', title: 'Reports' },
      { name: 'a report', path: `/reports/${reportId}`, title: await reportLabel() },
      { name: 'outlier list', path: '/outliers', title: 'Outlier list' },
      {
        name: 'an outlier drilled into',
        path: `/outliers/${open.id}/practices/${outlier.practice.id}/measures/${outlier.measure.key}`,
        title: `${outlier.practice.code} · ${outlier.measure.label}`,
      },
      { name: 'review cases', path: '/review-cases', title: 'Review cases' },
      { name: 'a review case', path: `/review-cases/${caseId}`, title: `Review case ${caseId}` },
      { name: 'digests (not for this role)', path: '/digests', title: 'Digests' },
    ];
  }

  async function reportLabel(): Promise<string> {
    return (await api<{ label: string }>(`/api/reports/${reportId}`)).label;
  }

  it('practice lead of one practice: home with an extract waiting, upload, report, refusal', async () => {
    await signIn('Priya Calloway');
    const me = await api<{ user: { practices: { id: number; code: string }[] } }>('/api/session');
    const practice = me.user.practices[0]!.id;
    const quarters = await api<{ id: number; status: string }[]>('/api/quarters');
    const open = quarters.find((q) => q.status === 'open')!;
    const refused = await uploadCsv(
      practice,
      open.id,
      'two-problems.csv',
      'record_ref,birth_year,sex,Patient name\nA-1,1950,F,x\n',
    );
    // Two extracts waiting beside the current submission: the home shows all three.
    const older = await uploadCsv(practice, open.id, 'older.csv', await cleanCsv('WAIT-1'));
    const newer = await uploadCsv(practice, open.id, 'newer.csv', await cleanCsv('WAIT-2'));
    const history = await api<{ quarters: { submissions: { id: number; status: string }[] }[] }>(
      `/api/practices/${practice}/submissions`,
    );
    const current = history.quarters[0]!.submissions.find((s) => s.status === 'accepted')!;
    for (const visit of [
      { name: 'home', path: '/', title: 'Home' },
      { name: 'upload', path: '/extracts/upload', title: 'Upload extract' },
      { name: 'submissions', path: '/submissions', title: 'Submissions' },
      {
        name: 'the current report',
        path: `/practices/${practice}/submissions/${current.id}`,
        title: `Submission ${current.id}`,
      },
      {
        name: 'an extract waiting, compared with the current one',
        path: `/practices/${practice}/submissions/${newer.id}`,
        title: `Submission ${newer.id}`,
      },
      {
        name: 'an older extract waiting',
        path: `/practices/${practice}/submissions/${older.id}`,
        title: `Submission ${older.id}`,
      },
      {
        name: 'a refusal with two problems',
        path: `/practices/${practice}/submissions/${refused.id}`,
        title: `Submission ${refused.id}`,
      },
      {
        name: 'sign-in landing (the practice’s results)',
        path: '/start',
        title: 'Results · OV102',
      },
      { name: 'results', path: '/results', title: 'Results · OV102' },
      ...['peers', 'values'].map((tab) => ({
        name: `results, ${tab}`,
        path: `/practices/${practice}/results?tab=${tab}`,
        title: 'Results · OV102',
      })),
      {
        name: 'another practice’s results (refused)',
        path: `/practices/${ov201}/results`,
        title: 'Results',
        expectedErrors: [
          'console: Failed to load resource: the server responded with a status of 403 (Forbidden)',
        ],
      },
      { name: 'reports', path: '/reports', title: 'Reports' },
      {
        name: 'a report, the practice’s part',
        path: `/reports/${reportId}`,
        title: await reportLabel(),
      },
      {
        name: 'review cases, none for this practice',
        path: '/review-cases',
        title: 'Review cases',
      },
      { name: 'benchmark (not for practice leads)', path: '/benchmark', title: 'Region benchmark' },
      { name: 'outliers (not for practice leads)', path: '/outliers', title: 'Outlier list' },
      { name: 'coverage (not for practice leads)', path: '/coverage', title: 'Coverage' },
      { name: 'audit trail (not for practice leads)', path: '/audit-trail', title: 'Audit trail' },
      ...mailPages(),
      ...(await everyone()),
    ])
      await check('practice lead of one practice', visit);
  }, 600_000);

  it('practice lead of two practices: home, upload, both practices', async () => {
    await signIn('Daniel Oyelaran');
    const me = await api<{ user: { practices: { id: number; code: string }[] } }>('/api/session');
    for (const visit of [
      { name: 'home', path: '/', title: 'Home' },
      { name: 'upload', path: '/extracts/upload', title: 'Upload extract' },
      ...me.user.practices.map((p) => ({
        name: 'submissions',
        path: `/practices/${p.id}/submissions`,
        title: 'Submissions',
      })),
      {
        name: 'sign-in landing (the first practice’s results)',
        path: '/start',
        title: 'Results · OV101',
      },
      ...me.user.practices.map((p) => ({
        name: 'results, with the practice switch',
        path: `/practices/${p.id}/results`,
        title: `Results · ${p.code}`,
      })),
      ...(await everyone()),
    ])
      await check('practice lead of two practices', visit);
    await check('practice lead of two practices', {
      name: 'sign-out',
      path: '/sign-out',
      title: 'Sign in',
    });
  }, 600_000);

  it('practice lead of the practice a review case asks: the case list and the case', async () => {
    await signIn('Ruth Penhallow');
    for (const visit of [
      { name: 'review cases', path: '/review-cases', title: 'Review cases' },
      {
        name: 'a review case asked of the practice',
        path: `/review-cases/${caseId}`,
        title: `Review case ${caseId}`,
      },
    ])
      await check('practice lead asked', visit);
  }, 600_000);

  // Last: opening the next quarter changes which quarter the other visits find open.
  it('regional lead: a mail delivery, once a quarter has opened', async () => {
    await signIn('Imogen Varley');
    const opened = await browser.page.evaluate(async () => {
      const session = (await (await fetch('/api/session')).json()) as { csrfToken: string };
      const deadline = new Date(Date.now() + 30 * 86_400_000).toISOString().slice(0, 10);
      const res = await fetch('/api/quarters', {
        method: 'POST',
        headers: { 'Content-Type': 'application/json', 'X-CSRF-Token': session.csrfToken },
        body: JSON.stringify({ year: 2026, quarter: 4, submissionDeadline: deadline }),
      });
      return res.status;
    });
    expect(opened).toBe(201);
    let sources: { kind: string; sourceId: number; label: string }[] = [];
    for (let i = 0; i < 120 && sources.length === 0; i++) {
      sources = (await api<{ sources: typeof sources }>('/api/mail/deliveries')).sources;
      if (sources.length === 0) await browser.page.waitForTimeout(250);
    }
    const source = sources[0]!;
    for (const visit of [
      { name: 'mail deliveries', path: '/deliveries', title: 'Mail deliveries' },
      {
        name: 'a mail delivery',
        path: `/deliveries/${source.kind}/${source.sourceId}`,
        title: source.label,
      },
      { name: 'audit quarters, two open', path: '/quarters', title: 'Audit quarters' },
    ])
      await check('regional lead', visit);
  });

  it('leaves no React Router warning in the console', () => {
    expect(warnings.filter((w) => /HydrateFallback|React Router/i.test(w))).toEqual([]);
  });
});
