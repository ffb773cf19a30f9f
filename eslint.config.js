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

// Raw SQL on a table is written only in the modules that own it (the migrations, the schema's
// author, excepted). A SQL text naming another module's table after FROM, JOIN, INTO, UPDATE
// or TABLE is refused: ask the owner's service (command-line code: the owner's command-line.ts).
export const tableOwners = {
  regions: ['organisations'],
  localities: ['organisations'],
  practices: ['organisations'],
  users: ['users'],
  memberships: ['users'],
  sessions: ['auth'],
  saml_requests: ['auth'],
  auth_throttle: ['auth'],
  audit_events: ['audit-trail'],
  audit_quarters: ['quarters'],
  measure_sets: ['measure-sets'],
  submissions: ['submissions'],
  practice_quarters: ['submissions'],
  extract_file_chunks: ['submissions'],
  submission_issues: ['submissions'],
  submission_rejected_rows: ['submissions'],
  submission_sums: ['submissions'],
  quarter_current_sets: ['submissions'],
  benchmark_results: ['benchmarks'],
  benchmark_answers: ['benchmarks'],
  benchmark_upkeep: ['benchmarks'],
  reports: ['reports'],
  // Staged by the submissions module through the bulk-load plumbing (src/database/bulk-load).
  care_records: ['submissions', 'database'],
  schema_migrations: ['database'],
  outbox_batches: ['mail'],
  outbox_messages: ['mail'],
  mail_extra_recipients: ['mail'],
  mail_schedule: ['mail'],
  // ── review cases ──
  review_cases: ['review-cases'],
  review_case_entries: ['review-cases'],
  review_case_files: ['review-cases'],
  review_case_file_chunks: ['review-cases'],
  // ── digests ──
  digest_schedules: ['digests'],
};

const sqlTouching = (tables) =>
  `/\\b(FROM|JOIN|INTO|UPDATE|TABLE)\\s+\`?(${tables.join('|')})\\b/i`;

const foreignSql = (module) => {
  const tables = Object.entries(tableOwners)
    .filter(([, owners]) => !owners.includes(module))
    .map(([table]) => table);
  const message =
    "SQL on another module's table: call the owning module's service instead (see tableOwners in eslint.config.js).";
  return [
    { selector: `Literal[value=${sqlTouching(tables)}]`, message },
    { selector: `TemplateElement[value.raw=${sqlTouching(tables)}]`, message },
  ];
};

const apiBoundaries = apiModules.flatMap((module) => [
  {
    files: [`packages/api/src/${module}/**/*.ts`],
    ignores: ['packages/api/src/database/migrations/**'],
    rules: {
      'no-restricted-imports': ['error', { patterns: otherModulesData(module) }],
      'no-restricted-syntax': ['error', ...foreignSql(module)],
    },
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
