/**
 * How `npm test` reports. Lint, format and typecheck are checks: each passes or fails on its own
 * line. The final line, `N passed, N failed`, counts test cases only, summed from the runners'
 * JSON reports. A runner that dies without a report, or a test file that fails to load, counts as
 * one failed test, so that a broken suite can never read as green. A failed check makes the exit
 * code non-zero and is named on the line just above the final one.
 */

/** The fields of vitest's JSON reporter that the summary reads. */
export interface VitestReport {
  numPassedTests: number;
  numFailedTests: number;
  numPendingTests: number;
  numTodoTests?: number;
  testResults: { status: string; assertionResults: unknown[] }[];
}

/** The fields of jest's `--json` report that the summary reads. */
export interface JestReport {
  numPassedTests: number;
  numFailedTests: number;
  numPendingTests: number;
  numTodoTests: number;
  numRuntimeErrorTestSuites: number;
}

export interface TestCounts {
  passed: number;
  failed: number;
  skipped: number;
  note?: string;
}

/**
 * The failures a runner reported, plus one when it exited non-zero without reporting any (so
 * that a runner that failed for a reason outside its tests still counts as a failure).
 */
function withExitCode(failed: number, exitCode: number): number {
  return failed + (exitCode !== 0 && failed === 0 ? 1 : 0);
}

/** Test cases of one vitest run; `report` is null when the runner wrote none. */
export function vitestCounts(report: VitestReport | null, exitCode: number): TestCounts {
  if (report === null) {
    return { passed: 0, failed: 1, skipped: 0, note: `vitest exited ${exitCode} without a report` };
  }
  // A file that fails to load has no test results of its own: one failure each.
  const brokenFiles = report.testResults.filter(
    (file) => file.status === 'failed' && file.assertionResults.length === 0,
  ).length;
  return {
    passed: report.numPassedTests,
    failed: withExitCode(report.numFailedTests + brokenFiles, exitCode),
    skipped: report.numPendingTests + (report.numTodoTests ?? 0),
    ...(brokenFiles ? { note: `${brokenFiles} file(s) failed to load` } : {}),
  };
}

/** Test cases of one jest run; `report` is null when the runner wrote none. */
export function jestCounts(report: JestReport | null, exitCode: number): TestCounts {
  if (report === null) {
    return { passed: 0, failed: 1, skipped: 0, note: `jest exited ${exitCode} without a report` };
  }
  const broken = report.numRuntimeErrorTestSuites;
  return {
    passed: report.numPassedTests,
    failed: withExitCode(report.numFailedTests + broken, exitCode),
    skipped: report.numPendingTests + report.numTodoTests,
    ...(broken ? { note: `${broken} suite(s) failed to run` } : {}),
  };
}

/** One check (lint, format, typecheck): it passed or it did not, and why. */
export interface CheckResult {
  step: string;
  ok: boolean;
  /** e.g. "329 files", or "2 files not formatted: a.ts, b.md" */
  detail: string;
  seconds: number;
}

/** One test step (a runner): its test cases. */
export interface TestResult extends TestCounts {
  step: string;
  seconds: number;
}

/** Up to `limit` names, then how many more. */
export function listed(names: readonly string[], limit = 8): string {
  if (names.length <= limit) return names.join(', ');
  return `${names.slice(0, limit).join(', ')} and ${names.length - limit} more`;
}

export interface Summary {
  /** Every line to print, the final `N passed, N failed` last. */
  lines: string[];
  exitCode: 0 | 1;
}

/**
 * The summary block: one line per check and per test step, the total time, the checks' verdict,
 * and the final line counting test cases only. The exit code is 1 when a check failed, a test
 * failed, or nothing was run at all.
 */
export function summarise(
  checks: readonly CheckResult[],
  tests: readonly TestResult[],
  totalSeconds: number,
): Summary {
  const seconds = (s: number) => `${s.toFixed(1).padStart(6)} s`;
  const lines: string[] = [];
  for (const c of checks) {
    lines.push(
      `  ${c.ok ? 'ok  ' : 'FAIL'} ${c.step.padEnd(10)} ${seconds(c.seconds)}  ${c.detail}`,
    );
  }
  for (const t of tests) {
    lines.push(
      `  ${t.failed > 0 ? 'FAIL' : 'ok  '} ${t.step.padEnd(10)} ${String(t.passed).padStart(5)} passed ${String(t.failed).padStart(4)} failed` +
        `${t.skipped ? ` ${t.skipped} skipped` : ''}  ${seconds(t.seconds)}${t.note ? `  (${t.note})` : ''}`,
    );
  }
  lines.push(`  total time ${totalSeconds.toFixed(0)} s`);

  const failedChecks = checks.filter((c) => !c.ok);
  const passed = tests.reduce((n, t) => n + t.passed, 0);
  const failed = tests.reduce((n, t) => n + t.failed, 0);
  const nothingRun = checks.length === 0 && tests.length === 0;
  if (nothingRun) {
    lines.push('nothing was run: --only and --skip left no step');
  } else if (checks.length === 0) {
    lines.push('checks not run (lint, format, typecheck)');
  } else if (failedChecks.length === 0) {
    lines.push(`checks passed: ${checks.map((c) => c.step).join(', ')}`);
  } else {
    lines.push(
      `checks FAILED: ${failedChecks.map((c) => c.step).join(', ')} (see above), so npm test fails; ` +
        'the line below counts test cases only',
    );
  }
  lines.push(`${passed} passed, ${failed} failed`);
  return { lines, exitCode: nothingRun || failedChecks.length > 0 || failed > 0 ? 1 : 0 };
}
