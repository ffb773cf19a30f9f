import { createHmac } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { discloseCount, discloseRate, protectGroup } from './disclosure-control.js';
import { createPseudonymiser, pseudonymMessage, recordPseudonym } from './pseudonym.js';
import { hmacSha256, sha256, toHex } from './sha256.js';
import { utf8Bytes } from './utf8.js';

const bytes = (hex: string): Uint8Array =>
  Uint8Array.from(hex.match(/../g) ?? [], (h) => parseInt(h, 16));

describe('sha256 (FIPS 180-4)', () => {
  // Examples of the Secure Hash Standard (NIST, FIPS 180-2/180-4 appendix).
  it.each([
    ['', 'e3b0c44298fc1c149afbf4c8996fb92427ae41e4649b934ca495991b7852b855'],
    ['abc', 'ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad'],
    [
      'abcdbcdecdefdefgefghfghighijhijkijkljklmklmnlmnomnopnopq',
      '248d6a61d20638b8e5c026930c3e6039a33ce45964ff2167f6ecedd419db06c1',
    ],
  ])('hashes %j', (text, digest) => {
    expect(toHex(sha256(utf8Bytes(text)))).toBe(digest);
  });
});

describe('hmacSha256 (RFC 2104; test vectors of RFC 4231)', () => {
  it('RFC 4231 test case 1', () => {
    const mac = hmacSha256(bytes('0b'.repeat(20)), utf8Bytes('Hi There'));
    expect(toHex(mac)).toBe('b0344c61d8db38535ca8afceaf0bf12b881dc200c9833da726e9376c2e32cff7');
  });

  it('RFC 4231 test case 2', () => {
    const mac = hmacSha256(utf8Bytes('Jefe'), utf8Bytes('what do ya want for nothing?'));
    expect(toHex(mac)).toBe('5bdcc146bf60754e6a042426089575c75a003f089d2739839dec58b964ec3843');
  });

  it('RFC 4231 test case 6 (key longer than the block)', () => {
    const mac = hmacSha256(
      bytes('aa'.repeat(131)),
      utf8Bytes('Test Using Larger Than Block-Size Key - Hash Key First'),
    );
    expect(toHex(mac)).toBe('60e431591ee0b67f0d8a26aacbf5b77f8e0bc6213728c5140546040f0ee37f54');
  });

  it('agrees with node:crypto on varied keys and messages, including non-ASCII text', () => {
    for (const [key, message] of [
      ['k', ''],
      ['région secrète', 'P00001\u001fABC-123'],
      ['x'.repeat(64), 'y'.repeat(1000)],
      ['🔑', 'ünïcødé 数据'],
    ] as const) {
      const expected = createHmac('sha256', key).update(message, 'utf8').digest('hex');
      expect(toHex(hmacSha256(utf8Bytes(key), utf8Bytes(message)))).toBe(expected);
    }
  });
});

describe('record pseudonyms (methods §9)', () => {
  it('are the first 12 hex characters of HMAC-SHA256(secret, practice ‖ U+001F ‖ record)', () => {
    const expected = createHmac('sha256', 'a region secret of enough length')
      .update(pseudonymMessage('P00001', 'R-42'), 'utf8')
      .digest('hex')
      .slice(0, 12);
    expect(recordPseudonym('a region secret of enough length', 'P00001', 'R-42')).toBe(expected);
    expect(createPseudonymiser('a region secret of enough length')('P00001', 'R-42')).toBe(
      expected,
    );
  });

  it('keep practice and record apart and differ by secret', () => {
    expect(recordPseudonym('s', 'AB', '1C')).not.toBe(recordPseudonym('s', 'A', 'B1C'));
    expect(recordPseudonym('s1', 'A', 'B')).not.toBe(recordPseudonym('s2', 'A', 'B'));
    expect(() => recordPseudonym('', 'A', 'B')).toThrow(/secret/);
  });
});

describe('disclosure control (methods §9; common practice in official statistics)', () => {
  it('shows counts 1–4 as "< 5" and keeps 0 and 5+', () => {
    expect(discloseCount(0)).toEqual({ value: 0, display: '0', suppression: 'none' });
    expect(discloseCount(3)).toEqual({ value: null, display: '< 5', suppression: 'primary' });
    expect(discloseCount(5).display).toBe('5');
    expect(discloseCount(9, { minCount: 10 }).display).toBe('< 10');
  });

  it('withholds rates with a denominator under 10', () => {
    expect(discloseRate(3, 9)).toBeNull();
    expect(discloseRate(3, 10)).toBeCloseTo(0.3, 15);
    expect(discloseRate(0, 0)).toBeNull();
    expect(() => discloseRate(5, 4)).toThrow(/events/);
  });

  it('suppresses a second cell so that the total does not reveal the first', () => {
    const { cells, total } = protectGroup([3, 20, 12, 40]);
    expect(cells.map((c) => c.suppression)).toEqual(['primary', 'none', 'secondary', 'none']);
    expect(total.display).toBe('75');
  });

  it('adds cells until the suppressed ones sum to at least 5', () => {
    const { cells } = protectGroup([1, 1, 6, 30]);
    expect(cells.map((c) => c.suppression)).toEqual(['primary', 'primary', 'secondary', 'none']);
  });

  it('withholds the total when no further cell can protect a suppressed one', () => {
    const { cells, total } = protectGroup([2, 0, 0]);
    expect(cells[0]?.suppression).toBe('primary');
    expect(total.suppression).not.toBe('none');
    expect(protectGroup([10, 20]).cells.every((c) => c.suppression === 'none')).toBe(true);
    expect(protectGroup([2, 20], { totalShown: false }).cells[1]?.suppression).toBe('none');
  });
});
