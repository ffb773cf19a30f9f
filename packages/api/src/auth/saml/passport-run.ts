/** Runs a Passport strategy on one request and reports what it did, as a promise. */
import type { Request, Response } from 'express';

export type PassportOutcome =
  | { kind: 'success'; user: unknown }
  | { kind: 'fail'; info: unknown }
  | { kind: 'error'; error: unknown }
  | { kind: 'responded' }
  | { kind: 'pass' };

/** The part of a Passport instance this needs. */
export interface PassportLike {
  authenticate(
    strategy: string,
    options: Record<string, unknown>,
    callback: (error: unknown, user: unknown, info: unknown) => void,
  ): unknown;
}

export function runPassport(
  authenticator: PassportLike,
  strategy: string,
  req: Request,
  res: Response,
  options: Record<string, unknown> = {},
): Promise<PassportOutcome> {
  return new Promise((resolve) => {
    let settled = false;
    const settle = (outcome: PassportOutcome) => {
      if (settled) return;
      settled = true;
      res.off('finish', onFinish);
      resolve(outcome);
    };
    // A redirect (to the IdP, or a logout response) is written by the strategy itself.
    const onFinish = () => settle({ kind: 'responded' });
    res.on('finish', onFinish);
    const middleware = authenticator.authenticate(
      strategy,
      { session: false, ...options },
      (error: unknown, user: unknown, info: unknown) => {
        if (error) settle({ kind: 'error', error });
        else if (user) settle({ kind: 'success', user });
        else settle({ kind: 'fail', info });
      },
    ) as (req: Request, res: Response, next: (err?: unknown) => void) => void;
    middleware(req, res, (err?: unknown) =>
      settle(err ? { kind: 'error', error: err } : { kind: 'pass' }),
    );
  });
}
