/**
 * End-to-end: nothing lost. A refused input or option leaves every existing output byte-identical
 * and standard output empty, for every command and format; an output that would land on an input or
 * on another output is refused; special files are written in place; replaced files keep their mode;
 * text cells a spreadsheet would run are neutralised; inputs over the size limit are refused.
 */
import { execFileSync } from "node:child_process";
import * as fs from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { beforeAll, describe, expect, it } from "vitest";
import { betabound, books, cli, monthly } from "./support/run.js";

let dir = "";
const previous = "the previous output, to be kept\n";

/** A fresh folder holding the previous outputs and the inputs. */
function folder(): string {
  const here = fs.mkdtempSync(join(dir, "run-"));
  for (const name of ["out.txt", "chart.svg", "report.html"]) fs.writeFileSync(join(here, name), previous);
  fs.writeFileSync(join(here, "bad.csv"), "date,low,high\n2020-01-31,0.01,0.02\n2020-02-29,0.01,abc\n");
  fs.writeFileSync(join(here, "good.csv"), fs.readFileSync(monthly));
  return here;
}

/** The folder's files and their contents (to compare before and after a run). */
function snapshot(here: string): Record<string, string> {
  return Object.fromEntries(fs.readdirSync(here).map((name) => [name, fs.readFileSync(join(here, name), "utf8")]));
}

beforeAll(() => {
  expect(fs.existsSync(cli), "dist/cli.cjs is missing: run npm run build").toBe(true);
  dir = fs.mkdtempSync(join(tmpdir(), "betabound-outputs-"));
});

describe("a refused input or option leaves every output as it was, and stdout empty", () => {
  const lowHigh = ["--low", "low", "--high", "high"];
  const outputs = ["--output", "out.txt"];
  const cases: [string, string[], number][] = [
    ...["text", "json", "csv", "jsonl"].map((format): [string, string[], number] => [
      `solve --format ${format}, a bad number`,
      ["solve", "bad.csv", ...lowHigh, "--format", format, ...outputs, "--chart", "chart.svg", "--report", "report.html"],
      2,
    ]),
    ["solve --format jsonl, a missing file", ["solve", "missing.csv", ...lowHigh, "--format", "jsonl", ...outputs], 2],
    ["solve, two files that both fail", ["solve", "bad.csv", "missing.csv", ...lowHigh, "--format", "csv", ...outputs], 2],
    ["solve, a missing column", ["solve", "good.csv", "--low", "nope", "--high", "nope2", "--format", "jsonl", ...outputs], 2],
    ...["text", "csv", "jsonl"].map((format): [string, string[], number] => [
      `roll --format ${format}, a bad number`,
      ["roll", "bad.csv", ...lowHigh, "--window", "3", "--format", format, ...outputs, "--chart", "chart.svg"],
      2,
    ]),
    ["roll, a missing file", ["roll", "missing.csv", ...lowHigh, "--window", "3", "--format", "jsonl", ...outputs], 2],
    ["roll, a window longer than the data", ["roll", "good.csv", ...books, "--window", "5000", ...outputs], 2],
    ["solve, a bad option value", ["solve", "good.csv", ...books, "--weight", "1.3", ...outputs], 1],
    ["implied, a bad option value", ["implied", "--low-beta", "0.7", "--factor-vol", "-1", ...outputs], 1],
    ["simulate, a bad option value", ["simulate", "--low-beta", "0.7", "--factor-vol", "0.01", "--periods", "x", ...outputs], 1],
  ];
  for (const [name, args, exit] of cases) {
    it(name, () => {
      const here = folder();
      const before = snapshot(here);
      const run = betabound(args, { cwd: here });
      expect(run.code, run.stderr).toBe(exit);
      expect(run.stdout).toBe("");
      expect(run.stderr).toMatch(/^error: /m);
      expect(run.stderr).not.toMatch(/\n\s+at /);
      expect(snapshot(here)).toEqual(before);
      // Without --output, the same refusal prints nothing on standard output.
      const plain = betabound(
        args.filter(
          (a, k) => !["--output", "--chart", "--report"].includes(a) && !["--output", "--chart", "--report"].includes(args[k - 1] ?? ""),
        ),
        { cwd: here },
      );
      expect(plain.code).toBe(exit);
      expect(plain.stdout).toBe("");
    });
  }
});

describe("an output that would land on an input or another output is refused (exit 1)", () => {
  const cases: [string, (here: string) => string[], RegExp][] = [
    ["--output is the input file", () => ["solve", "good.csv", ...books, "--output", "good.csv"], /is the input 'good.csv'/],
    ["--output is the input by another path", (here) => ["solve", "good.csv", ...books, "--output", `${here}/./good.csv`], /is the input/],
    [
      "--output is a link to the input",
      (here) => {
        fs.symlinkSync("good.csv", join(here, "link.csv"));
        return ["solve", "good.csv", ...books, "--output", "link.csv"];
      },
      /is the input/,
    ],
    ["--chart is the input", () => ["solve", "good.csv", ...books, "--chart", "good.csv"], /--chart 'good.csv' is the input/],
    ["roll --output is the input", () => ["roll", "good.csv", ...books, "--window", "24", "--output", "good.csv"], /is the input/],
    [
      "--output and --chart are one file",
      () => ["solve", "good.csv", ...books, "--output", "a.svg", "--chart", "a.svg"],
      /both name 'a.svg'/,
    ],
    [
      "--output is the config file",
      (here) => {
        fs.writeFileSync(join(here, "job.json"), JSON.stringify({ files: ["good.csv"], low: books[1], high: books[3] }));
        return ["solve", "--config", "job.json", "--output", "job.json"];
      },
      /is the input 'job.json'/,
    ],
    // Folded lexically, these would name the input file itself.
    ["--output is the input with a trailing slash", () => ["solve", "good.csv", ...books, "--output", "good.csv/"], /names a folder/],
    ["--report is the input and '/.'", () => ["solve", "good.csv", ...books, "--report", "./good.csv/."], /names a folder/],
    [
      "roll --chart is the input and '//'",
      () => ["roll", "good.csv", ...books, "--window", "24", "--chart", "good.csv//"],
      /names a folder/,
    ],
    [
      "simulate --output names a folder (no input, the same refusal)",
      () => [
        "simulate",
        "--low-beta",
        "0.7",
        "--factor-vol",
        "0.04",
        "--low-noise-vol",
        "0.01",
        "--high-noise-vol",
        "0.02",
        "--periods",
        "12",
        "--output",
        "out.txt/",
      ],
      /--output 'out.txt\/' names a folder/,
    ],
  ];
  for (const [name, args, message] of cases) {
    it(name, () => {
      const here = folder();
      const command = args(here);
      const before = snapshot(here);
      const run = betabound(command, { cwd: here });
      expect(run.code, run.stderr).toBe(1);
      expect(run.stdout).toBe("");
      expect(run.stderr).toMatch(message);
      expect(snapshot(here)).toEqual(before);
    });
  }

  it("two new files named through a linked folder are one file", () => {
    const here = folder();
    fs.mkdirSync(join(here, "sub"));
    fs.symlinkSync("sub", join(here, "linked"));
    const run = betabound(["solve", "good.csv", ...books, "--chart", "sub/x.svg", "--report", "linked/x.svg"], { cwd: here });
    expect(run.code, run.stderr).toBe(1);
    expect(run.stderr).toMatch(/both name 'linked\/x.svg'/);
    expect(fs.readdirSync(join(here, "sub"))).toEqual([]);
  });

  it("a link's '..' is where the system puts it: the link target's parent, not the input beside the link", () => {
    const here = folder();
    fs.mkdirSync(join(here, "d1", "inner"), { recursive: true });
    fs.symlinkSync("d1/inner", join(here, "deep"));
    const run = betabound(["solve", "good.csv", ...books, "--output", "deep/../good.csv"], { cwd: here });
    expect(run.code, run.stderr).toBe(0);
    expect(fs.readFileSync(join(here, "good.csv"), "utf8")).toBe(fs.readFileSync(monthly, "utf8"));
    expect(fs.readFileSync(join(here, "d1", "good.csv"), "utf8")).toMatch(/Stillwater Low Vol/);
  });

  it("--output is the file standard input reads", () => {
    const here = folder();
    const fd = fs.openSync(join(here, "good.csv"), "r");
    try {
      const run = betabound(["solve", "-", ...books, "--output", "good.csv"], { cwd: here, stdin: fd });
      expect(run.code, run.stderr).toBe(1);
      expect(run.stderr).toMatch(/is standard input/);
    } finally {
      fs.closeSync(fd);
    }
    expect(fs.readFileSync(join(here, "good.csv"), "utf8")).toBe(fs.readFileSync(monthly, "utf8"));
  });
});

describe("several outputs are written as one: a failure of any replaces none, and standard output stays empty", () => {
  const cases: [string, string[]][] = [
    [
      "solve: the report's folder is missing",
      ["solve", "good.csv", ...books, "--output", "out.txt", "--chart", "chart.svg", "--report", "none/r.html"],
    ],
    [
      "solve: the output's folder is missing",
      ["solve", "good.csv", ...books, "--output", "none/o.txt", "--chart", "chart.svg", "--report", "report.html"],
    ],
    [
      "solve: the output is /dev/full",
      ["solve", "good.csv", ...books, "--output", "/dev/full", "--chart", "chart.svg", "--report", "report.html"],
    ],
    [
      "solve to standard output: the chart's folder is missing",
      ["solve", "good.csv", ...books, "--chart", "none/c.svg", "--report", "report.html"],
    ],
    [
      "roll to standard output: the chart's folder is missing",
      ["roll", "good.csv", ...books, "--window", "24", "--format", "csv", "--chart", "none/c.svg"],
    ],
    ["roll: the output is /dev/full", ["roll", "good.csv", ...books, "--window", "24", "--output", "/dev/full", "--chart", "chart.svg"]],
  ];
  for (const [name, command] of cases) {
    it(name, () => {
      const here = folder();
      const before = snapshot(here);
      const run = betabound(command, { cwd: here });
      expect(run.code, run.stderr).toBe(4);
      expect(run.stdout).toBe("");
      expect(snapshot(here)).toEqual(before);
    });
  }
});

describe("where outputs land", () => {
  it("a device is written in place and stays a device", () => {
    const run = betabound(["solve", monthly, ...books, "--output", "/dev/null", "--chart", "/dev/null"]);
    expect(run.code, run.stderr).toBe(0);
    expect(fs.statSync("/dev/null").isCharacterDevice()).toBe(true);
  });

  it("a FIFO receives the output and stays a FIFO", () => {
    const here = folder();
    const fifo = join(here, "pipe");
    execFileSync("mkfifo", [fifo]);
    // The shell reads the FIFO while betabound writes it.
    const got = execFileSync(
      "sh",
      [
        "-c",
        `cat "${fifo}" & node "${cli}" solve "${monthly}" --low "${books[1]}" --high "${books[3]}" --format json --output "${fifo}"; wait`,
      ],
      {
        encoding: "utf8",
      },
    );
    expect(JSON.parse(got).status).toBe("ok");
    expect(fs.statSync(fifo).isFIFO()).toBe(true);
  });

  it("/dev/stdout reaches the file standard output was redirected to", () => {
    const here = folder();
    const target = join(here, "out.txt");
    const fd = fs.openSync(target, "w");
    const inode = fs.statSync(target).ino;
    try {
      execFileSync(process.execPath, [cli, "solve", monthly, ...books, "--format", "json", "--output", "/dev/stdout"], {
        stdio: ["ignore", fd, "ignore"],
      });
    } finally {
      fs.closeSync(fd);
    }
    expect(JSON.parse(fs.readFileSync(target, "utf8")).status).toBe("ok");
    expect(fs.statSync(target).ino).toBe(inode);
  });

  it("a replaced file keeps its mode", () => {
    const here = folder();
    fs.chmodSync(join(here, "out.txt"), 0o600);
    fs.chmodSync(join(here, "chart.svg"), 0o640);
    const run = betabound(["solve", "good.csv", ...books, "--output", "out.txt", "--chart", "chart.svg"], { cwd: here });
    expect(run.code, run.stderr).toBe(0);
    expect(fs.statSync(join(here, "out.txt")).mode & 0o777).toBe(0o600);
    expect(fs.statSync(join(here, "chart.svg")).mode & 0o777).toBe(0o640);
    expect(fs.readFileSync(join(here, "out.txt"), "utf8")).toMatch(/identified set/);
  });
});

describe("CSV cells a spreadsheet would run are neutralised (names only; numbers stay numbers)", () => {
  it("in solve's records and roll's windows", () => {
    const here = folder();
    const rows = fs.readFileSync(monthly, "utf8").split("\n").slice(1).join("\n");
    fs.writeFileSync(join(here, "=HYPERLINK(1).csv"), `Month End,=2+5,@SUM(A1)\n${rows}`);
    const names = ["--low", "=2+5", "--high", "@SUM(A1)"];
    const solve = betabound(["solve", "=HYPERLINK(1).csv", "good.csv", ...names, "--format", "csv"], { cwd: here });
    const lines = solve.stdout.split("\n").filter((l) => l.startsWith('"'));
    expect(lines.length).toBeGreaterThan(0);
    expect(lines[0]).toMatch(/^"'=HYPERLINK\(1\)\.csv","'=2\+5","'@SUM\(A1\)",/);
    const roll = betabound(["roll", "=HYPERLINK(1).csv", ...names, "--window", "36", "--format", "csv"], { cwd: here });
    expect(roll.code, roll.stderr).toBe(0);
    const first = roll.stdout.split("\n")[1] ?? "";
    expect(first).toMatch(/^"'=HYPERLINK\(1\)\.csv","'=2\+5","'@SUM\(A1\)",\d{4}-/);
    // Negative numbers are numbers: no apostrophe before them.
    expect(roll.stdout).toMatch(/,-0\.\d/);
    expect(roll.stdout).not.toMatch(/,"?'-/);
  });
});

describe("inputs over the size limit", () => {
  it("are refused up front, naming the size and the limit (a 2 GiB sparse file)", () => {
    const here = folder();
    const big = join(here, "big.csv");
    fs.writeFileSync(big, "date,low,high\n");
    fs.truncateSync(big, 2 ** 31);
    const run = betabound(["solve", "big.csv", "--low", "low", "--high", "high"], { cwd: here });
    expect(run.code, run.stderr).toBe(2);
    expect(run.stdout).toBe("");
    expect(run.stderr).toMatch(/2\.00 GiB \(2147483648 bytes\).*limit of 2\.00 GiB \(2147483647 bytes\)/);
  });
});
