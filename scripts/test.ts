/**
 * `npm test`: every check Cairn has, from a fresh clone.
 *
 * Ensures npm dependencies (bootstrap.mjs), Debian's mariadb-server and
 * chromium, starts the disposable test MariaDB (never the demo data), builds
 * what the suites need, then runs in turn:
 *
 *   lint        ESLint over the workspace (one check per file, from its JSON report)
 *   format      Prettier --check (one check)
 *   typecheck   tsc --noEmit per project (one check per project)
 *   metrics     vitest in packages/metrics (JSON report)
 *   web         vitest in packages/web (JSON report)
 *   api         jest in packages/api, e2e against MariaDB (JSON report)
 *   tests       vitest in tests/: reference and browser suites (JSON report)
 *
 * and ends with one line, `N passed, N failed`, summed from those reports.
 * Options: --only a,b   run only the named steps;   --skip a,b   skip them.
 */
import { existsSync, mkdirSync, readFileSync, rmSync } from 'node:fs';
import { join } from 'node:path';
import { buildIfStale, buildTargets } from './lib/build.ts';
import { loadContext } from './lib/context.ts';
import { ensureDebianPackage } from './lib/debian.ts';
import { fail, log, runMain } from './lib/log.ts';
import { runInherit } from './lib/proc.ts';
import { prepareDemoData } from './lib/seed.ts';
import { acquireTestDatabase } from './lib/test-db.ts';

interface StepResult {
  step: string;
  passed: number;
  failed: number;
  skipped: number;
  seconds: number;
  note?: string;
}

const steps = ['lint', 'format', 'typecheck', 'metrics', 'web', 'api', 'tests'] as const;
type Step = (typeof steps)[number];

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

interface VitestReport {
  numPassedTests: number;
  numFailedTests: number;
  numPendingTests: number;
  numTodoTests?: number;
  numFailedTestSuites: number;
  testResults: { status: string; message?: string; assertionResults: unknown[]; name: string }[];
}

interface JestReport {
  numPassedTests: number;
  numFailedTests: number;
  numPendingTests: number;
  numTodoTests: number;
  numRuntimeErrorTestSuites: number;
  success: boolean;
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
  const started = Date.now();
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

  const needsBuild = selected.some((s) => s !== 'lint' && s !== 'format');
  if (needsBuild) {
    // The API and web import @cairn/metrics from its build; browser tests run the built API and web.
    buildIfStale(ctx.root, buildTargets[0]!);
    if (selected.includes('tests'))
      for (const target of buildTargets.slice(1)) buildIfStale(ctx.root, target);
  }
  if (selected.includes('tests')) prepareDemoData(ctx.root);

  const database = needsDb ? await acquireTestDatabase(ctx) : null;
  const outcomes: StepResult[] = [];
  const bin = (name: string) => join(ctx.root, 'node_modules', '.bin', name);

  const timed = async (step: Step, run: () => Promise<Omit<StepResult, 'step' | 'seconds'>>) => {
    if (!selected.includes(step)) return;
    console.log('');
    log.step(`── ${step} ──`);
    const t0 = Date.now();
    const outcome = await run();
    outcomes.push({ step, seconds: (Date.now() - t0) / 1000, ...outcome });
  };

  const vitest = (step: Step, cwd: string, extra: string[] = []) =>
    timed(step, async () => {
      const report = join(results, `${step}.json`);
      const code = await runInherit(
        bin('vitest'),
        ['run', ...extra, '--reporter=default', '--reporter=json', `--outputFile.json=${report}`],
        { cwd, env },
      );
      const json = readJson<VitestReport>(report);
      if (!json)
        return { passed: 0, failed: 1, skipped: 0, note: `vitest exited ${code} without a report` };
      // A file that fails to load has no test results: count it as a failure.
      const brokenFiles = json.testResults.filter(
        (r) => r.status === 'failed' && r.assertionResults.length === 0,
      ).length;
      return {
        passed: json.numPassedTests,
        failed:
          json.numFailedTests +
          brokenFiles +
          (code !== 0 && json.numFailedTests + brokenFiles === 0 ? 1 : 0),
        skipped: json.numPendingTests + (json.numTodoTests ?? 0),
        ...(brokenFiles ? { note: `${brokenFiles} file(s) failed to load` } : {}),
      };
    });

  try {
    await timed('lint', async () => {
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
      if (!json)
        return { passed: 0, failed: 1, skipped: 0, note: `eslint exited ${code} without a report` };
      const bad = json.filter((f) => f.errorCount + f.warningCount > 0);
      for (const file of bad) {
        for (const m of file.messages)
          console.log(
            `  ${file.filePath.slice(ctx.root.length + 1)}:${m.line}:${m.column}  ${m.message}  (${m.ruleId ?? 'parse'})`,
          );
      }
      return {
        passed: json.length - bad.length,
        failed: bad.length,
        skipped: 0,
        note: `${json.length} files`,
      };
    });

    await timed('format', async () => {
      const code = await runInherit(bin('prettier'), ['--check', '--log-level', 'warn', '.'], {
        cwd: ctx.root,
        env,
      });
      return code === 0
        ? { passed: 1, failed: 0, skipped: 0 }
        : {
            passed: 0,
            failed: 1,
            skipped: 0,
            note: 'run `npm run format` to fix the files listed above',
          };
    });

    await timed('typecheck', async () => {
      const projects = ['packages/metrics', 'packages/api', 'packages/web', 'scripts', 'tests'];
      let passed = 0;
      const failedProjects: string[] = [];
      for (const project of projects) {
        const code = await runInherit(bin('tsc'), ['-p', project, '--noEmit', '--pretty'], {
          cwd: ctx.root,
          env,
        });
        if (code === 0) passed++;
        else failedProjects.push(project);
      }
      return {
        passed,
        failed: failedProjects.length,
        skipped: 0,
        ...(failedProjects.length ? { note: failedProjects.join(', ') } : {}),
      };
    });

    await vitest('metrics', join(ctx.root, 'packages', 'metrics'));
    await vitest('web', join(ctx.root, 'packages', 'web'));

    await timed('api', async () => {
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
      const json = readJson<JestReport>(report);
      if (!json)
        return { passed: 0, failed: 1, skipped: 0, note: `jest exited ${code} without a report` };
      const broken = json.numRuntimeErrorTestSuites;
      return {
        passed: json.numPassedTests,
        failed:
          json.numFailedTests + broken + (code !== 0 && json.numFailedTests + broken === 0 ? 1 : 0),
        skipped: json.numPendingTests + json.numTodoTests,
        ...(broken ? { note: `${broken} suite(s) failed to run` } : {}),
      };
    });

    await vitest('tests', join(ctx.root, 'tests'));
  } finally {
    await database?.release();
  }

  const totalPassed = outcomes.reduce((n, o) => n + o.passed, 0);
  const totalFailed = outcomes.reduce((n, o) => n + o.failed, 0);
  console.log('');
  log.step('── summary ──');
  for (const o of outcomes) {
    const mark = o.failed > 0 ? 'FAIL' : 'ok  ';
    console.log(
      `  ${mark} ${o.step.padEnd(10)} ${String(o.passed).padStart(5)} passed ${String(o.failed).padStart(4)} failed` +
        `${o.skipped ? ` ${o.skipped} skipped` : ''}  ${o.seconds.toFixed(1).padStart(6)} s${o.note ? `  (${o.note})` : ''}`,
    );
  }
  console.log(`  total time ${((Date.now() - started) / 1000).toFixed(0)} s`);
  console.log(`${totalPassed} passed, ${totalFailed} failed`);
  process.exitCode = totalFailed > 0 || outcomes.length === 0 ? 1 : 0;
}

runMain(async () => {
  try {
    await main();
  } catch (error) {
    // A set-up failure is a failure too: say so on the summary line.
    log.error((error as Error).message);
    console.log('0 passed, 1 failed');
    process.exit(1);
  }
});
