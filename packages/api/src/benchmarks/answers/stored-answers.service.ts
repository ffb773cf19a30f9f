/**
 * Finished responses of the results routes, stored by what they were built
 * from. A route names every input of its response in an answer key (the
 * stored results of the quarters it reads, the quarter and the region's
 * practices and localities as they are now, the split, locality, practice,
 * what the reader may see, ANSWER_FORMAT); the response is then
 *
 *   1. this process's bytes of that key (a bounded memo: a key's bytes never
 *      change, so any process may keep them; the row is still marked used at
 *      most once an hour, so pruning keeps what a process serves), else
 *   2. the stored row of that key (benchmark_answers: gzip of the JSON), else
 *   3. built once (concurrent requests of one key share the build), encoded
 *      (answer-encoding.ts: numbers to six significant figures, gzip),
 *      stored with INSERT IGNORE and served.
 *
 * Once served, the answer's brotli form is made off the request's path (one at
 * a time per process, answer-encoding.ts) and stored beside the gzip; readers
 * that accept brotli get it from then on. A process that finds a row without
 * it makes it too (the same bytes; the first stored is kept).
 *
 * Nothing a reader needs lives only here: another process finds the row or
 * builds the same bytes. A key is never served for other inputs: any change of
 * them (a confirm, a renamed practice, a quarter's new deadline) is another key.
 * The ETag is the key's hash, so an unchanged answer is a 304.
 */
import { createHash } from 'node:crypto';
import { promisify } from 'node:util';
import { gunzip } from 'node:zlib';
import { type BeforeApplicationShutdown, Inject, Injectable, Logger } from '@nestjs/common';
import { brotliOf, encodeAnswer } from './answer-encoding.js';
import { BenchmarkAnswersRepository, MARK_USED_MS } from './benchmark-answers.repository.js';

const gunzipAsync = promisify(gunzip);

/** Change when a stored answer's bytes would change for the same inputs (a DTO change). */
export const ANSWER_FORMAT = 4;

/** A finished response: its JSON bytes, plain, gzip and brotli once made, and its entity tag. */
export interface StoredAnswer {
  /** SHA-256 (hex) of the answer key */
  key: string;
  /** A strong entity tag made of the key, quoted */
  etag: string;
  plain: Buffer;
  gzip: Buffer;
  /** The brotli form, null until made (after the answer is first served) */
  brotli: Buffer | null;
}

/** Bytes of answers (plain + gzip) kept in memory at most. */
const MEMO_BYTES = 64 * 1024 * 1024;

@Injectable()
export class StoredAnswers implements BeforeApplicationShutdown {
  private readonly logger = new Logger('StoredAnswers');
  private readonly memo = new Map<string, StoredAnswer>();
  /** When this process last marked (or found marked, or stored) each remembered answer's row */
  private readonly markedAt = new Map<string, number>();
  /** The clock of the marks (a test moves it on) */
  clock: () => number = Date.now;
  private memoBytes = 0;
  private readonly building = new Map<string, Promise<StoredAnswer>>();
  /** Brotli forms being made or queued here, by key; made one at a time (the chain). */
  private readonly compressing = new Set<string>();
  private compressed: Promise<void> = Promise.resolve();

  constructor(
    @Inject(BenchmarkAnswersRepository) private readonly repository: BenchmarkAnswersRepository,
  ) {}

  /** The hash of an answer's inputs (each part a string; their order matters). */
  static keyOf(kind: string, parts: readonly string[]): string {
    return createHash('sha256')
      .update(JSON.stringify([kind, ANSWER_FORMAT, ...parts]))
      .digest('hex');
  }

  /** The answer of this key: remembered, stored, or built now by `build` and stored. */
  async answer(
    kind: string,
    quarterId: number,
    key: string,
    build: () => Promise<unknown>,
  ): Promise<StoredAnswer> {
    const known = this.memo.get(key);
    if (known) {
      // Most recently used last.
      this.memo.delete(key);
      this.memo.set(key, known);
      const now = this.clock();
      if (now - (this.markedAt.get(key) ?? 0) >= MARK_USED_MS) {
        // Not awaited, as when the row is read: the reader need not wait for the mark.
        this.markedAt.set(key, now);
        void this.repository.markUsed(key).catch(() => undefined);
      }
      return known;
    }
    let pending = this.building.get(key);
    if (!pending) {
      pending = this.findOrBuild(kind, quarterId, key, build).finally(() =>
        this.building.delete(key),
      );
      this.building.set(key, pending);
    }
    return pending;
  }

  private async findOrBuild(
    kind: string,
    quarterId: number,
    key: string,
    build: () => Promise<unknown>,
  ): Promise<StoredAnswer> {
    const stored = await this.repository.find(key);
    if (stored) {
      let plain: Buffer | null = null;
      try {
        plain = await gunzipAsync(stored.gzip);
      } catch {
        // Damaged bytes: built again below (the row keeps them; INSERT IGNORE).
      }
      if (plain) {
        const found = this.remember({
          key,
          etag: `"${key}"`,
          plain,
          gzip: stored.gzip,
          brotli: stored.brotli,
        });
        if (!found.brotli) this.makeBrotli(kind, quarterId, found);
        return found;
      }
    }
    // Numbers to six significant figures, then gzip (answer-encoding.ts).
    const { plain, gzip } = await encodeAnswer(await build());
    try {
      await this.repository.insert({
        answerKey: key,
        kind,
        quarterId,
        plainBytes: plain.length,
        gzip,
      });
    } catch (error) {
      // Served all the same: another process finds no row and builds the same bytes (e.g. an
      // answer larger than the server's max_allowed_packet).
      this.logger.warn(
        `the ${kind} answer of quarter ${quarterId} (${gzip.length} bytes) was not stored: ${(error as Error).message}`,
      );
    }
    const built = this.remember({ key, etag: `"${key}"`, plain, gzip, brotli: null });
    this.makeBrotli(kind, quarterId, built);
    return built;
  }

  /** Resolves when every brotli form queued so far is made and stored (or given up). */
  brotliSettled(): Promise<void> {
    return this.compressed;
  }

  async beforeApplicationShutdown(): Promise<void> {
    await this.compressed;
  }

  /**
   * Queues the answer's brotli form: made on libuv's threads after the answers queued before it,
   * stored beside the gzip and set on the remembered answer. A failure leaves the gzip only.
   */
  private makeBrotli(kind: string, quarterId: number, answer: StoredAnswer): void {
    if (this.compressing.has(answer.key)) return;
    this.compressing.add(answer.key);
    this.compressed = this.compressed.then(async () => {
      try {
        const brotli = await brotliOf(answer.plain);
        if (!brotli) return;
        await this.repository.setBrotli(answer.key, brotli);
        answer.brotli = brotli;
        if (this.memo.get(answer.key) === answer) this.memoBytes += brotli.length;
      } catch (error) {
        this.logger.warn(
          `the brotli form of a ${kind} answer of quarter ${quarterId} was not stored: ${(error as Error).message}`,
        );
      } finally {
        this.compressing.delete(answer.key);
      }
    });
  }

  private remember(answer: StoredAnswer): StoredAnswer {
    const size = (a: StoredAnswer) =>
      a.plain.length + a.gzip.length + (a.brotli?.length ?? 0) + 256;
    const old = this.memo.get(answer.key);
    if (old) this.memoBytes -= size(old);
    this.memo.delete(answer.key);
    this.memo.set(answer.key, answer);
    this.memoBytes += size(answer);
    // Read (and marked when stale) or stored just now, or already remembered: marked for now.
    if (!old) this.markedAt.set(answer.key, this.clock());
    for (const [oldest, entry] of this.memo) {
      if (this.memoBytes <= MEMO_BYTES || oldest === answer.key) break;
      this.memo.delete(oldest);
      this.markedAt.delete(oldest);
      this.memoBytes -= size(entry);
    }
    return answer;
  }
}
