/**
 * A report's downloads are the same bytes whenever and wherever they are
 * made: the workbook's dates and every zip entry's date come from the report's
 * publication time, the PDF's dates and file identifier from its information
 * dictionary. Made twice with the clock at two different times (as two API
 * processes, or one before and after a restart, would) and compared as bytes.
 */
import { PassThrough } from 'node:stream';
import { jest } from '@jest/globals';
import { packSheets } from './pack.js';
import { writePack } from './pack-writer.js';
import { writeReportPdf } from './pdf.js';
import { syntheticReport } from './synthetic-report.js';

async function bytesOf(write: (stream: PassThrough) => Promise<void>): Promise<Buffer> {
  const stream = new PassThrough();
  const chunks: Buffer[] = [];
  stream.on('data', (c: Buffer) => chunks.push(c));
  const ended = new Promise((resolve) => stream.on('end', resolve));
  await write(stream);
  stream.end();
  await ended;
  return Buffer.concat(chunks);
}

const ONLY_DATE = [
  'hrtime',
  'nextTick',
  'performance',
  'queueMicrotask',
  'requestAnimationFrame',
  'cancelAnimationFrame',
  'requestIdleCallback',
  'cancelIdleCallback',
  'setImmediate',
  'clearImmediate',
  'setInterval',
  'clearInterval',
  'setTimeout',
  'clearTimeout',
] as const;

async function at<T>(iso: string, make: () => Promise<T>): Promise<T> {
  jest.useFakeTimers({ now: new Date(iso), doNotFake: [...ONLY_DATE] });
  try {
    return await make();
  } finally {
    jest.useRealTimers();
  }
}

describe('report downloads', () => {
  const { row, snapshot } = syntheticReport(25);
  const pack = () =>
    bytesOf((stream) =>
      writePack(
        packSheets(row, snapshot, { kind: 'region' }),
        { title: 'pack', subject: 'hash', created: new Date(snapshot.identity.publishedAt) },
        stream,
      ),
    );

  it('writes the same data pack bytes at any time', async () => {
    const a = await at('2026-12-04T09:15:00Z', pack);
    const b = await at('2027-05-17T08:31:07Z', pack);
    expect(a.length).toBeGreaterThan(1000);
    expect(a.subarray(0, 2).toString()).toBe('PK');
    expect(b.equals(a)).toBe(true);
  });

  it('writes the same PDF bytes at any time', async () => {
    const pdf = () =>
      bytesOf((stream) => writeReportPdf(row, snapshot, { kind: 'region' }, stream));
    const a = await at('2026-12-04T09:15:00Z', pdf);
    const b = await at('2027-05-17T08:31:07Z', pdf);
    expect(a.subarray(0, 5).toString()).toBe('%PDF-');
    expect(b.equals(a)).toBe(true);
  });
});
