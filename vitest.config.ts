import { defineConfig } from "vitest/config";

export default defineConfig({
  test: {
    include: ["test/**/*.test.ts"],
    setupFiles: ["test/support/failOnConsole.ts"],
    testTimeout: 30_000,
    reporters: ["default", "./test/support/summaryReporter.ts"],
  },
});
