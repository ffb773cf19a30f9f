/**
 * A report's snapshot (snapshot.ts) is stored as gzip of canonical JSON and
 * identified by the SHA-256 of the canonical bytes; it decodes to itself.
 */
import { gunzipSync } from 'node:zlib';
import { canonicalJson } from '../measure-sets/canonical.js';
import { canonicalBytes, decodeSnapshot, encodeSnapshot, sha256Hex } from './snapshot.js';
import { syntheticReport } from './synthetic-report.js';

describe('report snapshots', () => {
  it('encodes a snapshot that decodes to itself, hashed over the canonical bytes', () => {
    const { snapshot } = syntheticReport(10);
    const encoded = encodeSnapshot(snapshot);
    expect(encoded.canonical.toString('utf8')).toBe(canonicalJson(snapshot));
    expect(encoded.contentHash).toBe(sha256Hex(encoded.canonical));
    expect(gunzipSync(encoded.stored).equals(encoded.canonical)).toBe(true);
    expect(canonicalJson(decodeSnapshot(encoded.canonical))).toBe(canonicalJson(snapshot));
  });

  it('refuses stored bytes that do not match the published hash', () => {
    const encoded = encodeSnapshot(syntheticReport(3).snapshot);
    expect(canonicalBytes(encoded.stored, encoded.contentHash).equals(encoded.canonical)).toBe(
      true,
    );
    expect(() => canonicalBytes(encoded.stored, 'f'.repeat(64))).toThrow(
      /does not match its content hash/,
    );
  });
});
