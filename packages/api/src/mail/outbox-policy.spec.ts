import { backoffMs, classifyFailure, clip, messageIdFor, messageIdHost } from './outbox-policy.js';

describe('backoffMs', () => {
  const settings = { backoffBaseSeconds: 30, backoffMaxSeconds: 3600 };
  it.each([
    // attempt, random, expected ms: base × 2^(attempt − 1), capped, less up to 20 % jitter
    [1, 0, 30_000],
    [2, 0, 60_000],
    [3, 0, 120_000],
    [7, 0, 1_920_000],
    [8, 0, 3_600_000],
    [30, 0, 3_600_000],
    [1, 1, 24_000],
    [2, 0.5, 54_000],
    [0, 0, 30_000],
  ])('attempt %i, random %f → %i ms', (attempt, random, expected) => {
    expect(backoffMs(attempt, settings, () => random)).toBe(expected);
  });
});

describe('classifyFailure', () => {
  it.each([
    [
      'a refused recipient (550)',
      {
        code: 'EENVELOPE',
        responseCode: 550,
        response: '550 5.1.1 <a@b.example>: no such mailbox',
      },
      { kind: 'permanent', replyCode: 550, error: '550 5.1.1 <a@b.example>: no such mailbox' },
    ],
    [
      'a message refused as too large (552)',
      { code: 'EMESSAGE', responseCode: 552, response: '552 5.3.4 message too big' },
      { kind: 'permanent', replyCode: 552, error: '552 5.3.4 message too big' },
    ],
    [
      'a busy mailbox (452)',
      { code: 'EENVELOPE', responseCode: 452, response: '452 4.2.2 mailbox full' },
      { kind: 'transient', replyCode: 452, error: '452 4.2.2 mailbox full' },
    ],
    [
      'greylisting (451)',
      { code: 'EENVELOPE', responseCode: 451, response: '451 4.7.1 try again later' },
      { kind: 'transient', replyCode: 451, error: '451 4.7.1 try again later' },
    ],
    [
      'a refused sign-in (535): a configuration to fix, then the queue goes out',
      { code: 'EAUTH', responseCode: 535, response: '535 5.7.8 bad credentials' },
      { kind: 'transient', replyCode: 535, error: '535 5.7.8 bad credentials' },
    ],
    [
      'a server that is not there',
      { code: 'ESOCKET', message: 'connect ECONNREFUSED 127.0.0.1:2525' },
      { kind: 'transient', replyCode: null, error: 'connect ECONNREFUSED 127.0.0.1:2525' },
    ],
    [
      'a time-out',
      { code: 'ETIMEDOUT', message: 'Greeting never received' },
      { kind: 'transient', replyCode: null, error: 'Greeting never received' },
    ],
    [
      'something unknown',
      new Error('something odd'),
      { kind: 'transient', replyCode: null, error: 'something odd' },
    ],
  ])('%s', (_what, error, expected) => {
    expect(classifyFailure(error)).toEqual(expected);
  });

  it('keeps at most 1,000 characters of a reply', () => {
    const long = `550 ${'x'.repeat(2000)}`;
    const result = classifyFailure({ responseCode: 550, response: long });
    expect(result.error).toHaveLength(1000);
    expect(result.error.endsWith('…')).toBe(true);
    expect(clip('short', 10)).toBe('short');
  });
});

describe('Message-ID', () => {
  it('is derived from the row, its region and the public host', () => {
    expect(messageIdFor(42, 1, 'cairn.example.org')).toBe('<outbox-42.region-1@cairn.example.org>');
    expect(messageIdHost('https://cairn.example.org/')).toBe('cairn.example.org');
    expect(messageIdHost('http://127.0.0.1:3000')).toBe('127.0.0.1');
  });
});
