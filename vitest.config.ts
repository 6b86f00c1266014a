import { defineConfig } from "vitest/config";

export default defineConfig({
  test: {
    include: ["test/**/*.test.ts"],
    setupFiles: ["test/support/failOnConsole.ts"],
    testTimeout: 30_000,
    reporters: ["default", "./test/support/summaryReporter.ts"],
    // The test files share their worker's module cache instead of each starting afresh: starting a
    // worker and importing the code again for each of some 140 files cost more than most files' tests
    // (test/core, test/report and test/cli: 29 s instead of 73 to 92 s on two loaded cores). The tests
    // keep no state between files: console spies are restored after each test and files write only in
    // their own scratch folders. One setting outlives a file: importing the CLI sets its zod settings
    // (src/cli/program.ts), English messages and no compiled fast path, which no test's outcome depends
    // on (the library's own zod settings are tested in a child process, test/e2e/library.test.ts).
    isolate: false,
  },
});
