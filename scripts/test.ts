/**
 * `npm test`: every check Cairn has, from a fresh clone.
 *
 * Ensures npm dependencies (bootstrap.mjs), Debian's mariadb-server and
 * chromium, starts the disposable test MariaDB (never the demo data), builds
 * what the suites need, then runs in turn:
 *
 *   lint        ESLint over the workspace                 checks: each passes or fails on its
 *   format      Prettier: every file formatted           own line, listing what failed
 *   typecheck   tsc --noEmit per project
 *   metrics     vitest in packages/metrics                tests: counted one by one from each
 *   web         vitest in packages/web                    runner's JSON report
 *   api         jest in packages/api, e2e against MariaDB
 *   tests       vitest in tests/: browser suites and the scripts' own tests
 *
 * and ends with the checks' verdict on one line, then `N passed, N failed` counting test cases
 * only (lib/test-summary.ts). A failed check or test makes the exit code 1.
 * Options: --only a,b   run only the named steps;   --skip a,b   skip them.
 */
import { existsSync, mkdirSync, readFileSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { buildIfStale, buildTargets } from './lib/build.ts';
import { loadContext } from './lib/context.ts';
import { ensureDebianPackage } from './lib/debian.ts';
import { fail, log, runMain } from './lib/log.ts';
import { runCapture, runInherit } from './lib/proc.ts';
import { prepareDemoData } from './lib/seed.ts';
import { acquireTestDatabase } from './lib/test-db.ts';
import {
  type CheckResult,
  jestCounts,
  type JestReport,
  listed,
  summarise,
  type TestCounts,
  type TestResult,
  vitestCounts,
  type VitestReport,
} from './lib/test-summary.ts';

const steps = ['lint', 'format', 'typecheck', 'metrics', 'web', 'api', 'tests'] as const;
type Step = (typeof steps)[number];

/** What has run so far: the summary is printed from these even when a set-up step throws. */
const checks: CheckResult[] = [];
const tests: TestResult[] = [];
const started = Date.now();

function parseList(flag: string, args: string[]): Step[] | null {
  const index = args.indexOf(flag);
  if (index < 0) return null;
  const names = (args[index + 1] ?? '').split(',').filter(Boolean);
  for (const name of names) {
    if (!steps.includes(name as Step))
      fail(`${flag}: unknown step "${name}"; steps are ${steps.join(', ')}`);
  }
  return names as Step[];
}

function readJson<T>(file: string): T | null {
  if (!existsSync(file)) return null;
  try {
    return JSON.parse(readFileSync(file, 'utf8')) as T;
  } catch {
    return null;
  }
}

async function main(): Promise<void> {
  const args = process.argv.slice(2);
  const only = parseList('--only', args);
  const skip = parseList('--skip', args) ?? [];
  const selected = steps.filter((s) => (only ? only.includes(s) : true) && !skip.includes(s));

  const ctx = loadContext('test');
  const env: NodeJS.ProcessEnv = { ...ctx.childEnv, FORCE_COLOR: process.stdout.isTTY ? '1' : '0' };
  const results = join(ctx.root, '.test-results');
  rmSync(results, { recursive: true, force: true });
  mkdirSync(results, { recursive: true });

  const needsDb = selected.some((s) => s === 'api' || s === 'tests');
  if (selected.includes('tests')) {
    const chromium = await ensureDebianPackage(
      'chromium',
      'chromium',
      'the browser tests drive it headless',
    );
    env.CAIRN_CHROMIUM = chromium;
  }

  if (selected.some((s) => s === 'api' || s === 'tests')) {
    // The report checks read the text of the PDFs Cairn makes with poppler's pdftotext.
    await ensureDebianPackage(
      'pdftotext',
      'poppler-utils',
      'the report checks read PDF text with it',
    );
  }

  const needsBuild = selected.some((s) => s !== 'lint' && s !== 'format');
  if (needsBuild) {
    // The API and web import @cairn/metrics from its build; browser tests run the built API and web.
    buildIfStale(ctx.root, buildTargets[0]!);
    if (selected.includes('tests'))
      for (const target of buildTargets.slice(1)) buildIfStale(ctx.root, target);
  }
  if (selected.includes('tests')) prepareDemoData(ctx.root);

  const database = needsDb ? await acquireTestDatabase(ctx) : null;
  const bin = (name: string) => join(ctx.root, 'node_modules', '.bin', name);
  const announce = (step: Step) => {
    console.log('');
    log.step(`── ${step} ──`);
  };

  const check = async (step: Step, run: () => Promise<{ ok: boolean; detail: string }>) => {
    if (!selected.includes(step)) return;
    announce(step);
    const t0 = Date.now();
    const outcome = await run();
    checks.push({ step, seconds: (Date.now() - t0) / 1000, ...outcome });
  };

  const testStep = async (step: Step, run: () => Promise<TestCounts>) => {
    if (!selected.includes(step)) return;
    announce(step);
    const t0 = Date.now();
    const outcome = await run();
    tests.push({ step, seconds: (Date.now() - t0) / 1000, ...outcome });
  };

  const vitest = (step: Step, cwd: string, extra: string[] = []) =>
    testStep(step, async () => {
      const report = join(results, `${step}.json`);
      const code = await runInherit(
        bin('vitest'),
        ['run', ...extra, '--reporter=default', '--reporter=json', `--outputFile.json=${report}`],
        { cwd, env },
      );
      return vitestCounts(readJson<VitestReport>(report), code);
    });

  try {
    await check('lint', async () => {
      const report = join(results, 'eslint.json');
      const code = await runInherit(
        bin('eslint'),
        ['--max-warnings', '0', '-f', 'json', '-o', report, '.'],
        { cwd: ctx.root, env },
      );
      const json = readJson<
        {
          filePath: string;
          errorCount: number;
          warningCount: number;
          messages: { line: number; column: number; message: string; ruleId: string | null }[];
        }[]
      >(report);
      if (!json) return { ok: false, detail: `eslint exited ${code} without a report` };
      const relative = (file: string) => file.slice(ctx.root.length + 1);
      const bad = json.filter((f) => f.errorCount + f.warningCount > 0);
      for (const file of bad) {
        for (const m of file.messages)
          console.log(
            `  ${relative(file.filePath)}:${m.line}:${m.column}  ${m.message}  (${m.ruleId ?? 'parse'})`,
          );
      }
      if (bad.length > 0) {
        return {
          ok: false,
          detail: `${bad.length} of ${json.length} files with problems: ${listed(bad.map((f) => relative(f.filePath)))}`,
        };
      }
      if (code !== 0) return { ok: false, detail: `eslint exited ${code}` };
      return { ok: true, detail: `${json.length} files` };
    });

    await check('format', async () => {
      // --list-different prints each file that is not formatted; syntax errors go to stderr.
      const { code, stdout } = await runCapture(bin('prettier'), ['--list-different', '.'], {
        cwd: ctx.root,
        env: { ...env, FORCE_COLOR: '0' },
      });
      const files = stdout.split('\n').filter(Boolean);
      for (const file of files) console.log(`  not formatted: ${file}`);
      if (files.length > 0) {
        return {
          ok: false,
          detail: `${files.length} file(s) not formatted (npm run format fixes them): ${listed(files)}`,
        };
      }
      if (code !== 0) return { ok: false, detail: `prettier exited ${code} (see above)` };
      return { ok: true, detail: 'every file formatted' };
    });

    await check('typecheck', async () => {
      const projects = ['packages/metrics', 'packages/api', 'packages/web', 'scripts', 'tests'];
      const failedProjects: string[] = [];
      for (const project of projects) {
        const code = await runInherit(bin('tsc'), ['-p', project, '--noEmit', '--pretty'], {
          cwd: ctx.root,
          env,
        });
        if (code !== 0) failedProjects.push(project);
      }
      return failedProjects.length === 0
        ? { ok: true, detail: `${projects.length} projects` }
        : {
            ok: false,
            detail: `${failedProjects.length} of ${projects.length} projects with errors: ${failedProjects.join(', ')}`,
          };
    });

    await vitest('metrics', join(ctx.root, 'packages', 'metrics'));
    await vitest('web', join(ctx.root, 'packages', 'web'));

    await testStep('api', async () => {
      const report = join(results, 'api.json');
      const code = await runInherit(bin('jest'), ['--json', `--outputFile=${report}`], {
        cwd: join(ctx.root, 'packages', 'api'),
        env: {
          ...env,
          NODE_OPTIONS: [
            env.NODE_OPTIONS,
            '--experimental-vm-modules',
            '--no-warnings=ExperimentalWarning',
          ]
            .filter(Boolean)
            .join(' '),
        },
      });
      return jestCounts(readJson<JestReport>(report), code);
    });

    await vitest('tests', join(ctx.root, 'tests'));
  } finally {
    await database?.release();
  }
}

function printSummary(): 0 | 1 {
  const { lines, exitCode } = summarise(checks, tests, (Date.now() - started) / 1000);
  console.log('');
  log.step('── summary ──');
  for (const line of lines) console.log(line);
  return exitCode;
}

runMain(async () => {
  try {
    await main();
  } catch (error) {
    // A set-up failure is a failure too: counted as one failed test, after what did run.
    log.error((error as Error).message);
    tests.push({
      step: 'set-up',
      passed: 0,
      failed: 1,
      skipped: 0,
      seconds: 0,
      note: 'see the error above',
    });
  }
  process.exitCode = printSummary();
});
