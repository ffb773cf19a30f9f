import { describe, expect, it } from 'vitest';
import {
  type CheckResult,
  jestCounts,
  type JestReport,
  listed,
  summarise,
  type TestResult,
  vitestCounts,
  type VitestReport,
} from '../../scripts/lib/test-summary.ts';

const vitestReport = (over: Partial<VitestReport> = {}): VitestReport => ({
  numPassedTests: 40,
  numFailedTests: 0,
  numPendingTests: 0,
  testResults: [{ status: 'passed', assertionResults: [{}, {}] }],
  ...over,
});

const jestReport = (over: Partial<JestReport> = {}): JestReport => ({
  numPassedTests: 230,
  numFailedTests: 0,
  numPendingTests: 0,
  numTodoTests: 0,
  numRuntimeErrorTestSuites: 0,
  ...over,
});

const check = (step: string, ok: boolean, detail = ok ? 'fine' : 'broken'): CheckResult => ({
  step,
  ok,
  detail,
  seconds: 1,
});

const test = (step: string, passed: number, failed = 0): TestResult => ({
  step,
  passed,
  failed,
  skipped: 0,
  seconds: 2,
});

describe('vitestCounts', () => {
  it('takes the passed, failed and skipped test cases from the report', () => {
    expect(
      vitestCounts(
        vitestReport({ numFailedTests: 2, numPendingTests: 1, numTodoTests: 3, numPassedTests: 9 }),
        1,
      ),
    ).toEqual({ passed: 9, failed: 2, skipped: 4 });
  });

  it('counts a file that failed to load as one failed test', () => {
    const counts = vitestCounts(
      vitestReport({
        testResults: [
          { status: 'passed', assertionResults: [{}] },
          { status: 'failed', assertionResults: [] },
        ],
      }),
      1,
    );
    expect(counts).toMatchObject({ passed: 40, failed: 1, note: '1 file(s) failed to load' });
  });

  it('counts a runner without a report, or failing without a failed test, as one failure', () => {
    expect(vitestCounts(null, 137)).toEqual({
      passed: 0,
      failed: 1,
      skipped: 0,
      note: 'vitest exited 137 without a report',
    });
    expect(vitestCounts(vitestReport(), 1).failed).toBe(1);
    expect(vitestCounts(vitestReport(), 0).failed).toBe(0);
  });
});

describe('jestCounts', () => {
  it('adds suites that failed to run to the failed tests', () => {
    expect(jestCounts(jestReport({ numFailedTests: 1, numRuntimeErrorTestSuites: 2 }), 1)).toEqual({
      passed: 230,
      failed: 3,
      skipped: 0,
      note: '2 suite(s) failed to run',
    });
    expect(jestCounts(jestReport({ numPendingTests: 2, numTodoTests: 1 }), 0)).toEqual({
      passed: 230,
      failed: 0,
      skipped: 3,
    });
  });

  it('counts a runner without a report, or failing without a failed test, as one failure', () => {
    expect(jestCounts(null, 1)).toMatchObject({ passed: 0, failed: 1 });
    expect(jestCounts(jestReport(), 1).failed).toBe(1);
  });
});

describe('summarise', () => {
  it('counts only test cases in the final line, which comes last', () => {
    const { lines, exitCode } = summarise(
      [check('lint', true, '329 files'), check('format', true), check('typecheck', true)],
      [test('metrics', 261), test('web', 43), test('api', 231), test('tests', 15)],
      300,
    );
    expect(lines.at(-1)).toBe('550 passed, 0 failed');
    expect(lines.at(-2)).toBe('checks passed: lint, format, typecheck');
    expect(lines).toContainEqual(expect.stringMatching(/^ {2}ok {3}lint .* s {2}329 files$/));
    expect(exitCode).toBe(0);
  });

  it('names a failed check just above the final line and fails, even when every test passed', () => {
    const { lines, exitCode } = summarise(
      [
        check('lint', true),
        check('format', false, '2 file(s) not formatted: a.ts, b.md'),
        check('typecheck', true),
      ],
      [test('metrics', 261)],
      60,
    );
    expect(lines.at(-1)).toBe('261 passed, 0 failed');
    expect(lines.at(-2)).toBe(
      'checks FAILED: format (see above), so npm test fails; the line below counts test cases only',
    );
    expect(exitCode).toBe(1);
  });

  it('fails on a failed test, and when nothing was run at all', () => {
    expect(summarise([], [test('api', 230, 1)], 10)).toMatchObject({ exitCode: 1 });
    const nothing = summarise([], [], 0);
    expect(nothing.exitCode).toBe(1);
    expect(nothing.lines.slice(-2)).toEqual([
      'nothing was run: --only and --skip left no step',
      '0 passed, 0 failed',
    ]);
  });

  it('passes with checks alone, and says when the checks were not run', () => {
    expect(summarise([check('lint', true)], [], 5)).toMatchObject({ exitCode: 0 });
    expect(summarise([], [test('web', 43)], 5).lines.at(-2)).toBe(
      'checks not run (lint, format, typecheck)',
    );
  });
});

describe('listed', () => {
  it('lists up to eight names, then how many more', () => {
    expect(listed(['a', 'b'])).toBe('a, b');
    expect(listed(['a', 'b', 'c'], 2)).toBe('a, b and 1 more');
  });
});
