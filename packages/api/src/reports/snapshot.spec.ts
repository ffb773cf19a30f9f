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

  it('reads a composite frozen with its parts named by key in their labels, the bytes unchanged', () => {
    const { snapshot } = syntheticReport(4);
    const last = snapshot.region.splits[0]!.measures.at(-1)! as unknown as Record<string, unknown>;
    Object.assign(last, {
      composite: true,
      components: ['measure_1', 'measure_2'],
      source: 'Cairn composite of measure_1 and measure_2 (not measure_10)',
      note: 'measure_2 first',
    });
    const encoded = encodeSnapshot(snapshot);
    const canonical = canonicalBytes(encoded.stored, encoded.contentHash);
    expect(sha256Hex(canonical)).toBe(encoded.contentHash);
    const read = decodeSnapshot(canonical);
    const copies = [
      read.region.splits[0]!.measures.at(-1)!,
      read.region.funnels.at(-1)!.measure,
      read.region.trends.at(-1)!.measure,
    ] as unknown as { source: string; note: string }[];
    for (const m of copies) {
      expect(m.source).toBe(
        'Cairn composite of “Synthetic measure 1” and “Synthetic measure 2” (not measure_10)',
      );
      expect(m.note).toBe('“Synthetic measure 2” first');
    }
    // Measures that combine nothing read as stored.
    expect(read.region.splits[0]!.measures[0]!.source).toBe('Invented for the benchmark');
  });
});
