/**
 * The module boundaries in eslint.config.js fire (imports of another module's models or
 * repository, the database from a controller, another web feature; SQL on another module's
 * table): each case is a snippet linted as if it were a file at that path (ESLint's Node API;
 * nothing is written).
 */
import { ESLint } from 'eslint';
import { beforeAll, describe, expect, it } from 'vitest';
import { repoRoot } from '../support/paths.ts';

let eslint: ESLint;
beforeAll(() => {
  eslint = new ESLint({ cwd: repoRoot });
});

async function restricted(filePath: string, code: string): Promise<string[]> {
  const [result] = await eslint.lintText(code, { filePath });
  return (result?.messages ?? [])
    .filter((m) => m.ruleId === 'no-restricted-imports' || m.ruleId === 'no-restricted-syntax')
    .map((m) => m.message);
}

describe('module boundaries (eslint.config.js)', () => {
  const cases: [string, string, string, RegExp | null][] = [
    [
      "a module importing another module's models",
      'packages/api/src/auth/example.ts',
      "import { User } from '../users/models/user.model.js';\nexport { User };\n",
      /users module owns its tables/,
    ],
    [
      "a module importing another module's repository",
      'packages/api/src/quarters/example.ts',
      "import { SubmissionRepository } from '../submissions/submission.repository.js';\nexport { SubmissionRepository };\n",
      /submissions module owns its tables/,
    ],
    [
      'a controller importing Sequelize',
      'packages/api/src/submissions/example.controller.ts',
      "import { Sequelize } from 'sequelize-typescript';\nexport { Sequelize };\n",
      /Controllers never touch the database/,
    ],
    [
      "a controller importing its own module's repository",
      'packages/api/src/submissions/example.controller.ts',
      "import { SubmissionRepository } from './submission.repository.js';\nexport { SubmissionRepository };\n",
      /Controllers never touch the database/,
    ],
    [
      'a web feature importing another feature',
      'packages/web/src/features/extracts/routes/Example.tsx',
      "import { useUsers } from '../../users/api/users';\nexport { useUsers };\n",
      /never imports another feature \(users\)/,
    ],
    [
      "raw SQL on another module's table",
      'packages/api/src/submissions/example.service.ts',
      "export const sql = 'SELECT region_id FROM practices WHERE id = ?';\n",
      /SQL on another module's table/,
    ],
    [
      "raw SQL on another module's table, in a template",
      'packages/api/src/quarters/example.service.ts',
      'export const sql = (n: number) => `UPDATE submissions SET rows_done = ${n}`;\n',
      /SQL on another module's table/,
    ],
    [
      "raw SQL on the module's own table",
      'packages/api/src/organisations/example.ts',
      "export const sql = 'SELECT id FROM practices WHERE region_id = ?';\n",
      null,
    ],
    [
      "a service importing its own module's models",
      'packages/api/src/users/example.service.ts',
      "import { User } from './models/user.model.js';\nexport { User };\n",
      null,
    ],
    [
      'a web feature importing shared UI',
      'packages/web/src/features/extracts/routes/Example.tsx',
      "import { ProblemCallout } from '../../../components/ProblemCallout';\nexport { ProblemCallout };\n",
      null,
    ],
  ];

  it.each(cases)('%s', async (_name, filePath, code, expected) => {
    const messages = await restricted(filePath, code);
    if (expected === null) expect(messages).toEqual([]);
    else expect(messages).toEqual([expect.stringMatching(expected)]);
  });
});
