/**
 * roll's CSV on two threads (cli/runtime/rollCsvThreads.ts), end to end: a run long enough for the
 * worker thread (50,000 windows or more, stamp dates, no uncertainty columns) writes the very bytes
 * the same command writes in one thread (run in this process from the sources, where there is no
 * worker script), to a file and to standard output.
 */
import { existsSync, mkdtempSync, readFileSync, writeFileSync } from "node:fs";
import { availableParallelism, tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { run } from "../../src/cli/program.js";
import { rollCsvThreadsPay, threadedCsvWindows } from "../../src/cli/runtime/rollCsvThreads.js";
import { windowCount } from "../../src/core/rolling/index.js";
import { fakeIo } from "../cli/fakeIo.js";
import { betabound, root } from "./support/run.js";

const scratch = mkdtempSync(join(tmpdir(), "betabound-roll-threads-"));

/** 60,000 days of two books from a seeded generator (a long-run test file, invented data). */
function longFile(): string {
  let state = 20261204;
  const uniform = () => {
    state = (Math.imul(state, 1103515245) + 12345) >>> 0;
    return state / 2 ** 32 - 0.5;
  };
  const lines = ["date,low,high"];
  for (let t = 0; t < 60_000; t++) {
    const f = 0.01 * uniform();
    const day = new Date(Date.UTC(1900, 0, 1) + t * 86_400_000).toISOString().slice(0, 10);
    lines.push(`${day},${(0.7 * f + 0.004 * uniform()).toFixed(9)},${(1.3 * f + 0.006 * uniform()).toFixed(9)}`);
  }
  return `${lines.join("\n")}\n`;
}

describe("roll's CSV on two threads", () => {
  const text = longFile();
  const path = join(scratch, "long.csv");
  writeFileSync(path, text);
  const args = ["--low", "low", "--high", "high", "--window", "20", "--format", "csv"];

  it("writes the bytes one thread writes", async () => {
    // The conditions under which the built CLI takes the worker thread, on this machine.
    expect(windowCount(60_000, { kind: "window", size: 20, step: 1 })).toBeGreaterThanOrEqual(threadedCsvWindows);
    expect(availableParallelism()).toBeGreaterThanOrEqual(2);
    expect(existsSync(join(root, "dist/rollCsvWorker.js"))).toBe(true);
    expect(rollCsvThreadsPay(threadedCsvWindows)).toBe(false); // from the sources: no worker script, one thread

    const { io, stdout } = fakeIo({ "long.csv": text });
    expect(await run(["roll", "long.csv", ...args], io)).toBe(0);
    const oneThread = stdout().replaceAll("long.csv,", `${path},`);

    const out = join(scratch, "windows.csv");
    const toFile = betabound(["roll", path, ...args, "--output", out]);
    expect(toFile.code).toBe(0);
    expect(readFileSync(out, "utf8")).toBe(oneThread);
    const toStdout = betabound(["roll", path, ...args]);
    expect(toStdout.code).toBe(0);
    expect(toStdout.stdout).toBe(oneThread);
  });
});
