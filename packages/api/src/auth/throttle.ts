/**
 * @nestjs/throttler for the sign-in routes, with its counters in MariaDB so
 * that the limit holds across several API processes (the library's default
 * storage is per process). A fixed window per client address and route:
 * auth.throttle.limit requests per auth.throttle.windowSeconds.
 */
import { HttpStatus, Injectable } from '@nestjs/common';
import {
  type ThrottlerLimitDetail,
  ThrottlerGuard,
  type ThrottlerStorage,
} from '@nestjs/throttler';
import type { ExecutionContext } from '@nestjs/common';
import { QueryTypes, type Sequelize } from 'sequelize';
import { ProblemException } from '../common/problem.js';

type ThrottlerStorageRecord = Awaited<ReturnType<ThrottlerStorage['increment']>>;

/** Every this many increments, windows that ended a day ago are deleted. */
const SWEEP_EVERY = 500;

export class DatabaseThrottlerStorage implements ThrottlerStorage {
  private calls = 0;

  constructor(private readonly sequelize: Sequelize) {}

  private async sweep(): Promise<void> {
    await this.sequelize.query(
      `DELETE FROM auth_throttle
        WHERE window_ends_at < NOW(3) - INTERVAL 1 DAY AND (blocked_until IS NULL OR blocked_until < NOW(3))`,
      { type: QueryTypes.DELETE },
    );
  }

  async increment(
    key: string,
    ttl: number,
    limit: number,
    blockDuration: number,
    throttlerName: string,
  ): Promise<ThrottlerStorageRecord> {
    const bucket = `${throttlerName}:${key}`.slice(0, 190);
    if (++this.calls % SWEEP_EVERY === 0) await this.sweep();
    await this.sequelize.query(
      `INSERT INTO auth_throttle (bucket, hits, window_ends_at, blocked_until)
         VALUES (?, 1, NOW(3) + INTERVAL (? * 1000) MICROSECOND, NULL)
       ON DUPLICATE KEY UPDATE
         hits = IF(window_ends_at <= NOW(3), 1, hits + 1),
         window_ends_at = IF(window_ends_at <= NOW(3), NOW(3) + INTERVAL (? * 1000) MICROSECOND, window_ends_at),
         blocked_until = IF(blocked_until > NOW(3), blocked_until,
           IF(hits > ?, NOW(3) + INTERVAL (? * 1000) MICROSECOND, NULL))`,
      { replacements: [bucket, ttl, ttl, limit, blockDuration], type: QueryTypes.INSERT },
    );
    const [row] = await this.sequelize.query<{
      hits: number;
      expireMs: number;
      blockMs: number | null;
    }>(
      `SELECT hits,
              TIMESTAMPDIFF(MICROSECOND, NOW(3), window_ends_at) / 1000 AS expireMs,
              IF(blocked_until > NOW(3), TIMESTAMPDIFF(MICROSECOND, NOW(3), blocked_until) / 1000, NULL) AS blockMs
         FROM auth_throttle WHERE bucket = ?`,
      { replacements: [bucket], type: QueryTypes.SELECT },
    );
    const blockMs = row?.blockMs == null ? null : Number(row.blockMs);
    return {
      totalHits: Number(row?.hits ?? 1),
      timeToExpire: Math.max(0, Math.ceil(Number(row?.expireMs ?? ttl) / 1000)),
      isBlocked: blockMs !== null && blockMs > 0,
      timeToBlockExpire: blockMs === null ? 0 : Math.max(1, Math.ceil(blockMs / 1000)),
    };
  }
}

/** ThrottlerGuard tracking by client address, refusing with RFC 9457 problem details. */
@Injectable()
export class SignInThrottlerGuard extends ThrottlerGuard {
  protected override async getTracker(req: Record<string, unknown>): Promise<string> {
    return Promise.resolve(String(req.ip ?? 'unknown'));
  }

  protected override async throwThrottlingException(
    _context: ExecutionContext,
    detail: ThrottlerLimitDetail,
  ): Promise<void> {
    throw new ProblemException(
      HttpStatus.TOO_MANY_REQUESTS,
      'too-many-requests',
      'Too many sign-in attempts',
      `Too many sign-in attempts from your network in a short time. Wait ${detail.timeToBlockExpire} seconds, then try again.`,
      { retryAfterSeconds: detail.timeToBlockExpire },
    );
  }
}
