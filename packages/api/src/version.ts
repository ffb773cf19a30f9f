import { readFileSync } from 'node:fs';

/** The API package's version (src/ and dist/ both sit one level below package.json). */
export const version: string = (
  JSON.parse(readFileSync(new URL('../package.json', import.meta.url), 'utf8')) as {
    version: string;
  }
).version;
