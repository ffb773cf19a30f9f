/**
 * Mail as its users meet it, in headless Chromium against the built app and
 * the local fakes (mail capture included): the regional lead adds extra
 * addresses for two practices (one the capture refuses), opens an audit
 * quarter whose deadline falls inside the reminder window, and follows the delivery page:
 * the opening messages and the reminders, the refusal with the server's reply,
 * sending it again. The captured mail: the mailbox lists the opening message
 * and a reminder; one delivered message is opened from the mailbox and its
 * HTML part on its own; the plain-text part is read; every message has both
 * parts, a Date, a Message-ID, List-Unsubscribe to the profile and no image
 * from outside. A practice lead switches reminders off on their profile.
 * axe-core finds nothing serious on the profile, delivery and recipients pages.
 */
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { expectAccessible } from '../support/a11y.ts';
import { type BrowserSession, openBrowser, signIn as signInAs } from '../support/browser.ts';
import { type CairnServer, startCairn } from '../support/cairn-server.ts';
import { readMailbox, waitForMail as waitForMailIn } from '../support/mailbox.ts';

interface Captured {
  id: string;
  messageId: string | null;
  repeats: number;
  to: string[];
  subject: string;
  text: string;
  html: string | null;
}

const inDays = (days: number) =>
  new Date(Date.now() + days * 86_400_000).toISOString().slice(0, 10);

// 2026 Q4's deadline must fall after the quarter ends (31 December 2026); three days away when
// that allows, else the first days of 2027, with the reminder window stretched to reach today.
const q4Deadline = [inDays(3), '2027-01-04'].sort().at(-1)!;
const reminderDays = Math.min(
  60,
  Math.max(7, Math.ceil((Date.parse(`${q4Deadline}T00:00:00Z`) - Date.now()) / 86_400_000) + 1),
);

function header(raw: string, name: string): string | null {
  const head = raw.split(/\r?\n\r?\n/)[0]!.replace(/\r?\n[ \t]+/g, ' ');
  return new RegExp(`^${name}:\\s*(.*)$`, 'im').exec(head)?.[1]?.trim() ?? null;
}

describe('mail in the browser', () => {
  let server: CairnServer;
  let browser: BrowserSession;

  beforeAll(async () => {
    server = await startCairn({
      env: { CAIRN_MAIL_REMINDERS_DAYS_BEFORE_DEADLINE: String(reminderDays) },
    });
    browser = await openBrowser();
  });
  afterAll(async () => {
    await browser?.close();
    await server?.stop();
  });

  const signIn = (name: string) => signInAs(browser, server.baseUrl, name);

  async function choosePractice(page: Page, code: string) {
    const value = await page
      .locator('#recipient-practice option', { hasText: `${code} · ` })
      .getAttribute('value');
    await page.getByLabel('Practice').selectOption(value!);
  }

  const mailbox = () => readMailbox<Captured>(server.fakesUrl);
  const waitForMail = (check: (messages: Captured[]) => boolean, what: string) =>
    waitForMailIn<Captured>(server.fakesUrl, check, what, 60_000);

  it('lets the regional lead add mail recipients', async () => {
    const { page } = browser;
    await signIn('Imogen Varley');
    const main = page.getByRole('navigation', { name: 'Main' });
    await main.getByRole('button', { name: 'Admin' }).click();
    await main.getByRole('link', { name: 'Mail' }).click();
    await page.getByRole('heading', { name: 'Mail deliveries' }).waitFor();
    await page.getByRole('link', { name: 'Mail recipients' }).click();
    await page.getByRole('heading', { name: 'Mail recipients' }).waitFor();
    for (const [code, address, note] of [
      ['OV102', 'reception@quarrybank.example', 'Practice manager'],
      ['OV104', 'nobody@refused.example', ''],
    ] as const) {
      await choosePractice(page, code);
      await page.getByLabel('E-mail address').fill(address);
      await page.getByLabel('Who is this? (optional)').fill(note);
      await page.getByRole('button', { name: 'Add address' }).click();
      await page.getByRole('button', { name: `Remove ${address} from ${code}` }).waitFor();
    }
    // A bad address is refused in place, naming the field.
    await choosePractice(page, 'OV105');
    await page.getByLabel('E-mail address').fill('reception at fellgate');
    await page.getByRole('button', { name: 'Add address' }).click();
    await page
      .getByText(/address must be an email/)
      .first()
      .waitFor();
    expect(await page.title()).toBe('Mail recipients · Cairn');
    await browser.screenshot('mail-recipients');
    await expectAccessible(page);
  });

  it('sends the quarter-opening message and reminders, and shows each delivery', async () => {
    const { page } = browser;
    // Opening a quarter has no screen of its own yet: the API, with this session.
    const opened = await page.evaluate(async (deadline) => {
      const session = (await (await fetch('/api/session')).json()) as { csrfToken: string };
      const res = await fetch('/api/quarters', {
        method: 'POST',
        headers: { 'Content-Type': 'application/json', 'X-CSRF-Token': session.csrfToken },
        body: JSON.stringify({ year: 2026, quarter: 4, submissionDeadline: deadline }),
      });
      return { status: res.status, body: (await res.json()) as { id: number } };
    }, q4Deadline);
    expect(opened.status).toBe(201);

    // Reachable leads: Priya (OV102), Daniel (OV101, OV103), Ruth (OV201); extras for OV102 and
    // OV104. Nobody has a 2026 Q4 submission: each is reminded too. The refused address fails.
    const messages = await waitForMail(
      (all) =>
        all.filter((m) => m.subject.startsWith('2026 Q4 is open')).length === 5 &&
        all.filter((m) => m.subject.startsWith('Reminder:') && m.subject.includes('2026 Q4'))
          .length === 5,
      'the opening messages and reminders',
    );

    await page.goto(server.baseUrl + '/deliveries', { waitUntil: 'networkidle' });
    await page.getByRole('link', { name: '2026 Q4 opening message' }).waitFor();
    await page.getByRole('link', { name: '2026 Q4 deadline reminders' }).waitFor();
    await page.getByText('Failed 1').first().waitFor();
    await browser.screenshot('mail-deliveries');
    await expectAccessible(page);

    await page.getByRole('link', { name: '2026 Q4 opening message' }).click();
    await page.getByRole('heading', { name: '2026 Q4 opening message' }).waitFor();
    await page.getByText(/^550 5\.1\.1 <nobody@refused\.example>: no such mailbox/).waitFor();
    await page.getByText(/practices had nobody to write to/).waitFor();
    expect(await page.title()).toBe('2026 Q4 opening message · Cairn');
    await browser.screenshot('mail-delivery');
    await expectAccessible(page);
    await page.getByRole('button', { name: 'Send the 1 failed again' }).click();
    await page.getByText('1 message queued again.').waitFor();

    // Every captured message: both parts, a Date, its Message-ID, List-Unsubscribe to the
    // profile, nothing fetched from outside.
    for (const m of messages) {
      const raw = await (await fetch(`${server.fakesUrl}/mailbox/${m.id}/raw`)).text();
      expect(raw).toMatch(/Content-Type: multipart\/alternative/i);
      expect(raw).toMatch(/Content-Type: text\/plain/i);
      expect(raw).toMatch(/Content-Type: text\/html/i);
      expect(Number.isNaN(Date.parse(header(raw, 'Date') ?? ''))).toBe(false);
      expect(header(raw, 'Message-ID')).toMatch(/^<outbox-\d+\.region-\d+@127\.0\.0\.1>$/);
      expect(header(raw, 'Message-ID')).toBe(m.messageId);
      expect(header(raw, 'List-Unsubscribe')).toBe(`<${server.baseUrl}/profile>`);
      expect(m.html).not.toBeNull();
      expect(m.html).not.toMatch(/<img\b|url\(|<link\b|<script\b|src=/i);
      expect(m.repeats).toBe(0);
    }
  });

  it('shows the delivered mail in the mailbox, its HTML and its plain text', async () => {
    const { page } = browser;
    await page.goto(`${server.fakesUrl}/mailbox`, { waitUntil: 'networkidle' });
    await page
      .getByRole('link', { name: /^2026 Q4 is open for submissions/ })
      .first()
      .waitFor();
    await page
      .getByRole('link', { name: /^Reminder: .* 2026 Q4 submission yet/ })
      .first()
      .waitFor();
    await browser.screenshot('mail-mailbox');

    const messages = await mailbox();
    const opening = messages.find(
      (m) => m.to[0] === 'priya.calloway@quarrybank.example' && m.subject.startsWith('2026 Q4'),
    )!;
    expect(opening).toBeDefined();
    await page.goto(`${server.fakesUrl}/mailbox/${opening.id}`, { waitUntil: 'networkidle' });
    await page.getByRole('heading', { name: 'Plain-text part' }).waitFor();
    await browser.screenshot('mail-mailbox-message');

    // The HTML part on its own, as a mail client shows it (nothing may be fetched).
    const requests: string[] = [];
    page.on('request', (r) => {
      if (!r.url().startsWith('data:') && r.url() !== 'about:blank') requests.push(r.url());
    });
    await page.setContent(opening.html!, { waitUntil: 'load' });
    await page.getByText('Dear Priya Calloway,').waitFor();
    await page.getByRole('link', { name: 'Download the extract template (XLSX)' }).waitFor();
    await browser.screenshot('mail-opening-html');
    expect(requests).toEqual([]);

    const reminder = messages.find(
      (m) => m.to[0] === 'ruth.penhallow@cindermere.example' && m.subject.startsWith('Reminder:'),
    )!;
    await page.setContent(reminder.html!, { waitUntil: 'load' });
    await browser.screenshot('mail-reminder-html');
    expect(requests).toEqual([]);

    // The plain-text part, read as a text-only mail client shows it.
    const text = opening.text.replace(/\s+/g, ' ');
    expect(text).toContain('Dear Priya Calloway,');
    expect(text).toContain('The audit quarter 2026 Q4 is now open.');
    expect(text).toContain('Quarrybank Surgery (OV102)');
    expect(text).toContain(
      `Download the extract template (XLSX): ${server.baseUrl}/api/extracts/template.xlsx`,
    );
    expect(text).toContain(`${server.baseUrl}/profile`);
    console.log(`\n── plain-text part of "${opening.subject}" ──\n${opening.text}`);
    // The template link works without signing in.
    const template = await fetch(`${server.baseUrl}/api/extracts/template.xlsx`);
    expect(template.status).toBe(200);
  });

  it('lets a practice lead switch reminders off on their profile', async () => {
    const { page } = browser;
    await signIn('Priya Calloway');
    await page
      .locator('.cairn-navbar')
      .getByRole('link', { name: /Priya Calloway/ })
      .click();
    await page.getByRole('heading', { name: 'Your profile' }).waitFor();
    await page.getByText('OV102 · Quarrybank Surgery').waitFor();
    const reminders = page.getByRole('checkbox', { name: 'Submission deadline reminders' });
    expect(await reminders.isChecked()).toBe(true);
    await reminders.click({ force: true });
    await page.getByText('Saved.').waitFor();
    expect(await reminders.isChecked()).toBe(false);
    expect(await page.title()).toBe('Your profile · Cairn');
    await browser.screenshot('mail-profile');
    await expectAccessible(page);
    await page.reload({ waitUntil: 'networkidle' });
    expect(
      await page.getByRole('checkbox', { name: 'Submission deadline reminders' }).isChecked(),
    ).toBe(false);
    // The only console errors: the refused address of the first test (400, shown in place).
    expect(browser.errors.filter((e) => !/status of 400/.test(e))).toEqual([]);
  });
});
