/**
 * End-to-end: the WebAssembly kernels change no byte of any output. Under `node --jitless` WebAssembly is
 * unavailable, so every pass takes its JavaScript twin (the row reader's, the series kernels', the
 * autocovariances'); the outputs must be the same bytes as with the kernels.
 */
import { spawnSync } from "node:child_process";
import { join } from "node:path";
import { describe, expect, it } from "vitest";

const root = new URL("../../", import.meta.url).pathname;
const cli = join(root, "dist/cli.cjs");
const daily = join(root, "examples/harbourline-daily.csv");
const desk = join(root, "examples/desks/desk-a.csv");

function run(nodeFlags: readonly string[], args: readonly string[]) {
  const result = spawnSync(process.execPath, [...nodeFlags, cli, ...args], { encoding: "utf8" });
  return { code: result.status, stdout: result.stdout };
}

describe("the WebAssembly kernels", () => {
  const cases: readonly (readonly string[])[] = [
    // Moments, residual sums, window sums, the bounds', Sharpe ratios' and pricing's influence series.
    ["solve", daily, "--low", "Stillwater Low Vol", "--high", "Kestrel High Beta", "--rf", "0.0001", "--format", "json"],
    // The factor model's covariance, a risk-free column, percent units.
    [
      ...["solve", desk, "--low", "Stillwater Low Vol", "--high", "Kestrel High Beta", "--rf", "Cash Rate", "--units", "percent"],
      ...["--portfolios", "Stillwater Low Vol,Tidewater Low Vol,Kestrel High Beta", "--format", "json"],
    ],
  ];

  it.each(cases)("give the same bytes as the JavaScript passes (no WebAssembly under --jitless): %s %s", (...args) => {
    const withKernels = run([], args);
    const withoutKernels = run(["--jitless"], args);
    expect(withKernels.code).toBe(0);
    expect(withoutKernels.code).toBe(0);
    expect(withKernels.stdout.length).toBeGreaterThan(1000);
    expect(withoutKernels.stdout).toBe(withKernels.stdout);
  });
});
