/**
 * A sheet scan thread (sheet-scan-thread.ts): scans each worksheet part it is sent, one at a
 * time, and answers with the sheet's facts, the refusal, or what went wrong.
 */
import { parentPort } from 'node:worker_threads';
import type { ScanReply, ScanRequest } from './sheet-scan-thread.js';
import { PrescanRefusal, scanSheet } from './xlsx-prescan.js';
import type { ZipEntry } from './zip.js';

const port = parentPort!;

port.on('message', (request: ScanRequest) => {
  const buf = Buffer.from(request.data.buffer, request.data.byteOffset, request.data.byteLength);
  const sheet: ZipEntry = {
    name: request.name,
    method: request.method,
    encrypted: false,
    compressedSize: buf.length,
    uncompressedSize: 0,
    localOffset: 0,
    dataStart: 0,
    end: buf.length,
  };
  scanSheet(buf, sheet, { remaining: request.remaining }, request.capBytes).then(
    (facts) => port.postMessage({ facts } satisfies ScanReply),
    (error: unknown) =>
      port.postMessage(
        (error instanceof PrescanRefusal
          ? { refusal: error.refusal }
          : { error: error instanceof Error ? error.message : String(error) }) satisfies ScanReply,
      ),
  );
});
