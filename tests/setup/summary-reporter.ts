// Prints one plain closing line, "Tests: N passed, N failed, N skipped", after vitest's own
// summary, so tools that read a run's last lines (CI) can count the tests in any runner's terms.
// "failed" counts failed tests, plus test files and suites that failed outside a test (a throwing
// beforeAll, an import error), plus vitest's unhandled errors; the line before it gives that
// breakdown. Whenever failed is not 0 the run's exit code is non-zero.
import type { Reporter, SerializedError, TestModule, TestRunEndReason, TestSuite } from 'vitest/node';

/** Counts of one finished run. */
export interface RunCounts {
  passed: number;
  skipped: number;
  failedTests: number;
  failedFiles: number;
  errors: number;
}

function suitesOf(parent: TestModule | TestSuite): TestSuite[] {
  const out: TestSuite[] = [];
  for (const suite of parent.children.suites()) out.push(suite, ...suitesOf(suite));
  return out;
}

/** Counts tests, files/suites failed outside a test, and unhandled errors. */
export function countRun(testModules: ReadonlyArray<TestModule>, unhandledErrors: ReadonlyArray<SerializedError>): RunCounts {
  const counts: RunCounts = { passed: 0, skipped: 0, failedTests: 0, failedFiles: 0, errors: unhandledErrors.length };
  for (const testModule of testModules) {
    let failedHere = 0;
    for (const test of testModule.children.allTests()) {
      const state = test.result().state;
      if (state === 'passed') counts.passed += 1;
      else if (state === 'failed') failedHere += 1;
      else counts.skipped += 1;
    }
    counts.failedTests += failedHere;
    // Errors raised outside a test: the file's own (import, top-level code) and its suites' hooks.
    const outside = testModule.errors().length + suitesOf(testModule).reduce((n, s) => n + s.errors().length, 0);
    if (outside > 0) counts.failedFiles += 1;
    else if (testModule.state() === 'failed' && failedHere === 0) counts.failedFiles += 1;
  }
  return counts;
}

export default class SummaryReporter implements Reporter {
  onTestRunEnd(testModules: ReadonlyArray<TestModule>, unhandledErrors: ReadonlyArray<SerializedError>, _reason: TestRunEndReason): void {
    const c = countRun(testModules, unhandledErrors);
    const failed = c.failedTests + c.failedFiles + c.errors;
    process.stdout.write(`\nFailed: ${c.failedTests} tests, ${c.failedFiles} files, ${c.errors} errors\n`);
    process.stdout.write(`Tests: ${c.passed} passed, ${failed} failed, ${c.skipped} skipped\n`);
    if (failed > 0) process.exitCode = 1;
  }
}
