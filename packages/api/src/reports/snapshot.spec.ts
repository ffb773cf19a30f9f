/**
 * The snapshot's canonical JSON (snapshot.ts) gives the same bytes as the
 * measure sets' `canonicalJson` (sorted keys, no white space), on a synthetic
 * report and on values with the awkward members JSON leaves out or changes.
 */
import { canonicalJson } from '../measure-sets/canonical.js';
import { canonicalSnapshotJson, encodeSnapshot, decodeSnapshot, sha256Hex } from './snapshot.js';
import { syntheticReport } from './synthetic-report.js';

describe('canonicalSnapshotJson', () => {
  it.each([
    ['a synthetic report of 40 practices', syntheticReport(40).snapshot],
    [
      'awkward members',
      {
        b: [1, undefined, null, 'x', () => 1, { z: 1, a: [] }],
        a: { undef: undefined, fn: () => 1, n: NaN, inf: -Infinity, neg: -0, s: 'é"\\\n\u2028' },
        date: new Date(0),
        'Z key': true,
        'a key': false,
        nested: [[{ y: 2, x: { q: null } }]],
      },
    ],
    ['a string', 'text'],
    ['null', null],
  ])('%s: the same bytes as canonicalJson', (_name, value) => {
    expect(canonicalSnapshotJson(value)).toBe(canonicalJson(value));
  });

  it('encodes a snapshot that decodes to itself, hashed over the canonical bytes', () => {
    const { snapshot } = syntheticReport(10);
    const encoded = encodeSnapshot(snapshot);
    expect(encoded.contentHash).toBe(sha256Hex(Buffer.from(canonicalJson(snapshot), 'utf8')));
    expect(canonicalJson(decodeSnapshot(encoded.canonical))).toBe(canonicalJson(snapshot));
  });
});
