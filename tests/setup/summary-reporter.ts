// Prints one plain closing line, "Tests: N passed, N failed, N skipped", after vitest's own
// summary, so tools that read a run's last lines (CI) can count the tests in any runner's terms.
import type { Reporter, TestModule } from 'vitest/node';

export default class SummaryReporter implements Reporter {
  onTestRunEnd(testModules: ReadonlyArray<TestModule>): void {
    let passed = 0;
    let failed = 0;
    let skipped = 0;
    for (const testModule of testModules) {
      for (const test of testModule.children.allTests()) {
        const state = test.result().state;
        if (state === 'passed') passed += 1;
        else if (state === 'failed') failed += 1;
        else skipped += 1;
      }
      // A file that failed to load has no tests but must not read as green.
      if (testModule.state() === 'failed' && testModule.children.size === 0) failed += 1;
    }
    process.stdout.write(`\nTests: ${passed} passed, ${failed} failed, ${skipped} skipped\n`);
  }
}
