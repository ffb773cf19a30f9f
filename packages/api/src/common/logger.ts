/**
 * Structured logging: one JSON line per event (pino), used as Nest's logger
 * and by the request logger. Request ids come from X-Request-Id when a proxy
 * sets one (validated), else are generated, and are echoed in the response.
 */
import type { LoggerService } from '@nestjs/common';
import { randomUUID } from 'node:crypto';
import type { NextFunction, Request, Response } from 'express';
import { pino, type Logger, type LevelWithSilent } from 'pino';

export function createRootLogger(level: LevelWithSilent): Logger {
  return pino({
    level,
    base: { service: 'cairn-api', pid: process.pid },
    timestamp: pino.stdTimeFunctions.isoTime,
    redact: {
      paths: ['req.headers.cookie', 'req.headers.authorization', '*.password', '*.SAMLResponse'],
      censor: '[redacted]',
    },
  });
}

export class PinoNestLogger implements LoggerService {
  constructor(private readonly logger: Logger) {}

  private write(
    level: 'info' | 'warn' | 'error' | 'debug' | 'trace' | 'fatal',
    message: unknown,
    rest: unknown[],
  ) {
    const context = typeof rest[rest.length - 1] === 'string' ? (rest.pop() as string) : undefined;
    if (typeof message === 'object' && message !== null && !(message instanceof Error)) {
      const text = rest.find((r) => typeof r === 'string') as string | undefined;
      this.logger[level]({ context, ...(message as object) }, text);
    } else if (message instanceof Error) {
      this.logger[level]({ context, err: message }, message.message);
    } else {
      const stack = level === 'error' && typeof rest[0] === 'string' ? rest[0] : undefined;
      this.logger[level]({ context, ...(stack ? { stack } : {}) }, String(message));
    }
  }

  log(message: unknown, ...rest: unknown[]) {
    this.write('info', message, rest);
  }
  error(message: unknown, ...rest: unknown[]) {
    this.write('error', message, rest);
  }
  warn(message: unknown, ...rest: unknown[]) {
    this.write('warn', message, rest);
  }
  debug(message: unknown, ...rest: unknown[]) {
    this.write('debug', message, rest);
  }
  verbose(message: unknown, ...rest: unknown[]) {
    this.write('trace', message, rest);
  }
  fatal(message: unknown, ...rest: unknown[]) {
    this.write('fatal', message, rest);
  }
}

const requestIdPattern = /^[A-Za-z0-9._:-]{8,100}$/;

/** Express middleware: request id, and one log line per finished request. */
export function requestLogger(logger: Logger, enabled: boolean) {
  return (req: Request, res: Response, next: NextFunction) => {
    const given = req.header('x-request-id');
    const id = given && requestIdPattern.test(given) ? given : randomUUID();
    (req as Request & { id: string }).id = id;
    res.setHeader('X-Request-Id', id);
    if (!enabled) return next();
    const started = process.hrtime.bigint();
    res.on('finish', () => {
      const ms = Number(process.hrtime.bigint() - started) / 1e6;
      const user = (req as Request & { user?: { id?: number } }).user;
      const entry = {
        requestId: id,
        method: req.method,
        path: req.originalUrl.split('?')[0],
        status: res.statusCode,
        ms: Math.round(ms * 10) / 10,
        userId: user?.id,
      };
      if (res.statusCode >= 500) logger.error(entry, 'request failed');
      else logger.info(entry, 'request');
    });
    next();
  };
}
