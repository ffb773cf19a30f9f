import 'reflect-metadata';
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { OpenAPIObject } from '@nestjs/swagger';
import { buildOpenApiDocument } from './openapi.js';
import { contractDir, renderContract } from './render.js';

const REGENERATE = 'run `npm run api:contract` and commit both files';

describe('the web contract (packages/web/src/lib/api)', () => {
  let document: OpenAPIObject;
  let fresh: Record<string, string>;

  beforeAll(async () => {
    document = await buildOpenApiDocument();
    fresh = await renderContract(document);
  });

  it.each(['openapi.json', 'schema.ts'])(
    `%s is in step with the API's DTO classes (else ${REGENERATE})`,
    (name) => {
      const path = join(contractDir(), name);
      const committed = existsSync(path) ? readFileSync(path, 'utf8') : '';
      if (committed !== fresh[name]) {
        throw new Error(`${path} is stale: ${REGENERATE}.`);
      }
    },
  );

  it('describes a response body for every JSON route, with no untyped object', () => {
    const untyped: string[] = [];
    const walk = (node: unknown, at: string) => {
      if (!node || typeof node !== 'object') return;
      const schema = node as Record<string, unknown>;
      if (
        schema.type === 'object' &&
        !schema.properties &&
        !schema.allOf &&
        schema.additionalProperties === undefined
      )
        untyped.push(at);
      for (const [key, value] of Object.entries(schema)) walk(value, `${at}.${key}`);
    };
    walk(document.components?.schemas, 'components.schemas');
    expect(untyped).toEqual([]);

    const missing: string[] = [];
    for (const [path, item] of Object.entries(document.paths)) {
      for (const [method, operation] of Object.entries(item)) {
        const responses = (operation as { responses?: Record<string, unknown> }).responses ?? {};
        const ok = Object.entries(responses).find(([status]) => /^2/.test(status));
        const content = (ok?.[1] as { content?: Record<string, unknown> } | undefined)?.content;
        if (!content) missing.push(`${method.toUpperCase()} ${path}`);
      }
    }
    // Routes that answer with a redirect, a page or a file the browser saves are described by
    // their summary; every other route names its response class.
    expect(missing.sort()).toEqual([
      'GET /api/auth/saml/login',
      'GET /api/auth/saml/metadata',
      'GET /api/auth/saml/slo',
      'POST /api/auth/saml/acs',
    ]);
  });

  it('names the enums the web reads (roles, statuses, severities)', () => {
    expect(Object.keys(document.components?.schemas ?? {})).toEqual(
      expect.arrayContaining([
        'Role',
        'UserStatus',
        'SubmissionStatus',
        'QuarterStatus',
        'IssueSeverity',
        'CoverageState',
        'AuditOutcome',
        'SessionEnd',
      ]),
    );
  });
});
