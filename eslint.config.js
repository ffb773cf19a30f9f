// ESLint flat config for the whole workspace (typescript-eslint, React hooks for the web),
// and the boundaries between modules (see "Module boundaries" below and DEVELOPERS.md).
import { readdirSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import js from '@eslint/js';
import tseslint from 'typescript-eslint';
import reactHooks from 'eslint-plugin-react-hooks';
import prettier from 'eslint-config-prettier';
import globals from 'globals';

const root = dirname(fileURLToPath(import.meta.url));
const foldersOf = (dir) =>
  readdirSync(join(root, dir), { withFileTypes: true })
    .filter((entry) => entry.isDirectory())
    .map((entry) => entry.name);
const escape = (text) => text.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');

// ── Module boundaries, generated from the folders that exist ──
//
// API: a module's tables are written only by that module (its service, or a repository class);
// another module calls its service. So no file of packages/api/src/<m>/ imports another
// module's models/ or *.repository; and controllers never reach the database (no Sequelize,
// no models, no repository: they call services).
// Web: a feature never imports another feature; what several need lives in src/lib or
// src/components.
export const apiModules = foldersOf('packages/api/src');
export const webFeatures = foldersOf('packages/web/src/features');

const otherModulesData = (module) =>
  apiModules
    .filter((other) => other !== module)
    .map((other) => ({
      regex: `(^|/)${escape(other)}/(.*/)?(models/|[^/]*\\.repository(\\.js)?$)`,
      message: `The ${other} module owns its tables: call its service instead of importing its models or repository.`,
    }));

const controllerData = [
  {
    regex: '^(sequelize|sequelize-typescript|@nestjs/sequelize)$',
    message: 'Controllers never touch the database: inject a service and call it.',
  },
  {
    regex: '(^|/)models/|\\.repository(\\.js)?$',
    message: 'Controllers never touch the database: inject a service and call it.',
  },
];

const apiBoundaries = apiModules.flatMap((module) => [
  {
    files: [`packages/api/src/${module}/**/*.ts`],
    rules: { 'no-restricted-imports': ['error', { patterns: otherModulesData(module) }] },
  },
  {
    files: [`packages/api/src/${module}/**/*.controller.ts`],
    rules: {
      'no-restricted-imports': [
        'error',
        { patterns: [...otherModulesData(module), ...controllerData] },
      ],
    },
  },
]);

const webBoundaries = webFeatures.map((feature) => ({
  files: [`packages/web/src/features/${feature}/**/*.{ts,tsx}`],
  rules: {
    'no-restricted-imports': [
      'error',
      {
        patterns: webFeatures
          .filter((other) => other !== feature)
          .map((other) => ({
            regex: `(^(\\.\\./)+|(^|/)features/)${escape(other)}(/|$)`,
            message: `A feature never imports another feature (${other}): move what both need to src/lib or src/components.`,
          })),
      },
    ],
  },
}));

export default tseslint.config(
  {
    ignores: [
      '**/node_modules/**',
      '**/dist/**',
      '.data/**',
      'seed-data/out/**',
      'tests/artifacts/**',
      '.test-results/**',
      'coverage/**',
    ],
  },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    languageOptions: {
      ecmaVersion: 2023,
      sourceType: 'module',
      globals: { ...globals.node },
    },
    rules: {
      '@typescript-eslint/no-unused-vars': [
        'error',
        { argsIgnorePattern: '^_', varsIgnorePattern: '^_', caughtErrorsIgnorePattern: '^_' },
      ],
      '@typescript-eslint/consistent-type-imports': ['error', { fixStyle: 'inline-type-imports' }],
      eqeqeq: ['error', 'always', { null: 'ignore' }],
      'no-console': 'off',
    },
  },
  {
    // NestJS injects by constructor parameter type: these imports must stay value imports.
    files: ['packages/api/src/**/*.ts', 'packages/api/test/**/*.ts'],
    rules: {
      '@typescript-eslint/consistent-type-imports': 'off',
    },
  },
  {
    files: ['packages/web/**/*.{ts,tsx}'],
    languageOptions: { globals: { ...globals.browser } },
    plugins: { 'react-hooks': reactHooks },
    rules: {
      'react-hooks/rules-of-hooks': 'error',
      'react-hooks/exhaustive-deps': 'error',
    },
  },
  ...apiBoundaries,
  ...webBoundaries,
  prettier,
);
