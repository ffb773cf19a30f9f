/**
 * Every page each role can reach, in headless Chromium against the built app with the demo
 * region, checked with axe-core (tests/support/a11y.ts): no serious or critical violation, one
 * h1, no skipped heading level, everything inside landmarks, and a document title that names the
 * page ("Coverage · Cairn"). Minor and moderate findings are printed. The console must stay free
 * of errors and of React Router warnings.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { type A11yViolation, auditA11y, describeViolations } from '../support/a11y.ts';
import { type BrowserSession, openBrowser } from '../support/browser.ts';
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
    await page.getByRole('heading', { name: `Welcome, ${name}` }).waitFor();
  }

  /** Reads the API as the signed-in person (the page's own session). */
  async function api<T>(path: string): Promise<T> {
    return browser.page.evaluate(async (url) => {
      const res = await fetch(url);
      if (!res.ok) throw new Error(`${url} answered ${res.status}`);
      return (await res.json()) as T;
    }, path);
  }

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
    await page.goto(server.baseUrl + visit.path, { waitUntil: 'networkidle' });
    await page.locator('h1').first().waitFor();
    // Lazy icons and late queries settle.
    await page.waitForTimeout(250);
    const where = `${who}: ${visit.name} (${visit.path})`;
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
    expect(browser.errors.slice(errorsBefore), where).toEqual([]);
  }

  const common = (): Visit[] => [
    { name: 'not found', path: '/no-such-page', title: 'Page not found' },
    { name: 'sign-in (signed in)', path: '/sign-in', title: 'Sign in' },
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
      ...common(),
    ])
      await check('regional lead', visit);
    // Signing out ends on the signed-out sign-in page.
    await check('regional lead', { name: 'sign-out', path: '/sign-out', title: 'Sign in' });
  });

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
      { name: 'upload (not for auditors)', path: '/extracts/upload', title: 'Upload extract' },
      { name: 'users (not for auditors)', path: '/users', title: 'Users' },
      ...common(),
    ])
      await check('auditor', visit);
  });

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
      'record_ref,birth_year,Patient name\nA-1,1950,x\n',
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
      { name: 'coverage (not for practice leads)', path: '/coverage', title: 'Coverage' },
      { name: 'audit trail (not for practice leads)', path: '/audit-trail', title: 'Audit trail' },
      ...common(),
    ])
      await check('practice lead of one practice', visit);
  });

  it('practice lead of two practices: home, upload, both practices', async () => {
    await signIn('Daniel Oyelaran');
    const me = await api<{ user: { practices: { id: number }[] } }>('/api/session');
    for (const visit of [
      { name: 'home', path: '/', title: 'Home' },
      { name: 'upload', path: '/extracts/upload', title: 'Upload extract' },
      ...me.user.practices.map((p) => ({
        name: 'submissions',
        path: `/practices/${p.id}/submissions`,
        title: 'Submissions',
      })),
      ...common(),
    ])
      await check('practice lead of two practices', visit);
    await check('practice lead of two practices', {
      name: 'sign-out',
      path: '/sign-out',
      title: 'Sign in',
    });
  });

  it('leaves no React Router warning in the console', () => {
    expect(warnings.filter((w) => /HydrateFallback|React Router/i.test(w))).toEqual([]);
  });
});
