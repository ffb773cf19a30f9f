import { hmacSha256, toHex } from './sha256.js';
import { utf8Bytes } from './utf8.js';

/**
 * Record pseudonym shown to users outside the practice: the first 12 hexadecimal characters of
 * HMAC-SHA256 (RFC 2104) under the region secret of the message
 * UTF-8(practiceCode ‖ U+001F ‖ recordKey) — the unit separator keeps ("AB", "1C") and
 * ("A", "B1C") apart. Callers that hash with another HMAC implementation (e.g. node:crypto) must
 * hash exactly `pseudonymMessage(…)` with the UTF-8 bytes of the secret, and take the first 12
 * hex characters, to get the same pseudonyms.
 */
export const PSEUDONYM_LENGTH = 12;

export function pseudonymMessage(practiceCode: string, recordKey: string): string {
  return `${practiceCode}\u001f${recordKey}`;
}

export function recordPseudonym(secret: string, practiceCode: string, recordKey: string): string {
  if (typeof secret !== 'string' || secret.length === 0) {
    throw new RangeError('secret must be a non-empty string');
  }
  if (typeof practiceCode !== 'string' || typeof recordKey !== 'string') {
    throw new RangeError('practiceCode and recordKey must be strings');
  }
  const mac = hmacSha256(utf8Bytes(secret), utf8Bytes(pseudonymMessage(practiceCode, recordKey)));
  return toHex(mac).slice(0, PSEUDONYM_LENGTH);
}

/** A reusable pseudonymiser: the key's inner and outer pads are the same for every record. */
export function createPseudonymiser(
  secret: string,
): (practiceCode: string, recordKey: string) => string {
  if (typeof secret !== 'string' || secret.length === 0) {
    throw new RangeError('secret must be a non-empty string');
  }
  const key = utf8Bytes(secret);
  return (practiceCode, recordKey) =>
    toHex(hmacSha256(key, utf8Bytes(pseudonymMessage(practiceCode, recordKey)))).slice(
      0,
      PSEUDONYM_LENGTH,
    );
}
