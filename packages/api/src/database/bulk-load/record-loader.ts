/**
 * Stages validated records into care_records as the extract is read:
 * `LOAD DATA LOCAL INFILE` statements of ROWS_PER_STATEMENT rows inside one
 * transaction, fed by streams the pipeline writes to (so parsing in Node and
 * inserting in MariaDB run at the same time). `finish()` commits; `abort()` rolls back, so a refused,
 * cancelled or crashed read leaves nothing behind (a killed process's open
 * transaction is rolled back by the server).
 *
 * Staged rows are invisible to readers until confirm switches
 * practice_quarters.current_submission_id to their submission.
 */
import { createHash } from 'node:crypto';
import { PassThrough, Readable } from 'node:stream';
import type { Sequelize } from 'sequelize';
import { acquireRaw, type RawConnection, type RawResult, releaseRaw } from './raw-connection.js';
import { COL, RECORD_COLUMNS, type RecordRow } from './record-columns.js';
import { TsvEncoder } from './tsv-encoder.js';

/**
 * The HMAC-SHA256 key pads (RFC 2104) of the pseudonym secret. MariaDB computes each staged
 * record's pseudonym from them while loading, as
 *   SHA2((K ⊕ opad) ‖ SHA2((K ⊕ ipad) ‖ practice code ‖ U+001F ‖ record_ref)),
 * first 12 hex characters: the same value as recordPseudonym in @cairn/metrics (docs/methods.md §9),
 * computed where there is spare CPU (a test checks that the two agree).
 */
export function hmacPads(secret: string): { ipad: string; opad: string } {
  let key = Buffer.from(secret, 'utf8');
  if (key.length > 64) key = createHash('sha256').update(key).digest();
  const ipad = Buffer.alloc(64, 0x36);
  const opad = Buffer.alloc(64, 0x5c);
  for (let i = 0; i < key.length; i++) {
    ipad[i] = key[i]! ^ 0x36;
    opad[i] = key[i]! ^ 0x5c;
  }
  return { ipad: ipad.toString('hex'), opad: opad.toString('hex') };
}

const STAGED_COLUMNS = RECORD_COLUMNS.filter((c) => c !== 'pseudonym');

/** Loads staged records, computing each pseudonym from the session's key pads. */
export const LOAD_STAGED_SQL =
  "LOAD DATA LOCAL INFILE 'cairn-records' INTO TABLE care_records CHARACTER SET utf8mb4 " +
  "FIELDS TERMINATED BY '\\t' ESCAPED BY '\\\\' LINES TERMINATED BY '\\n' " +
  `(${STAGED_COLUMNS.join(', ')}) ` +
  'SET pseudonym = LEFT(SHA2(CONCAT(@cairn_opad, UNHEX(SHA2(CONCAT(@cairn_ipad, @cairn_practice, 0x1f, record_ref), 256))), 256), 12)';

/** Loads complete rows as they are (every column given): the benchmark's reference. */
export const LOAD_RECORDS_SQL =
  "LOAD DATA LOCAL INFILE 'cairn-records' INTO TABLE care_records CHARACTER SET utf8mb4 " +
  "FIELDS TERMINATED BY '\\t' ESCAPED BY '\\\\' LINES TERMINATED BY '\\n' " +
  `(${RECORD_COLUMNS.join(', ')})`;

/**
 * Rows per LOAD DATA statement. The connector sends a LOCAL INFILE stream only when its 16 MB
 * packet buffer is full or the stream ends, so one statement for a whole file would reach
 * MariaDB only after the last row was read. Statements of a few thousand rows (about 1 MB)
 * reach it as the file is read, so MariaDB stores one slice while the next is being checked.
 */
export const ROWS_PER_STATEMENT = 5000;
/** Statements sent but not yet answered before the reader waits for MariaDB. */
const STATEMENTS_AHEAD = 2;

export class RecordLoader {
  private written = 0;
  private staged = 0;
  private current: PassThrough | null = null;
  private currentRows = 0;
  /** The current statement's rows as LOAD DATA text, in buffers handed to its stream */
  private readonly encoder = new TsvEncoder((chunk) => this.current!.write(chunk));
  private readonly inflight: Promise<void>[] = [];
  /** Statements not yet answered, and whether MariaDB has asked for their rows yet */
  private readonly streams = new Map<
    PassThrough,
    { requested: boolean; ended: boolean; stopped: boolean }
  >();
  private failure: Error | null = null;
  private aborting = false;
  private closed = false;

  private constructor(
    private readonly sequelize: Sequelize,
    private readonly connection: RawConnection,
  ) {}

  static async open(
    sequelize: Sequelize,
    pseudonym: { practiceCode: string; secret: string },
  ): Promise<RecordLoader> {
    const connection = await acquireRaw(sequelize);
    const loader = new RecordLoader(sequelize, connection);
    try {
      const pads = hmacPads(pseudonym.secret);
      // foreign_key_checks = 0 for this session while it stages: every staged row belongs to the
      // submission this process holds the lease of, and the check would take a shared lock on
      // that submission's row until commit, blocking the lease renewals and progress updates
      // other connections make to it. Restored before the connection goes back to the pool.
      await connection.query(
        'SET @cairn_ipad = UNHEX(?), @cairn_opad = UNHEX(?), @cairn_practice = ?, foreign_key_checks = 0',
        [pads.ipad, pads.opad, pseudonym.practiceCode],
      );
      await connection.beginTransaction();
    } catch (error) {
      await releaseRaw(sequelize, connection);
      throw error;
    }
    return loader;
  }

  get count(): number {
    return this.written;
  }

  /** Starts the next LOAD DATA statement; the connector queues it behind those still running. */
  private startStatement(): void {
    const stream = new PassThrough({ highWaterMark: 4 << 20 });
    // The connector listens to a stream only once MariaDB asks for its statement's rows; until
    // then a stream destroyed by stopStatements() would raise an 'error' event nobody hears, which ends
    // the process. Failures reach the loader through the statement's own result instead.
    stream.on('error', () => undefined);
    const state = { requested: false, ended: false, stopped: false };
    // Once its rows have all gone, a statement only waits for MariaDB's answer: nothing to stop.
    stream.once('end', () => (state.ended = true));
    this.streams.set(stream, state);
    const done = this.connection
      .query<RawResult>({
        sql: LOAD_STAGED_SQL,
        infileStreamFactory: () => {
          state.requested = true;
          // A statement stopped before MariaDB reached it loads nothing (and is rolled back).
          return state.stopped ? Readable.from([]) : stream;
        },
      })
      .then(
        (result) => {
          this.staged += result.affectedRows;
          this.streams.delete(stream);
        },
        (error: Error) => {
          this.failure ??= error;
          this.streams.delete(stream);
          this.stopStatements();
          throw error;
        },
      );
    // Keep an early failure from being an unhandled rejection; it is rethrown by write/finish.
    done.catch(() => undefined);
    this.inflight.push(done);
    this.current = stream;
    this.currentRows = 0;
  }

  /**
   * Stops every statement not yet answered. One MariaDB is reading ends with an error (the
   * connector then tells MariaDB the rows are over, and the statement fails); one still waiting
   * for its turn gets no rows when MariaDB reaches it. A stream the connector was never given
   * must not simply be destroyed: MariaDB would wait for its rows, and the connection with it.
   */
  private stopStatements(): void {
    for (const [stream, state] of this.streams) {
      if (state.stopped || state.ended) continue;
      state.stopped = true;
      if (state.requested) stream.destroy(new Error('staging stopped'));
      else stream.destroy();
    }
    this.current = null;
    this.encoder.discard();
  }

  private endStatement(): void {
    if (this.current) this.encoder.flush();
    this.current?.end();
    this.current = null;
  }

  async write(rows: RecordRow[]): Promise<void> {
    if (this.failure) throw this.failure;
    if (this.closed || this.aborting) throw new Error('the record loader was stopped');
    for (const row of rows) {
      if (this.current === null) this.startStatement();
      this.encoder.line(row, COL.pseudonym);
      if (++this.currentRows >= ROWS_PER_STATEMENT) this.endStatement();
    }
    this.written += rows.length;
    // Memory stays bounded: wait for MariaDB when it is more than a couple of slices behind.
    while (this.inflight.length > STATEMENTS_AHEAD + 1) {
      await this.inflight.shift();
    }
    if (this.failure) throw this.failure;
  }

  /** Ends the last statement, waits for MariaDB, checks the count and commits. Returns the rows staged. */
  async finish(): Promise<number> {
    this.endStatement();
    try {
      while (this.inflight.length > 0) await this.inflight.shift();
      if (this.staged !== this.written) {
        throw new Error(`staged ${this.staged} of ${this.written} records`);
      }
      await this.connection.commit();
      return this.staged;
    } catch (error) {
      await this.connection.rollback().catch(() => undefined);
      throw error;
    } finally {
      await this.release();
    }
  }

  /** Stops the statements and rolls their rows back. */
  async abort(): Promise<void> {
    if (this.closed) return;
    this.aborting = true;
    this.stopStatements();
    await Promise.allSettled(this.inflight.splice(0));
    await this.connection.rollback().catch(() => undefined);
    await this.release();
  }

  private async release(): Promise<void> {
    if (this.closed) return;
    this.closed = true;
    // The key pads must not stay on a pooled connection.
    await this.connection
      .query(
        'SET @cairn_ipad = NULL, @cairn_opad = NULL, @cairn_practice = NULL, foreign_key_checks = 1',
      )
      .catch(() => undefined);
    await releaseRaw(this.sequelize, this.connection);
  }
}
