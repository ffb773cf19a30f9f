/**
 * Who is acting, as every service sees it: a signed-in person (derived once,
 * by `actorOf`, from the AuthUser of the request) or Cairn itself (`systemActor`:
 * demo seeding, the job runner, the benchmark). Services take an Actor and
 * never an HTTP request; the audit trail records `id` and `label`.
 */
import { createParamDecorator, type ExecutionContext } from '@nestjs/common';
import type { Request } from 'express';
import type { Role } from '../users/roles.js';
import type { AuthUser } from './auth-user.js';

export interface Actor {
  /** The person's user id; null when Cairn itself acts */
  id: number | null;
  /** How the audit trail names them: an e-mail address, or what Cairn was doing */
  label: string;
  /** How summaries name them */
  displayName: string;
  role: Role | 'system';
  regionId: number;
  /** The practices a practice lead leads (empty for everyone else) */
  practiceIds: readonly number[];
  /** The request this action came from, for the audit trail */
  requestId: string | null;
  ipAddress: string | null;
}

/** The one way to turn the signed-in person (and their request) into an Actor. */
export function actorOf(user: AuthUser, req?: Request): Actor {
  return {
    id: user.id,
    label: user.email,
    displayName: user.displayName,
    role: user.role,
    regionId: user.regionId,
    practiceIds: user.practiceIds,
    requestId: (req as (Request & { id?: string }) | undefined)?.id ?? null,
    ipAddress: req?.ip ?? null,
  };
}

/** Cairn acting on its own, in a region (`label` says what it is doing: "demo seeding"). */
export function systemActor(label: string, regionId: number): Actor {
  return {
    id: null,
    label,
    displayName: label,
    role: 'system',
    regionId,
    practiceIds: [],
    requestId: null,
    ipAddress: null,
  };
}

/** The signed-in person as an Actor (for routes that declare a role, so someone is signed in). */
export const CurrentActor = createParamDecorator((_data: unknown, context: ExecutionContext) => {
  const req = context.switchToHttp().getRequest<Request & { user?: AuthUser }>();
  if (!req.user) throw new Error('@CurrentActor() on a route nobody need be signed in for');
  return actorOf(req.user, req);
});
