/**
 * End-to-end: the executable run again in a child with huge pages (src/cli/runtime/hugePages.ts),
 * forced by BETABOUND_HUGE_PAGES=on, gives what the run in one process gives (standard output, standard
 * error, exit code, standard input read through), and a signal to the parent reaches the child, which
 * removes its temporary file and ends with 128 + the signal's number, as the parent then does.
 */
import { spawn, spawnSync } from "node:child_process";
import * as fs from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { processFacts, wantsHugePages } from "../../src/cli/runtime/hugePages.js";
import { betabound, books, cli, monthly } from "./support/run.js";

/** Whether this machine runs the child at all (Linux, glibc 2.35 or later, huge pages on request). */
const relaunches = wantsHugePages({ BETABOUND_HUGE_PAGES: "on" }, processFacts([])).relaunch;

function run(args: readonly string[], setting: "on" | "off", input?: string) {
  const result = spawnSync(process.execPath, [cli, ...args], {
    input,
    encoding: "utf8",
    env: { ...process.env, NO_COLOR: "1", BETABOUND_HUGE_PAGES: setting },
  });
  return { code: result.status, signal: result.signal, stdout: result.stdout, stderr: result.stderr };
}

describe("the command line run again with huge pages", () => {
  it.each([
    ["a solve as JSON", ["solve", monthly, ...books, "--format", "json"]],
    ["a roll as CSV", ["roll", monthly, ...books, "--window", "24", "--format", "csv"]],
    ["a missing column (exit 2)", ["solve", monthly, "--low", "Stillwater Low Vol", "--high", "Kestrel Hi Beta"]],
    ["an unknown option (exit 64)", ["solve", monthly, "--lowest", "x"]],
  ])("%s: the same bytes and exit code as in one process", (_name, args) => {
    const one = run(args, "off");
    const again = run(args, "on");
    expect(again).toEqual(one);
    expect(one.stdout.length + one.stderr.length).toBeGreaterThan(0);
  });

  it("reads standard input through the parent", () => {
    const text = fs.readFileSync(monthly, "utf8");
    const args = ["solve", "-", ...books, "--format", "json", "--no-uncertainty"];
    const again = run(args, "on", text);
    expect(again).toEqual(run(args, "off", text));
    expect(again.code).toBe(0);
  });

  it("warns once about a setting it does not know, also when it runs the child (which takes it as auto)", (context) => {
    if (!relaunches) context.skip();
    // An existing output of 200 MB (sparse: no disk used) counts as a named file: the run starts a child.
    const dir = fs.mkdtempSync(join(tmpdir(), "betabound-huge-warn-"));
    const target = join(dir, "out.json");
    fs.writeFileSync(target, "");
    fs.truncateSync(target, 200 * 1024 * 1024);
    try {
      const result = spawnSync(process.execPath, [cli, "solve", monthly, ...books, "--format", "json", "--output", target], {
        encoding: "utf8",
        env: { ...process.env, BETABOUND_HUGE_PAGES: "yes" },
      });
      expect(result.status).toBe(0);
      expect(result.stderr).toBe('warning: BETABOUND_HUGE_PAGES is "yes", not one of auto, on, off; using auto\n');
      expect(JSON.parse(fs.readFileSync(target, "utf8")).status).toBe("ok");
    } finally {
      fs.rmSync(dir, { recursive: true, force: true });
    }
  });

  it("warns once about a setting it does not know, and runs as auto", () => {
    const result = spawnSync(process.execPath, [cli, "solve", monthly, ...books, "--format", "json"], {
      encoding: "utf8",
      env: { ...process.env, BETABOUND_HUGE_PAGES: "yes" },
    });
    expect(result.status).toBe(0);
    expect(result.stderr).toBe('warning: BETABOUND_HUGE_PAGES is "yes", not one of auto, on, off; using auto\n');
  });
});

describe("a signal to the parent", () => {
  let dir = "";
  let data = "";
  beforeAll(() => {
    dir = fs.mkdtempSync(join(tmpdir(), "betabound-huge-"));
    data = join(dir, "data.csv");
    const args = ["simulate", "--low-beta", "0.7", "--factor-vol", "0.01", "--low-noise-vol", "0.004", "--high-noise-vol", "0.006"];
    const made = betabound([...args, "--frequency", "daily", "--periods", "300000", "--seed", "5", "--digits", "6", "--output", data]);
    expect(made.code, made.stderr).toBe(0);
  }, 30_000);
  afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

  it("reaches the child: its temporary file is removed, the previous file kept, both exit 143", async (context) => {
    if (!relaunches) context.skip();
    const target = join(dir, "windows.csv");
    fs.writeFileSync(target, "the previous output\n");
    const args = [cli, "roll", data, "--low", "low", "--high", "high", "--window", "252", "--format", "csv", "--output", target];
    const parent = spawn(process.execPath, args, { stdio: "ignore", env: { ...process.env, BETABOUND_HUGE_PAGES: "on" } });
    const ended = new Promise<number | null>((done) => parent.on("exit", (code) => done(code)));
    const deadline = Date.now() + 20_000;
    while (!fs.readdirSync(dir).some((name) => name.endsWith(".tmp")) && Date.now() < deadline) {
      await new Promise((done) => setTimeout(done, 20));
    }
    // The run is the parent's child, and that child has the tunable.
    const children = fs.readFileSync(`/proc/${parent.pid}/task/${parent.pid}/children`, "utf8").trim().split(/\s+/);
    expect(children).toHaveLength(1);
    expect(fs.readFileSync(`/proc/${children[0]}/environ`, "utf8").split("\0")).toContain("GLIBC_TUNABLES=glibc.malloc.hugetlb=1");
    parent.kill("SIGTERM");
    expect(await ended).toBe(143);
    expect(fs.readdirSync(dir).sort()).toEqual(["data.csv", "windows.csv"]);
    expect(fs.readFileSync(target, "utf8")).toBe("the previous output\n");
  }, 30_000);
});
