/**
 * Reports in headless Chromium against the built app with the demo region:
 * the regional lead follows the open quarter (quarters page, coverage),
 * publishes its benchmark with a release note, lands on the report's
 * permanent page and downloads the region's data pack and PDF (the pack's
 * hash is the page's; a PDF page is rendered with poppler's pdftoppm and
 * kept as a screenshot). A practice lead then reads the report: their own
 * practice only, no region figures. axe-core finds no serious or critical
 * issue on any of these pages.
 */
import { spawnSync } from 'node:child_process';
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import ExcelJS from 'exceljs';
import type { Download, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { auditA11y, describeViolations } from '../support/a11y.ts';
import {
  type BrowserSession,
  navLink,
  openBrowser,
  signIn as signInAs,
} from '../support/browser.ts';
import { type CairnServer, startCairn } from '../support/cairn-server.ts';
import { artifactsDir } from '../support/paths.ts';

async function bytesOf(download: Download): Promise<Buffer> {
  return readFileSync(await download.path());
}

describe('reports in the browser', () => {
  let server: CairnServer;
  let browser: BrowserSession;
  let permalink = '';

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

  async function accessible(page: Page) {
    const report = await auditA11y(page);
    expect(report.blocking, describeViolations(report.blocking)).toEqual([]);
  }

  it('lets the regional lead follow the open quarter and publish its report', async () => {
    const { page } = browser;
    await signIn('Imogen Varley');
    await nav(page, 'Quarters').click();
    const row = page.locator('tr[data-quarter="2026 Q3"]');
    await row.waitFor();
    await row.getByText('No report published yet').waitFor();
    await browser.screenshot('reports-quarters');
    await row.locator('.cairn-coverage-line').click();
    await page
      .getByRole('heading', { name: /Coverage/ })
      .first()
      .waitFor();
    await browser.screenshot('reports-coverage');

    await nav(page, 'Quarters').click();
    await row.getByRole('link', { name: 'Reports of 2026 Q3' }).click();
    await page.getByRole('heading', { name: 'Reports' }).waitFor();
    await page.getByRole('button', { name: 'Publish report' }).waitFor();
    await accessible(page);
    // A blank note is refused next to its field.
    await page.getByRole('button', { name: 'Publish report' }).click();
    await page.getByText('Must not be blank.').waitFor();
    // The browser logs the refusal (400) it was asked for, and nothing else.
    expect(browser.errors).toEqual([
      'console: Failed to load resource: the server responded with a status of 400 (Bad Request)',
    ]);
    browser.errors.length = 0;
    await page.locator('#release-note').fill('First report of 2026 Q3; OV303 had not submitted.');
    await browser.screenshot('reports-publish');
    await page.getByRole('button', { name: 'Publish report' }).click();
    await page.getByRole('heading', { name: /2026 Q3 · report \d+/ }).waitFor({ timeout: 60_000 });
    permalink = new URL(page.url()).pathname;
    expect(permalink).toMatch(/^\/reports\/\d+$/);
    await page.getByRole('heading', { name: 'The region' }).waitFor();
    await page.getByText('First report of 2026 Q3; OV303 had not submitted.').waitFor();
    await browser.screenshot('reports-permalink-region');
    await accessible(page);
  });

  it('hands out the region’s data pack and PDF from the report’s page', async () => {
    const { page } = browser;
    const hash = (await page.locator('.cairn-report-identity code').textContent())!.trim();
    expect(hash).toMatch(/^[0-9a-f]{64}$/);
    const [packDownload] = await Promise.all([
      page.waitForEvent('download'),
      page.getByRole('button', { name: 'Region data pack (XLSX)' }).click(),
    ]);
    const workbook = new ExcelJS.Workbook();
    await workbook.xlsx.load((await bytesOf(packDownload)) as unknown as ArrayBuffer);
    const about = workbook.getWorksheet('About')!;
    const values: unknown[] = [];
    about.eachRow((r) => values.push(...(r.values as unknown[])));
    expect(values).toContain(hash);
    const [pdfDownload] = await Promise.all([
      page.waitForEvent('download'),
      page.getByRole('button', { name: 'Region report (PDF)' }).click(),
    ]);
    const pdf = join(artifactsDir, 'reports-region.pdf');
    writeFileSync(pdf, await bytesOf(pdfDownload));
    const text = spawnSync('pdftotext', [pdf, '-'], { encoding: 'utf8' }).stdout;
    expect(text).toContain(hash);
    // The first page as an image, to look at.
    spawnSync('pdftoppm', [
      '-png',
      '-r',
      '60',
      '-f',
      '1',
      '-l',
      '2',
      pdf,
      join(artifactsDir, 'reports-region-pdf'),
    ]);
  });

  it('lets a practice lead read their practice’s part of the report', async () => {
    const { page } = browser;
    await signIn('Priya Calloway');
    await page.goto(server.baseUrl + permalink, { waitUntil: 'networkidle' });
    await page.getByRole('heading', { name: 'A practice’s report' }).waitFor();
    await page.getByText(/OV102 Quarrybank Surgery: everyone/).waitFor();
    expect(await page.getByRole('heading', { name: 'The region' }).count()).toBe(0);
    expect(await page.getByRole('button', { name: 'Withdraw' }).count()).toBe(0);
    expect(await page.locator('#report-practice option').count()).toBe(1);
    await browser.screenshot('reports-permalink-practice');
    await accessible(page);
    const [pdfDownload] = await Promise.all([
      page.waitForEvent('download'),
      page.getByRole('button', { name: 'OV102 report (PDF)' }).click(),
    ]);
    const pdf = join(artifactsDir, 'reports-ov102.pdf');
    writeFileSync(pdf, await bytesOf(pdfDownload));
    expect(spawnSync('pdftotext', [pdf, '-'], { encoding: 'utf8' }).stdout).toContain('OV102');
    spawnSync('pdftoppm', [
      '-png',
      '-r',
      '60',
      '-f',
      '1',
      '-l',
      '1',
      pdf,
      join(artifactsDir, 'reports-ov102-pdf'),
    ]);
    expect(browser.errors).toEqual([]);
  });

  it('lets the regional lead publish the chosen quarter from the benchmark page', async () => {
    const { page } = browser;
    await signIn('Imogen Varley');
    await nav(page, 'Benchmark').click();
    await page.getByRole('button', { name: 'Publish report…' }).click();
    const dialog = page.getByRole('dialog');
    await dialog.getByRole('button', { name: 'Publish report' }).click();
    await dialog
      .getByText('Write a release note: what readers of this report should know.')
      .waitFor();
    await dialog.getByLabel(/Release note/).fill('Second report of 2026 Q3, from the benchmark.');
    await browser.screenshot('reports-publish-from-benchmark');
    await accessible(page);
    await dialog.getByRole('button', { name: 'Publish report' }).click();
    await page.getByRole('heading', { name: /2026 Q3 · report 2/ }).waitFor({ timeout: 60_000 });
    expect(page.url()).toMatch(/\/reports\/\d+$/);
    expect(page.url()).not.toBe(server.baseUrl + permalink);
    await page.getByText('Second report of 2026 Q3, from the benchmark.').waitFor();
    expect(browser.errors).toEqual([]);
  });
});
