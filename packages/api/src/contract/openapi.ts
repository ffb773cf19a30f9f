/**
 * The API's contract: the OpenAPI document (served at /api/docs) and the
 * TypeScript types the web is generated from. The document comes from the
 * controllers' and DTO classes' decorators alone, so it can be built without
 * a database or a listening server, from a preview-mode application (Nest
 * builds the module graph but instantiates no provider).
 *
 * Committed copies live in packages/web/src/lib/api/ (openapi.json, schema.ts;
 * see render.ts): `npm run api:contract` rewrites them and contract.spec.ts
 * fails when they are stale.
 */
import type { INestApplication } from '@nestjs/common';
import { NestFactory } from '@nestjs/core';
import { DocumentBuilder, type OpenAPIObject, SwaggerModule } from '@nestjs/swagger';
import { AppModule } from '../app.module.js';
import type { CairnSecrets } from '../config/config.schema.js';
import { loadConfig } from '../config/load-config.js';
import { version } from '../version.js';

/** The OpenAPI document of an application whose global prefix is set. */
export function describeApi(app: INestApplication): OpenAPIObject {
  return SwaggerModule.createDocument(
    app,
    new DocumentBuilder()
      .setTitle('Cairn API')
      .setDescription(
        'Quarterly diabetes care audit and peer benchmarking. Errors are RFC 9457 problem details.',
      )
      .setVersion(version)
      .build(),
  );
}

/** Placeholders: a preview application opens no connection and reads no secret. */
const PREVIEW_SECRETS = {
  CAIRN_DATABASE_PASSWORD: 'preview-only-not-a-secret',
  CAIRN_SESSION_SECRET: 'preview-only-not-a-secret-preview-only-not-a-secret',
  CAIRN_PSEUDONYM_SECRET: 'preview-only-not-a-secret-preview-only-not-a-secret',
} as CairnSecrets;

/** The document as the app serves it, built without a database (config/default.json only). */
export async function buildOpenApiDocument(): Promise<OpenAPIObject> {
  const config = loadConfig({ profile: 'development', env: {} });
  const app = await NestFactory.create(AppModule.forRoot({ config, secrets: PREVIEW_SECRETS }), {
    preview: true,
    logger: false,
    abortOnError: false,
  });
  try {
    app.setGlobalPrefix('api');
    return describeApi(app);
  } finally {
    await app.close();
  }
}
