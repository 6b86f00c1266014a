// The core and the renderers never print: any console output during a test is a bug.
import { afterEach, beforeEach, vi } from "vitest";

const methods = ["log", "info", "warn", "error", "debug"] as const;

beforeEach(() => {
  for (const method of methods) {
    vi.spyOn(console, method).mockImplementation((...args: unknown[]) => {
      throw new Error(`console.${method} called during a test: ${args.map(String).join(" ")}`);
    });
  }
});

afterEach(() => {
  vi.restoreAllMocks();
});
