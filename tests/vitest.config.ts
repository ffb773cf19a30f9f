import { defineConfig } from 'vitest/config';

// Cross-package suites: reference/ (published check values), lint/ (the module
// boundaries of eslint.config.js), browser/ (headless Chromium against the built
// app) and scripts/ (the orchestration scripts' own logic). Browser files run one at a time.
export default defineConfig({
  test: {
    include: [
      'reference/**/*.test.ts',
      'lint/**/*.test.ts',
      'browser/**/*.test.ts',
      'reliability/**/*.test.ts',
      'scripts/**/*.test.ts',
    ],
    environment: 'node',
    testTimeout: 120_000,
    hookTimeout: 300_000,
    fileParallelism: false,
    setupFiles: ['./support/env.ts'],
  },
});
