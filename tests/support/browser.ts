/**
 * Headless Chromium from Debian's package, driven by playwright-core (no
 * browser download). Launch flags as verified in toolchain.md.
 */
import { execFileSync } from 'node:child_process';
import { mkdirSync, mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { type BrowserContext, chromium, type ConsoleMessage, type Page } from 'playwright-core';
import { artifactsDir } from './paths.ts';

function chromiumPath(): string {
  if (process.env.CAIRN_CHROMIUM) return process.env.CAIRN_CHROMIUM;
  try {
    return execFileSync('sh', ['-c', 'command -v chromium'], { encoding: 'utf8' }).trim();
  } catch {
    throw new Error(
      "chromium is not installed: `npm test` installs Debian's chromium package; or run apt-get install -y chromium",
    );
  }
}

export interface BrowserSession {
  context: BrowserContext;
  page: Page;
  /** Console errors and page errors seen so far */
  errors: string[];
  screenshot(name: string): Promise<string>;
  close(): Promise<void>;
}

export async function openBrowser(): Promise<BrowserSession> {
  const profile = mkdtempSync(join(tmpdir(), 'cairn-chromium-'));
  const context = await chromium.launchPersistentContext(profile, {
    executablePath: chromiumPath(),
    headless: true,
    viewport: { width: 1280, height: 860 },
    args: [
      '--headless',
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
      '--disable-dev-shm-usage',
    ],
  });
  const page = context.pages()[0] ?? (await context.newPage());
  const errors: string[] = [];
  const onConsole = (message: ConsoleMessage) => {
    if (message.type() === 'error') errors.push(`console: ${message.text()}`);
  };
  page.on('console', onConsole);
  page.on('pageerror', (error) => errors.push(`page: ${error.message}`));
  mkdirSync(artifactsDir, { recursive: true });
  return {
    context,
    page,
    errors,
    screenshot: async (name) => {
      const file = join(artifactsDir, `${name}.png`);
      await page.screenshot({ path: file, fullPage: true });
      return file;
    },
    close: () => context.close(),
  };
}

/**
 * Waits until sign-in has landed: the person's name in the navigation bar and the landing page's
 * heading (the home page's welcome, or — for a practice lead whose practice has a current
 * submission — that practice's results). Returns the path landed on.
 */
export async function waitForLanding(page: Page, name: string): Promise<string> {
  await page.waitForURL((url) => url.pathname !== '/start' && !url.pathname.startsWith('/api/'));
  await page.locator('.cairn-user', { hasText: name }).waitFor();
  await page.locator('h1.cairn-page-title').first().waitFor();
  return new URL(page.url()).pathname;
}

/**
 * Signs `name` in as a person does, in a fresh session (cookies cleared): the front page's Sign
 * in, the organisation's sign-in, then the persona on the local identity provider's page; waits
 * for the landing page.
 */
export async function signIn(browser: BrowserSession, baseUrl: string, name: string) {
  const { page } = browser;
  await browser.context.clearCookies();
  await page.goto(baseUrl + '/', { waitUntil: 'networkidle' });
  await page.locator('.cairn-navbar').getByRole('button', { name: 'Sign in' }).click();
  await page.getByRole('button', { name: "Continue to your organisation's sign-in" }).click();
  await page.getByRole('button', { name: `Sign in as ${name}` }).click();
  return waitForLanding(page, name);
}

/** A link of the main navigation bar, by its words. */
export const navLink = (page: Page, name: string, { exact = false } = {}) =>
  page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name, exact });
