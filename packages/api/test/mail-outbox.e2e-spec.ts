/**
 * Mail through the real HTTP stack, the real outbox and a real SMTP server on
 * loopback: the quarter-opening message queued with the quarter and sent to
 * each practice's recipients (leads who did not opt out, and extra
 * addresses); what every message carries; deadline reminders only to
 * practices without a current submission, once; the recipients form and
 * mail preferences with their refusals; the delivery page and resending.
 */
import { QueryTypes } from 'sequelize';
import { defaultDeadline } from '../src/quarters/deadline.js';
import { simpleParser } from 'mailparser';
import { QuarterEvents } from '../src/quarters/quarter-events.js';
import { messageIdFor, messageIdHost } from '../src/mail/outbox-policy.js';
import { OutboxService } from '../src/mail/outbox.service.js';
import { QuarterMailService } from '../src/mail/quarter-mail.service.js';
import { csvOf, goodRow } from './extracts-fixtures/rows.js';
import { uploadAndWait } from './extracts-fixtures/api.js';
import { demoIds, seedDemoOrganisation, signInAs, type SignedInAgent } from './support/auth.js';
import {
  type Capture,
  daysFromToday,
  header,
  mailTestApp,
  outboxRows,
  startCapture,
  stateCounts,
  waitUntil,
} from './support/mail.js';
import type { TestApp } from './support/test-app.js';

describe('mail: opening message, reminders, recipients, deliveries', () => {
  let capture: Capture;
  let t: TestApp;
  let regional: SignedInAgent;
  let priya: SignedInAgent;
  let daniel: SignedInAgent;
  let auditor: SignedInAgent;
  let ids: Awaited<ReturnType<typeof demoIds>>;
  let quarterId: number;
  let regionId: number;
  // 2027 Q1's deadline: after the quarter ends (quarters/deadline.ts), whatever today is.
  const deadline = defaultDeadline(2027, 1, 45);

  const audit = (action: string) =>
    t.db.query<{ summary: string; detail: string | null }>(
      'SELECT summary, detail FROM audit_events WHERE action = ? ORDER BY id',
      { replacements: [action], type: QueryTypes.SELECT },
    );

  beforeAll(async () => {
    capture = await startCapture();
    t = await mailTestApp(capture.port);
    await seedDemoOrganisation(t);
    ids = await demoIds(t);
    const [region] = await t.db.query<{ id: number }>('SELECT id FROM regions', {
      type: QueryTypes.SELECT,
    });
    regionId = region!.id;
    regional = await signInAs(t, 'regional_lead');
    priya = await signInAs(t, 'practice_lead_one');
    daniel = await signInAs(t, 'practice_lead_two');
    auditor = await signInAs(t, 'auditor');
  });
  afterAll(async () => {
    await t?.close();
    await capture?.stop();
  });

  describe('mail preferences (profile)', () => {
    it('lists every kind, received by default, and says which apply to the role', async () => {
      const res = await priya.get('/api/me/mail-preferences').expect(200);
      expect(res.body.preferences.map((p: { kind: string }) => p.kind)).toEqual([
        'quarter_opened',
        'deadline_reminder',
        'review_case_question',
        'digest',
      ]);
      for (const p of res.body.preferences) {
        expect(p).toMatchObject({ receive: true, appliesToYou: true, sentTo: ['practice_lead'] });
        expect(p.label.length).toBeGreaterThan(5);
      }
      const lead = await regional.get('/api/me/mail-preferences').expect(200);
      expect(lead.body.preferences.every((p: { appliesToYou: boolean }) => !p.appliesToYou)).toBe(
        true,
      );
    });

    it.each([
      [{ optedOut: ['digest_weekly'] }, 'optedOut'],
      [{ optedOut: ['quarter_opened', 'quarter_opened'] }, 'optedOut'],
      [{ optedOut: 'quarter_opened' }, 'optedOut'],
      [{}, 'optedOut'],
      [{ optedOut: [], extra: true }, 'extra'],
    ])('refuses %j naming the field, and keeps what was stored', async (body, field) => {
      const res = await daniel.put('/api/me/mail-preferences').send(body).expect(400);
      expect(res.headers['content-type']).toMatch(/application\/problem\+json/);
      expect(res.body.errors.map((e: { field: string }) => e.field)).toContain(field);
      const now = await daniel.get('/api/me/mail-preferences').expect(200);
      expect(now.body.preferences.every((p: { receive: boolean }) => p.receive)).toBe(true);
    });

    it('records an opt-out with an audit event, and an auditor may change their own', async () => {
      const res = await daniel
        .put('/api/me/mail-preferences')
        .send({ optedOut: ['quarter_opened'] })
        .expect(200);
      expect(
        res.body.preferences.map((p: { kind: string; receive: boolean }) => [p.kind, p.receive]),
      ).toEqual([
        ['quarter_opened', false],
        ['deadline_reminder', true],
        ['review_case_question', true],
        ['digest', true],
      ]);
      // The same choice again changes nothing and records nothing.
      await daniel
        .put('/api/me/mail-preferences')
        .send({ optedOut: ['quarter_opened'] })
        .expect(200);
      const events = await audit('user.mail_preferences_changed');
      expect(events).toHaveLength(1);
      expect(events[0]!.summary).toBe('Daniel Oyelaran chose not to receive audit quarter opened');
      await auditor.put('/api/me/mail-preferences').send({ optedOut: [] }).expect(200);
    });
  });

  describe('extra recipients', () => {
    const url = () => `/api/practices/${ids.practice('OV102')}/mail-recipients`;

    it('adds an address to a practice, with an audit event', async () => {
      const res = await regional
        .post(url())
        .send({ address: '  Reception@Quarrybank.example ', note: 'Practice manager' })
        .expect(201);
      expect(res.body.practice.code).toBe('OV102');
      expect(res.body.leads.map((l: { email: string }) => l.email)).toEqual([
        'priya.calloway@quarrybank.example',
      ]);
      expect(res.body.extras).toEqual([
        expect.objectContaining({
          address: 'reception@quarrybank.example',
          note: 'Practice manager',
          addedBy: regional.user.email,
          actions: { remove: true },
        }),
      ]);
      const [event] = await audit('mail_recipient.added');
      expect(event!.summary).toContain('reception@quarrybank.example');
      await regional
        .post(`/api/practices/${ids.practice('OV201')}/mail-recipients`)
        .send({ address: 'nobody@refused.example' })
        .expect(201);
    });

    it.each([
      ['not an address', { address: 'reception at quarrybank' }, 400, 'validation', 'address'],
      ['no domain', { address: 'reception@' }, 400, 'validation', 'address'],
      [
        'a display name',
        { address: 'Reception <r@quarrybank.example>' },
        400,
        'validation',
        'address',
      ],
      [
        'too long a note',
        { address: 'a@quarrybank.example', note: 'x'.repeat(101) },
        400,
        'validation',
        'note',
      ],
      [
        'an address already there',
        { address: 'reception@quarrybank.example' },
        409,
        'recipient-exists',
        'address',
      ],
      [
        "a lead's address",
        { address: 'Priya.Calloway@quarrybank.example' },
        409,
        'recipient-is-lead',
        'address',
      ],
    ])(
      'refuses %s with a specific problem, losing nothing',
      async (_what, body, status, type, field) => {
        const before = await regional.get('/api/mail/recipients').expect(200);
        const res = await regional.post(url()).send(body).expect(status);
        expect(res.body.type).toBe(`/api/problems/${type}`);
        expect(res.body.errors.map((e: { field: string }) => e.field)).toContain(field);
        const after = await regional.get('/api/mail/recipients').expect(200);
        expect(after.body).toEqual(before.body);
      },
    );

    it('refuses a 21st address and an unknown removal; removes one with an audit event', async () => {
      const practice = ids.practice('OV104');
      for (let i = 1; i <= 20; i++)
        await regional
          .post(`/api/practices/${practice}/mail-recipients`)
          .send({ address: `person${i}@ov104.example` })
          .expect(201);
      const over = await regional
        .post(`/api/practices/${practice}/mail-recipients`)
        .send({ address: 'person21@ov104.example' })
        .expect(422);
      expect(over.body.type).toBe('/api/problems/too-many-recipients');
      const list = await regional.get('/api/mail/recipients').expect(200);
      const entry = list.body.practices.find(
        (p: { practice: { id: number } }) => p.practice.id === practice,
      );
      expect(entry.extras).toHaveLength(20);
      expect(entry.actions.addRecipient).toBe(false);
      await regional.delete(`/api/practices/${practice}/mail-recipients/999999`).expect(404);
      for (const extra of entry.extras)
        await regional.delete(`/api/practices/${practice}/mail-recipients/${extra.id}`).expect(200);
      expect(await audit('mail_recipient.removed')).toHaveLength(20);
    });

    it('is the regional lead’s: a practice lead may neither read nor add', async () => {
      await priya.get('/api/mail/recipients').expect(403);
      await priya.post(url()).send({ address: 'x@quarrybank.example' }).expect(403);
    });
  });

  describe('the quarter-opening message', () => {
    it('is queued with the quarter, in its transaction: a failed opening queues nothing', async () => {
      let fail = true;
      t.app.get(QuarterEvents).onOpened(async () => {
        if (fail) throw new Error('a listener after the mail module failed');
      });
      await regional
        .post('/api/quarters')
        .send({ year: 2027, quarter: 1, submissionDeadline: deadline })
        .expect(500);
      expect(await outboxRows(t)).toEqual([]);
      const [{ n }] = (await t.db.query('SELECT COUNT(*) AS n FROM audit_quarters', {
        type: QueryTypes.SELECT,
      })) as [{ n: number }];
      expect(Number(n)).toBe(0);
      fail = false;
    });

    it('goes to every active practice’s recipients, less the leads who opted out', async () => {
      const res = await regional
        .post('/api/quarters')
        .send({ year: 2027, quarter: 1, submissionDeadline: deadline })
        .expect(201);
      quarterId = res.body.id;
      const rows = await outboxRows(t);
      expect(rows.map((r) => [r.kind, r.source_id, r.recipient_address]).sort()).toEqual(
        [
          ['quarter_opened', quarterId, 'nobody@refused.example'],
          ['quarter_opened', quarterId, 'priya.calloway@quarrybank.example'],
          ['quarter_opened', quarterId, 'reception@quarrybank.example'],
          ['quarter_opened', quarterId, 'ruth.penhallow@cindermere.example'],
        ].sort(),
      );
      const [event] = await audit('mail.queued');
      expect(event!.summary).toBe('2027 Q1 opening message queued for 30 practices (4 recipients)');
    });

    it('is sent once to each, and the refused address fails with the server’s reply', async () => {
      await capture.waitFor(3);
      await waitUntil(
        async () => {
          const counts = await stateCounts(t);
          return counts.failed === 1 && counts.sent === 3;
        },
        20_000,
        async () => JSON.stringify(await stateCounts(t)),
      );
      expect(await stateCounts(t)).toEqual({ sent: 3, failed: 1 });
      const [refused] = await outboxRows(t, "state = 'failed'");
      expect(refused!.recipient_address).toBe('nobody@refused.example');
      expect(refused!.attempts).toBe(1);
      expect(refused!.last_reply_code).toBe(550);
      expect(refused!.last_error).toMatch(
        /^550 5\.1\.1 <nobody@refused\.example>: no such mailbox/,
      );
      expect(capture.mailbox.stats()).toEqual({ messages: 3, repeats: 0 });
    });

    it('carries both parts, a Date, its Message-ID, List-Unsubscribe to the profile, no outside image', async () => {
      const rows = await outboxRows(t, "state = 'sent'");
      for (const message of capture.messages()) {
        const raw = capture.raw(message);
        const row = rows.find((r) => r.recipient_address === message.to[0]);
        expect(row).toBeDefined();
        expect(header(raw, 'Message-ID')).toBe(row!.message_id);
        // Derived from the row alone (the SQL of the claim and messageIdFor agree).
        expect(row!.message_id).toBe(
          messageIdFor(row!.id, regionId, messageIdHost(t.config.server.publicUrl)),
        );
        expect(Number.isNaN(Date.parse(header(raw, 'Date') ?? ''))).toBe(false);
        expect(header(raw, 'List-Unsubscribe')).toBe(`<${t.config.server.publicUrl}/profile>`);
        expect(header(raw, 'Auto-Submitted')).toBe('auto-generated');
        const parsed = await simpleParser(raw);
        expect(parsed.text).toContain('Submission deadline');
        expect(typeof parsed.html).toBe('string');
        const html = parsed.html as string;
        expect(html).not.toMatch(/<img\b/i);
        expect(html).not.toMatch(/url\(|@import|<link\b|<script\b/i);
        expect(html).toContain(`${t.config.server.publicUrl}/api/extracts/template.xlsx`);
        expect(parsed.text).toContain(`${t.config.server.publicUrl}/api/extracts/template.xlsx`);
        expect(parsed.text).toContain(`${t.config.server.publicUrl}/extracts/upload`);
        expect(parsed.subject).toMatch(
          /^2027 Q1 is open for submissions \(deadline \w+day \d+ \w+ \d{4}\)$/,
        );
        // No data in any link: each is one of the app's fixed addresses.
        const links = [...html.matchAll(/href="([^"]+)"/g)].map((m) => m[1]);
        for (const link of links)
          expect(
            ['/api/extracts/template.xlsx', '/extracts/upload'].map(
              (p) => `${t.config.server.publicUrl}${p}`,
            ),
          ).toContain(link);
        // No clinical caution: this message cannot steer care.
        expect(parsed.text).not.toContain('clinical judgement');
      }
      const priyaMail = capture
        .messages()
        .find((m) => m.to[0] === 'priya.calloway@quarrybank.example')!;
      expect(priyaMail.text).toContain('Dear Priya Calloway,');
      expect(priyaMail.text).toContain('Quarrybank Surgery (OV102)');
      expect(priyaMail.text).toContain(`${t.config.server.publicUrl}/profile`);
      const extra = capture.messages().find((m) => m.to[0] === 'reception@quarrybank.example')!;
      expect(extra.text).toContain('Hello,');
      expect(extra.text).toContain('ask the regional lead to remove it');
    });

    it('is queued once per practice: queueing again adds nothing', async () => {
      const before = (await outboxRows(t)).length;
      const outbox = t.app.get(OutboxService);
      const again = await outbox.transaction((transaction) =>
        outbox.queue(
          {
            kind: 'quarter_opened',
            sourceId: quarterId,
            regionId,
            practiceId: ids.practice('OV102'),
            recipients: [{ address: 'someone.new@quarrybank.example', name: null, userId: null }],
          },
          transaction,
        ),
      );
      expect(again).toBeNull();
      expect(await outboxRows(t)).toHaveLength(before);
    });
  });

  describe('deadline reminders', () => {
    let soonId: number;

    it('go only to practices without a current submission, once, however often the check runs', async () => {
      // 2026 Q3 opens with its deadline in 30 days; OV102 then sends a current submission.
      const soon = await regional
        .post('/api/quarters')
        .send({ year: 2026, quarter: 3, submissionDeadline: daysFromToday(30) })
        .expect(201);
      soonId = soon.body.id;
      const mail = t.app.get(QuarterMailService);
      // Not due yet: 30 days is more than the 7 of mail.reminders.daysBeforeDeadline.
      expect(await mail.queueReminders(daysFromToday(0))).toMatchObject({ quarters: 0 });
      const done = await uploadAndWait(
        priya,
        ids.practice('OV102'),
        soonId,
        Buffer.from(csvOf([goodRow(1), goodRow(2)])),
        { name: 'ov102.csv' },
      );
      expect(done.status).toBe('awaiting_confirmation');
      await priya
        .post(`/api/practices/${ids.practice('OV102')}/submissions/${done.id}/confirm`)
        .expect(200);

      // Three days before the deadline, two processes' checks at once: one runs, the other
      // finds the lease taken (or runs after it and queues nothing).
      const at = (days: number) => new Date(Date.now() + days * 86_400_000);
      const [a, b] = await Promise.all([
        mail.runReminderCheck(at(27)),
        mail.runReminderCheck(at(27)),
      ]);
      const ran = [a, b].filter((r) => r !== null);
      expect(ran.length).toBeGreaterThanOrEqual(1);
      expect(ran.reduce((n, r) => n + r!.messages, 0)).toBe(4);
      const rows = await outboxRows(t, "kind = 'deadline_reminder'");
      // OV102 submitted: neither Priya nor its extra address. Daniel's two practices have no
      // current submission, and he opted out of opening messages only.
      expect(rows.map((r) => r.recipient_address).sort()).toEqual(
        [
          'daniel.oyelaran@harnleigh.example',
          'daniel.oyelaran@harnleigh.example',
          'nobody@refused.example',
          'ruth.penhallow@cindermere.example',
        ].sort(),
      );
      expect(new Set(rows.map((r) => r.source_id))).toEqual(new Set([soonId]));
      // Later the same day, or the next, nothing more is queued.
      expect(await mail.runReminderCheck(at(27))).toMatchObject({ practices: 0, messages: 0 });
      expect(await mail.queueReminders(daysFromToday(28))).toMatchObject({ messages: 0 });
      expect(await outboxRows(t, "kind = 'deadline_reminder'")).toHaveLength(4);
      // After the deadline no reminder is due at all.
      expect(await mail.queueReminders(daysFromToday(31))).toMatchObject({ quarters: 0 });
    });

    it('are sent, naming the practice, the quarter and the deadline', async () => {
      await waitUntil(
        async () =>
          (await outboxRows(t, "kind = 'deadline_reminder' AND state IN ('sent', 'failed')"))
            .length === 4,
        20_000,
      );
      const reminders = capture.messages().filter((m) => m.subject.startsWith('Reminder:'));
      for (const m of reminders)
        expect(m.subject).toMatch(
          /^Reminder: .+ has no 2026 Q3 submission yet \(deadline \w+day \d+ \w+ \d{4}\)$/,
        );
      expect(reminders).toHaveLength(3);
      for (const m of reminders) {
        expect(m.text.replace(/\s+/g, ' ')).toContain(
          'had no current submission for the audit quarter 2026 Q3',
        );
        expect(m.html).not.toMatch(/<img\b/i);
      }
    });
  });

  describe('the delivery page', () => {
    it('counts each source’s messages by state, latest first', async () => {
      const res = await regional.get('/api/mail/deliveries').expect(200);
      expect(
        res.body.sources.map((s: { kind: string; label: string; counts: object }) => [
          s.kind,
          s.label,
          s.counts,
        ]),
      ).toEqual([
        [
          'deadline_reminder',
          '2026 Q3 deadline reminders',
          { queued: 0, sending: 0, sent: 3, failed: 1, total: 4 },
        ],
        [
          'quarter_opened',
          '2026 Q3 opening message',
          expect.objectContaining({ total: expect.any(Number) }),
        ],
        [
          'quarter_opened',
          '2027 Q1 opening message',
          { queued: 0, sending: 0, sent: 3, failed: 1, total: 4 },
        ],
      ]);
      const opening = res.body.sources.find(
        (s: { label: string }) => s.label === '2027 Q1 opening message',
      );
      expect(opening).toMatchObject({
        practices: 30,
        practicesWithoutRecipients: 28,
        actions: { resendFailed: true },
      });
    });

    it('shows each message with its recipient, times and the failure’s reply', async () => {
      const res = await regional
        .get(`/api/mail/deliveries/quarter_opened/${quarterId}`)
        .expect(200);
      expect(res.body.messages).toHaveLength(4);
      const [first] = res.body.messages;
      expect(first).toMatchObject({
        state: 'failed',
        recipient: 'nobody@refused.example',
        practice: { code: 'OV201' },
        attempts: 1,
        lastReplyCode: 550,
        actions: { resend: true },
      });
      expect(first.lastError).toMatch(/^550 /);
      for (const m of res.body.messages.slice(1)) {
        expect(m).toMatchObject({ state: 'sent', lastError: null, actions: { resend: false } });
        expect(Date.parse(m.sentAt)).toBeGreaterThanOrEqual(Date.parse(m.queuedAt));
      }
      expect(res.body.practicesWithoutRecipients).toHaveLength(28);
    });

    it('sends failed messages again, with an audit event; nothing failed is a conflict', async () => {
      const res = await regional
        .post(`/api/mail/deliveries/quarter_opened/${quarterId}/resend`)
        .expect(200);
      expect(res.body.resent).toBe(1);
      const [event] = await audit('mail.resent');
      expect(event!.summary).toBe(
        `${regional.user.displayName} sent 1 failed message of the 2027 Q1 opening message again`,
      );
      // Still refused by the server: failed again, attempts counted afresh.
      await waitUntil(
        async () =>
          (
            await outboxRows(t, "state = 'failed' AND kind = 'quarter_opened' AND source_id = ?", [
              quarterId,
            ])
          ).length === 1,
        20_000,
      );
      const [again] = await outboxRows(
        t,
        "state = 'failed' AND kind = 'quarter_opened' AND source_id = ?",
        [quarterId],
      );
      expect(again!.attempts).toBe(1);
      // One failed message on its own, then nothing left: 409.
      await regional.post(`/api/mail/messages/${again!.id}/resend`).expect(200);
      const sent = (await outboxRows(t, "state = 'sent'"))[0]!;
      const conflict = await regional.post(`/api/mail/messages/${sent.id}/resend`).expect(409);
      expect(conflict.body.type).toBe('/api/problems/message-not-failed');
    });

    it('answers 404 for an unknown source or message, and is the regional lead’s alone', async () => {
      const unknown = await regional.get('/api/mail/deliveries/digest_weekly/1').expect(404);
      expect(unknown.body.type).toBe('/api/problems/delivery-not-found');
      await regional.get('/api/mail/deliveries/quarter_opened/999999').expect(404);
      await regional.post('/api/mail/messages/999999/resend').expect(404);
      await priya.get('/api/mail/deliveries').expect(403);
      await auditor.get('/api/mail/deliveries').expect(403);
    });
  });
});
