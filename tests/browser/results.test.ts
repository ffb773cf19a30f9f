/**
 * Results and benchmarks as their users meet them, over the demo region (2026 Q3): the
 * regional lead and the auditor on the region benchmark (funnel plot, practices × measures,
 * CSV), a practice's results opened from the funnel; practice leads on their own results
 * (measures, kidney risk, time to insulin, data quality, recall list), switching practice.
 * axe-core finds no serious or critical violation on any of these pages; the first visit loads
 * at most 350 kB of JavaScript (gzip).
 */
import { readFileSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { expectAccessible } from '../support/a11y.ts';
import {
  type BrowserSession,
  navLink,
  openBrowser,
  signIn as signInAs,
} from '../support/browser.ts';
import { type CairnServer, startCairn } from '../support/cairn-server.ts';
import { funnelVisibleMs, initialJs } from '../support/web-figures.ts';

describe('results and benchmarks in the browser', () => {
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

  const signIn = (name: string) => signInAs(browser, server.baseUrl, name);

  const nav = navLink;

  it('shows the regional lead every practice on the funnel, the table and its CSV', async () => {
    const { page } = browser;
    await signIn('Imogen Varley');
    await nav(page, 'Benchmark').click();
    await page.getByRole('heading', { name: 'Region benchmark' }).waitFor();
    // 29 practices have a current submission; OV303 has not submitted and is listed as missing.
    await page.locator('.cairn-funnel-point').nth(28).waitFor();
    expect(await page.locator('.cairn-funnel-point').count()).toBe(29);
    expect(await page.getByTestId('coverage').textContent()).toContain(
      'Missing (shown as missing, not as zero): OV303 Wickerby Road Surgery',
    );
    // The persistently low practice is flagged low, in words.
    expect(
      await page.getByRole('button', { name: /^OV201 .*Outlier: below the 99\.8 % limit/ }).count(),
    ).toBe(1);
    await expectAccessible(page);
    await browser.screenshot('results-benchmark-regional-lead');

    // Practices × measures: OV303 shown as missing, never as zero.
    const table = page.getByRole('region', { name: 'Practices by measure' });
    await table.getByText('OV303').scrollIntoViewIfNeeded();
    await page.getByLabel('Sort by').selectOption({ label: 'HbA1c recorded' });
    // The table re-renders in its new order: wait for it rather than read it at once.
    const first = table.locator('.cairn-bench-practice').first();
    await first.filter({ hasText: 'OV201' }).waitFor();
    await expect(first.textContent()).resolves.toContain('OV201');
    const [download] = await Promise.all([
      page.waitForEvent('download'),
      page.getByRole('button', { name: 'Download the table (CSV)' }).click(),
    ]);
    expect(download.suggestedFilename()).toBe('benchmark-2026-Q3-all.csv');
    const csv = readFileSync((await download.path())!, 'utf8').split('\r\n');
    expect(csv[0]).toMatch(/^practice_code,practice_name,locality,data_quality_flags,hba1c_n,/);
    expect(csv[1]).toMatch(/^OV201,/);
    expect(csv.find((l) => l.startsWith('OV303,'))).toContain('no submission');

    // Clicking a point opens that practice's results.
    await page.getByRole('button', { name: /^OV201 / }).click();
    await page.getByRole('heading', { name: /\(OV201\)$/ }).waitFor();
    await page.getByRole('row', { name: /HbA1c recorded/ }).waitFor();
    await expectAccessible(page);
    await browser.screenshot('results-practice-from-funnel');
    expect(browser.errors).toEqual([]);
  }, 120_000);

  // The 1.5 s target is judged by `npm run bench` (tests/bench/web.ts, same measurement): this
  // shared machine's load makes a timing assertion here flaky, so the test prints the figure.
  it('shows the funnel points after navigation, after ≤ 350 kB of initial JS', async () => {
    const { page } = browser;
    const quarter = await page.getByLabel('Audit quarter').inputValue();
    const url = `${server.baseUrl}/benchmark?quarter=${quarter}&measure=foot_surveillance`;
    const runs: number[] = [];
    for (let i = 0; i < 3; i++) runs.push(await funnelVisibleMs(page, url, 29));
    console.log(`funnel points visible after ${runs.join(', ')} ms (target 1500 ms)`);
    const js = initialJs();
    console.log(`initial JS ${(js.gzip / 1000).toFixed(1)} kB gzip`);
    expect(js.gzip).toBeLessThanOrEqual(350_000);
  }, 120_000);

  it('lets the auditor change the limits, read OV205’s data-quality flags and see pseudonyms', async () => {
    const { page } = browser;
    await signIn('Tobias Renwick');
    await nav(page, 'Benchmark').click();
    await page.locator('.cairn-funnel-point').nth(28).waitFor();
    await page.getByText('Limits allowing for over-dispersion').click();
    await page.getByText('Case-mix-adjusted rates').click();
    await page.getByText('Show funnel plot as a table').click();
    await page.getByRole('table', { name: /figures$/ }).waitFor();
    await expectAccessible(page);
    await browser.screenshot('results-benchmark-auditor-table');

    await page
      .getByRole('table', { name: /figures$/ })
      .getByRole('link', { name: /^OV205 / })
      .click();
    await page.getByRole('heading', { name: /\(OV205\)$/ }).waitFor();
    await page.getByRole('tab', { name: /Data quality \(\d+\)/ }).click();
    await page.getByRole('rowheader', { name: /Type 1 diabetes but not on insulin/ }).waitFor();
    await expectAccessible(page);
    await browser.screenshot('results-practice-data-quality-auditor');
    await page.getByRole('tab', { name: 'Recall list' }).click();
    await page.getByText(/References are pseudonyms/).waitFor();
    await expectAccessible(page);
    expect(browser.errors).toEqual([]);
  }, 120_000);

  it('gives a practice lead their results, kidney risk, time to insulin and recall list', async () => {
    const { page } = browser;
    // A lead whose practice has a current submission lands on its results.
    expect(await signIn('Priya Calloway')).toMatch(/^\/practices\/\d+\/results$/);
    // Home first, so that following Results is a navigation of its own: nothing below may read
    // the results page it would otherwise leave and come back to.
    await nav(page, 'Home', { exact: true }).click();
    await page.waitForURL((url) => url.pathname === '/');
    await nav(page, 'Results').click();
    await page.waitForURL((url) => /^\/practices\/\d+\/results$/.test(url.pathname));
    await page.getByRole('heading', { name: 'Quarrybank Surgery (OV102)' }).waitFor();
    // The improving practice shows an upward run-chart signal.
    await page
      .getByText(/^Trend upward: /)
      .first()
      .waitFor();
    // Disclosure control is said once, with the figures it applies to.
    await page
      .getByText(/counts from 1 to 4 show as/)
      .first()
      .waitFor();
    await expect(page.getByText(/counts from 1 to 4 show as/).count()).resolves.toBe(1);
    await expectAccessible(page);
    await browser.screenshot('results-practice-lead-measures');

    await page.getByRole('tab', { name: 'Kidney risk' }).click();
    await page.getByRole('rowheader', { name: 'G3a' }).waitFor();
    await expectAccessible(page);
    await browser.screenshot('results-practice-lead-kidney');

    await page.getByRole('tab', { name: 'Time to insulin' }).click();
    await page.getByText('Rule of thumb: about 7 years').waitFor();
    await expectAccessible(page);
    await browser.screenshot('results-practice-lead-insulin');

    await page.getByRole('tab', { name: 'Breakdowns' }).click();
    await page.getByRole('heading', { name: 'Age band' }).waitFor();
    await expectAccessible(page);

    await page.getByRole('tab', { name: 'Recall list' }).click();
    await page.getByRole('table', { name: 'Recall list' }).waitFor();
    await page.getByText(/the practice’s own record references/).waitFor();
    const [download] = await Promise.all([
      page.waitForEvent('download'),
      page.getByRole('link', { name: 'Download CSV' }).click(),
    ]);
    expect(readFileSync((await download.path())!, 'utf8').length).toBeGreaterThan(0);
    await expectAccessible(page);
    await browser.screenshot('results-practice-lead-recall');

    await page.goto(server.baseUrl + '/benchmark', { waitUntil: 'networkidle' });
    await page.getByRole('heading', { name: 'Not available for your role' }).waitFor();
    expect(browser.errors).toEqual([]);
  }, 120_000);

  it('lets a lead of two practices switch practice in place', async () => {
    const { page } = browser;
    expect(await signIn('Daniel Oyelaran')).toMatch(/^\/practices\/\d+\/results$/);
    // Home first, then Results, as above. (Home heads each of the lead's practices too: the
    // page's own heading is the level-1 one.)
    await nav(page, 'Home', { exact: true }).click();
    await page.waitForURL((url) => url.pathname === '/');
    await nav(page, 'Results').click();
    await page.waitForURL((url) => /^\/practices\/\d+\/results$/.test(url.pathname));
    await page.getByRole('heading', { level: 1, name: /\(OV10[13]\)$/ }).waitFor();
    const other = (await page.getByRole('heading', { level: 1, name: /\(OV101\)$/ }).count())
      ? 'OV103'
      : 'OV101';
    const value = await page.locator('option', { hasText: `${other} ` }).getAttribute('value');
    await page.getByLabel('Practice').selectOption(value!);
    await page.getByRole('heading', { name: new RegExp(`\\(${other}\\)$`) }).waitFor();
    await expectAccessible(page);
    await browser.screenshot('results-practice-lead-switched');
    expect(browser.errors).toEqual([]);
  }, 120_000);
});
