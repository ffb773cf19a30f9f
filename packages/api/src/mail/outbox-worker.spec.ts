/**
 * One message's attempt (OutboxWorker.deliver) without a database or a mail
 * server: what is recorded after the server's answer, and that a message the
 * server accepted is never queued to be sent again because recording the 250
 * failed (a deadlock between a claim and the update of a sent row).
 */
import { jest } from '@jest/globals';
import { Logger } from '@nestjs/common';
import type { OutboxMessageRow } from './outbox.repository.js';
import { OutboxWorker } from './outbox-worker.service.js';

const ROW = {
  id: 196,
  kind: 'test_kind',
  recipient_address: 'reader@practice.example',
  recipient_name: null,
  message_id: '<outbox-196.region-1@cairn.example>',
  attempts: 1,
  resumed: 0,
  state: 'sending',
} as unknown as OutboxMessageRow;

const deadlock = () =>
  Object.assign(new Error('Deadlock found when trying to get lock; try restarting transaction'), {
    code: 'ER_LOCK_DEADLOCK',
    errno: 1213,
  });

function worker(options: { send: () => Promise<unknown>; markSent: () => Promise<boolean> }) {
  const outbox = {
    markSent: jest.fn(options.markSent),
    markRetry: jest.fn(async () => true),
    markFailed: jest.fn(async () => true),
  };
  const transport = { send: jest.fn(options.send) };
  const composers = {
    get: () => ({ compose: async () => ({ subject: 'S', html: '<p>H</p>', text: 'T' }) }),
  };
  const settings = {
    mail: {
      from: 'Cairn <no-reply@cairn.invalid>',
      outbox: { maxAttempts: 10, backoffBaseSeconds: 0.2, backoffMaxSeconds: 1 },
    },
    server: { publicUrl: 'http://cairn.example' },
  };
  const config = { get: (key: keyof typeof settings) => settings[key] };
  const w = new OutboxWorker(
    outbox as never,
    transport as never,
    composers as never,
    config as never,
  );
  const deliver = (row: OutboxMessageRow) =>
    (w as unknown as { deliver(r: OutboxMessageRow): Promise<void> }).deliver(row);
  return { outbox, transport, deliver };
}

const accepted = async () => ({
  response: '250 OK',
  accepted: [ROW.recipient_address],
  rejected: [],
});

describe('an outbox message’s attempt', () => {
  beforeAll(() => Logger.overrideLogger(false));
  afterAll(() => Logger.overrideLogger(['log', 'error', 'warn', 'debug', 'verbose']));

  it('records the 250 as sent', async () => {
    const w = worker({ send: accepted, markSent: async () => true });
    await w.deliver(ROW);
    expect(w.outbox.markSent).toHaveBeenCalledTimes(1);
    expect(w.outbox.markRetry).not.toHaveBeenCalled();
  });

  it('records the 250 again after a deadlock, and never queues the accepted message again', async () => {
    let calls = 0;
    const w = worker({
      send: accepted,
      markSent: async () => {
        calls++;
        if (calls < 3) throw deadlock();
        return true;
      },
    });
    await w.deliver(ROW);
    expect(w.transport.send).toHaveBeenCalledTimes(1);
    expect(w.outbox.markSent).toHaveBeenCalledTimes(3);
    expect(w.outbox.markRetry).not.toHaveBeenCalled();
    expect(w.outbox.markFailed).not.toHaveBeenCalled();
  });

  it('leaves the row sending (resent after its lease, counted) when the 250 cannot be recorded', async () => {
    const w = worker({
      send: accepted,
      markSent: async () => {
        throw deadlock();
      },
    });
    await w.deliver(ROW);
    expect(w.outbox.markSent.mock.calls.length).toBeGreaterThan(1);
    expect(w.outbox.markRetry).not.toHaveBeenCalled();
    expect(w.outbox.markFailed).not.toHaveBeenCalled();
  }, 20_000);

  it('queues the message again when the server did not answer', async () => {
    const w = worker({
      send: async () => {
        throw Object.assign(new Error('Connection closed unexpectedly'), { code: 'ECONNECTION' });
      },
      markSent: async () => true,
    });
    await w.deliver(ROW);
    expect(w.outbox.markSent).not.toHaveBeenCalled();
    expect(w.outbox.markRetry).toHaveBeenCalledTimes(1);
  });
});
