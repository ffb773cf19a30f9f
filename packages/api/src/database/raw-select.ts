/**
 * A statement on a connection of the app's Sequelize pool, through the mariadb
 * connector directly: no Sequelize query pipeline (option cloning, hooks,
 * replacement formatting, model hydration). For the small reads and writes
 * every signed-in request makes (its session, the person, the quarter, the
 * current set). The connection is Sequelize's, so its type casts and its
 * time_zone (+00:00) apply as to Sequelize's own queries.
 *
 * Parameters: numbers, strings, null, and arrays of them (an array is written
 * as a comma-separated list: `IN (?)`). Never pass a Date: the connector would
 * write it in the process's local time; pass epoch milliseconds to
 * FROM_UNIXTIME(? / 1000) instead.
 */
import type { Sequelize } from 'sequelize';
import { type RawResult, withRaw } from './bulk-load/raw-connection.js';

type Param = string | number | null | readonly (string | number)[];

/** The rows of one SELECT, as plain objects. */
export function selectRows<T extends object>(
  sequelize: Sequelize,
  sql: string,
  values: readonly Param[] = [],
): Promise<T[]> {
  return withRaw(sequelize, (connection) => connection.query<T[]>(sql, [...values]));
}

/** One INSERT, UPDATE or DELETE; returns how many rows it changed. */
export async function execute(
  sequelize: Sequelize,
  sql: string,
  values: readonly Param[] = [],
): Promise<number> {
  const result = await withRaw(sequelize, (connection) =>
    connection.query<RawResult>(sql, [...values]),
  );
  return result.affectedRows;
}
