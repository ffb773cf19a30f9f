/**
 * A raw mariadb connector connection from Sequelize's pool, for what
 * Sequelize cannot do quickly: LOAD DATA LOCAL INFILE fed by a stream, and
 * `batch()` inserts (toolchain.md: bulkCreate is about ten times slower).
 */
import type { Readable } from 'node:stream';
import type { Sequelize } from 'sequelize';

export interface RawResult {
  affectedRows: number;
  insertId?: number;
  warningStatus?: number;
}

/** The part of the mariadb connector's Connection that Cairn uses. */
export interface RawConnection {
  query<T = unknown>(
    sql: string | { sql: string; infileStreamFactory?: (path: string) => Readable },
    values?: unknown[],
  ): Promise<T>;
  batch(sql: string, values: unknown[][]): Promise<RawResult | RawResult[]>;
  /** A streamed SELECT: rows arrive one 'data' event each. */
  queryStream(
    sql: { sql: string; rowsAsArray?: boolean; typeCast?: null },
    values?: unknown[],
  ): Readable;
  beginTransaction(): Promise<void>;
  commit(): Promise<void>;
  rollback(): Promise<void>;
}

interface Manager {
  getConnection(options: { type: 'read' | 'write' }): Promise<unknown>;
  releaseConnection(connection: unknown): void | Promise<void>;
}

function manager(sequelize: Sequelize): Manager {
  return (sequelize as unknown as { connectionManager: Manager }).connectionManager;
}

export async function acquireRaw(sequelize: Sequelize): Promise<RawConnection> {
  return (await manager(sequelize).getConnection({ type: 'write' })) as RawConnection;
}

export async function releaseRaw(sequelize: Sequelize, connection: RawConnection): Promise<void> {
  await manager(sequelize).releaseConnection(connection);
}

export async function withRaw<T>(
  sequelize: Sequelize,
  fn: (c: RawConnection) => Promise<T>,
): Promise<T> {
  const connection = await acquireRaw(sequelize);
  try {
    return await fn(connection);
  } finally {
    await releaseRaw(sequelize, connection);
  }
}

export function affected(result: RawResult | RawResult[]): number {
  return Array.isArray(result)
    ? result.reduce((n, r) => n + r.affectedRows, 0)
    : result.affectedRows;
}
