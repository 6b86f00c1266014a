/**
 * End-to-end: outputs under faults. A full disk (a small tmpfs when this test may mount one, and
 * /dev/full) is exit 4 with the previous file intact and no temporary file; a signal mid-run removes
 * the temporary file and ends with 128 + the signal's number; a reader that stops reading holds the
 * writer back (memory stays flat) and one that closes the pipe ends the run at once, quietly (141).
 */
import { execFileSync, spawn } from "node:child_process";
import * as fs from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { betabound, books, cli, monthly } from "./support/run.js";

let dir = "";
/** 1,000,000 daily rows (about 30 MB): a roll over it runs for seconds and writes about 500 MB. */
let big = "";
const previous = "the previous output, to be kept\n";
/** One process (never the huge-page child of src/cli/runtime/hugePages.ts): /proc/<pid> is the run's own. */
const env = { ...process.env, BETABOUND_HUGE_PAGES: "off" };
const roll = (output: string[]) => [cli, "roll", big, "--low", "low", "--high", "high", "--window", "252", "--format", "csv", ...output];

beforeAll(() => {
  dir = fs.mkdtempSync(join(tmpdir(), "betabound-faults-"));
  big = join(dir, "big.csv");
  const args = ["simulate", "--low-beta", "0.7", "--factor-vol", "0.01", "--low-noise-vol", "0.004", "--high-noise-vol", "0.006"];
  const more = ["--frequency", "daily", "--periods", "1000000", "--seed", "3", "--digits", "6", "--output", big];
  const made = betabound([...args, ...more]);
  expect(made.code, made.stderr).toBe(0);
}, 30_000);

/** The resident peak (VmHWM) of a running process, in MB (Linux). */
function peakMegabytes(pid: number): number {
  const status = fs.readFileSync(`/proc/${pid}/status`, "utf8");
  return Number(/VmHWM:\s+(\d+) kB/.exec(status)?.[1] ?? Number.NaN) / 1024;
}

describe("a full disk", () => {
  const mount = join(tmpdir(), `betabound-full-${process.pid}`);
  let mounted = false;
  beforeAll(() => {
    fs.mkdirSync(mount, { recursive: true });
    try {
      execFileSync("mount", ["-t", "tmpfs", "-o", "size=256k", "tmpfs", mount], { stdio: "ignore" });
      mounted = true;
    } catch {
      // Not allowed here: the injected write errors of test/cli/output.test.ts cover the same path.
    }
  });
  afterAll(() => {
    if (mounted) execFileSync("umount", [mount]);
    fs.rmSync(mount, { recursive: true, force: true });
  });

  it("a small tmpfs: roll and solve fail with exit 4, the previous file intact, no temporary file", (context) => {
    if (!mounted) context.skip();
    const target = join(mount, "windows.csv");
    fs.writeFileSync(target, previous);
    const small = betabound(["roll", monthly, ...books, "--window", "12", "--format", "jsonl", "--output", target]);
    expect(small.code, small.stderr).toBe(4);
    expect(small.stderr).toMatch(/cannot write .*no space left on the device/);
    expect(fs.readFileSync(target, "utf8")).toBe(previous);
    expect(fs.readdirSync(mount)).toEqual(["windows.csv"]);
    const report = join(mount, "report.html");
    fs.writeFileSync(report, previous);
    const filler = join(mount, "filler");
    try {
      fs.writeFileSync(filler, Buffer.alloc(256 * 1024)); // fills what is left of the disk
    } catch {
      // ENOSPC: the disk is full, as wanted
    }
    const solve = betabound(["solve", monthly, ...books, "--report", report]);
    expect(solve.code, solve.stderr).toBe(4);
    expect(fs.readFileSync(report, "utf8")).toBe(previous);
    expect(fs.readdirSync(mount).sort()).toEqual(["filler", "report.html", "windows.csv"]);
  });

  it("a small tmpfs under standard output redirected to a file: a write that only half fits is exit 4, not a truncated file and 0", (context) => {
    if (!mounted) context.skip();
    const filler = join(mount, "filler");
    fs.rmSync(filler, { force: true });
    // Leaves 8 KiB: the JSON document (about 40 KB) is one write the disk takes only in part.
    fs.writeFileSync(filler, Buffer.alloc(fs.statfsSync(mount).bavail * fs.statfsSync(mount).bsize - 8192));
    const redirected = join(mount, "report.json");
    const fd = fs.openSync(redirected, "w");
    try {
      const child = spawnSyncTo(["solve", monthly, ...books, "--format", "json"], fd);
      expect(child.code, child.stderr).toBe(4);
      expect(child.stderr).toMatch(/cannot write to standard output: no space left on the device/);
    } finally {
      fs.closeSync(fd);
      fs.rmSync(filler, { force: true });
    }
  });

  const stdoutCases: [string, string[]][] = [
    ["solve --format json", ["solve", monthly, ...books, "--format", "json"]],
    ["roll --format csv", ["roll", monthly, ...books, "--window", "12", "--format", "csv"]],
    ["implied", ["implied", "--low-beta", "0.7", "--factor-vol", "0.04", "--low-noise-vol", "0.01", "--high-noise-vol", "0.02"]],
    ["simulate", ["simulate", "--low-beta", "0.7", "--factor-vol", "0.04", "--low-noise-vol", "0.01", "--high-noise-vol", "0.02"]],
    ["--output /dev/full", ["solve", monthly, ...books, "--output", "/dev/full"]],
  ];
  for (const [name, args] of stdoutCases) {
    it(`standard output on /dev/full: ${name} exits 4 and says so`, () => {
      const fd = fs.openSync("/dev/full", "w");
      try {
        const child = spawnSyncTo(args, fd);
        expect(child.code, child.stderr).toBe(4);
        expect(child.stderr).toMatch(/no space left on the device/);
        expect(child.stderr).not.toMatch(/\n\s+at /);
      } finally {
        fs.closeSync(fd);
      }
    });
  }
});

function spawnSyncTo(args: string[], stdout: number) {
  try {
    execFileSync(process.execPath, [cli, ...args], { stdio: ["ignore", stdout, "pipe"], encoding: "utf8" });
    return { code: 0, stderr: "" };
  } catch (error) {
    const failed = error as { status: number | null; stderr: string };
    return { code: failed.status, stderr: failed.stderr };
  }
}

describe("a low limit of open files", () => {
  it("drawing a chart under `ulimit -n 40` is exit 4 with what to do, never 70, and writes nothing", () => {
    const here = fs.mkdtempSync(join(dir, "files-"));
    const chart = join(here, "chart.svg");
    fs.writeFileSync(chart, previous);
    const quoted = [process.execPath, cli, "solve", monthly, ...books, "--chart", chart].map((a) => `'${a}'`).join(" ");
    let code = 0;
    let stderr = "";
    try {
      execFileSync("bash", ["-c", `ulimit -n 40 && exec ${quoted}`], { stdio: ["ignore", "pipe", "pipe"], encoding: "utf8", env });
    } catch (error) {
      const failed = error as { status: number | null; stderr: string };
      [code, stderr] = [failed.status ?? -1, failed.stderr];
    }
    expect(code, stderr).toBe(4);
    expect(stderr).toMatch(/limit of open files.*ulimit -n/);
    expect(fs.readFileSync(chart, "utf8")).toBe(previous);
  });
});

describe("a signal mid-run", () => {
  for (const [signal, number] of [
    ["SIGTERM", 15],
    ["SIGINT", 2],
    ["SIGHUP", 1],
    ["SIGXCPU", 24], // a CPU time limit (ulimit -t), one of the other ending signals (signals.ts)
  ] as const) {
    it(`${signal}: the temporary file is removed, the previous file kept, exit ${128 + number}`, async () => {
      const here = fs.mkdtempSync(join(dir, "signal-"));
      const target = join(here, "windows.csv");
      fs.writeFileSync(target, previous);
      const child = spawn(process.execPath, roll(["--output", target]), { stdio: "ignore", env });
      const ended = new Promise<number | null>((done) => child.on("exit", (code) => done(code)));
      // Wait until the output is being written: its temporary file exists and grows.
      const deadline = Date.now() + 20_000;
      while (!fs.readdirSync(here).some((name) => name.endsWith(".tmp")) && Date.now() < deadline) {
        await new Promise((done) => setTimeout(done, 20));
      }
      expect(fs.readdirSync(here)).toHaveLength(2);
      child.kill(signal);
      expect(await ended).toBe(128 + number);
      expect(fs.readdirSync(here)).toEqual(["windows.csv"]);
      expect(fs.readFileSync(target, "utf8")).toBe(previous);
    }, 30_000);
  }
});

describe("a reader on a pipe", () => {
  it("that stops reading holds the writer back: memory stays flat", async () => {
    const child = spawn(process.execPath, roll([]), { stdio: ["ignore", "pipe", "ignore"], env });
    child.stdout.pause();
    const ended = new Promise<number | null>((done) => child.on("exit", (code) => done(code)));
    // Measured from the first output on: before it the run is still reading and computing windows
    // (longer on a loaded machine), and its memory grows for that reason.
    while (child.stdout.readableLength === 0) await new Promise((done) => setTimeout(done, 50));
    await new Promise((done) => setTimeout(done, 1000));
    const early = peakMegabytes(child.pid ?? 0);
    await new Promise((done) => setTimeout(done, 1500));
    const late = peakMegabytes(child.pid ?? 0);
    child.stdout.destroy();
    // Input and window columns (about 30 columns x 1,000,000 doubles) are held; the 500 MB of CSV is not.
    expect(late).toBeLessThan(700);
    expect(late - early).toBeLessThan(32);
    expect(await ended).toBe(141);
  }, 60_000);

  it("that closes the pipe after one line ends the run within a second, quietly, with 141", async () => {
    const child = spawn(process.execPath, roll([]), { stdio: ["ignore", "pipe", "pipe"], env });
    let stderr = "";
    child.stderr.on("data", (chunk) => {
      stderr += String(chunk);
    });
    let closedAt = 0;
    child.stdout.once("data", () => {
      closedAt = performance.now();
      child.stdout.destroy();
    });
    const code = await new Promise<number | null>((done) => child.on("exit", (c) => done(c)));
    const afterClose = performance.now() - closedAt;
    expect(code).toBe(141);
    expect(stderr).toBe("");
    expect(afterClose).toBeLessThan(1000);
  }, 30_000);
});
