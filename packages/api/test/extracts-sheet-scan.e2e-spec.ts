/**
 * The scan of a large sheet on a thread of its own (sheet-scan-thread.ts):
 * the same facts as the scan on the calling thread, the same refusals, and
 * the rows of a large workbook read while it runs, none handed out before.
 */
import { sniff } from '../src/submissions/files/sniff.js';
import {
  OFF_THREAD_BYTES,
  scanSheetFacts,
  scanThreadStats,
} from '../src/submissions/files/sheet-scan-thread.js';
import {
  planXlsx,
  PrescanRefusal,
  scanSheet,
  type XlsxPlan,
} from '../src/submissions/files/xlsx-prescan.js';
import { openExtract } from '../src/submissions/pipeline/process-extract.js';
import { editSheetXml } from './extracts-fixtures/zip.js';
import { goodRows, xlsxOf } from './extracts-fixtures/rows.js';

const CAP = 100 << 20;
const limits = { maxRows: 200_000, maxUncompressedBytes: CAP, maxZipEntries: 1000 };

async function planOf(bytes: Buffer): Promise<XlsxPlan> {
  const sniffed = sniff(bytes, 'extract.xlsx');
  if (sniffed.kind !== 'xlsx') throw new Error('not a workbook');
  return planXlsx(bytes, sniffed.entries, CAP);
}

/** The scan forced onto a thread however small the sheet (offThreadBytes 0). */
async function onThread(bytes: Buffer, remaining = CAP) {
  const plan = await planOf(bytes);
  return scanSheetFacts(bytes, plan.sheet, { remaining }, CAP, 0);
}

async function refusalOf(scan: Promise<unknown>): Promise<string> {
  try {
    await scan;
  } catch (error) {
    if (error instanceof PrescanRefusal) return error.refusal.code;
    throw error;
  }
  throw new Error('the scan did not refuse the workbook');
}

describe('sheet scan on a thread', () => {
  it('finds the same rows, merges and hidden rows and columns as the scan on this thread', async () => {
    const bytes = await xlsxOf(goodRows(300), undefined, {
      merges: ['C5:C7'],
      hiddenRows: [9, 12],
    });
    const hidden = editSheetXml(bytes, (xml) =>
      xml.replace('<sheetData', '<cols><col min="4" max="5" hidden="1"/></cols><sheetData'),
    );
    const before = { ...scanThreadStats };
    const plan = await planOf(hidden);
    const inline = await scanSheet(hidden, plan.sheet, { remaining: CAP }, CAP);
    const threaded = await onThread(hidden);
    expect(threaded).toEqual(inline);
    expect(threaded.valuedRows).toBe(301);
    expect(threaded.merges.map((m) => m.ref)).toEqual(['C5:C7']);
    expect(threaded.hiddenRows).toEqual([9, 12]);
    expect(threaded.hiddenColumns).toEqual([4, 5]);
    // Scanned on the thread, not on this one after the thread failed.
    expect(scanThreadStats.scans).toBe(before.scans + 1);
    expect(scanThreadStats.fallbacks).toBe(before.fallbacks);
  });

  it('refuses a sheet declaring entities, as the scan on this thread does', async () => {
    const bytes = editSheetXml(await xlsxOf(goodRows(2)), (xml) =>
      xml.replace('?>', '?><!DOCTYPE worksheet [<!ENTITY a "aaaaaaaaaa">]>'),
    );
    expect(await refusalOf(onThread(bytes))).toBe('xml_entities');
  });

  it('stops at the byte budget the other parts left', async () => {
    const bytes = await xlsxOf(goodRows(200));
    expect(await refusalOf(onThread(bytes, 10_000))).toBe('uncompressed_too_large');
  });

  it('reads a large workbook while the thread scans it, and hands out every row in order', async () => {
    const n = 15_000;
    const bytes = await xlsxOf(goodRows(n), undefined, { sharedStrings: true });
    expect((await planOf(bytes)).sheet.compressedSize).toBeGreaterThanOrEqual(OFF_THREAD_BYTES);
    const before = scanThreadStats.scans;
    const opened = await openExtract(bytes, 'extract.xlsx', limits);
    if (!('source' in opened)) throw new Error(`refused: ${opened.refusal.code}`);
    expect(scanThreadStats.scans).toBe(before + 1);
    expect(opened.source.valuedRows).toBe(n + 1);
    const numbers: number[] = [];
    for await (const batch of opened.source.batches()) for (const r of batch) numbers.push(r.row);
    expect(numbers).toEqual(Array.from({ length: n + 1 }, (_, i) => i + 1));
  }, 60_000);

  it('stops reading ahead when the scan refuses a large workbook, or the rows are not all wanted', async () => {
    const good = await xlsxOf(goodRows(15_000), undefined, { sharedStrings: true });
    const hostile = editSheetXml(good, (xml) =>
      xml.replace('?>', '?><!DOCTYPE worksheet [<!ENTITY a "a">]>'),
    );
    const refused = await openExtract(hostile, 'extract.xlsx', limits);
    expect('refusal' in refused && refused.refusal.code).toBe('xml_entities');

    const first = await openExtract(good, 'extract.xlsx', limits);
    if (!('source' in first)) throw new Error('refused');
    let seen = 0;
    for await (const batch of first.source.batches()) {
      seen += batch.length;
      if (seen >= 1000) break;
    }
    await first.source.close?.();
    const second = await openExtract(good, 'extract.xlsx', limits);
    if (!('source' in second)) throw new Error('refused');
    let rows = 0;
    for await (const batch of second.source.batches()) rows += batch.length;
    expect(rows).toBe(15_001);
  }, 60_000);
});
