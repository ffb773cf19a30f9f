/**
 * The module boundaries in eslint.config.js fire: each case is a snippet linted as if it were
 * a file at that path (ESLint's Node API; nothing is written).
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
    .filter((m) => m.ruleId === 'no-restricted-imports')
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
