/**
 * Digests end to end against a real SMTP server on loopback: the preview is
 * the message as sent, a test goes to the regional lead alone, sending queues
 * each practice once and delivers both parts with the practice's data pack of
 * the report (the file its leads download from the report's page), a
 * practice lead who opted out gets none, and a scheduled sending runs once.
 */
import { simpleParser } from 'mailparser';
import { QueryTypes } from 'sequelize';
import { DigestsService } from '../src/digests/digests.service.js';
import { arrange, type ExtractsWorld, uploadAndWait } from './extracts-fixtures/api.js';
import { csvOf, goodRows } from './extracts-fixtures/rows.js';
import { binary, cellsOf } from './support/downloads.js';
import { signInAs, type SignedInAgent } from './support/auth.js';
import {
  type Capture,
  header,
  mailTestApp,
  outboxRows,
  startCapture,
  waitUntil,
} from './support/mail.js';
import type { TestApp } from './support/test-app.js';

describe('digests', () => {
  let capture: Capture;
  let t: TestApp;
  let w: ExtractsWorld;
  let regional: SignedInAgent;
  let priya: SignedInAgent;
  let daniel: SignedInAgent;
  let q3: number;
  let ov102: number;
  /** The published 2026 Q3 report: the source of its digests */
  let r3: number;
  let r3Label: string;

  beforeAll(async () => {
    capture = await startCapture();
    t = await mailTestApp(capture.port);
    w = await arrange(t);
    q3 = w.quarter('2026 Q3');
    ov102 = w.practice('OV102');
    regional = await signInAs(t, 'regional_lead');
    priya = await signInAs(t, 'practice_lead_one');
    daniel = await signInAs(t, 'practice_lead_two');
    const mine = await uploadAndWait(priya, ov102, q3, csvOf(goodRows(40)), { name: 'ov102.csv' });
    await priya.post(`/api/practices/${ov102}/submissions/${mine.id}/confirm`).expect(200);
    const ov103 = w.practice('OV103');
    const his = await uploadAndWait(daniel, ov103, q3, csvOf(goodRows(30)), { name: 'ov103.csv' });
    await daniel.post(`/api/practices/${ov103}/submissions/${his.id}/confirm`).expect(200);
    const published = await regional
      .post(`/api/quarters/${q3}/reports`)
      .send({ releaseNote: 'First publication of 2026 Q3.' })
      .expect(201);
    r3 = published.body.id;
    r3Label = published.body.label;
    // Opening 2026 Q3 sent its opening messages; digests are counted apart from them.
    await waitUntil(
      async () => (await outboxRows(t)).every((r) => r.state === 'sent'),
      60_000,
      async () => 'opening messages still sending',
    );
  }, 180_000);
  afterAll(async () => {
    await t?.close();
    await capture?.stop();
  });

  const digestRows = (sourceId?: number) =>
    sourceId === undefined
      ? outboxRows(t, "kind = 'digest'")
      : outboxRows(t, "kind = 'digest' AND source_id = ?", [sourceId]);
  const preview = (reportId: number, practiceId: number) =>
    `/api/digests/${reportId}/practices/${practiceId}/preview`;

  it('lists what digests can be made from and previews a practice’s digest as sent', async () => {
    const list = await regional.get('/api/digests').expect(200);
    expect(list.body.map((r: { id: number }) => r.id)).toEqual([r3]);
    expect(list.body[0].label).toBe(r3Label);

    const res = await regional.get(preview(r3, ov102)).expect(200);
    expect(res.body.practice.code).toBe('OV102');
    expect(res.body.subject).toBe('Quarrybank Surgery: your 2026 Q3 digest');
    expect(res.body.recipients.map((r: { address: string }) => r.address)).toContain(
      'priya.calloway@quarrybank.example',
    );
    const text = (res.body.text as string).replace(/\s+/g, ' ');
    expect(text).toMatch(/Of \d+ measures? with figures for Quarrybank Surgery \(OV102\)/);
    expect(text).toContain('What changed since the previous quarter');
    expect(text).toContain('Where improvement would matter most');
    expect(text).toContain('No review case is waiting');
    expect(text).toContain('follow local guidelines');
    expect(text).toContain('NICE NG28');
    expect(res.body.reviewCasesCounted).toBe(true); // the review-case module counts them
    expect(res.body.attachment).toMatchObject({
      filename: `cairn-report-${r3}-2026-Q3-OV102.xlsx`,
      contentType: 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet',
    });

    const html = await regional.get(res.body.htmlPath).expect(200);
    expect(html.headers['content-type']).toMatch(/^text\/html/);
    expect(html.headers['content-security-policy']).toContain("default-src 'none'");
    expect(html.text).toMatch(/^<!DOCTYPE html>/);
    expect(html.text).not.toMatch(/<img\b|<script\b|<link\b|url\(/i);
    expect(html.text).toContain('Dear Priya Calloway,');
  });

  it('refuses whoever is not the regional lead, and names what it cannot find', async () => {
    await priya.get(preview(r3, ov102)).expect(403);
    await priya.post(`/api/digests/${r3}/send`).expect(403);
    const unknown = await regional.get(preview(987654, ov102)).expect(404);
    expect(unknown.headers['content-type']).toMatch(/application\/problem\+json/);
    expect(unknown.body.type).toMatch(/digest-source-not-found$/);
    const practice = await regional.get(preview(r3, 987654)).expect(404);
    expect(practice.body.type).toMatch(/practice-not-in-report$/);
    const bad = await regional
      .put(`/api/digests/${r3}/schedule`)
      .send({ sendAt: 'next tuesday' })
      .expect(400);
    expect(bad.body.errors.map((e: { field: string }) => e.field)).toContain('sendAt');
    const past = await regional
      .put(`/api/digests/${r3}/schedule`)
      .send({ sendAt: '2020-01-01T08:00:00Z' })
      .expect(422);
    expect(past.body.errors.map((e: { field: string }) => e.field)).toEqual(['sendAt']);
    const none = await regional.delete(`/api/digests/${r3}/schedule`).expect(409);
    expect(none.body.type).toMatch(/no-digest-schedule$/);
    expect(await digestRows()).toEqual([]);
  });

  it('sends a test to the regional lead alone, through the server, not the outbox', async () => {
    const res = await regional.post(`/api/digests/${r3}/practices/${ov102}/test`).expect(200);
    expect(res.body.to).toBe(regional.user.email);
    const tests = capture.messages().filter((m) => m.subject.startsWith('Test: '));
    expect(tests).toHaveLength(1);
    const message = tests[0];
    expect(message!.to).toEqual([regional.user.email]);
    expect(message!.subject).toBe('Test: Quarrybank Surgery: your 2026 Q3 digest');
    expect(message!.attachments.map((a) => a.filename)).toEqual([
      `cairn-report-${r3}-2026-Q3-OV102.xlsx`,
    ]);
    expect(await digestRows()).toEqual([]);
  });

  it('sends every practice’s digest once; a lead who opted out gets none', async () => {
    await daniel
      .put('/api/me/mail-preferences')
      .send({ optedOut: ['digest'] })
      .expect(200);
    const res = await regional.post(`/api/digests/${r3}/send`).expect(200);
    expect(res.body.practices).toBe(res.body.report.practices);
    expect(res.body.alreadyQueued).toBe(0);
    const again = await regional.post(`/api/digests/${r3}/send`).expect(200);
    expect(again.body).toMatchObject({ practices: 0, messages: 0 });
    expect(again.body.alreadyQueued).toBe(res.body.practices);

    const rows = await digestRows();
    expect(rows).toHaveLength(res.body.messages);
    const addresses = rows.map((r) => r.recipient_address);
    expect(addresses).toContain('priya.calloway@quarrybank.example');
    expect(addresses.filter((a) => a === daniel.user.email)).toEqual([]);

    await waitUntil(
      async () => (await digestRows()).every((r) => r.state === 'sent'),
      60_000,
      async () => 'digests still sending',
    );
    const digests = capture
      .messages()
      .filter((m) => m.subject.endsWith('2026 Q3 digest') && !m.subject.startsWith('Test: '));
    expect(digests).toHaveLength(res.body.messages);
    expect(capture.mailbox.stats().repeats).toBe(0);
    const priyaMail = digests.find((m) => m.to[0] === 'priya.calloway@quarrybank.example')!;
    const raw = capture.raw(priyaMail);
    expect(header(raw, 'List-Unsubscribe')).toBe(`<${t.config.server.publicUrl}/profile>`);
    expect(Number.isNaN(Date.parse(header(raw, 'Date') ?? ''))).toBe(false);
    expect(header(raw, 'Message-ID')).toMatch(/^<outbox-\d+\.region-\d+@/);
    const parsed = await simpleParser(raw);
    expect(parsed.text).toContain('Dear Priya Calloway,');
    expect(typeof parsed.html).toBe('string');
    expect(parsed.html as string).not.toMatch(/<img\b|url\(|<script\b/i);
    // What the preview showed is what arrived.
    const shown = await regional.get(preview(r3, ov102)).expect(200);
    expect(parsed.text!.trim()).toBe((shown.body.text as string).trim());
    // The attachment is the practice's data pack, sheet for sheet and cell for cell the file its
    // leads download from the report's page.
    const [pack] = parsed.attachments;
    expect(pack!.filename).toBe(`cairn-report-${r3}-2026-Q3-OV102.xlsx`);
    const download = await binary(
      priya.get(`/api/reports/${r3}/practices/${ov102}/data-pack.xlsx`),
    ).expect(200);
    expect(download.headers['content-disposition']).toContain(pack!.filename);
    const attached = await cellsOf(pack!.content);
    expect(Object.keys(attached)).toContain('Your results');
    expect(attached['Your results']!.length).toBeGreaterThan(10);
    expect(attached).toEqual(await cellsOf(download.body as Buffer));
    await daniel.put('/api/me/mail-preferences').send({ optedOut: [] }).expect(200);
  }, 120_000);

  it('schedules a sending, moves and cancels it, and runs a due one once', async () => {
    const q2 = r3;
    const digests = t.app.get(DigestsService);
    // A newly published report gets a sending of its own, a while after its publication.
    expect(await digests.scheduleNewReports(new Date())).toBe(1);
    expect(await digests.scheduleNewReports(new Date())).toBe(0);
    const auto = await regional.get(`/api/digests/${q2}/schedule`).expect(200);
    expect(auto.body).toMatchObject({ state: 'scheduled', scheduledBy: 'on publication' });
    const report = await regional.get(`/api/reports/${r3}`).expect(200);
    expect(Date.parse(auto.body.sendAt) - Date.parse(report.body.publishedAt)).toBe(
      t.config.mail.digests.afterPublicationMinutes * 60_000,
    );
    const queuedBefore = (await digestRows(q2)).length;
    const at = new Date(Date.now() + 3_600_000).toISOString();
    const set = await regional.put(`/api/digests/${q2}/schedule`).send({ sendAt: at }).expect(200);
    expect(set.body).toMatchObject({ state: 'scheduled', sendAt: at });
    await regional.delete(`/api/digests/${q2}/schedule`).expect(200);
    expect((await regional.get(`/api/digests/${q2}/schedule`).expect(200)).body.state).toBe(
      'cancelled',
    );
    await regional.put(`/api/digests/${q2}/schedule`).send({ sendAt: at }).expect(200);

    // Not due yet: nothing sent.
    expect(await digests.runScheduled(new Date())).toBe(0);
    expect(await digestRows(q2)).toHaveLength(queuedBefore);
    // An hour and a minute later it is due, and runs once.
    const later = new Date(Date.now() + 3_660_000);
    expect(await digests.runScheduled(later)).toBe(1);
    expect(await digests.runScheduled(later)).toBe(0);
    const after = await regional.get(`/api/digests/${q2}/schedule`).expect(200);
    expect(after.body.state).toBe('sent');
    // Sent already by hand: the scheduled sending queues nothing twice.
    expect(after.body.outcome).toMatch(
      /^0 practices, 0 messages queued; \d+ practices queued before$/,
    );
    const moved = await regional
      .put(`/api/digests/${q2}/schedule`)
      .send({ sendAt: at })
      .expect(409);
    expect(moved.body.type).toMatch(/digests-sent-already$/);
    const events = await t.db.query<{ action: string }>(
      "SELECT action FROM audit_events WHERE action LIKE 'mail.digest%' ORDER BY id",
      { type: QueryTypes.SELECT },
    );
    expect(events.map((e) => e.action)).toEqual([
      'mail.digest_test_sent',
      'mail.digests_scheduled',
      'mail.digests_unscheduled',
      'mail.digests_scheduled',
    ]);
    await waitUntil(
      async () => (await outboxRows(t)).every((r) => r.state === 'sent'),
      60_000,
      async () => 'digests still sending',
    );
  }, 120_000);
});
