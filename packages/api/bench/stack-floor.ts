/**
 * The stack's floor for a signed-in read (bench/http.ts runs it in a process
 * of its own, with the API's Node flags, under the same load as the judged
 * routes; not judged): NestJS on Express, express-session with the API's
 * cookie name and secret over the same `sessions` table, and one route that
 * reads the region's quarters, each read one SELECT on a connection of a
 * Sequelize pool through the connector directly (database/raw-select.ts, as
 * the API reads). Nothing else: no helmet, request log, validation, guards or
 * answer memo, and the session is never written (the API writes it at most
 * once a minute). What a route costs above this is Cairn's; this is what any
 * signed-in read that checks its session in the database costs here.
 *
 * With --no-read the route answers from memory after the session's read (one
 * SELECT a request in all): the floor of a read that needed no query of its own.
 *
 * Usage: node --import tsx/esm bench/stack-floor.ts <database> [--no-read];
 * prints the port it listens on, on 127.0.0.1.
 */
import 'reflect-metadata';
import { Controller, Get, Module } from '@nestjs/common';
import { NestFactory } from '@nestjs/core';
import type { NextFunction, Request, Response } from 'express';
import session, { type SessionData, Store } from 'express-session';
import { loadConfig, loadSecrets } from '../src/config/load-config.js';
import { connect } from '../src/database/connect.js';
import { selectRows } from '../src/database/raw-select.js';

type Callback<T = void> = (err?: unknown, value?: T) => void;

const [database, mode] = process.argv.slice(2);
if (!database) throw new Error('usage: stack-floor.ts <database> [--no-read]');
const noRead = mode === '--no-read';
const config = loadConfig({ profile: 'test' });
const secrets = loadSecrets();
const db = connect({ ...config, database: { ...config.database, name: database } }, secrets);

/** The session row by its id: one SELECT, as the API's store reads it (without the person). */
class FloorStore extends Store {
  override get(sid: string, callback: Callback<SessionData | null>): void {
    selectRows<{ data: string }>(db, 'SELECT data FROM sessions WHERE sid = ?', [sid]).then(
      ([row]) => callback(null, row ? (JSON.parse(row.data) as SessionData) : null),
      (error) => callback(error),
    );
  }
  override set(_sid: string, _data: SessionData, callback?: Callback): void {
    callback?.();
  }
  override destroy(_sid: string, callback?: Callback): void {
    callback?.();
  }
  override touch(_sid: string, _data: SessionData, callback?: Callback): void {
    callback?.();
  }
}

// Decorators applied as calls: this file runs through tsx, which emits no decorator metadata.
class QuartersFloor {
  /** The first answer, kept for --no-read */
  private remembered: unknown[] | null = null;

  async quarters() {
    if (this.remembered) return this.remembered;
    const rows = await selectRows(
      db,
      'SELECT * FROM audit_quarters ORDER BY year DESC, quarter DESC',
    );
    if (noRead) this.remembered = rows;
    return rows;
  }
}
Get('quarters')(
  QuartersFloor.prototype,
  'quarters',
  Object.getOwnPropertyDescriptor(QuartersFloor.prototype, 'quarters')!,
);
Controller()(QuartersFloor);
class FloorModule {}
Module({ controllers: [QuartersFloor] })(FloorModule);

const app = await NestFactory.create(FloorModule, { logger: false });
app.use(
  session({
    name: config.session.cookieName,
    secret: secrets.CAIRN_SESSION_SECRET,
    store: new FloorStore(),
    resave: false,
    saveUninitialized: false,
    rolling: false,
    cookie: { httpOnly: true, sameSite: 'lax', path: '/' },
  }),
);
// Signed in or refused, as every API read is.
app.use((req: Request, res: Response, next: NextFunction) => {
  if ((req.session as Partial<SessionData> | undefined)?.auth) next();
  else res.status(401).end();
});
app.setGlobalPrefix('api');
await app.listen(0, '127.0.0.1');
const address = app.getHttpServer().address() as { port: number };
console.log(address.port);
