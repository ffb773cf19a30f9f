/**
 * The signed-out landing page in headless Chromium, served by the built API
 * exactly as `npm start` serves it.
 */
import { existsSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { type BrowserSession, openBrowser } from '../support/browser.ts';
import { type CairnServer, startCairn } from '../support/cairn-server.ts';

describe('landing page', () => {
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

  it('renders Cairn with the demo region, in Lato, without console errors', async () => {
    const { page } = browser;
    await page.goto(server.baseUrl + '/', { waitUntil: 'networkidle' });
    await page.getByRole('heading', { name: 'Cairn', level: 1 }).waitFor();
    await expect(page.title()).resolves.toBe('Cairn');
    // The region's name comes from /api/about, which may answer after the heading is drawn.
    await page.getByText('for Ostrevale').first().waitFor();
    expect(await page.getByText('30 practices in 4 localities take part.').count()).toBe(1);
    expect(await page.getByRole('button', { name: 'Sign in with your organisation' }).count()).toBe(
      1,
    );
    expect(await page.getByText(/not clinical advice/).count()).toBeGreaterThan(0);

    const fonts = await page.evaluate(async () => {
      await document.fonts.ready;
      const loaded = [...document.fonts]
        .filter((f) => f.status === 'loaded')
        .map((f) => f.family.replace(/"/g, ''));
      const heading = document.querySelector('h1');
      return {
        loaded,
        body: getComputedStyle(document.body).fontFamily,
        heading: heading ? getComputedStyle(heading).fontFamily : '',
      };
    });
    expect(fonts.loaded).toContain('Lato');
    expect(fonts.body).toMatch(/^"?Lato"?/);
    expect(fonts.heading).toMatch(/^"?Lato"?/);
    expect(browser.errors).toEqual([]);

    const file = await browser.screenshot('landing');
    expect(existsSync(file)).toBe(true);
  });

  it('switches to the dark theme and remembers it', async () => {
    const { page } = browser;
    await page.getByRole('button', { name: 'Use the dark theme' }).click();
    expect(await page.evaluate(() => document.body.classList.contains('bp6-dark'))).toBe(true);
    await page.reload({ waitUntil: 'networkidle' });
    expect(await page.evaluate(() => document.body.classList.contains('bp6-dark'))).toBe(true);
    await browser.screenshot('landing-dark');
    await page.getByRole('button', { name: 'Use the light theme' }).click();
    expect(browser.errors).toEqual([]);
  });

  it('shows a 404 page for an unknown address', async () => {
    const { page } = browser;
    await page.goto(server.baseUrl + '/no/such/page', { waitUntil: 'networkidle' });
    await page.getByRole('heading', { name: 'This page does not exist' }).waitFor();
    expect(await page.getByText('/no/such/page').count()).toBe(1);
    await browser.screenshot('not-found');
    expect(browser.errors).toEqual([]);
  });
});
