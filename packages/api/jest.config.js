// Jest for @cairn/api: ESM TypeScript through SWC (decorator metadata on),
// e2e suites in test/ against the private test MariaDB, unit specs beside sources.
/** @type {import('jest').Config} */
export default {
  rootDir: '.',
  testEnvironment: 'node',
  testMatch: ['<rootDir>/test/**/*.e2e-spec.ts', '<rootDir>/src/**/*.spec.ts'],
  extensionsToTreatAsEsm: ['.ts'],
  moduleNameMapper: {
    '^(\\.{1,2}/.*)\\.js$': '$1',
    // CommonJS packages that require ESM-only NestJS: served as ESM (test/support/esm-interop).
    '^@nestjs/throttler$': '<rootDir>/test/support/esm-interop/nestjs-throttler.mjs',
  },
  transform: {
    'esm-interop/nestjs-throttler\\.mjs$':
      '<rootDir>/test/support/esm-interop/cjs-package-to-esm.js',
    '^.+\\.ts$': [
      '@swc/jest',
      {
        jsc: {
          parser: { syntax: 'typescript', decorators: true },
          transform: {
            legacyDecorator: true,
            decoratorMetadata: true,
            useDefineForClassFields: false,
          },
          target: 'es2022',
        },
        module: { type: 'es6' },
        sourceMaps: 'inline',
      },
    ],
  },
  testTimeout: 60_000,
  maxWorkers: 2,
  setupFiles: ['<rootDir>/test/support/env.ts'],
};
