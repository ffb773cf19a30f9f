/**
 * Signing in as each role in headless Chromium, through Cairn's sign-in page
 * and the local identity provider's persona picker, against the built app
 * run as real processes: each role sees its own navigation, and signs out
 * through single logout. Also: refusals shown as Cairn pages, a second API
 * process accepting the same session, and the regional lead's screens.
 */
import { type ChildProcess, spawn } from 'node:child_process';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { type BrowserSession, openBrowser, waitForLanding } from '../support/browser.ts';
import { type CairnServer, freePort, startCairn } from '../support/cairn-server.ts';
import { repoRoot } from '../support/paths.ts';

const personas: {
  name: string;
  role: string;
  nav: string[];
  menus?: { label: string; links: string[] }[];
  /** 'home', or the heading of the practice results page the person lands on */
  lands: string;
  shot: string;
  practices?: string[];
}[] = [
  {
    name: 'Imogen Varley',
    role: 'Regional lead',
    nav: ['Home', 'Benchmark', 'Coverage', 'Quarters', 'Measure sets', 'Outliers', 'Review cases'],
    // Gathered under menus of the navigation bar, so that it keeps to one row.
    menus: [
      { label: 'Extracts', links: ['Upload extract', 'Submissions'] },
      { label: 'Admin', links: ['Users', 'Mail', 'Audit trail'] },
    ],
    lands: 'home',
    shot: 'sign-in-regional-lead',
  },
  {
    name: 'Tobias Renwick',
    role: 'Auditor',
    nav: [
      'Home',
      'Benchmark',
      'Coverage',
      'Quarters',
      'Reports',
      'Measure sets',
      'Outliers',
      'Review cases',
      'Audit trail',
    ],
    lands: 'home',
    shot: 'sign-in-auditor',
  },
  {
    name: 'Priya Calloway',
    role: 'Practice lead',
    nav: [
      'Home',
      'Upload extract',
      'Submissions',
      'Results',
      'Quarters',
      'Reports',
      'Measure sets',
      'Review cases',
    ],
    // OV102 has a current submission: its results are the first page.
    lands: 'Quarrybank Surgery (OV102)',
    shot: 'sign-in-practice-lead-one',
    practices: ['Quarrybank Surgery'],
  },
  {
    name: 'Daniel Oyelaran',
    role: 'Practice lead',
    nav: [
      'Home',
      'Upload extract',
      'Submissions',
      'Results',
      'Quarters',
      'Reports',
      'Measure sets',
      'Review cases',
    ],
    // The first of the lead's practices by code (OV101) that has a current submission.
    lands: 'Wrenfield Health Centre (OV101)',
    shot: 'sign-in-practice-lead-two',
    practices: ['Wrenfield Health Centre', 'Harnleigh Old Mill Practice'],
  },
];

describe('sign-in in the browser', () => {
  let server: CairnServer;
  let browser: BrowserSession;

  beforeAll(async () => {
    server = await startCairn();
    browser = await openBrowser();
  });
  afterAll(async () => {
    await browser?.close();
    await server?.stop();
  });

  async function signIn(name: string, { screenshots = false } = {}) {
    const { page } = browser;
    await browser.context.clearCookies();
    await page.goto(server.baseUrl + '/', { waitUntil: 'networkidle' });
    await page.locator('.cairn-navbar').getByRole('button', { name: 'Sign in' }).click();
    await page.getByRole('heading', { name: 'Sign in to Cairn' }).waitFor();
    if (screenshots) await browser.screenshot('sign-in-page');
    await page.getByRole('button', { name: "Continue to your organisation's sign-in" }).click();
    await page.getByRole('heading', { name: 'Local sign-in' }).waitFor();
    if (screenshots) await browser.screenshot('sign-in-persona-picker');
    await page.getByRole('button', { name: `Sign in as ${name}` }).click();
  }

  for (const persona of personas) {
    it(`signs in as ${persona.name} (${persona.role}) and shows that role's navigation`, async () => {
      const { page } = browser;
      await signIn(persona.name, { screenshots: persona === personas[0] });
      const landed = await waitForLanding(page, persona.name);
      if (persona.lands === 'home') {
        await page.getByRole('heading', { name: `Welcome, ${persona.name}` }).waitFor();
        expect(landed).toBe('/');
      } else {
        await page.getByRole('heading', { name: persona.lands, level: 1 }).waitFor();
        expect(landed).toMatch(/^\/practices\/\d+\/results$/);
      }
      const main = page.getByRole('navigation', { name: 'Main' });
      const nav = await main.getByRole('link').allTextContents();
      expect(nav).toEqual(persona.nav);
      for (const menu of persona.menus ?? []) {
        const button = main.getByRole('button', { name: menu.label });
        expect(await button.getAttribute('aria-expanded')).toBe('false');
        await button.click();
        expect(await button.getAttribute('aria-expanded')).toBe('true');
        expect(await main.getByRole('listitem').getByRole('link').allTextContents()).toEqual(
          menu.links,
        );
        await browser.screenshot(`${persona.shot}-${menu.label.toLowerCase()}`);
        await page.keyboard.press('Escape');
        expect(await button.getAttribute('aria-expanded')).toBe('false');
      }
      expect(await main.getByRole('button').count()).toBe(persona.menus?.length ?? 0);
      // Every entry stays on the navigation bar's one row at 1280 px.
      const barHeight = await page
        .locator('.cairn-navbar')
        .evaluate((bar) => bar.getBoundingClientRect().height);
      expect(barHeight, 'the navigation bar keeps to one row').toBeLessThan(70);
      expect(await page.locator('.cairn-user').textContent()).toContain(persona.role);
      // Home stays reachable from the navigation.
      await main.getByRole('link', { name: 'Home' }).click();
      await page.getByRole('heading', { name: `Welcome, ${persona.name}` }).waitFor();
      expect(new URL(page.url()).pathname).toBe('/');
      for (const practice of persona.practices ?? []) {
        // each practice of the lead has its own section on the home page, headed by its name
        await page.getByRole('heading', { name: practice }).first().waitFor();
        expect(await page.getByRole('heading', { name: practice }).count()).toBe(1);
      }
      await browser.screenshot(persona.shot);
      expect(browser.errors).toEqual([]);
    });
  }

  it('keeps a practice lead out of the regional lead’s screens', async () => {
    const { page } = browser;
    // Still signed in as the last persona (a practice lead).
    await page.goto(server.baseUrl + '/users', { waitUntil: 'networkidle' });
    await page.getByRole('heading', { name: 'Not available for your role' }).waitFor();
    await browser.screenshot('sign-in-practice-lead-users-refused');
  });

  it('signs out through the identity provider and says so', async () => {
    const { page } = browser;
    await page.getByRole('button', { name: 'Sign out' }).click();
    await page.getByText('You have signed out of Cairn').waitFor();
    expect(new URL(page.url()).pathname).toBe('/sign-in');
    await browser.screenshot('sign-in-signed-out');
    await page.goto(server.baseUrl + '/', { waitUntil: 'networkidle' });
    await page.getByRole('heading', { name: 'Cairn', level: 1 }).waitFor();
    expect(browser.errors).toEqual([]);
  });

  it('shows Cairn’s refusal page to a deactivated person and to a stranger', async () => {
    const { page } = browser;
    await signIn('Hester Quill');
    await page.getByText('Your Cairn account has been deactivated').waitFor();
    expect(page.url()).toContain('/sign-in?refused=deactivated');
    await browser.screenshot('sign-in-refused-deactivated');
    await signIn('Sam Ashdown');
    await page.getByText('Cairn does not know you yet').waitFor();
    await browser.screenshot('sign-in-refused-unknown');
    expect(await page.getByRole('navigation', { name: 'Main' }).getByRole('link').count()).toBe(0);
  });

  it('returns to the page asked for, and lets the regional lead manage people and read the audit trail', async () => {
    const { page } = browser;
    await browser.context.clearCookies();
    await page.goto(server.baseUrl + '/users?role=practice_lead', { waitUntil: 'networkidle' });
    await page.getByRole('heading', { name: 'Sign in to Cairn' }).waitFor();
    await page.getByRole('button', { name: "Continue to your organisation's sign-in" }).click();
    await page.getByRole('button', { name: 'Sign in as Imogen Varley' }).click();
    await page.getByRole('heading', { name: 'Users' }).waitFor();
    expect(new URL(page.url()).pathname + new URL(page.url()).search).toBe(
      '/users?role=practice_lead',
    );
    await page.getByText('Priya Calloway').waitFor();
    await browser.screenshot('users-list');
    await page.getByRole('button', { name: 'Edit Priya Calloway' }).click();
    await page.getByRole('heading', { name: 'Practices' }).waitFor();
    await page
      .getByLabel('Practice to add')
      .selectOption({ label: 'OV104 · Fellgate Family Practice (Harnleigh Fold)' });
    await page.getByRole('button', { name: 'Add', exact: true }).click();
    await page.getByText('OV104 added.').waitFor();
    await page.waitForTimeout(400); // the drawer's slide-in
    await browser.screenshot('users-edit');
    await page.getByRole('button', { name: 'Close' }).click();
    await page.locator('.bp6-overlay-backdrop').waitFor({ state: 'detached' });
    await page.getByRole('button', { name: 'Admin' }).click();
    await page.getByRole('link', { name: 'Audit trail' }).click();
    await page.getByRole('heading', { name: 'Audit trail' }).waitFor();
    await page
      .getByText('Imogen Varley made Priya Calloway a lead of Fellgate Family Practice (OV104)')
      .waitFor();
    await page.getByText('Sign-in refused: the person is not known to Cairn').waitFor();
    await browser.screenshot('audit-trail');
    expect(browser.errors).toEqual([]);
  });

  it('is signed in at a second API process sharing the database', async () => {
    const { page } = browser;
    const port = await freePort();
    const second: ChildProcess = spawn(
      process.execPath,
      [join(repoRoot, 'packages', 'api', 'dist', 'main.js')],
      {
        env: { ...server.env, CAIRN_SERVER_PORT: String(port) },
        cwd: repoRoot,
        stdio: 'ignore',
      },
    );
    try {
      const url = `http://127.0.0.1:${port}`;
      for (let i = 0; i < 100; i++) {
        if (
          await fetch(`${url}/api/health`).then(
            (r) => r.ok,
            () => false,
          )
        )
          break;
        await new Promise((r) => setTimeout(r, 200));
      }
      // Cookies are per host, not per port: the browser sends the same session to the second process.
      await page.goto(url + '/', { waitUntil: 'networkidle' });
      await page.getByRole('heading', { name: 'Welcome, Imogen Varley' }).waitFor();
    } finally {
      second.kill('SIGTERM');
    }
  });
});
