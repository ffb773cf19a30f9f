/**
 * The scan of a large worksheet (xlsx-prescan.ts, scanSheet) on a thread of its own, while
 * exceljs starts reading the same sheet on the API's thread (xlsx-source.ts). Expanding and
 * searching a hundred megabytes of sheet XML is work the reading thread would otherwise do
 * before its first row; here it costs that thread one copy of the compressed part.
 *
 * Threads are kept for the next workbook (a few at most, each ended after a while unused) and
 * never keep the process alive. A sheet whose part is small is scanned on the calling thread:
 * a thread's first start costs more than such a scan. Should a thread fail to start or stop
 * for any reason but the workbook, the sheet is scanned on the calling thread instead.
 */
import type { Refusal } from '../format/issue-codes.js';
import { ThreadPool } from './threads.js';
import { PrescanRefusal, scanSheet, type SheetFacts } from './xlsx-prescan.js';
import type { InflateBudget, ZipEntry } from './zip.js';

/** Sheets whose compressed part is smaller than this (about 7,000 extract rows) stay inline. */
export const OFF_THREAD_BYTES = 1 << 20;

/** What the API's thread sends: the sheet's compressed bytes alone, and its budget. */
export interface ScanRequest {
  data: Uint8Array;
  name: string;
  method: number;
  remaining: number;
  capBytes: number;
}

export type ScanReply = { facts: SheetFacts } | { refusal: Refusal } | { error: string };

const pool = new ThreadPool(import.meta.url, 'sheet-scan-worker');
/** Scans done on a thread, for the tests */
export const scanThreadStats = { scans: 0, fallbacks: 0 };

/** Not the workbook's fault: the thread could not do the work. */
export class ThreadFailure extends Error {}

function onThread(request: ScanRequest): Promise<SheetFacts> {
  const worker = pool.take();
  return new Promise<SheetFacts>((resolve, reject) => {
    const done = () => {
      worker.off('message', onMessage);
      worker.off('error', onError);
      worker.off('exit', onExit);
    };
    const onMessage = (reply: ScanReply) => {
      done();
      pool.park(worker);
      if ('facts' in reply) resolve(reply.facts);
      else if ('refusal' in reply) reject(new PrescanRefusal(reply.refusal));
      else reject(new ThreadFailure(reply.error));
    };
    const onError = (error: Error) => {
      done();
      void worker.terminate();
      reject(new ThreadFailure(error.message));
    };
    const onExit = (code: number) => {
      done();
      reject(new ThreadFailure(`the sheet scan thread stopped with code ${code}`));
    };
    worker.on('message', onMessage);
    worker.once('error', onError);
    worker.once('exit', onExit);
    worker.postMessage(request, [request.data.buffer as ArrayBuffer]);
  });
}

/**
 * The chosen sheet's facts: scanned on a thread when its part is large, else here. Rejects with
 * PrescanRefusal exactly as scanSheet does.
 */
export async function scanSheetFacts(
  buf: Buffer,
  sheet: ZipEntry,
  budget: InflateBudget,
  capBytes: number,
  offThreadBytes = OFF_THREAD_BYTES,
): Promise<SheetFacts> {
  if (sheet.compressedSize < offThreadBytes || sheet.encrypted || sheet.method !== 8)
    return scanSheet(buf, sheet, budget, capBytes);
  // A copy of the compressed part alone, handed over to the thread.
  const data = new Uint8Array(sheet.compressedSize);
  data.set(buf.subarray(sheet.dataStart, sheet.dataStart + sheet.compressedSize));
  try {
    const facts = await onThread({
      data,
      name: sheet.name,
      method: sheet.method,
      remaining: budget.remaining,
      capBytes,
    });
    scanThreadStats.scans++;
    return facts;
  } catch (error) {
    if (!(error instanceof ThreadFailure)) throw error;
    scanThreadStats.fallbacks++;
    return scanSheet(buf, sheet, budget, capBytes);
  }
}
