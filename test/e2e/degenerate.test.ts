/**
 * The degenerate-data catalogue, end to end: the CLI on constant, identical, perfectly (negatively)
 * correlated, cancelling, tiny and huge inputs, and on every option at and just beyond the ends of its
 * range, for solve (text, json, csv, jsonl), roll (csv, jsonl, text), implied and simulate. Every run
 * keeps the contract (no exit 70, no NaN or Infinity with exit 0, no stack trace, nothing on stdout
 * with exit 1 or 2) and exits with the code the README's table gives the case.
 *
 * Which runs are real processes, and why: every case runs in this process (support/inProcess.ts: the
 * program with the executable's own file reads and output path, standard output and error captured),
 * which costs the work alone instead of a node start-up each (the whole catalogue: about 5 s instead of
 * 40 s on two cores). The cases marked `real` run again as the built executable (dist/cli.cjs, through
 * a pool of processes): one or more per command and exit code (0, 1, 2, 3), a failure record on stdout
 * (jsonl) and roll's header alone (csv) with exit 2, a large output through the pipe, and a bootstrap on
 * worker threads (absent from source). Each must keep the contract on its own and write exactly what
 * the in-process run wrote, byte for byte on both streams, with the same exit code: so the launcher,
 * the bundle, the process's exit code and the flushing of its streams stay covered end to end, and the
 * in-process runs stand for the executable's.
 */
import { mkdtempSync, readFileSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { beforeAll, describe, expect, it } from "vitest";
import { inputWarningCodes } from "../../src/input/index.js";
import { scaledDifference } from "../support/units.js";
import { books, type CliRun, contractBreaches, describeRun, monthly, runAll } from "./support/cliRuns.js";
import { asFromSource, runAllInProcess } from "./support/inProcess.js";

const scratch = mkdtempSync(join(tmpdir(), "betabound-degenerate-"));

/** The bundled example's dates and both books (180 months). */
const example = readFileSync(monthly, "utf8")
  .trim()
  .split("\n")
  .slice(1)
  .map((line) => line.split(","));
const dates = example.map((row) => row[0]!);
const low = example.map((row) => Number(row[1]));
const high = example.map((row) => Number(row[2]));

/** A CSV file date,low,high with the first rows of the example's dates; its path. */
function data(name: string, lows: readonly number[], highs: readonly number[]): string {
  const path = join(scratch, `${name}.csv`);
  const lines = lows.map((l, t) => `${dates[t]},${l},${highs[t]}`);
  writeFileSync(path, `date,low,high\n${lines.join("\n")}\n`);
  return path;
}

/** A CSV file date,low,high,index; its path. */
function withIndex(name: string, lows: readonly number[], highs: readonly number[], index: readonly number[]): string {
  const path = join(scratch, `${name}.csv`);
  const lines = lows.map((l, t) => `${dates[t]},${l},${highs[t]},${index[t]}`);
  writeFileSync(path, `date,low,high,index\n${lines.join("\n")}\n`);
  return path;
}

const n = 60;
const first = (x: readonly number[], count = n) => x.slice(0, count);
const scaled = (x: readonly number[], factor: number) => first(x).map((v) => v * factor);
const files = {
  example: data("example", first(low), first(high)),
  constantLow: data("constant-low", first(low).fill(0.01), first(high)),
  constantHigh: data("constant-high", first(low), first(high).fill(-0.004)),
  identical: data("identical", first(low), first(low)),
  perfect: data("perfect", first(low), scaled(low, 2)),
  negativePerfect: data("negative-perfect", first(low), scaled(low, -1)),
  negativeDouble: data("negative-double", first(low), scaled(low, -2)),
  negative: data(
    "negative",
    first(low),
    first(low).map((l, t) => -l + 0.3 * high[t]!),
  ),
  // The classic cancellation: columns 0.01 and 0.02 that differ only by 1e-17 in some rows.
  cancellation: data(
    "cancellation",
    first(low).map((_, t) => (t % 2 === 0 ? 0.01 + 1e-17 : 0.01)),
    first(low).map((_, t) => (t % 3 === 0 ? 0.02 + 1e-17 : 0.02)),
  ),
  // Both books vary, but their covariance is rounding (orthogonal patterns of 0.01 and 0.03).
  covarianceRounding: data(
    "covariance-rounding",
    first(low).map((_, t) => (t % 2 === 0 ? 0.01 : -0.01)),
    first(low).map((_, t) => (t % 4 < 2 ? 0.03 : -0.03)),
  ),
  // Binary fractions: the covariance is exactly 0.
  zeroCovariance: data(
    "zero-covariance",
    first(low).map((_, t) => (t % 2 === 0 ? 0.5 : -0.5)),
    first(low).map((_, t) => (t % 4 < 2 ? 0.25 : -0.25)),
  ),
  tiny80: data("tiny-1e-80", scaled(low, 1e-80), scaled(high, 1e-80)),
  tiny300: data("tiny-1e-300", scaled(low, 1e-300), scaled(high, 1e-300)),
  // Values of 1e-300 that vary: out of range, never "constant".
  varying300: data(
    "varying-1e-300",
    first(low).map((_, t) => (t % 2 === 0 ? 1e-300 : 2e-300)),
    first(high),
  ),
  huge150: data("huge-1e150", scaled(low, 1e150), scaled(high, 1e150)),
  huge300: data("huge-1e300", scaled(low, 1e300), scaled(high, 1e300)),
  atMinimum: data(
    "at-minimum",
    scaled(low, 1e-100 / Math.max(...first(low).map(Math.abs))),
    scaled(high, 1e-100 / Math.max(...first(low).map(Math.abs))),
  ),
  apart: data("apart", scaled(low, 1e-25), first(high)),
  twoRows: data("two-rows", first(low, 2), first(high, 2)),
  threeRows: data("three-rows", first(low, 3), first(high, 3)),
  nineRows: data("nine-rows", first(low, 9), first(high, 9)),
  tenRows: data("ten-rows", first(low, 10), first(high, 10)),
  // The second half's high book is minus the low one: windows there have a constant market or a negative covariance.
  negativeWindow: data(
    "negative-window",
    first(low),
    first(high).map((h, t) => (t < 30 ? h : -0.5 * low[t]! + 0.2 * h)),
  ),
  // An index column beside the books (docs/methods.md §3): the market proxy itself (a Heywood case), a
  // constant, values of 1e-300, and an index on perfectly correlated books.
  indexIsMarket: withIndex(
    "index-market",
    first(low),
    first(high),
    first(low).map((l, t) => (l + high[t]!) / 2),
  ),
  indexConstant: withIndex("index-constant", first(low), first(high), first(low).fill(0.002)),
  indexTiny: withIndex("index-tiny", first(low), first(high), scaled(high, 1e-300)),
  indexOnPerfect: withIndex("index-perfect", first(low), scaled(low, 2), scaled(high, 0.5)),
};
const ab = ["--low", "low", "--high", "high"];

interface Case {
  readonly name: string;
  readonly args: readonly string[];
  /** The exit code the README's table gives this case. */
  readonly code: number;
  /** Text stderr must contain (the diagnostic's words), if any. */
  readonly says?: string;
  /** Text stderr must not contain. */
  readonly never?: string;
  /** Run as the built executable too (see the top of this file). */
  readonly real?: boolean;
}

const real = (c: Case): Case => ({ ...c, real: true });
/** `list` with its case in `format` marked real (the one solveOn or rollOn made in that format). */
const realIn = (format: string, list: Case[]): Case[] => {
  if (!list.some((c) => c.name.endsWith(`(${format})`))) throw new Error(`no case in ${format} among ${list[0]?.name}`);
  return list.map((c) => (c.name.endsWith(`(${format})`) ? real(c) : c));
};

/** Every format for data that are solved or rejected; a refused input writes no report, so json and jsonl (its failure record) cover it. */
const solveFormats = (code: number) => (code === 2 ? ["json", "jsonl"] : ["text", "json", "csv", "jsonl"]);
const solveOn = (name: string, file: string, code: number, extra: readonly string[] = [], says?: string, never?: string): Case[] =>
  solveFormats(code).map((format) => ({
    name: `solve ${name} (${format})`,
    args: ["solve", file, ...ab, "--allow-extreme", "--format", format, ...extra],
    code,
    ...(says === undefined ? {} : { says }),
    ...(never === undefined ? {} : { never }),
  }));
const rollOn = (name: string, file: string, code: number, extra: readonly string[]): Case[] =>
  ["csv", "jsonl", "text"].map((format) => ({
    name: `roll ${name} (${format})`,
    args: ["roll", file, ...ab, "--allow-extreme", "--format", format, ...extra],
    code,
  }));
/** An option on the bundled example: the value at the end of its range (exit 0) and just beyond it (exit 1). */
const option = (command: string, flag: string, value: string, code: number, extra: readonly string[] = []): Case => ({
  name: [command, flag, value, ...extra].join(" "),
  args: command === "solve" || command === "roll" ? [command, monthly, ...books, flag, value, ...extra] : [command, flag, value, ...extra],
  code,
});
const structure = ["--low-beta", "0.7", "--factor-vol", "0.04", "--low-noise-vol", "0.01", "--high-noise-vol", "0.015"];
const simulate = (...extra: string[]) => [...structure, "--periods", "24", ...extra];

const cases: Case[] = [
  // ---- data ---------------------------------------------------------------------------------
  ...realIn("text", realIn("csv", solveOn("on the example rows", files.example, 0))),
  ...realIn("jsonl", solveOn("with a constant low book", files.constantLow, 2, [], "constant")),
  ...solveOn("with a constant high book", files.constantHigh, 2, [], "constant"),
  ...solveOn("with identical books", files.identical, 0, ["--bootstrap", "200"]),
  ...realIn(
    "json",
    solveOn("with perfectly correlated books, Stoye and bootstrap errors", files.perfect, 0, [
      "--bootstrap",
      "200",
      "--interval",
      "stoye",
      "--interval-source",
      "bootstrap",
    ]),
  ),
  ...solveOn("with perfectly correlated books, prewhitened", files.perfect, 0, ["--hac-prewhite"]),
  ...solveOn("with identical books, Andrews bandwidth, quadratic-spectral kernel", files.identical, 0, [
    "--hac-bandwidth",
    "andrews-1991",
    "--hac-kernel",
    "quadratic-spectral",
  ]),
  ...solveOn("with high = -low (a constant market proxy)", files.negativePerfect, 2, [], "market"),
  ...solveOn("with high = -2 low (perfectly negatively correlated)", files.negativeDouble, 3, ["--bootstrap", "100"], "covariance"),
  ...realIn("text", solveOn("with a negative covariance", files.negative, 3, ["--bootstrap", "100"], "covariance")),
  ...solveOn("with columns that differ only by 1e-17 (cancellation)", files.cancellation, 2, [], "last digits"),
  ...solveOn("with a covariance at the level of rounding", files.covarianceRounding, 3, ["--bootstrap", "50"], "rounding"),
  ...solveOn("with an exactly zero covariance", files.zeroCovariance, 3, [], "covariance"),
  ...solveOn("on returns times 1e-80", files.tiny80, 0, ["--bootstrap", "100"]),
  ...realIn("json", solveOn("on returns times 1e-300", files.tiny300, 2, [], "1e-100 to 1e+100", "constant")),
  ...solveOn("on returns of 1e-300 and 2e-300", files.varying300, 2, [], "1e-100 to 1e+100", "constant"),
  ...solveOn("on returns times 1e+150", files.huge150, 2, [], "1e-100 to 1e+100"),
  ...solveOn("on returns times 1e+300", files.huge300, 2, [], "1e-100 to 1e+100"),
  ...solveOn("on returns whose largest is 1e-100", files.atMinimum, 0),
  ...solveOn("on books 1e25 apart", files.apart, 2, [], "apart"),
  ...solveOn("on two rows", files.twoRows, 2),
  ...solveOn("on three rows (the minimum)", files.threeRows, 0),
  ...solveOn("on nine rows (no uncertainty)", files.nineRows, 0),
  ...solveOn("on ten rows (the minimum for uncertainty), with a bootstrap", files.tenRows, 0, ["--bootstrap", "50", "--hac-prewhite"]),
  ...solveOn("with the market proxy as the index (a Heywood case)", files.indexIsMarket, 0, ["--index", "index"], "Heywood"),
  ...solveOn("with a constant index", files.indexConstant, 0, ["--index", "index", "--bootstrap", "50"], "index series is constant"),
  ...solveOn("with an index of 1e-300", files.indexTiny, 0, ["--index", "index"], "outside 1e-100 to 1e+100"),
  ...solveOn("with an index on perfectly correlated books", files.indexOnPerfect, 0, ["--index", "index", "--bootstrap", "50"]),
  ...solveOn("with an index column that is not there", files.example, 2, ["--index", "index"], '"index"'),
  ...solveOn("with noise correlations -1, 0 and 1 on identical books", files.identical, 0, ["--noise-correlation", "-1,0,1"]),
  ...solveOn("with noise correlations on a negative covariance", files.negative, 3, ["--noise-correlation", "-0.5,0.5"], "no bounds"),
  ...rollOn("a window with a negative covariance", files.negativeWindow, 0, ["--window", "12", "--step", "6", "--uncertainty"]),
  ...realIn("jsonl", rollOn("over identical books", files.identical, 0, ["--window", "10", "--step", "7", "--uncertainty"])),
  ...rollOn("over columns that differ by 1e-17", files.cancellation, 0, ["--window", "12", "--step", "12"]),
  ...rollOn("over a covariance at the level of rounding", files.covarianceRounding, 0, ["--window", "12", "--step", "12", "--uncertainty"]),
  ...rollOn("over returns times 1e-80", files.tiny80, 0, ["--window", "24", "--step", "12", "--uncertainty"]),
  ...rollOn("over returns times 1e-300", files.tiny300, 2, ["--window", "24"]),
  ...rollOn("expanding from three rows (the minimum)", files.example, 0, ["--expanding", "--min-periods", "3", "--step", "19"]),
  ...rollOn("with a window of all the rows", files.example, 0, ["--window", String(n)]),
  ...realIn("csv", rollOn("with a window one longer than the rows", files.example, 2, ["--window", String(n + 1)])),
  // ---- options at and beyond the ends of their ranges ---------------------------------------
  option("solve", "--weight", "0.0001", 0),
  real(option("solve", "--weight", "0.00009", 1)),
  option("solve", "--weight", "0.9999", 0),
  option("solve", "--weight", "0.99991", 1),
  option("solve", "--weight", "1e-17", 1),
  option("solve", "--weight", "1e-300", 1),
  option("solve", "--weight", "0", 1),
  option("solve", "--weight", "1", 1),
  option("solve", "--confidence", "0.5", 0, ["--interval", "stoye"]),
  option("solve", "--confidence", "0.4999", 1),
  option("solve", "--confidence", "0.9999", 0, ["--interval", "stoye", "--bootstrap", "100"]),
  option("solve", "--confidence", "0.99991", 1),
  option("solve", "--confidence", "1e-300", 1),
  option("solve", "--confidence", "0.9999999999999999", 1),
  option("solve", "--noise-correlation", "-1", 0),
  option("solve", "--noise-correlation", "1", 0, ["--format", "json"]),
  option("solve", "--noise-correlation", "-1.0001", 1),
  option("solve", "--noise-correlation", "0.5,1.0001", 1),
  option("solve", "--noise-correlation", "0.3,", 1),
  option("solve", "--steps", "2", 0),
  option("solve", "--steps", "1", 1),
  real(option("solve", "--steps", "100000", 0, ["--format", "csv", "--no-uncertainty"])),
  option("solve", "--steps", "100001", 1),
  option("solve", "--bootstrap", "2", 0),
  option("solve", "--bootstrap", "1", 0),
  real(option("solve", "--bootstrap", "1", 1, ["--interval-source", "bootstrap"])),
  option("solve", "--bootstrap", "1000001", 1),
  option("solve", "--bootstrap", "1e9", 1),
  option("solve", "--bootstrap", "-1", 1),
  option("solve", "--bootstrap", "2.5", 1),
  option("solve", "--block-length", "1", 0, ["--bootstrap", "50"]),
  option("solve", "--block-length", "0.999", 1, ["--bootstrap", "50"]),
  // The table's largest values pass the option rules; on the example's 180 rows they are refused as
  // the data's (a block or lag truncation as long as the sample gives intervals of no width).
  { ...option("solve", "--block-length", "100000000", 2, ["--bootstrap", "50"]), says: "is not below the sample's 180 rows" },
  option("solve", "--block-length", "179", 0, ["--bootstrap", "50"]),
  option("solve", "--block-length", "100000001", 1, ["--bootstrap", "50"]),
  option("solve", "--hac-lags", "0", 0),
  { ...option("solve", "--hac-lags", "100000", 2), says: "is not below the sample's 180 rows: give at most 179" },
  option("solve", "--hac-lags", "179", 0),
  option("solve", "--hac-lags", "100001", 1),
  option("solve", "--hac-lags", "-1", 1),
  option("solve", "--seed", "9007199254740991", 0, ["--bootstrap", "20"]),
  option("solve", "--seed", "1.5", 1, ["--bootstrap", "20"]),
  option("roll", "--window", "3", 0, ["--format", "csv", "--step", "50"]),
  option("roll", "--window", "2", 1),
  option("roll", "--step", "100000000", 0, ["--window", "24"]),
  option("roll", "--step", "100000001", 1, ["--window", "24"]),
  real(option("roll", "--step", "0", 1, ["--window", "24"])),
  option("roll", "--confidence", "0.9999", 0, ["--window", "24", "--step", "40", "--uncertainty", "--format", "jsonl"]),
  option("roll", "--weight", "0.0001", 0, ["--window", "24", "--step", "40", "--format", "jsonl"]),
  real(option("implied", "--factor-vol", "1e-100", 0, [...structure.slice(0, 2), ...structure.slice(4), "--format", "json"])),
  option("implied", "--factor-vol", "9e-101", 1, [...structure.slice(0, 2), ...structure.slice(4)]),
  option("implied", "--factor-vol", "1e100", 0, [...structure.slice(0, 2), ...structure.slice(4), "--format", "csv"]),
  option("implied", "--factor-vol", "1.1e100", 1, [...structure.slice(0, 2), ...structure.slice(4)]),
  option("implied", "--weight", "0.9999", 0, ["--low-beta", "1.0001", ...structure.slice(2)]),
  option("implied", "--low-noise-vol", "0", 0, [...structure.slice(0, 4), "--high-noise-vol", "0", "--format", "json"]),
  option("implied", "--factor-mean", "1e100", 0, [...structure]),
  real(option("implied", "--factor-mean", "Infinity", 1, [...structure])),
  option("implied", "--steps", "100000", 0, [...structure, "--format", "csv"]),
  {
    real: true,
    name: "implied with the factor 1e-100 and a noise 1e+100 (a covariance lost next to the variances)",
    args: [
      "implied",
      "--low-beta",
      "0.7",
      "--factor-vol",
      "1e-100",
      "--low-noise-vol",
      "1e100",
      "--high-noise-vol",
      "0.01",
      "--format",
      "json",
    ],
    code: 3,
  },
  { real: true, name: "simulate one period", args: ["simulate", ...structure, "--periods", "1"], code: 0 },
  { real: true, name: "simulate 0 periods", args: ["simulate", ...structure, "--periods", "0"], code: 1 },
  { name: "simulate 1,000,001 periods", args: ["simulate", ...structure, "--periods", "1000001"], code: 1 },
  { name: "simulate with seed 1.5", args: ["simulate", ...simulate("--seed", "1.5")], code: 1 },
  { name: "simulate with 2 degrees of freedom", args: ["simulate", ...simulate("--tails", "2")], code: 1 },
  { name: "simulate with 2.0001 degrees of freedom", args: ["simulate", ...simulate("--tails", "2.0001", "--format", "jsonl")], code: 0 },
  { name: "simulate with a noise AR of 0.99999", args: ["simulate", ...simulate("--noise-ar", "0.99999")], code: 0 },
  { name: "simulate with GARCH 0,0.99999", args: ["simulate", ...simulate("--garch", "0,0.99999")], code: 0 },
  { name: "simulate with the factor 1e100", args: ["simulate", ...simulate("--factor-vol", "1e100")], code: 0 },
  { name: "simulate with no noise", args: ["simulate", ...simulate("--low-noise-vol", "0", "--high-noise-vol", "0")], code: 0 },
];

const realCases = cases.filter((c) => c.real === true);
let runs: CliRun[] = [];
let realRuns: CliRun[] = [];
beforeAll(async () => {
  // The executable's runs go on in child processes while this process runs the catalogue.
  [runs, realRuns] = await Promise.all([runAllInProcess(cases.map((c) => c.args)), runAll(realCases.map((c) => c.args))]);
}, 120_000);

/** The checks every case's run must pass, in process or as the executable. */
function checkCase(c: Case, run: CliRun): void {
  expect(contractBreaches(run), describeRun(run)).toEqual([]);
  expect(run.code, `${describeRun(run)}\n${run.stderr}`).toBe(c.code);
  if (c.says !== undefined) expect(run.stderr).toContain(c.says);
  if (c.never !== undefined) expect(run.stderr).not.toContain(c.never);
  if (c.code === 0 || c.code === 3) expect(run.stdout.length, describeRun(run)).toBeGreaterThan(0);
}

describe("degenerate data and options at the ends of their ranges", () => {
  it.each(cases.map((c, i) => [c.name, i] as const))("%s", (_name, i) => {
    checkCase(cases[i]!, runs[i]!);
  });
});

describe("the built executable on the cases marked real: the contract, and what the in-process run wrote", () => {
  it("runs every command and every exit code as a real process", () => {
    const covered = new Set(realCases.map((c) => `${c.args[0]} ${c.code}`));
    for (const expected of [
      "solve 0",
      "solve 1",
      "solve 2",
      "solve 3",
      "roll 0",
      "roll 1",
      "roll 2",
      "implied 0",
      "implied 1",
      "implied 3",
      "simulate 0",
      "simulate 1",
    ])
      expect(covered).toContain(expected);
  });

  it.each(realCases.map((c, k) => [c.name, k] as const))("%s", (_name, k) => {
    const c = realCases[k]!;
    const run = realRuns[k]!;
    checkCase(c, run);
    const inProcess = runs[cases.indexOf(c)]!;
    const restated = asFromSource(run);
    expect(restated.code).toBe(inProcess.code);
    expect(restated.stderr).toBe(inProcess.stderr);
    expect(restated.stdout).toBe(inProcess.stdout);
  });
});

describe("returns scaled by a power of ten give the unscaled results in their units (to 1e-12)", () => {
  // The core's tests cover more scales (test/core/degenerate.test.ts); here the CLI's documents, run in process.
  const scales = [1e-80, 1e80];
  const solveArgs = (file: string) => [
    "solve",
    file,
    ...ab,
    "--allow-extreme",
    "--format",
    "json",
    "--bootstrap",
    "200",
    "--interval",
    "stoye",
  ];
  const rollArgs = (file: string) => [
    "roll",
    file,
    ...ab,
    "--allow-extreme",
    "--format",
    "jsonl",
    "--window",
    "24",
    "--step",
    "9",
    "--uncertainty",
  ];
  const scaledFiles = scales.map((s) => data(`scaled-${s}`, scaled(low, s), scaled(high, s)));
  const impliedArgs = (s: number) => [
    "implied",
    "--low-beta",
    "0.72",
    "--factor-vol",
    String(0.045 * s),
    "--factor-mean",
    String(0.006 * s),
    "--low-noise-vol",
    String(0.014 * s),
    "--high-noise-vol",
    String(0.022 * s),
    "--format",
    "json",
  ];
  let plain: CliRun[] = [];
  let scaledRuns: CliRun[][] = [];
  beforeAll(async () => {
    const all = await runAllInProcess([
      solveArgs(files.example),
      rollArgs(files.example),
      impliedArgs(1),
      ...scaledFiles.flatMap((file, k) => [solveArgs(file), rollArgs(file), impliedArgs(scales[k]!)]),
    ]);
    plain = all.slice(0, 3);
    scaledRuns = scales.map((_, k) => all.slice(3 + 3 * k, 6 + 3 * k));
  }, 60_000);

  it.each(scales.map((s, k) => [s, k] as const))("returns times %s", (s, k) => {
    // Returns of 1e+80 look like percent to the reader (a reading warning); the computed results are compared.
    const reading = new Set<string>(inputWarningCodes);
    const computed = (document: unknown) => {
      const d = document as { diagnostics?: { code: string }[] };
      return d.diagnostics === undefined ? d : { ...d, diagnostics: d.diagnostics.filter((x) => !reading.has(x.code)) };
    };
    const parse = (run: CliRun) => {
      expect(run.code, `${describeRun(run)}\n${run.stderr}`).toBe(0);
      return run.stdout
        .trim()
        .split("\n")
        .map((line) => computed(JSON.parse(line)));
    };
    const runs = scaledRuns[k]!;
    const solveDifference = scaledDifference(computed(JSON.parse(plain[0]!.stdout)), computed(JSON.parse(runs[0]!.stdout)), s);
    const rollDifference = scaledDifference(parse(plain[1]!), parse(runs[1]!), s);
    const impliedDifference = scaledDifference(JSON.parse(plain[2]!.stdout), JSON.parse(runs[2]!.stdout), s);
    expect(solveDifference.compared).toBeGreaterThan(300);
    expect(rollDifference.compared).toBeGreaterThan(200);
    expect(solveDifference.largest, `solve: at ${solveDifference.at}`).toBeLessThan(1e-12);
    expect(rollDifference.largest, `roll: at ${rollDifference.at}`).toBeLessThan(1e-12);
    expect(impliedDifference.largest, `implied: at ${impliedDifference.at}`).toBeLessThan(1e-12);
  });
});

describe("a --config file value beyond its range is refused like the flag: exit 1, the same words", () => {
  const values: readonly [string, string, unknown][] = [
    ["bootstrap", "--bootstrap", 1e9],
    ["steps", "--steps", 1e9],
    ["confidence", "--confidence", 1e-300],
    ["confidence", "--confidence", 0.9999999999999999],
    ["weight", "--weight", 1e-17],
    ["hacLags", "--hac-lags", 1e9],
    ["blockLength", "--block-length", 1e300],
    ["seed", "--seed", 1.5],
  ];
  let pairs: CliRun[][] = [];
  beforeAll(async () => {
    const argsList = values.flatMap(([key, flag, value], k) => {
      const config = join(scratch, `config-${k}.json`);
      writeFileSync(config, JSON.stringify({ [key]: value }));
      return [
        ["solve", monthly, ...books, "--config", config],
        ["solve", monthly, ...books, flag, String(value)],
      ];
    });
    const all = await runAllInProcess(argsList);
    pairs = values.map((_, k) => [all[2 * k]!, all[2 * k + 1]!]);
  }, 60_000);

  it.each(values.map(([key, , value], k) => [key, value, k] as const))("%s = %s", (_key, _value, k) => {
    const [fromFile, fromFlag] = pairs[k]!;
    for (const run of [fromFile!, fromFlag!]) {
      expect(contractBreaches(run), describeRun(run)).toEqual([]);
      expect(run.code, describeRun(run)).toBe(1);
    }
    const rule = (stderr: string) => /must be [^;(\n]+/.exec(stderr)?.[0]?.trim();
    expect(rule(fromFile!.stderr)).toBeDefined();
    expect(rule(fromFile!.stderr)).toBe(rule(fromFlag!.stderr));
  });
});

describe("charts and HTML reports of degenerate data hold no NaN or Infinity either", () => {
  const drawn: readonly [string, readonly string[]][] = [
    [
      "solve, identical books",
      ["solve", files.identical, ...ab, "--report", join(scratch, "identical.html"), "--chart", join(scratch, "identical.svg")],
    ],
    [
      "solve, high = 2 low",
      ["solve", files.perfect, ...ab, "--report", join(scratch, "perfect.html"), "--chart", join(scratch, "perfect.svg")],
    ],
    ["solve, covariance at rounding", ["solve", files.covarianceRounding, ...ab, "--report", join(scratch, "rounding.html")]],
    [
      "roll, every window constant up to rounding",
      ["roll", files.cancellation, ...ab, "--window", "12", "--chart", join(scratch, "cancel-roll.svg")],
    ],
    [
      "roll, windows with a negative covariance",
      ["roll", files.negativeWindow, ...ab, "--window", "12", "--uncertainty", "--chart", join(scratch, "negative-roll.svg")],
    ],
  ];
  let drawnRuns: CliRun[] = [];
  beforeAll(async () => {
    drawnRuns = await runAllInProcess(drawn.map(([, args]) => args));
  }, 60_000);

  it.each(drawn.map(([name], k) => [name, k] as const))("%s", (_name, k) => {
    const run = drawnRuns[k]!;
    expect(contractBreaches(run), describeRun(run)).toEqual([]);
    expect([0, 3], describeRun(run)).toContain(run.code);
    const outputs = run.args.filter((a) => a.endsWith(".svg") || a.endsWith(".html"));
    expect(outputs.length).toBeGreaterThan(0);
    for (const output of outputs) expect(readFileSync(output, "utf8")).not.toMatch(/\bNaN\b|Infinity/);
  });
});
