/**
 * Extracts in headless Chromium against the built app: a practice lead
 * downloads the template, uploads an extract with a few deliberate row
 * errors, watches the progress bar, reads and filters the validation report,
 * downloads the refused rows, confirms, and finds the new submission
 * accepted and the previous one superseded in the history. Then the regional
 * lead and the auditor read coverage (the auditor sees no write buttons).
 */
import { readFileSync } from 'node:fs';
import ExcelJS from 'exceljs';
import type { Download } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  type ExtractValue,
  writeXlsx,
} from '../../packages/api/src/submissions/template/extract-writer.ts';
import {
  type BrowserSession,
  navLink,
  openBrowser,
  signIn as signInAs,
} from '../support/browser.ts';
import { type CairnServer, startCairn } from '../support/cairn-server.ts';

/** Rows enough that checking takes a moment: the progress bar is seen moving. */
const GOOD_ROWS = 30_000;

/** A clean row for 2026 Q3 (review window 2025-10 … 2026-09). */
function goodRow(i: number): Record<string, ExtractValue> {
  const type1 = i % 10 === 0;
  const diagnosisYear = 2005 + (i % 15);
  return {
    record_ref: `QB-${String(i).padStart(6, '0')}`,
    birth_year: 1940 + (i % 60),
    sex: i % 2 ? 'F' : 'M',
    diabetes_type: type1 ? 'type1' : 'type2',
    diagnosis_year: diagnosisYear,
    deprivation_quintile: (i % 5) + 1,
    hba1c_date: '2026-05-14',
    hba1c_value: 48 + (i % 30),
    bp_date: '2026-05-14',
    bp_systolic: 120 + (i % 30),
    bp_diastolic: 70 + (i % 15),
    cholesterol_date: '2026-03-02',
    cholesterol_value: 4.2,
    creatinine_date: '2026-03-02',
    creatinine_value: 80 + (i % 20),
    acr_date: '2026-03-02',
    acr_value: 1.5,
    foot_check_date: '2025-11-20',
    bmi_date: '2026-05-14',
    bmi_value: 29.5,
    smoking_date: '2026-05-14',
    smoking_status: 'never',
    retinal_screening_date: '2025-12-08',
    on_statin: 'yes',
    on_insulin: type1 ? 'yes' : 'no',
    insulin_start_year: type1 ? diagnosisYear : null,
    cvd_history: 'no',
  };
}

/** Deliberate mistakes, each refusing its row (spreadsheet rows: heading is row 1). */
const BAD_ROWS: { at: number; change: Record<string, ExtractValue>; code: string }[] = [
  { at: 3, change: { hba1c_value: 900 }, code: 'out_of_range' },
  { at: 10, change: { bp_date: 'next week' }, code: 'invalid_date' },
  { at: 25, change: { birth_year: null }, code: 'birth_year_missing' },
];

async function readDownload(download: Download): Promise<Buffer> {
  const path = await download.path();
  return readFileSync(path);
}

async function openWorkbook(bytes: Buffer): Promise<ExcelJS.Workbook> {
  const workbook = new ExcelJS.Workbook();
  await workbook.xlsx.load(bytes as unknown as ArrayBuffer);
  return workbook;
}

describe('extracts in the browser', () => {
  let server: CairnServer;
  let browser: BrowserSession;
  let newSubmissionId = 0;
  let previousSubmissionId = 0;

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

  it('lets a practice lead upload an extract, follow its check, read the report and confirm it', async () => {
    const { page } = browser;
    await signIn('Priya Calloway');
    await nav(page, 'Upload extract').click();
    await page.getByRole('heading', { name: 'Upload extract' }).waitFor();
    await page.getByText('OV102 · Quarrybank Surgery').waitFor();
    await page
      .getByText(/at most 25 MB and 200,000 rows/)
      .first()
      .waitFor();
    await page.getByText(/Current submission for 2026 Q3/).waitFor();
    previousSubmissionId = Number(
      (await page.locator('.cairn-upload-context a').first().textContent())?.replace(/\D/g, ''),
    );
    expect(previousSubmissionId).toBeGreaterThan(0);
    await browser.screenshot('extracts-upload');

    // The template, as a practice would start from it.
    const [templateDownload] = await Promise.all([
      page.waitForEvent('download'),
      page.getByRole('button', { name: 'Download template (XLSX)' }).click(),
    ]);
    expect(templateDownload.suggestedFilename()).toBe('cairn-extract-template.xlsx');
    const template = await readDownload(templateDownload);
    expect(template.subarray(0, 2).toString('latin1')).toBe('PK');
    const templateBook = await openWorkbook(template);
    const dataSheet = templateBook.worksheets[0]!;
    const headings = (dataSheet.getRow(1).values as unknown[])
      .slice(1)
      .map((v) => String(v ?? ''))
      .filter(Boolean);
    expect(headings[0]).toBe('record_ref');
    expect(headings).toContain('hba1c_value');

    const [csvDownload] = await Promise.all([
      page.waitForEvent('download'),
      page.getByRole('button', { name: 'Download template (CSV)' }).click(),
    ]);
    const csv = (await readDownload(csvDownload)).toString('utf8').replace(/^\uFEFF/, '');
    expect(csv.split(/\r?\n/)[0]!.split(',')).toEqual(headings);

    // An extract in the template's columns, with three rows that cannot be accepted.
    const rows: ExtractValue[][] = [];
    for (let i = 1; i <= GOOD_ROWS; i++) {
      const bad = BAD_ROWS.find((b) => b.at === i + 1);
      const row = { ...goodRow(i), ...(bad?.change ?? {}) };
      rows.push(headings.map((h) => (row[h] === undefined ? null : row[h]!)));
    }
    const extract = (await writeXlsx({ headings, rows }))!;

    await page.getByLabel('Extract file').setInputFiles({
      name: 'quarrybank-2026-q3.xlsx',
      mimeType: 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet',
      buffer: extract,
    });
    await page.getByText('quarrybank-2026-q3.xlsx').waitFor();
    await browser.screenshot('extracts-upload-chosen');
    await page.getByRole('button', { name: 'Upload and check' }).click();

    // The submission page: a progress bar fed by polling, surviving a reload.
    await page.waitForURL(/\/practices\/\d+\/submissions\/\d+$/);
    newSubmissionId = Number(new URL(page.url()).pathname.split('/').pop());
    expect(newSubmissionId).toBeGreaterThan(previousSubmissionId);
    const bar = page.getByRole('progressbar', { name: 'Rows checked' });
    await bar.waitFor({ timeout: 10_000 });
    const seen = new Set<number>();
    let shot = false;
    let reloaded = false;
    while (await bar.isVisible().catch(() => false)) {
      const now = await bar.getAttribute('aria-valuenow').catch(() => null);
      if (now !== null) seen.add(Number(now));
      if (!shot && now !== null && Number(now) > 0) {
        await browser.screenshot('extracts-progress');
        shot = true;
      }
      if (!reloaded && now !== null && Number(now) > 0) {
        await page.reload({ waitUntil: 'domcontentloaded' });
        reloaded = true;
        await page
          .getByRole('heading', { name: new RegExp(`Submission ${newSubmissionId}`) })
          .waitFor();
        continue;
      }
      await page.waitForTimeout(150);
    }
    expect(shot).toBe(true);
    expect([...seen].some((v) => v > 0 && v < 100)).toBe(true);

    // The report.
    await page.getByText('Checked: read the report, then confirm').waitFor({ timeout: 60_000 });
    const figure = (label: string) =>
      page
        .locator('.cairn-figure', { has: page.getByText(label, { exact: true }) })
        .locator('.cairn-figure-value')
        .textContent();
    expect(await figure('Rows read')).toBe('30,000');
    expect(await figure('Rows accepted')).toBe('29,997');
    expect(await figure('Rows refused')).toBe('3');
    // Each kind of issue in words, its code kept for support as the cell's tooltip.
    const byKind = page.getByRole('table', { name: 'Issues by kind' });
    for (const bad of BAD_ROWS) await byKind.locator(`td[title="Code: ${bad.code}"]`).waitFor();
    await page.getByText(/^1–\d+ of \d+ issues?$/).waitFor();
    await browser.screenshot('extracts-report');

    // Filters go to the server; the table shows the one issue asked for.
    await page.getByLabel('Kind of issue').selectOption('error');
    await page.getByText('1–3 of 3 issues').waitFor();
    await page.getByLabel('Problem', { exact: true }).selectOption('out_of_range');
    await page.getByText('1–1 of 1 issue').waitFor();
    const table = page.locator('.cairn-issues-table');
    await table.getByText('900', { exact: true }).waitFor();
    await table.getByText('hba1c_value', { exact: true }).waitFor();
    expect(new URL(page.url()).search).toBe('?severity=error&code=out_of_range');
    await browser.screenshot('extracts-report-filtered');
    await page.getByRole('button', { name: 'Clear filters' }).click();
    await page.getByLabel('Sort by').selectOption('-row');
    await page.waitForFunction(
      () => !document.querySelector('.cairn-issues-table[aria-busy="true"]'),
    );

    // The refused rows, ready to fix.
    const [rejectedDownload] = await Promise.all([
      page.waitForEvent('download'),
      page.getByRole('button', { name: 'Refused rows (XLSX)' }).click(),
    ]);
    const rejected = await readDownload(rejectedDownload);
    expect(rejected.subarray(0, 2).toString('latin1')).toBe('PK');
    const rejectedBook = await openWorkbook(rejected);
    const rejectedSheet = rejectedBook.worksheets[0]!;
    const refs: string[] = [];
    rejectedSheet.eachRow((row) => {
      const values = (row.values as unknown[]).map((v) => String(v ?? ''));
      const ref = values.find((v) => /^QB-\d{6}$/.test(v));
      if (ref) refs.push(ref);
    });
    expect(refs.sort()).toEqual(
      BAD_ROWS.map((b) => `QB-${String(b.at - 1).padStart(6, '0')}`).sort(),
    );

    // Confirm: the alert says what it replaces.
    await page.getByRole('button', { name: 'Confirm submission' }).click();
    const alert = page.getByRole('alertdialog');
    await alert
      .getByText(`It replaces the current submission ${previousSubmissionId}`, { exact: false })
      .waitFor();
    await page.waitForTimeout(300); // the alert's opening transition
    await browser.screenshot('extracts-confirm');
    await alert.getByRole('button', { name: 'Confirm submission' }).click();
    await page.getByText('Current submission for 2026 Q3').waitFor();
    await page.locator('.bp6-overlay-backdrop').waitFor({ state: 'detached' });
    expect(await page.getByRole('button', { name: 'Confirm submission' }).count()).toBe(0);

    // History: the new one accepted and current, the previous one superseded.
    await page.getByRole('link', { name: '← Submissions of Quarrybank Surgery' }).click();
    await page.getByRole('heading', { name: 'Submissions' }).waitFor();
    const newRow = page.locator(`tr[data-submission="${newSubmissionId}"]`);
    await newRow.getByText('Accepted', { exact: true }).waitFor();
    await newRow.getByText('Current', { exact: true }).waitFor();
    await page
      .locator(`tr[data-submission="${previousSubmissionId}"]`)
      .getByText('Superseded', { exact: true })
      .waitFor();
    await browser.screenshot('extracts-history');
    expect(browser.errors).toEqual([]);
  });

  it('shows the regional lead which practices have a current submission', async () => {
    const { page } = browser;
    await signIn('Imogen Varley');
    await nav(page, 'Coverage').click();
    await page.getByRole('heading', { name: 'Coverage' }).waitFor();
    const row = page.locator('tr[data-practice="OV102"]');
    await row.getByText('Current submission', { exact: true }).waitFor();
    await row.getByRole('link', { name: `Submission ${newSubmissionId}` }).waitFor();
    await row.getByText('29,997 records', { exact: false }).waitFor();
    const practices = await page.locator('.cairn-coverage-table tbody tr').count();
    expect(practices).toBeGreaterThan(20);
    await browser.screenshot('extracts-coverage');
    await page.getByRole('radio', { name: /^No submission/ }).click();
    const none = await page.locator('.cairn-coverage-table tbody tr').count();
    expect(none).toBeLessThan(practices);
    await browser.screenshot('extracts-coverage-none');
    expect(browser.errors).toEqual([]);
  });

  it('lets the auditor read coverage and a report, with no write buttons', async () => {
    const { page } = browser;
    await signIn('Tobias Renwick');
    expect(
      await page.getByRole('navigation', { name: 'Main' }).getByRole('link').allTextContents(),
    ).toEqual([
      'Home',
      'Benchmark',
      'Coverage',
      'Quarters',
      'Reports',
      'Measure sets',
      'Outliers',
      'Review cases',
      'Audit trail',
    ]);
    await nav(page, 'Coverage').click();
    await page
      .locator('tr[data-practice="OV102"]')
      .getByRole('link', { name: `Submission ${newSubmissionId}` })
      .click();
    await page.getByText('Current submission for 2026 Q3').waitFor();
    await page.getByRole('button', { name: 'Full report (JSON)' }).waitFor();
    await page.getByText(/Record references are shown as pseudonyms/).waitFor();
    for (const name of ['Confirm submission', 'Cancel submission', 'Check again'])
      expect(await page.getByRole('button', { name }).count()).toBe(0);
    await browser.screenshot('extracts-auditor-report');
    await page.getByRole('button', { name: 'Use the dark theme' }).click();
    await page.locator('body.bp6-dark').waitFor({ state: 'attached' });
    await browser.screenshot('extracts-auditor-report-dark');
    await page.getByRole('button', { name: 'Use the light theme' }).click();
    expect(browser.errors).toEqual([]);
  });
});
