/**
 * Stages validated records into care_records as the extract is read: one
 * `LOAD DATA LOCAL INFILE` statement inside one transaction, fed by a stream
 * the pipeline writes to (so parsing in Node and inserting in MariaDB run at
 * the same time). `finish()` commits; `abort()` rolls back, so a refused,
 * cancelled or crashed read leaves nothing behind (a killed process's open
 * transaction is rolled back by the server).
 *
 * Staged rows are invisible to readers until confirm switches
 * practice_quarters.current_submission_id to their submission.
 */
import { createHash } from 'node:crypto';
import { PassThrough } from 'node:stream';
import type { Sequelize } from 'sequelize';
import { acquireRaw, type RawConnection, type RawResult, releaseRaw } from './raw-connection.js';
import { COL, RECORD_COLUMNS, type RecordRow } from './record-columns.js';

// eslint-disable-next-line no-control-regex
const NEEDS_ESCAPE = /[\\\t\n\r\u0000]/;

/** A value in LOAD DATA's default text format: \N for NULL, backslash escapes. */
export function tsvField(value: string | number | null): string {
  if (value === null) return '\\N';
  if (typeof value === 'number') return String(value);
  if (!NEEDS_ESCAPE.test(value)) return value;
  // eslint-disable-next-line no-control-regex
  return value.replace(/[\\\t\n\r\u0000]/g, (ch) =>
    ch === '\\' ? '\\\\' : ch === '\t' ? '\\t' : ch === '\n' ? '\\n' : ch === '\r' ? '\\r' : '\\0',
  );
}

/** A staged record as one line of LOAD DATA text; the pseudonym column is left to MariaDB. */
export function tsvLine(row: RecordRow): string {
  let line = tsvField(row[0]!);
  for (let i = 1; i < row.length; i++) {
    if (i !== COL.pseudonym) line += '\t' + tsvField(row[i] ?? null);
  }
  return line + '\n';
}

/**
 * The HMAC-SHA256 key pads (RFC 2104) of the pseudonym secret. MariaDB computes each staged
 * record's pseudonym from them while loading, as
 *   SHA2((K ⊕ opad) ‖ SHA2((K ⊕ ipad) ‖ practice code ‖ U+001F ‖ record_ref)),
 * first 12 hex characters: the same value as recordPseudonym in @cairn/metrics (methods.md §9),
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

export class RecordLoader {
  private written = 0;
  private settled: Promise<RawResult> | null = null;
  private failure: Error | null = null;
  private closed = false;

  private constructor(
    private readonly sequelize: Sequelize,
    private readonly connection: RawConnection,
    private readonly stream: PassThrough,
  ) {}

  static async open(
    sequelize: Sequelize,
    pseudonym: { practiceCode: string; secret: string },
  ): Promise<RecordLoader> {
    const connection = await acquireRaw(sequelize);
    const stream = new PassThrough({ highWaterMark: 1 << 20 });
    const loader = new RecordLoader(sequelize, connection, stream);
    try {
      const pads = hmacPads(pseudonym.secret);
      await connection.query(
        'SET @cairn_ipad = UNHEX(?), @cairn_opad = UNHEX(?), @cairn_practice = ?',
        [pads.ipad, pads.opad, pseudonym.practiceCode],
      );
      await connection.beginTransaction();
    } catch (error) {
      await releaseRaw(sequelize, connection);
      throw error;
    }
    loader.settled = connection
      .query<RawResult>({ sql: LOAD_STAGED_SQL, infileStreamFactory: () => stream })
      .catch((error: Error) => {
        loader.failure = error;
        stream.destroy();
        throw error;
      });
    // Keep an early failure from being an unhandled rejection; it is rethrown by write/finish.
    loader.settled.catch(() => undefined);
    return loader;
  }

  get count(): number {
    return this.written;
  }

  async write(rows: RecordRow[]): Promise<void> {
    if (this.failure) throw this.failure;
    let text = '';
    for (const row of rows) text += tsvLine(row);
    this.written += rows.length;
    if (!this.stream.write(text)) {
      await new Promise<void>((resolve, reject) => {
        const onDrain = () => {
          cleanup();
          resolve();
        };
        const onClose = () => {
          cleanup();
          reject(this.failure ?? new Error('the record stream closed'));
        };
        const cleanup = () => {
          this.stream.off('drain', onDrain);
          this.stream.off('close', onClose);
        };
        this.stream.on('drain', onDrain);
        this.stream.on('close', onClose);
      });
    }
  }

  /** Ends the stream, waits for MariaDB, checks the count and commits. Returns the rows staged. */
  async finish(): Promise<number> {
    this.stream.end();
    try {
      const result = await this.settled!;
      if (result.affectedRows !== this.written) {
        throw new Error(
          `staged ${result.affectedRows} of ${this.written} records (warnings: ${result.warningStatus ?? 0})`,
        );
      }
      await this.connection.commit();
      return result.affectedRows;
    } catch (error) {
      await this.connection.rollback().catch(() => undefined);
      throw error;
    } finally {
      await this.release();
    }
  }

  /** Stops the statement and rolls its rows back. */
  async abort(): Promise<void> {
    if (this.closed) return;
    this.stream.destroy(new Error('aborted'));
    await this.settled!.catch(() => undefined);
    await this.connection.rollback().catch(() => undefined);
    await this.release();
  }

  private async release(): Promise<void> {
    if (this.closed) return;
    this.closed = true;
    // The key pads must not stay on a pooled connection.
    await this.connection
      .query('SET @cairn_ipad = NULL, @cairn_opad = NULL, @cairn_practice = NULL')
      .catch(() => undefined);
    await releaseRaw(this.sequelize, this.connection);
  }
}
