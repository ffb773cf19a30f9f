import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Mailbox, refuseAtRefusedDomain } from './smtp-capture.js';

const message = (id: string, subject: string) =>
  Buffer.from(
    [
      'From: Cairn <no-reply@cairn.invalid>',
      'To: lead@practice.example',
      `Subject: ${subject}`,
      `Message-ID: ${id}`,
      'Date: Fri, 04 Dec 2026 10:00:00 +0000',
      'Content-Type: text/plain; charset=utf-8',
      '',
      'Hello',
      '',
    ].join('\r\n'),
  );

describe('the capture mailbox', () => {
  it('counts a repeated Message-ID as a repeat of the first message, never as a second', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'cairn-mailbox-'));
    const mailbox = new Mailbox(dir);
    // Arriving together: the parse is asynchronous, the decision is not.
    await Promise.all([
      mailbox.store(message('<outbox-1.region-1@cairn.test>', 'first')),
      mailbox.store(message('<outbox-1.region-1@cairn.test>', 'first')),
      mailbox.store(message('<outbox-2.region-1@cairn.test>', 'second')),
    ]);
    await mailbox.store(message('<outbox-1.region-1@cairn.test>', 'first'));
    expect(mailbox.stats()).toEqual({ messages: 2, repeats: 2 });
    const first = mailbox.list().find((m) => m.messageId === '<outbox-1.region-1@cairn.test>')!;
    expect(first.repeats).toBe(2);
    expect(first.repeatedAt).toHaveLength(2);
    // A mailbox opened on the same folder (a restarted capture) still knows the ids.
    const reopened = new Mailbox(dir);
    await reopened.store(message('<outbox-2.region-1@cairn.test>', 'second'));
    expect(reopened.stats()).toEqual({ messages: 2, repeats: 3 });
  });

  it('refuses addresses at refused.example only', () => {
    expect(refuseAtRefusedDomain('nobody@refused.example')).toMatchObject({ code: 550 });
    expect(refuseAtRefusedDomain('lead@practice.example')).toBeNull();
  });
});
