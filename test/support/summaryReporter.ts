/**
 * Prints one plain closing line, `tests: N passed, N failed` (", N skipped" when any), after the
 * default reporter, so that any tool reading the last line of a run can tell what ran.
 */
import type { Reporter, TestModule } from "vitest/node";

export default class SummaryReporter implements Reporter {
  onTestRunEnd(testModules: readonly TestModule[]): void {
    let passed = 0;
    let failed = 0;
    let skipped = 0;
    for (const module of testModules) {
      for (const test of module.children.allTests()) {
        const state = test.result().state;
        if (state === "passed") passed++;
        else if (state === "failed") failed++;
        else skipped++;
      }
    }
    process.stdout.write(`tests: ${passed} passed, ${failed} failed${skipped > 0 ? `, ${skipped} skipped` : ""}\n`);
  }
}
