/**
 * Jest transformer: serves a CommonJS package that requires ESM-only NestJS
 * (@nestjs/throttler 6 requires @nestjs/common 12) as an ES module. Jest 30
 * below Node 24.9 cannot require() ESM, while Node itself (and so the built
 * API) can. esbuild bundles the package's own files into one ES module whose
 * `require` of @nestjs/common / @nestjs/core is answered by real `import`s,
 * so the package shares Jest's NestJS instance (same Reflector, same classes).
 * Used only through jest.config.js (moduleNameMapper + transform).
 */
import { createHash } from 'node:crypto';
import { createRequire } from 'node:module';
import { readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { buildSync } from 'esbuild';

const require = createRequire(import.meta.url);
const PACKAGE = '@nestjs/throttler';
const ESM_PEERS = ['@nestjs/common', '@nestjs/core'];

function packageFiles() {
  const entry = require.resolve(PACKAGE);
  const manifest = join(dirname(entry), '..', 'package.json');
  return { entry, version: JSON.parse(readFileSync(manifest, 'utf8')).version };
}

export default {
  getCacheKey(source) {
    const { version } = packageFiles();
    return createHash('sha256').update(`${PACKAGE}@${version}\0${source}\0v1`).digest('hex');
  },
  process() {
    const { entry } = packageFiles();
    // Node itself can load the package (require of ESM works in Node 20.19+): read its export names.
    const names = Object.keys(require(PACKAGE)).filter(
      (n) => n !== 'default' && n !== '__esModule',
    );
    const result = buildSync({
      stdin: {
        contents:
          `import * as mod from ${JSON.stringify(entry)};\n` +
          names.map((n) => `export const ${n} = mod.${n};`).join('\n'),
        resolveDir: dirname(entry),
        loader: 'js',
      },
      bundle: true,
      format: 'esm',
      platform: 'node',
      target: 'node20',
      external: [...ESM_PEERS, 'reflect-metadata'],
      write: false,
      banner: {
        js: [
          ...ESM_PEERS.map((p, i) => `import * as __peer${i} from ${JSON.stringify(p)};`),
          "import { createRequire as __createRequire } from 'node:module';",
          'const __nodeRequire = __createRequire(import.meta.url);',
          `const __peers = { ${ESM_PEERS.map((p, i) => `${JSON.stringify(p)}: __peer${i}`).join(', ')} };`,
          'const require = (id) => __peers[id] ?? __nodeRequire(id);',
        ].join('\n'),
      },
    });
    return { code: result.outputFiles[0].text };
  },
};
