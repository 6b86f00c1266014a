/**
 * When the executable runs the command line again with huge pages (src/cli/runtime/hugePages.ts):
 * the decision over the environment and the machine's facts, the child's environment, and the size
 * of the inputs a command line names. test/e2e/hugePages.test.ts runs the child itself.
 */
import * as fs from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import {
  commandLineBytes,
  type HugePageFacts,
  hugePagesFrom,
  wantsHugePages,
  withHugePages,
  writtenPathFlags,
} from "../../src/cli/runtime/hugePages.js";
import { optionTable } from "../../src/options/table.js";

/** A Linux machine with huge pages on request, glibc 2.36 and a large input; `read` counts what was asked. */
function facts(change: Partial<{ platform: string; bytes: number; mode: string | null; glibc: string | null; execArgv: string[] }> = {}) {
  const read: string[] = [];
  const given: HugePageFacts = {
    platform: change.platform ?? "linux",
    execArgv: change.execArgv ?? [],
    inputBytes: () => {
      read.push("bytes");
      return change.bytes ?? hugePagesFrom;
    },
    transparentHugePages: () => {
      read.push("mode");
      return change.mode === undefined ? "madvise" : change.mode;
    },
    glibc: () => {
      read.push("glibc");
      return change.glibc === undefined ? "2.36" : change.glibc;
    },
  };
  return { given, read };
}

describe("wantsHugePages", () => {
  it("runs again for inputs of hugePagesFrom bytes or more on Linux with glibc 2.35 or later and huge pages on request", () => {
    expect(wantsHugePages({}, facts().given)).toEqual({ relaunch: true, warning: null });
    expect(wantsHugePages({}, facts({ glibc: "2.35" }).given).relaunch).toBe(true);
    expect(wantsHugePages({}, facts({ glibc: "3.0" }).given).relaunch).toBe(true);
    expect(wantsHugePages({}, facts({ bytes: hugePagesFrom - 1 }).given).relaunch).toBe(false);
  });

  it("does not where the tunable does nothing or huge pages come without asking", () => {
    expect(wantsHugePages({}, facts({ glibc: "2.34" }).given).relaunch).toBe(false);
    expect(wantsHugePages({}, facts({ glibc: null }).given).relaunch).toBe(false);
    expect(wantsHugePages({}, facts({ mode: "always" }).given).relaunch).toBe(false);
    expect(wantsHugePages({}, facts({ mode: "never" }).given).relaunch).toBe(false);
    expect(wantsHugePages({}, facts({ mode: null }).given).relaunch).toBe(false);
    expect(wantsHugePages({}, facts({ platform: "darwin" }).given).relaunch).toBe(false);
    expect(wantsHugePages({}, facts({ platform: "win32" }).given).relaunch).toBe(false);
  });

  it("keeps a run under the inspector in the process the debugger attached to; other node flags do not matter", () => {
    expect(wantsHugePages({}, facts({ execArgv: ["--inspect-brk=9229"] }).given).relaunch).toBe(false);
    expect(wantsHugePages({ BETABOUND_HUGE_PAGES: "on" }, facts({ execArgv: ["--inspect"] }).given).relaunch).toBe(false);
    expect(wantsHugePages({}, facts({ execArgv: ["--max-old-space-size=8000"] }).given).relaunch).toBe(true);
  });

  it("never runs a child's child: the tunable already set (by the parent or the user) means no", () => {
    expect(wantsHugePages({ GLIBC_TUNABLES: "glibc.malloc.hugetlb=1" }, facts().given).relaunch).toBe(false);
    expect(wantsHugePages({ GLIBC_TUNABLES: "glibc.malloc.arena_max=2:glibc.malloc.hugetlb=0" }, facts().given).relaunch).toBe(false);
    expect(wantsHugePages({ GLIBC_TUNABLES: "glibc.malloc.arena_max=2" }, facts().given).relaunch).toBe(true);
    expect(wantsHugePages({ BETABOUND_HUGE_PAGES: "on", GLIBC_TUNABLES: "glibc.malloc.hugetlb=1" }, facts().given).relaunch).toBe(false);
  });

  it("BETABOUND_HUGE_PAGES: off never, on whatever the size, anything else warns and is auto", () => {
    expect(wantsHugePages({ BETABOUND_HUGE_PAGES: "off" }, facts().given).relaunch).toBe(false);
    expect(wantsHugePages({ BETABOUND_HUGE_PAGES: "on" }, facts({ bytes: 0 }).given).relaunch).toBe(true);
    expect(wantsHugePages({ BETABOUND_HUGE_PAGES: "on" }, facts({ mode: "always" }).given).relaunch).toBe(false);
    expect(wantsHugePages({ BETABOUND_HUGE_PAGES: "auto" }, facts({ bytes: 0 }).given)).toEqual({ relaunch: false, warning: null });
    const odd = wantsHugePages({ BETABOUND_HUGE_PAGES: "yes" }, facts({ bytes: 0 }).given);
    expect(odd.relaunch).toBe(false);
    expect(odd.warning).toBe('warning: BETABOUND_HUGE_PAGES is "yes", not one of auto, on, off; using auto\n');
    expect(wantsHugePages({ BETABOUND_HUGE_PAGES: "yes" }, facts().given).relaunch).toBe(true);
  });

  it("reads the facts only as far as it needs: a small input costs no file read and no report", () => {
    const small = facts({ bytes: 10 });
    wantsHugePages({}, small.given);
    expect(small.read).toEqual(["bytes"]);
    const off = facts();
    wantsHugePages({ BETABOUND_HUGE_PAGES: "off" }, off.given);
    expect(off.read).toEqual([]);
    const other = facts({ platform: "darwin" });
    wantsHugePages({}, other.given);
    expect(other.read).toEqual([]);
  });
});

describe("withHugePages", () => {
  it("adds the tunable to glibc's others, leaving the rest of the environment as it was", () => {
    expect(withHugePages({ HOME: "/h" })).toEqual({ HOME: "/h", GLIBC_TUNABLES: "glibc.malloc.hugetlb=1" });
    expect(withHugePages({ GLIBC_TUNABLES: "" }).GLIBC_TUNABLES).toBe("glibc.malloc.hugetlb=1");
    expect(withHugePages({ GLIBC_TUNABLES: "glibc.malloc.arena_max=2" }).GLIBC_TUNABLES).toBe(
      "glibc.malloc.arena_max=2:glibc.malloc.hugetlb=1",
    );
  });

  it("gives the child a setting it knows: one this process warned about is auto there (no second warning)", () => {
    expect(withHugePages({ BETABOUND_HUGE_PAGES: "on" }).BETABOUND_HUGE_PAGES).toBe("on");
    expect(withHugePages({ BETABOUND_HUGE_PAGES: "yes" }).BETABOUND_HUGE_PAGES).toBe("auto");
    expect("BETABOUND_HUGE_PAGES" in withHugePages({})).toBe(false);
    const child = withHugePages({ BETABOUND_HUGE_PAGES: "yes" });
    expect(wantsHugePages(child, facts().given)).toEqual({ relaunch: false, warning: null });
  });
});

describe("commandLineBytes", () => {
  let dir = "";
  let a = "";
  let b = "";
  beforeAll(() => {
    dir = fs.mkdtempSync(join(tmpdir(), "betabound-huge-"));
    a = join(dir, "a.csv");
    b = join(dir, "b:c.csv");
    fs.writeFileSync(a, "x".repeat(1000));
    fs.writeFileSync(b, "y".repeat(300));
  });
  afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

  it("sums the files named, PATH:COLUMN's path, and skips options, folders and what is not there", () => {
    const none = () => null;
    expect(commandLineBytes(["solve", a, "--low", "x"], none)).toBe(1000);
    expect(commandLineBytes(["solve", "--low", `${a}:Return`, "--high", `${a}:Other`], none)).toBe(2000);
    expect(commandLineBytes([b, `${b}:col`], none)).toBe(600);
    expect(commandLineBytes([dir, join(dir, "missing.csv"), `-${a}`, "\u0000"], none)).toBe(0);
  });

  it("does not count an output about to be replaced (the value after a flag of a file written)", () => {
    const none = () => null;
    expect(commandLineBytes(["roll", b, "--output", a, "--low", "x"], none)).toBe(300);
    expect(commandLineBytes(["solve", b, "--chart", a, "--report", a], none)).toBe(300);
    // Another option's file counts (the launcher does not parse options); `--output=FILE` is one flag, not counted.
    expect(commandLineBytes(["solve", b, "--config", a, `--output=${a}`], none)).toBe(1300);
  });

  it("names as written exactly the option table's paths", () => {
    const paths = Object.values(optionTable).flatMap((o) =>
      "path" in o && o.path === true ? [`--${o.name.replace(/[A-Z]/g, (c) => `-${c.toLowerCase()}`)}`] : [],
    );
    expect([...writtenPathFlags].sort()).toEqual(paths.sort());
  });

  it("counts standard input (when it is a file) for `-` or when no argument names a file", () => {
    const file = () => 5000;
    expect(commandLineBytes(["solve", "-", "--low", "x"], file)).toBe(5000);
    expect(commandLineBytes(["solve", "--low", "x"], file)).toBe(5000);
    expect(commandLineBytes(["solve", a, "--low", "x"], file)).toBe(1000);
    expect(commandLineBytes(["solve", a, "-"], file)).toBe(6000);
  });
});
