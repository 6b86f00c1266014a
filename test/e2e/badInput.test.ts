/**
 * The bad-input catalogue, end to end: every case exits with its documented code, prints one or more
 * `error:` lines naming the file (and line, column and value where there is one), prints nothing on
 * stdout, never a stack trace, and leaves an existing --output file untouched.
 *
 * Which runs are real processes, and why: every case runs in this process (support/inProcess.ts: the
 * program with the executable's file reads and output path), which costs its work alone rather than a
 * node start-up; the cases marked `real` (a missing file, a bad value in a file, binary content, a bad
 * option value: each kind of refusal, exit 1 and 2) and the unwritable output (exit 4) run as the built
 * executable as well, which must write what the in-process run wrote, with the same exit code. So the
 * launcher, the bundle and the process's exit code stay covered end to end.
 */
import { mkdtempSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { describe, expect, it } from "vitest";
import { runBothWays, runInProcess } from "./support/inProcess.js";

const root = new URL("../../", import.meta.url).pathname;
const scratch = mkdtempSync(join(tmpdir(), "betabound-bad-"));
const header = "date,low,high";
const good = [header, "2024-01-31,0.01,0.02", "2024-02-29,-0.02,-0.03", "2024-03-31,0.015,0.01", "2024-04-30,0.004,0.012"];

function file(name: string, content: string | Uint8Array): string {
  const path = join(scratch, name);
  writeFileSync(path, content);
  return path;
}

interface Case {
  readonly name: string;
  readonly args: (output: string) => string[];
  readonly code: number;
  /** Text the message must contain (file name, line, column, value, hint). */
  readonly says: readonly (string | RegExp)[];
  /** Run as the built executable too. */
  readonly real?: boolean;
}

const books = ["--low", "low", "--high", "high"];
const solve =
  (path: string, ...extra: string[]) =>
  (output: string) => ["solve", path, ...books, "--output", output, ...extra];

const cases: Case[] = [
  { real: true, name: "a missing file", args: solve(join(scratch, "absent.csv")), code: 2, says: ["absent.csv", "no such file"] },
  { name: "an unreadable path (a folder)", args: solve(scratch), code: 2, says: ["it is a directory"] },
  { name: "an empty file", args: solve(file("empty.csv", "")), code: 2, says: ["empty.csv", "empty"] },
  { name: "a header only", args: solve(file("header.csv", `${header}\n`)), code: 2, says: ["header.csv", "line 1"] },
  {
    name: "an unknown column, with a suggestion",
    args: (o) => ["solve", file("u.csv", good.join("\n")), "--low", "lwo", "--high", "high", "--output", o],
    code: 2,
    says: ['"lwo"', 'did you mean "low"'],
  },
  {
    name: "duplicate column names",
    args: solve(file("dup.csv", ["date,low,low,high", "2024-01-31,1,1,1"].join("\n"))),
    code: 2,
    says: ["dup.csv", '"low"'],
  },
  {
    real: true,
    name: "a non-numeric value",
    args: solve(file("nan.csv", [...good.slice(0, 3), "2024-03-31,0.01,abc", good[4]].join("\n"))),
    code: 2,
    says: ["nan.csv line 4", 'column "high"', '"abc"'],
  },
  {
    name: "a row with the wrong number of fields",
    args: solve(file("fields.csv", [...good.slice(0, 2), "2024-02-29,0.01", ...good.slice(3)].join("\n"))),
    code: 2,
    says: ["fields.csv line 3", "2"],
  },
  {
    name: "duplicate dates",
    args: solve(file("dd.csv", [...good, "2024-04-30,0.01,0.02"].join("\n"))),
    code: 2,
    says: ["dd.csv line 6", "2024-04-30"],
  },
  {
    name: "unsorted dates",
    args: solve(file("us.csv", [header, good[2], good[1], good[3], good[4]].join("\n"))),
    code: 2,
    says: ["us.csv line 3", "--sort"],
  },
  {
    name: "an unparseable date",
    args: solve(file("bd.csv", [...good, "someday,0.01,0.02"].join("\n"))),
    code: 2,
    says: ["bd.csv line 6", '"someday"', "--date-format"],
  },
  { name: "too few aligned observations", args: solve(file("few.csv", good.slice(0, 3).join("\n"))), code: 2, says: ["few.csv", "3"] },
  {
    name: "a constant series",
    args: solve(file("flat.csv", [header, "2024-01-31,0.01,0.02", "2024-02-29,0.01,-0.03", "2024-03-31,0.01,0.01"].join("\n"))),
    code: 2,
    says: ["flat.csv", "constant"],
  },
  {
    name: "an absurd return (> 10 in decimal units)",
    args: solve(file("big.csv", [...good, "2024-05-31,12,0.02"].join("\n"))),
    code: 2,
    says: ["big.csv line 6", '"12"', "--allow-extreme"],
  },
  {
    real: true,
    name: "binary content",
    args: solve(file("bin.csv", new Uint8Array([0x64, 0x61, 0x74, 0x65, 0x00, 0x01, 0x02]))),
    code: 2,
    says: ["bin.csv"],
  },
  {
    name: "invalid UTF-8",
    args: solve(file("latin.csv", readFileSync(join(root, "test/fixtures/csv/latin1.csv")))),
    code: 2,
    says: ["latin.csv line 1"],
  },
  {
    name: "an unquoted delimiter inside a value",
    args: solve(file("split.csv", [...good.slice(0, 2), "2024-02-29,0,01,0.02", ...good.slice(3)].join("\n"))),
    code: 2,
    says: ["split.csv line 3"],
  },
  {
    real: true,
    name: "a weight outside (0, 1)",
    args: solve(file("w.csv", good.join("\n")), "--weight", "1"),
    code: 1,
    says: ["--weight", "'1'"],
  },
  { name: "steps below 2", args: solve(file("s.csv", good.join("\n")), "--steps", "1"), code: 1, says: ["--steps", "'1'"] },
  { name: "an unknown format", args: solve(file("f.csv", good.join("\n")), "--format", "xlsx"), code: 1, says: ["--format", "xlsx"] },
];

describe("bad input end to end", () => {
  it.each(cases)("refuses $name with its exit code and a message, touching no output", async ({ args, code, says, real }) => {
    const output = join(scratch, "previous-output.json");
    writeFileSync(output, "previous\n");
    const result = await (real === true ? runBothWays : runInProcess)(args(output));
    expect(result.code).toBe(code);
    expect(result.stdout).toBe("");
    expect(result.stderr).toMatch(/^error: /);
    expect(result.stderr).not.toMatch(/\n\s+at .+:\d+:\d+/);
    for (const text of says)
      expect(result.stderr).toMatch(typeof text === "string" ? new RegExp(text.replace(/[.*+?^${}()|[\]\\]/g, "\\$&")) : text);
    expect(readFileSync(output, "utf8")).toBe("previous\n");
  });

  it("refuses an output path that cannot be written with exit 4 and no stdout", async () => {
    const input = file("ok.csv", good.join("\n"));
    const result = await runBothWays(["solve", input, ...books, "--output", join(scratch, "missing-dir", "out.json")]);
    expect(result.code).toBe(4);
    expect(result.stdout).toBe("");
    expect(result.stderr).toContain("cannot write");
  });
});
