import { screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { renderApp, stubFetch } from '../../../test/render';
import { about } from '../../../test/signed-in';

const lead = {
  id: 1,
  email: 'imogen@x.example',
  displayName: 'Imogen Varley',
  role: 'regional_lead',
  regionName: 'Ostrevale',
  practices: [],
};
const source = {
  kind: 'quarter_opened',
  sourceId: 9,
  label: '2027 Q1 opening message',
  firstQueuedAt: '2026-12-04T10:00:00.000Z',
  lastActivityAt: '2026-12-04T10:00:05.000Z',
  practices: 30,
  practicesWithoutRecipients: 28,
  counts: { queued: 0, sending: 0, sent: 3, failed: 1, total: 4 },
  actions: { resendFailed: true },
};
const message = (over: object) => ({
  id: 1,
  practice: { id: 9, code: 'OV201', name: 'Cindermere Lakeside Surgery' },
  recipient: 'nobody@refused.example',
  recipientName: null,
  state: 'failed',
  attempts: 1,
  resumed: 0,
  queuedAt: '2026-12-04T10:00:00.000Z',
  nextAttemptAt: null,
  lastAttemptAt: '2026-12-04T10:00:01.000Z',
  sentAt: null,
  failedAt: '2026-12-04T10:00:01.000Z',
  lastError: '550 5.1.1 <nobody@refused.example>: no such mailbox',
  lastReplyCode: 550,
  messageId: '<outbox-1.region-1@127.0.0.1>',
  actions: { resend: true },
  ...over,
});
const detail = {
  source,
  messages: [
    message({}),
    message({
      id: 2,
      practice: { id: 2, code: 'OV102', name: 'Quarrybank Surgery' },
      recipient: 'priya.calloway@quarrybank.example',
      recipientName: 'Priya Calloway',
      state: 'sent',
      sentAt: '2026-12-04T10:00:01.000Z',
      failedAt: null,
      lastError: null,
      lastReplyCode: null,
      actions: { resend: false },
    }),
  ],
  practicesWithoutRecipients: [{ id: 1, code: 'OV101', name: 'Wrenfield Health Centre' }],
};

afterEach(() => vi.unstubAllGlobals());

describe('mail deliveries', () => {
  it('lists each source with its counts by state, in words and icons', async () => {
    stubFetch({
      '/api/about': { body: about },
      '/api/session': { body: { user: lead, csrfToken: 't' } },
      '/api/mail/deliveries': { body: { sources: [source] } },
    });
    renderApp('/deliveries');
    const link = await screen.findByRole('link', { name: '2027 Q1 opening message' });
    expect(link.getAttribute('href')).toBe('/deliveries/quarter_opened/9');
    expect(screen.getByText('Sent 3')).toBeTruthy();
    expect(screen.getByText('Failed 1')).toBeTruthy();
    expect(screen.getByText(/28 with nobody to write to/)).toBeTruthy();
    expect(document.title).toBe('Mail deliveries · Cairn');
  });

  it('shows a failure with the server’s reply and sends the failed again', async () => {
    const fetchMock = stubFetch({
      '/api/about': { body: about },
      '/api/session': { body: { user: lead, csrfToken: 't' } },
      '/api/mail/deliveries/quarter_opened/9': { body: detail },
      '/api/mail/deliveries/quarter_opened/9/resend': { body: { resent: 1, delivery: detail } },
    });
    renderApp('/deliveries/quarter_opened/9');
    expect(
      await screen.findByText('550 5.1.1 <nobody@refused.example>: no such mailbox'),
    ).toBeTruthy();
    const rows = screen.getAllByRole('row');
    expect(within(rows[1]!).getByText('Failed')).toBeTruthy();
    expect(within(rows[2]!).getByText('Sent')).toBeTruthy();
    expect(within(rows[2]!).queryByRole('button')).toBeNull();
    expect(screen.getByText(/1 practices had nobody to write to/)).toBeTruthy();
    await userEvent.click(screen.getByRole('button', { name: 'Send the 1 failed again' }));
    expect(await screen.findByText(/1 message queued again/)).toBeTruthy();
    const calls = fetchMock.mock.calls as unknown as [string, RequestInit | undefined][];
    const post = calls.find(([url, init]) => url.endsWith('/resend') && init?.method === 'POST');
    expect(post).toBeTruthy();
  });
});
