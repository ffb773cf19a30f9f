/**
 * Writes the committed contract files (packages/web/src/lib/api/openapi.json and schema.ts).
 * Run through `npm run api:contract`, which builds the API first (the document needs the
 * decorator metadata that tsc emits).
 */
import 'reflect-metadata';
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { buildOpenApiDocument } from './openapi.js';
import { contractDir, renderContract } from './render.js';

const files = await renderContract(await buildOpenApiDocument());
for (const [name, text] of Object.entries(files)) {
  const path = join(contractDir(), name);
  writeFileSync(path, text);
  console.log(`wrote ${path}`);
}
