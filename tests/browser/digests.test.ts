/**
 * Digests as the regional lead meets them, in headless Chromium against the
 * built app and the local fakes (mail capture included): 2026 Q3's report is
 * published from the quarter's reports page; under Mail → Digests the regional
 * lead opens one practice's digest (the HTML part in its sandboxed frame, the
 * plain-text part in its tab), sends a test to themselves and sends the
 * report's digests to every practice. A delivered digest is then opened from
 * the local mailbox page, its attachment (the practice's data pack of the
 * report) listed. axe-core finds nothing serious or critical on the digest
 * pages; screenshots are saved for a person to look at.
 */
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { expectAccessible } from '../support/a11y.ts';
import {
  type BrowserSession,
  navLink,
  openBrowser,
  signIn as signInAs,
} from '../support/browser.ts';
import { type CairnServer, startCairn } from '../support/cairn-server.ts';
import { readMailbox, waitForMail as waitForMailIn } from '../support/mailbox.ts';

interface Captured {
  id: string;
  to: string[];
  subject: string;
  text: string;
  attachments: { filename: string; contentType: string; size: number }[];
}

const SUBJECT = 'Quarrybank Surgery: your 2026 Q3 digest';
const PRIYA = 'priya.calloway@quarrybank.example';

describe('digests in the browser', () => {
  let server: CairnServer;
  let browser: BrowserSession;
  let packName = '';

  beforeAll(async () => {
    server = await startCairn();
    browser = await openBrowser();
  }, 600_000);
  afterAll(async () => {
    await browser?.close();
    await server?.stop();
  });

  const signIn = (name: string) => signInAs(browser, server.baseUrl, name);

  const nav = (page: Page, name: string) => navLink(page, name, { exact: true });

  const mailbox = () => readMailbox<Captured>(server.fakesUrl);
  const waitForMail = (check: (messages: Captured[]) => boolean, what: string) =>
    waitForMailIn<Captured>(server.fakesUrl, check, what, 90_000);

  it('lets the regional lead preview one practice’s digest, both parts', async () => {
    const { page } = browser;
    await signIn('Imogen Varley');
    // The report the digests are made from, published as the regional lead publishes it.
    await nav(page, 'Quarters').click();
    const quarter = page.locator('tr[data-quarter="2026 Q3"]');
    await quarter.getByRole('link', { name: 'Reports of 2026 Q3' }).click();
    await page.locator('#release-note').fill('2026 Q3 report for the digests.');
    await page.getByRole('button', { name: 'Publish report' }).click();
    await page.getByRole('heading', { name: /2026 Q3 · report \d+/ }).waitFor({ timeout: 60_000 });

    // Mail is in the regional lead's Admin menu.
    await page
      .getByRole('navigation', { name: 'Main' })
      .getByRole('button', { name: 'Admin' })
      .click();
    await nav(page, 'Mail').click();
    await page.getByRole('heading', { name: 'Mail deliveries' }).waitFor();
    await page.getByRole('link', { name: 'Digests' }).click();
    await page.getByRole('heading', { name: 'Digests', level: 1 }).waitFor();
    expect(await page.title()).toBe('Digests · Cairn');
    const ov102 = await page
      .locator('#digest-practice option', { hasText: 'OV102 · ' })
      .getAttribute('value');
    await page.getByLabel('Practice').selectOption(ov102!);
    const headers = page.locator('.cairn-digests-headers');
    await headers.getByRole('cell', { name: SUBJECT }).waitFor();
    await expect(headers.textContent()).resolves.toContain(PRIYA);
    const attachment = (await headers
      .getByRole('row', { name: /^Attachment/ })
      .getByRole('cell')
      .textContent())!;
    expect(attachment).toMatch(/^cairn-report-\d+-2026-Q3-OV102\.xlsx \(\d+ kB\)$/);
    packName = attachment.replace(/ \(\d+ kB\)$/, '');

    // The HTML part, in a frame that may run nothing (same origin, so its height can be read).
    const frameElement = page.locator('iframe[title="Digest for OV102, HTML part"]');
    expect(await frameElement.getAttribute('sandbox')).toBe('allow-same-origin');
    const frame = page.frameLocator('iframe[title="Digest for OV102, HTML part"]');
    await frame.getByText('Dear Priya Calloway,').waitFor();
    await frame
      .getByText(/follow local guidelines/)
      .first()
      .waitFor();
    // As tall as the message: no white space under it, no scroll bar of its own.
    const fit = async () =>
      frameElement.evaluate((element) => {
        const iframe = element as HTMLIFrameElement;
        const body = iframe.contentDocument!.body;
        return {
          frame: iframe.clientHeight,
          content: body.scrollHeight,
          scrolls: iframe.contentDocument!.documentElement.scrollHeight > iframe.clientHeight,
        };
      });
    await expect.poll(async () => (await fit()).frame, { timeout: 10_000 }).toBeGreaterThan(320);
    const sized = await fit();
    expect(sized).toEqual(expect.objectContaining({ scrolls: false }));
    expect(Math.abs(sized.frame - sized.content)).toBeLessThanOrEqual(2);
    await browser.screenshot('digests-preview-html');
    await expectAccessible(page);

    await page.getByRole('tab', { name: 'Plain text' }).click();
    const text = (await page.getByLabel('Plain-text part').textContent())!.replace(/\s+/g, ' ');
    expect(text).toContain('Dear Priya Calloway,');
    expect(text).toMatch(/Of \d+ measures? with figures for Quarrybank Surgery \(OV102\)/);
    expect(text).toContain('follow local guidelines');
    expect(text).toContain('The attached data pack (XLSX)');
    await browser.screenshot('digests-preview-text');
    await expectAccessible(page);
  });

  it('sends a test to the regional lead, then every practice’s digest', async () => {
    const { page } = browser;
    await page.getByRole('button', { name: 'Send this digest to me' }).click();
    await page
      .getByRole('status')
      .filter({ hasText: /^Sent to / })
      .waitFor();
    const tests = await waitForMail(
      (all) => all.some((m) => m.subject === `Test: ${SUBJECT}`),
      'the test digest',
    );
    const test = tests.find((m) => m.subject === `Test: ${SUBJECT}`)!;
    expect(test.to).toHaveLength(1);
    expect(test.to[0]).not.toBe(PRIYA);
    expect(test.attachments.map((a) => a.filename)).toEqual([packName]);
    // A test reaches nobody at the practice.
    expect(tests.filter((m) => m.subject === SUBJECT)).toEqual([]);

    await page.getByRole('button', { name: /^Send to all \d+ practices now$/ }).click();
    const queued = page.getByRole('status').filter({ hasText: /messages to \d+ practices queued/ });
    await queued.waitFor();
    await browser.screenshot('digests-sent');
    await expectAccessible(page);
    await queued.getByRole('link', { name: 'Follow their delivery' }).click();
    await page.getByRole('heading', { name: /2026 Q3 · report \d+ digests/ }).waitFor();
    await waitForMail(
      (all) => all.some((m) => m.subject === SUBJECT && m.to[0] === PRIYA),
      'OV102’s digest to Priya Calloway',
    );
    await page.reload({ waitUntil: 'networkidle' });
    await page.getByRole('heading', { name: /2026 Q3 · report \d+ digests/ }).waitFor();
    await browser.screenshot('digests-delivery');
    await expectAccessible(page);
  });

  it('shows a delivered digest in the mailbox with its data pack attached', async () => {
    const { page } = browser;
    const messages = await mailbox();
    const digest = messages.find((m) => m.subject === SUBJECT && m.to[0] === PRIYA)!;
    expect(digest.attachments).toHaveLength(1);
    expect(digest.attachments[0]).toMatchObject({
      filename: packName,
      contentType: 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet',
    });
    await page.goto(`${server.fakesUrl}/mailbox`, { waitUntil: 'networkidle' });
    await page.getByRole('link', { name: SUBJECT }).first().waitFor();
    await browser.screenshot('digests-mailbox');
    await page.goto(`${server.fakesUrl}/mailbox/${digest.id}`, { waitUntil: 'networkidle' });
    await page.getByRole('heading', { name: 'Attachments' }).waitFor();
    await page.getByRole('link', { name: packName }).waitFor();
    await page.getByRole('heading', { name: 'Plain-text part' }).waitFor();
    await browser.screenshot('digests-mailbox-message');
    // The attachment opens from the mailbox as the workbook it is (a zip: "PK").
    const href = await page.getByRole('link', { name: packName }).getAttribute('href');
    const bytes = Buffer.from(await (await fetch(`${server.fakesUrl}${href}`)).arrayBuffer());
    expect(bytes.subarray(0, 2).toString('latin1')).toBe('PK');
    expect(browser.errors).toEqual([]);
  });
});
