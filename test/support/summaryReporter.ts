// Prints one plain closing line, "tests: N passed, N failed, N skipped", after a vitest run,
// so that CI logs carry a runner-independent summary.
import type { Reporter, TestModule } from 'vitest/node';

export default class SummaryReporter implements Reporter {
  onTestRunEnd(testModules: ReadonlyArray<TestModule>): void {
    let passed = 0;
    let failed = 0;
    let skipped = 0;
    for (const mod of testModules) {
      for (const test of mod.children.allTests()) {
        const state = test.result().state;
        if (state === 'passed') passed++;
        else if (state === 'failed') failed++;
        else skipped++;
      }
      // A module that failed to load counts as a failure even when it holds no collected test.
      if (mod.state() === 'failed' && [...mod.children.allTests()].length === 0) failed++;
    }
    process.stdout.write(`\ntests: ${passed} passed, ${failed} failed, ${skipped} skipped\n`);
  }
}
