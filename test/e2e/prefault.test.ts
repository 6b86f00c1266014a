/**
 * End-to-end: fresh memory readied on a worker thread (src/cli/runtime/pretouch.ts). On an input long
 * enough for it (300,000 rows: every column over 1 MiB), BETABOUND_PREFAULT=on starts the worker and
 * sends it the long arrays, =off starts none, and both give the same bytes, standard error and exit
 * code: solve with the default uncertainty (its scratch series), roll as CSV, and a file with a bad
 * row (exit 2), and three files in one run. A preloaded hook (support/workerLog.cjs) reports the
 * workers a run started.
 */
import { spawnSync } from "node:child_process";
import * as fs from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { cli, root } from "./support/run.js";

const hook = join(root, "test/e2e/support/workerLog.cjs");
const rows = 300_000;
let dir = "";
let data = "";
let broken = "";

beforeAll(() => {
  dir = fs.mkdtempSync(join(tmpdir(), "betabound-prefault-"));
  data = join(dir, "long.csv");
  broken = join(dir, "broken.csv");
  // A one-factor sample on a daily calendar of numbered days (seeded, plain arithmetic).
  const lines = ["date,low,high,rf"];
  let seed = 7;
  const draw = (): number => {
    seed = (seed * 1103515245 + 12345) % 2147483648;
    return seed / 2147483648 - 0.5;
  };
  const start = Date.UTC(1900, 0, 1);
  for (let t = 0; t < rows; t++) {
    const f = 0.01 * draw();
    const day = new Date(start + t * 86_400_000).toISOString().slice(0, 10);
    lines.push(`${day},${(0.7 * f + 0.004 * draw()).toFixed(6)},${(1.3 * f + 0.005 * draw()).toFixed(6)},0.0001`);
  }
  fs.writeFileSync(data, `${lines.join("\n")}\n`);
  lines[rows - 10] = `${lines[rows - 10]},extra`;
  fs.writeFileSync(broken, `${lines.join("\n")}\n`);
}, 60_000);

afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

function run(args: readonly string[], setting: "on" | "off") {
  const result = spawnSync(process.execPath, [cli, ...args], {
    encoding: "utf8",
    env: { ...process.env, NO_COLOR: "1", BETABOUND_HUGE_PAGES: "off", BETABOUND_PREFAULT: setting, NODE_OPTIONS: `--require "${hook}"` },
    maxBuffer: 1 << 28,
  });
  const workers = result.stderr.split("\n").filter((line) => line.startsWith("worker "));
  const stderr = result.stderr
    .split("\n")
    .filter((line) => !line.startsWith("worker "))
    .join("\n");
  return { code: result.status, stdout: result.stdout, stderr, workers };
}

describe("fresh memory readied on a worker thread", () => {
  const books = ["--low", "low", "--high", "high", "--rf", "rf"];

  it.each([
    ["solve, default uncertainty, JSON", ["solve", "DATA", ...books, "--format", "json"], 0],
    ["roll --step 21, CSV", ["roll", "DATA", ...books, "--window", "252", "--step", "21", "--format", "csv"], 0],
    ["a row with a field too many (exit 2)", ["solve", "BROKEN", ...books, "--format", "json"], 2],
  ])(
    "%s: the same bytes with the worker as without",
    (_name, template, code) => {
      const args = template.map((a) => (a === "DATA" ? data : a === "BROKEN" ? broken : a));
      const on = run(args, "on");
      const off = run(args, "off");
      expect(on.code).toBe(code);
      expect({ ...on, workers: [] }).toEqual({ ...off, workers: [] });
      expect(pretouchWorkers(off.workers)).toEqual([]);
      const started = pretouchWorkers(on.workers);
      expect(started.length).toBeGreaterThanOrEqual(1);
      // The columns, the row starts and (solve) the scratch series: several buffers of 1 MiB or more each.
      const sent = started.map((line) => /: (\d+) buffers, (\d+) bytes/.exec(line)!.slice(1).map(Number));
      expect(sent.reduce((n, [buffers]) => n + buffers!, 0)).toBeGreaterThanOrEqual(4);
      expect(sent.reduce((n, [, bytes]) => n + bytes!, 0)).toBeGreaterThanOrEqual(4 * rows * 4);
    },
    60_000,
  );

  it("reads several files in one run as without the worker", () => {
    const copies = [1, 2, 3].map((k) => {
      const copy = join(dir, `copy${k}.csv`);
      fs.copyFileSync(data, copy);
      return copy;
    });
    const args = ["solve", ...copies, ...books, "--format", "jsonl"];
    const on = run(args, "on");
    expect(on.code).toBe(0);
    expect(on.stdout.split("\n").filter((line) => line.startsWith("{"))).toHaveLength(3);
    expect({ ...on, workers: [] }).toEqual({ ...run(args, "off"), workers: [] });
    expect(pretouchWorkers(on.workers)).toHaveLength(1);
  }, 60_000);
});

/** The hook's lines of the workers that readied memory. */
const pretouchWorkers = (lines: readonly string[]): string[] => lines.filter((line) => line.startsWith("worker pretouchWorker.js: "));
