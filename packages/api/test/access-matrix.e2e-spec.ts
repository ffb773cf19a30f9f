/**
 * The access matrix, generated from Nest's route table: every route of the
 * real app (checked against Express's router, so nothing is missed) × six
 * callers — anonymous, a practice lead of the route's practice, a practice
 * lead of another practice, the regional lead, the auditor, and a person
 * deactivated after signing in — against the route's declaration.
 *
 * Fails when a route declares neither @Public() nor @Roles(). Routes added
 * by other modules join the matrix automatically. The matrix is written to
 * .test-results/access-matrix.md.
 */
import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { RequestMethod } from '@nestjs/common';
import { METHOD_METADATA, PATH_METADATA } from '@nestjs/common/constants.js';
import { ModulesContainer } from '@nestjs/core';
import { QueryTypes } from 'sequelize';
import request from 'supertest';
import { ACCESS_PROBLEMS, SAFE_METHODS } from '../src/auth/access.guard.js';
import {
  AUDITOR_MAY_WRITE_KEY,
  PRACTICE_PARAM_KEY,
  PUBLIC_KEY,
  ROLES_KEY,
  SKIP_CSRF_KEY,
} from '../src/auth/decorators.js';
import { findRepoRoot } from '../src/config/load-config.js';
import type { Role } from '../src/users/roles.js';
import { demoIds, seedDemoOrganisation, signInAs, type SignedInAgent } from './support/auth.js';
import { createTestApp, type TestApp } from './support/test-app.js';

interface RouteInfo {
  method: string;
  path: string;
  handler: string;
  isPublic: boolean;
  roles: Role[] | null;
  practiceParam: string | null;
  auditorMayWrite: boolean;
  skipCsrf: boolean;
}

const CALLERS = [
  'anonymous',
  'lead of practice',
  'lead of another',
  'regional lead',
  'auditor',
  'deactivated',
] as const;
type Caller = (typeof CALLERS)[number];

/** What the declaration says this caller gets: 'allowed' or the refusal (status + problem type). */
function expected(route: RouteInfo, caller: Caller): string {
  const unsafe = !SAFE_METHODS.has(route.method);
  if (!route.isPublic && !route.roles) return '403 undeclared-route';
  const signedIn = caller !== 'anonymous' && caller !== 'deactivated';
  if (!route.isPublic && !signedIn) return '401 sign-in-required';
  if (unsafe && !route.skipCsrf && !signedIn) return '403 csrf';
  if (route.isPublic) return 'allowed';
  const role: Role =
    caller === 'regional lead'
      ? 'regional_lead'
      : caller === 'auditor'
        ? 'auditor'
        : 'practice_lead';
  if (!route.roles!.includes(role)) return '403 role-not-allowed';
  if (role === 'auditor' && unsafe && !route.auditorMayWrite) return '403 auditor-read-only';
  if (route.practiceParam && caller === 'lead of another') return '403 practice-not-yours';
  return 'allowed';
}

function observed(res: {
  status: number;
  body: unknown;
  headers: Record<string, unknown>;
}): string {
  const type = (res.body as { type?: string } | null)?.type;
  if (typeof type === 'string' && (ACCESS_PROBLEMS as readonly string[]).includes(type)) {
    return `${res.status} ${type.replace('/api/problems/', '')}`;
  }
  return 'allowed';
}

/**
 * Hand-written expectations for the sign-in, users, audit-trail, measure-set, audit-quarter and
 * recall-list routes (a cross-check of the rule above).
 * Hand-written expectations for the sign-in, users, audit-trail, measure-set, recall-list,
 * results, benchmark and mail routes (a cross-check of the rule above).
 */
const A = 'allowed';
const U = '401 sign-in-required';
const R = '403 role-not-allowed';
/** A practice's own figures: its leads, the regional lead and the auditor; no other practice's lead. */
const OWN_PRACTICE: Record<Caller, string> = {
  anonymous: U,
  'lead of practice': A,
  'lead of another': '403 practice-not-yours',
  'regional lead': A,
  auditor: A,
  deactivated: U,
};
const handWritten: Record<string, Record<Caller, string>> = {
  'GET /api/session': {
    anonymous: A,
    'lead of practice': A,
    'lead of another': A,
    'regional lead': A,
    auditor: A,
    deactivated: A,
  },
  'GET /api/me': {
    anonymous: U,
    'lead of practice': A,
    'lead of another': A,
    'regional lead': A,
    auditor: A,
    deactivated: U,
  },
  'GET /api/users': {
    anonymous: U,
    'lead of practice': R,
    'lead of another': R,
    'regional lead': A,
    auditor: R,
    deactivated: U,
  },
  'POST /api/users': {
    anonymous: U,
    'lead of practice': R,
    'lead of another': R,
    'regional lead': A,
    auditor: R,
    deactivated: U,
  },
  'PUT /api/users/:userId/practices/:practiceId': {
    anonymous: U,
    'lead of practice': R,
    'lead of another': R,
    'regional lead': A,
    auditor: R,
    deactivated: U,
  },
  'GET /api/audit-events': {
    anonymous: U,
    'lead of practice': R,
    'lead of another': R,
    'regional lead': A,
    auditor: A,
    deactivated: U,
  },
  'POST /api/auth/saml/acs': {
    anonymous: A,
    'lead of practice': A,
    'lead of another': A,
    'regional lead': A,
    auditor: A,
    deactivated: A,
  },
  'POST /api/auth/sign-out': {
    anonymous: '403 csrf',
    'lead of practice': A,
    'lead of another': A,
    'regional lead': A,
    auditor: A,
    deactivated: '403 csrf',
  },
  'GET /api/measure-sets': {
    anonymous: U,
    'lead of practice': A,
    'lead of another': A,
    'regional lead': A,
    auditor: A,
    deactivated: U,
  },
  'GET /api/measure-sets/:measureSetId': {
    anonymous: U,
    'lead of practice': A,
    'lead of another': A,
    'regional lead': A,
    auditor: A,
    deactivated: U,
  },
  // Measure sets and audit quarters: everyone reads; regional leads change (auditors are read-only).
  ...Object.fromEntries(
    [
      'GET /api/quarter-overview',
      'GET /api/measure-sets/:measureSetId/changes',
      'GET /api/quarters',
      'GET /api/quarters/:quarterId',
    ].map((key) => [
      key,
      {
        anonymous: U,
        'lead of practice': A,
        'lead of another': A,
        'regional lead': A,
        auditor: A,
        deactivated: U,
      },
    ]),
  ),
  ...Object.fromEntries(
    [
      'POST /api/measure-sets/:measureSetId/drafts',
      'PUT /api/measure-sets/:measureSetId',
      'POST /api/measure-sets/:measureSetId/publish',
      'DELETE /api/measure-sets/:measureSetId',
      'POST /api/quarters',
      'PATCH /api/quarters/:quarterId',
      'POST /api/quarters/:quarterId/close',
      'POST /api/quarters/:quarterId/reopen',
    ].map((key) => [
      key,
      {
        anonymous: U,
        'lead of practice': R,
        'lead of another': R,
        'regional lead': A,
        auditor: R,
        deactivated: U,
      },
    ]),
  ),
  ...Object.fromEntries(
    ['recall-list', 'recall-list.csv', 'recall-list.xlsx'].map((path) => [
      `GET /api/practices/:practiceId/quarters/:quarterId/${path}`,
      OWN_PRACTICE,
    ]),
  ),
  // Results and benchmarks: the region's figures for the regional lead and the auditor; a
  // practice's results for its own leads too, never for a lead of another practice.
  ...Object.fromEntries(
    [
      'GET /api/quarters/:quarterId/benchmark',
      'GET /api/quarters/:quarterId/benchmark/measures/:measureKey',
      'GET /api/quarters/:quarterId/benchmark/trend',
    ].map((route) => [
      route,
      {
        anonymous: U,
        'lead of practice': R,
        'lead of another': R,
        'regional lead': A,
        auditor: A,
        deactivated: U,
      },
    ]),
  ),
  ...Object.fromEntries(
    [
      'GET /api/practices/:practiceId/quarters/:quarterId/results',
      'GET /api/practices/:practiceId/quarters/:quarterId/results/detail',
    ].map((route) => [route, OWN_PRACTICE]),
  ),
  ...Object.fromEntries(
    [
      'GET /api/mail/deliveries',
      'GET /api/mail/deliveries/:kind/:sourceId',
      'POST /api/mail/deliveries/:kind/:sourceId/resend',
      'POST /api/mail/messages/:messageId/resend',
      'GET /api/mail/recipients',
      'POST /api/practices/:practiceId/mail-recipients',
      'DELETE /api/practices/:practiceId/mail-recipients/:recipientId',
    ].map((route) => [
      route,
      {
        anonymous: U,
        'lead of practice': R,
        'lead of another': R,
        'regional lead': A,
        auditor: R,
        deactivated: U,
      },
    ]),
  ),
  // ── digests: the regional lead only ──
  ...Object.fromEntries(
    [
      'GET /api/digests',
      'GET /api/digests/:reportId/practices/:practiceId/preview',
      'GET /api/digests/:reportId/practices/:practiceId/preview.html',
      'POST /api/digests/:reportId/practices/:practiceId/test',
      'POST /api/digests/:reportId/send',
      'GET /api/digests/:reportId/schedule',
      'PUT /api/digests/:reportId/schedule',
      'DELETE /api/digests/:reportId/schedule',
    ].map((route) => [
      route,
      {
        anonymous: U,
        'lead of practice': R,
        'lead of another': R,
        'regional lead': A,
        auditor: R,
        deactivated: U,
      },
    ]),
  ),
  ...Object.fromEntries(
    ['GET /api/me/mail-preferences', 'PUT /api/me/mail-preferences'].map((route) => [
      route,
      {
        anonymous: U,
        'lead of practice': A,
        'lead of another': A,
        'regional lead': A,
        auditor: A,
        deactivated: U,
      },
    ]),
  ),
  // ── review cases and the outlier list ──
  // (own/other practice for case routes, whose practice is the case's: review-cases.e2e-spec.ts)
  ...Object.fromEntries(
    (
      [
        ['GET /api/quarters/:quarterId/outliers', [R, R, A, A]],
        [
          'GET /api/quarters/:quarterId/outliers/practices/:practiceId/measures/:measureKey',
          [R, R, A, A],
        ],
        [
          'GET /api/quarters/:quarterId/outliers/practices/:practiceId/measures/:measureKey/records',
          [R, R, A, A],
        ],
        [
          'GET /api/quarters/:quarterId/outliers/practices/:practiceId/measures/:measureKey/evidence.xlsx',
          [R, R, A, A],
        ],
        ['GET /api/review-cases', [A, A, A, A]],
        ['GET /api/review-cases/:caseId', [A, A, A, A]],
        ['GET /api/review-cases/:caseId/files/:fileId', [A, A, A, A]],
        ['POST /api/review-cases', [R, R, R, A]],
        ['POST /api/review-cases/:caseId/transitions', [R, R, R, A]],
        ['POST /api/review-cases/:caseId/comments', [A, A, R, A]],
        ['POST /api/review-cases/:caseId/answers', [A, A, R, R]],
      ] as const
    ).map(([route, [own, other, regional, auditor]]) => [
      route,
      {
        anonymous: U,
        'lead of practice': own,
        'lead of another': other,
        'regional lead': regional,
        auditor,
        deactivated: U,
      },
    ]),
  ),
  // ── reports ──
  ...Object.fromEntries(
    ['GET /api/reports', 'GET /api/reports/:reportId'].map((route) => [
      route,
      {
        anonymous: U,
        'lead of practice': A,
        'lead of another': A,
        'regional lead': A,
        auditor: A,
        deactivated: U,
      },
    ]),
  ),
  ...Object.fromEntries(
    [
      'GET /api/reports/:reportId/region',
      'GET /api/reports/:reportId/data-pack.xlsx',
      'GET /api/reports/:reportId/report.pdf',
    ].map((route) => [
      route,
      {
        anonymous: U,
        'lead of practice': R,
        'lead of another': R,
        'regional lead': A,
        auditor: A,
        deactivated: U,
      },
    ]),
  ),
  ...Object.fromEntries(
    [
      'GET /api/reports/:reportId/practices/:practiceId',
      'GET /api/reports/:reportId/practices/:practiceId/data-pack.xlsx',
      'GET /api/reports/:reportId/practices/:practiceId/report.pdf',
    ].map((route) => [route, OWN_PRACTICE]),
  ),
  ...Object.fromEntries(
    ['POST /api/quarters/:quarterId/reports', 'POST /api/reports/:reportId/withdraw'].map(
      (route) => [
        route,
        {
          anonymous: U,
          'lead of practice': R,
          'lead of another': R,
          'regional lead': A,
          auditor: R,
          deactivated: U,
        },
      ],
    ),
  ),
  'GET /api/health': {
    anonymous: A,
    'lead of practice': A,
    'lead of another': A,
    'regional lead': A,
    auditor: A,
    deactivated: A,
  },
};

function nestRoutes(t: TestApp): RouteInfo[] {
  const routes: RouteInfo[] = [];
  const container = t.app.get(ModulesContainer);
  const meta = <T>(key: string, ...targets: object[]): T | undefined => {
    for (const target of targets) {
      const value = Reflect.getMetadata(key, target) as T | undefined;
      if (value !== undefined) return value;
    }
    return undefined;
  };
  for (const module of container.values()) {
    for (const wrapper of module.controllers.values()) {
      const controller = wrapper.metatype as (new (...args: never[]) => object) | null;
      if (!controller) continue;
      const base = String(Reflect.getMetadata(PATH_METADATA, controller) ?? '');
      for (const name of Object.getOwnPropertyNames(controller.prototype)) {
        if (name === 'constructor') continue;
        const handler: unknown = Object.getOwnPropertyDescriptor(controller.prototype, name)?.value;
        if (typeof handler !== 'function') continue;
        const method = Reflect.getMetadata(METHOD_METADATA, handler) as RequestMethod | undefined;
        if (method === undefined) continue;
        const paths = Reflect.getMetadata(PATH_METADATA, handler) as string | string[];
        for (const sub of Array.isArray(paths) ? paths : [paths]) {
          const path = ['/api', base, sub]
            .map((p) => p.replace(/^\/+|\/+$/g, ''))
            .filter(Boolean)
            .join('/');
          routes.push({
            method: RequestMethod[method],
            path: `/${path}`,
            handler: `${controller.name}.${name}`,
            isPublic: meta<boolean>(PUBLIC_KEY, handler, controller) === true,
            roles: meta<Role[]>(ROLES_KEY, handler, controller) ?? null,
            practiceParam: meta<string>(PRACTICE_PARAM_KEY, handler, controller) ?? null,
            auditorMayWrite: meta<boolean>(AUDITOR_MAY_WRITE_KEY, handler, controller) === true,
            skipCsrf: meta<boolean>(SKIP_CSRF_KEY, handler, controller) === true,
          });
        }
      }
    }
  }
  // Sign-out ends the caller's session: run it last.
  return routes.sort(
    (a, b) =>
      Number(a.path === '/api/auth/sign-out') - Number(b.path === '/api/auth/sign-out') ||
      a.path.localeCompare(b.path) ||
      a.method.localeCompare(b.method),
  );
}

/** The routes Express actually serves under /api (besides Swagger's documentation pages). */
function expressRoutes(t: TestApp): string[] {
  const instance = t.app.getHttpAdapter().getInstance() as {
    router: { stack: { route?: { path: string; methods: Record<string, boolean> } }[] };
  };
  return instance.router.stack
    .filter(
      (layer) =>
        layer.route &&
        layer.route.path.startsWith('/api') &&
        !layer.route.path.startsWith('/api/docs'),
    )
    .flatMap((layer) =>
      Object.keys(layer.route!.methods)
        .filter((m) => m !== '_all')
        .map((m) => `${m.toUpperCase()} ${layer.route!.path}`),
    );
}

describe('access matrix', () => {
  let t: TestApp;
  let routes: RouteInfo[];
  let agents: Record<Caller, SignedInAgent | ReturnType<typeof request.agent>>;
  let practiceId: number;

  beforeAll(async () => {
    t = await createTestApp();
    await seedDemoOrganisation(t);
    routes = nestRoutes(t);
    const ids = await demoIds(t);
    practiceId = ids.practice('OV102');
    const deactivated = await signInAs(t, 'practice_lead_three');
    await t.db.query(
      "UPDATE users SET status = 'deactivated' WHERE email = 'ruth.penhallow@cindermere.example'",
      {
        type: QueryTypes.UPDATE,
      },
    );
    agents = {
      anonymous: request.agent(t.http),
      'lead of practice': await signInAs(t, 'practice_lead_one'),
      'lead of another': await signInAs(t, 'practice_lead_two'),
      'regional lead': await signInAs(t, 'regional_lead'),
      auditor: await signInAs(t, 'auditor'),
      deactivated,
    };
  });
  afterAll(async () => {
    await t?.close();
  });

  it('finds every route Express serves', () => {
    const fromNest = routes.map((r) => `${r.method} ${r.path}`).sort();
    expect(fromNest).toEqual(expressRoutes(t).sort());
    expect(routes.length).toBeGreaterThan(15);
  });

  it('has an access declaration on every route', () => {
    const undeclared = routes
      .filter((r) => !r.isPublic && !r.roles)
      .map((r) => `${r.method} ${r.path} (${r.handler})`);
    expect(undeclared).toEqual([]);
    const both = routes
      .filter((r) => r.isPublic && r.roles)
      .map((r) => `${r.method} ${r.path} (${r.handler})`);
    expect(both).toEqual([]);
  });

  it('answers every route × caller as declared', async () => {
    const rows: string[] = [];
    const mismatches: string[] = [];
    for (const route of routes) {
      const url = route.path.replace(/:(\w+)/g, (_m, name: string) =>
        name === route.practiceParam ? String(practiceId) : '999999',
      );
      const cells: string[] = [];
      for (const caller of CALLERS) {
        const agent = agents[caller];
        const method = route.method.toLowerCase() as
          'get' | 'post' | 'put' | 'patch' | 'delete' | 'head' | 'options';
        const res = await agent[method](url).redirects(0).send();
        const want = expected(route, caller);
        const got = observed(res);
        cells.push(got === 'allowed' ? `${res.status}` : got.replace(/^(\d+) .*/, '$1 ✗'));
        if (got !== want)
          mismatches.push(
            `${route.method} ${route.path} as ${caller}: expected ${want}, got ${got} (HTTP ${res.status})`,
          );
        const key = `${route.method} ${route.path}`;
        if (handWritten[key] && handWritten[key][caller] !== got) {
          mismatches.push(
            `${key} as ${caller}: the hand-written matrix says ${handWritten[key][caller]}, got ${got}`,
          );
        }
        if (got === 'allowed') expect(res.status).toBeLessThan(500);
      }
      rows.push(`| ${route.method} ${route.path} | ${cells.join(' | ')} |`);
    }
    const dir = join(findRepoRoot(), '.test-results');
    mkdirSync(dir, { recursive: true });
    writeFileSync(
      join(dir, 'access-matrix.md'),
      `# Access matrix (${routes.length} routes × ${CALLERS.length} callers = ${routes.length * CALLERS.length} requests)\n\n` +
        'Status answered; ✗ marks a refusal by the access guard.\n\n' +
        `| route | ${CALLERS.join(' | ')} |\n|---|${CALLERS.map(() => '---').join('|')}|\n${rows.join('\n')}\n`,
    );
    expect(mismatches).toEqual([]);
    for (const key of Object.keys(handWritten))
      expect(rows.some((r) => r.startsWith(`| ${key} |`))).toBe(true);
  }, 300_000); // every route × caller, one request each: a few hundred requests in sequence
});
