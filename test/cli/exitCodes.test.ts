/** The exit-code table (src/cli/runtime/exitCodes.ts) and the README's table say the same. */
import { readFileSync } from "node:fs";
import { constants } from "node:os";
import { expect, it } from "vitest";
import { exitCodes } from "../../src/cli/runtime/exitCodes.js";
import { endingSignals } from "../../src/cli/runtime/signals.js";

// The README gives Linux's signal numbers (SIGUSR2 is 12 there, 31 on macOS).
it.skipIf(process.platform !== "linux")("every exit code is in the README's table, and the table has no other", () => {
  const readme = readFileSync(new URL("../../README.md", import.meta.url), "utf8");
  const section = readme.slice(readme.indexOf("## Exit codes"), readme.indexOf("\n## ", readme.indexOf("## Exit codes") + 1));
  const listed = [...section.matchAll(/^\| ([\d, ]+) \|/gm)].flatMap((m) => m[1]!.split(",").map((c) => Number(c.trim())));
  const signals = endingSignals.map((signal) => 128 + constants.signals[signal]); // main.ts
  expect(signals).toContain(143);
  expect(listed.sort((a, b) => a - b)).toEqual([...Object.values(exitCodes), ...signals].sort((a, b) => a - b));
});
