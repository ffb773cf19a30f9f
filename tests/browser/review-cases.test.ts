/**
 * Outlier review as its users meet it, in headless Chromium against the built
 * app with the demo region: the auditor opens the outlier list, drills into a
 * practice flagged low, opens a review case from the list and asks the
 * practice; the practice's lead finds the e-mail in the local mailbox, follows
 * it to the case and answers with an attachment (a CSV); the auditor reads the
 * answer and closes the case with a finding. The timeline shows each step;
 * axe-core finds nothing serious or critical on the list, drill-down and case
 * pages; screenshots are saved for a person to look at.
 */
import { writeFileSync, mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { expectAccessible } from '../support/a11y.ts';
import { type BrowserSession, openBrowser, signIn as signInAs } from '../support/browser.ts';
import { type CairnServer, startCairn } from '../support/cairn-server.ts';
import { waitForMail } from '../support/mailbox.ts';

interface Captured {
  id: string;
  to: string[];
  subject: string;
  text: string;
}

describe('outlier review in the browser', () => {
  let server: CairnServer;
  let browser: BrowserSession;
  let caseUrl = '';

  beforeAll(async () => {
    server = await startCairn();
    browser = await openBrowser();
  }, 600_000);
  afterAll(async () => {
    await browser?.close();
    await server?.stop();
  });

  const signIn = (name: string) => signInAs(browser, server.baseUrl, name);

  it('lets the auditor find a flagged practice, drill in and open a case from the list', async () => {
    await signIn('Tobias Renwick');
    const { page } = browser;
    await page.locator('.cairn-navbar').getByRole('link', { name: 'Outliers' }).click();
    await page.getByRole('heading', { name: 'Outlier list' }).waitFor();
    await page.getByRole('heading', { name: /^Worse than expected/ }).waitFor();
    const row = page.locator('tr', { hasText: 'OV201' }).first();
    await row.waitFor();
    await expect(row.textContent()).resolves.toMatch(/limit/);
    await browser.screenshot('review-outliers');
    await expectAccessible(page);

    await row.getByRole('link', { name: /OV201/ }).click();
    await page.getByRole('heading', { name: 'Why it stands out' }).waitFor();
    await page.getByRole('heading', { name: 'By diabetes type' }).waitFor();
    await page.getByRole('heading', { name: 'Over time' }).waitFor();
    await page.getByRole('button', { name: 'Show as table' }).first().click();
    const byType = page.locator('figure', { hasText: 'Practice (bars) against the region' });
    await byType.getByRole('columnheader', { name: 'Diabetes type' }).waitFor();
    // The records behind the result, a page at a time under pseudonyms, and the evidence.
    await page.getByText(/^Records 1–\d+ of \d+$/).waitFor();
    await expect(
      page.getByRole('link', { name: /Download the evidence/ }).getAttribute('href'),
    ).resolves.toMatch(/\/evidence\.xlsx$/);
    await browser.screenshot('review-drill-down');
    await expectAccessible(page);

    await page.goBack({ waitUntil: 'networkidle' });
    const again = page.locator('tr', { hasText: 'OV201' }).first();
    await again.getByRole('button', { name: 'Open case' }).click();
    await page.getByRole('heading', { name: /^Review case \d+: OV201/ }).waitFor();
    caseUrl = page.url();
    await page
      .getByLabel('Question to the practice')
      .fill('Your rate is well below the region’s. Could you check how these are recorded?');
    await page.getByRole('button', { name: 'Send the question' }).click();
    await page.getByText('Awaiting the practice').first().waitFor();
    await page.getByText('asked', { exact: false }).first().waitFor();
    await browser.screenshot('review-case-asked');
    await expectAccessible(page);
  });

  it('lets the practice lead find the e-mail, follow it and answer with an attachment', async () => {
    const question = (m: Captured) =>
      /^Review case \d+:/.test(m.subject) && m.to.some((a) => /ruth\.penhallow/.test(a));
    const messages = await waitForMail<Captured>(
      server.fakesUrl,
      (all) => all.some(question),
      'the review case e-mail',
    );
    const mail = messages.find(question)!;
    expect(mail.text).toMatch(/not clinical advice/);
    const link = /(http\S+\/review-cases\/\d+)/.exec(mail.text)?.[1];
    expect(link).toBe(caseUrl);

    const { page } = browser;
    await page.goto(`${server.fakesUrl}/mailbox/${mail.id}`, { waitUntil: 'networkidle' });
    await browser.screenshot('review-mailbox-message');

    await signIn('Ruth Penhallow');
    await page.goto(link!, { waitUntil: 'networkidle' });
    await page.getByRole('heading', { name: /^Review case \d+: OV201/ }).waitFor();
    expect(await page.getByText('internal: the practice does not see this').count()).toBe(0);
    const dir = mkdtempSync(join(tmpdir(), 'cairn-answer-'));
    const file = join(dir, 'recording-check.csv');
    writeFileSync(file, 'check,result\ncoded in the wrong field,42 records\n');
    await page.getByLabel('Your answer').fill('We found 42 records coded in the wrong field.');
    await page.locator('#answer-files').setInputFiles(file);
    await page.getByRole('button', { name: 'Send the answer' }).click();
    await page.getByText('Practice responded').first().waitFor();
    await page.getByRole('link', { name: 'recording-check.csv' }).waitFor();
    await browser.screenshot('review-case-answered');
    await expectAccessible(page);
  });

  it('lets the auditor read the answer and close the case with a finding', async () => {
    await signIn('Tobias Renwick');
    const { page } = browser;
    await page.goto(caseUrl, { waitUntil: 'networkidle' });
    await page.getByRole('link', { name: 'recording-check.csv' }).waitFor();
    await page.getByLabel('Finding').selectOption('data_quality_issue');
    await page
      .getByLabel('Closing remark (the practice sees it)')
      .fill('Thank you: a recording issue.');
    await page.getByRole('button', { name: 'Close the case' }).click();
    await page.getByText('This case is closed.').waitFor();
    // the timeline's own entries (an answer lists its files in a nested list)
    const timeline = await page.locator('.cairn-timeline > li').allTextContents();
    expect(
      timeline.map((t) => /opened the case|asked|answered|changed the state/.exec(t)?.[0] ?? t),
    ).toEqual(['opened the case', 'asked', 'answered', 'changed the state']);
    await browser.screenshot('review-case-closed');
    await expectAccessible(page);
  });
});
