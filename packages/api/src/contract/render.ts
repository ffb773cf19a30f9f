/** Renders the committed contract files: the OpenAPI document and the types generated from it. */
import { join } from 'node:path';
import type { OpenAPIObject } from '@nestjs/swagger';
import openapiTS, { astToString } from 'openapi-typescript';
import { format, resolveConfig } from 'prettier';
import { findRepoRoot } from '../config/load-config.js';

export const contractDir = () => join(findRepoRoot(), 'packages', 'web', 'src', 'lib', 'api');

const HEADER = `/**
 * Cairn's API types, generated from its OpenAPI document (openapi.json beside this file)
 * by openapi-typescript. Do not edit: change the API's DTO classes, then run
 * \`npm run api:contract\`.
 */

`;

/**
 * The two committed files: the document, and the types generated from it, both formatted as
 * Prettier formats the repository (so formatting them again changes nothing).
 */
export async function renderContract(document: OpenAPIObject) {
  const dir = contractDir();
  const options = { ...(await resolveConfig(join(dir, 'schema.ts'))) };
  const json = JSON.stringify(document);
  const ast = await openapiTS(JSON.parse(json) as Parameters<typeof openapiTS>[0], {
    enumValues: true,
  });
  return {
    'openapi.json': await format(json, { ...options, filepath: join(dir, 'openapi.json') }),
    'schema.ts': await format(HEADER + astToString(ast), {
      ...options,
      filepath: join(dir, 'schema.ts'),
    }),
  };
}
