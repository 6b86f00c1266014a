/**
 * Fuzzing the built executable: random commands (solve, roll, implied, simulate) with option values in
 * and out of range and odd texts (1e308, -0, NaN, Infinity, 0x10, empty), on small tables with
 * degenerate structure (constant, identical, scaled or negated copies, perturbations of 1e-17, tiny and
 * huge scales, a few rows). Whatever the input, every run keeps the contract: no exit 70, no NaN or
 * Infinity in a successful output, no stack trace, nothing on stdout when the command line or the input
 * is refused (exit 1 or 2; test/e2e/support/cliRuns.ts).
 *
 * The cases come from fast-check with a fixed seed, so CI runs the same ones; BETABOUND_FUZZ_RUNS
 * (default 60) and BETABOUND_FUZZ_SEED run more or others.
 *
 * Which runs are real processes, and why: every case runs in this process (support/inProcess.ts: the
 * program with the executable's file reads and output path), which costs its work alone rather than a
 * node start-up each; every sixth case runs again as the built executable (dist/cli.cjs), in child
 * processes meanwhile, and must keep the contract and write exactly what its in-process run wrote, with
 * the same exit code. The launcher, the bundle and the process's exit and streams stay covered on
 * random commands, and the in-process runs stand for the executable's.
 */
import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import fc from "fast-check";
import { beforeAll, describe, expect, it } from "vitest";
import { type CliRun, contractBreaches, describeRun, runAll } from "./support/cliRuns.js";
import { asFromSource, runAllInProcess } from "./support/inProcess.js";

const runs = Number(process.env.BETABOUND_FUZZ_RUNS ?? 60);
const seed = Number(process.env.BETABOUND_FUZZ_SEED ?? 20260611);
const scratch = mkdtempSync(join(tmpdir(), "betabound-fuzz-"));

/** Texts a hostile user might give any numeric option. */
const oddNumbers = [
  "0",
  "-0",
  "1",
  "-1",
  "2",
  "3",
  "0.5",
  "0.9999",
  "0.99991",
  "0.0001",
  "0.00009",
  "1.5",
  "1e-17",
  "1e-300",
  "1e-320",
  "1e308",
  "1e309",
  "-1e308",
  "NaN",
  "Infinity",
  "-Infinity",
  "0x10",
  "1,5",
  "1e9",
  "100000",
  "100001",
  "9007199254740993",
  "",
  " ",
  "abc",
];
const numberText = fc.oneof(
  { weight: 3, arbitrary: fc.constantFrom(...oddNumbers) },
  { weight: 1, arbitrary: fc.integer({ min: -5, max: 400 }).map(String) },
  { weight: 1, arbitrary: fc.double({ min: -2, max: 2, noNaN: true }).map(String) },
);

/** Options and the texts they get: [flag, value] pairs, or a switch alone. */
type Flag = readonly [string, fc.Arbitrary<string>] | readonly [string];
/** A flag whose value is one of `usual` three times in four, any odd text otherwise. */
const valued = (flag: string, ...usual: string[]): Flag =>
  [flag, fc.oneof({ weight: 3, arbitrary: fc.constantFrom(...usual) }, { weight: 1, arbitrary: numberText })] as const;
/** Sizes large enough to cost minutes are left out of these (their ranges are checked by the catalogue test). */
const small = (flag: string, ...usual: string[]): Flag =>
  [
    flag,
    fc.oneof(
      { weight: 3, arbitrary: fc.constantFrom(...usual) },
      { weight: 1, arbitrary: numberText.filter((t) => !/^(1e9|100000|9007199254740993|1e308|400|3\d\d)$/.test(t)) },
    ),
  ] as const;

const solveFlags: Flag[] = [
  valued("--weight", "0.5", "0.0001", "0.9999", "0.3"),
  valued("--confidence", "0.95", "0.5", "0.9999"),
  valued("--steps", "2", "3", "11"),
  small("--bootstrap", "0", "1", "2", "20", "60"),
  valued("--block-length", "auto", "1", "3", "100000000"),
  valued("--hac-lags", "0", "1", "30", "100000"),
  valued("--seed", "1", "0", "9007199254740991"),
  valued("--interval", "imbens-manski", "stoye"),
  valued("--interval-source", "delta", "bootstrap"),
  valued("--long-run", "hac", "iid"),
  valued("--hac-kernel", "bartlett", "quadratic-spectral"),
  valued("--hac-bandwidth", "newey-west-1994", "andrews-1991"),
  ["--hac-prewhite"],
  ["--hac-adjust"],
  ["--no-uncertainty"],
  valued("--format", "text", "json", "csv", "jsonl"),
  valued("--rf", "0", "0.001", "1e-300", "-0.5"),
];
const rollFlags: Flag[] = [
  valued("--window", "3", "4", "5", "10", "12"),
  valued("--step", "1", "2", "7"),
  ["--expanding"],
  valued("--min-periods", "3", "10"),
  ["--uncertainty"],
  valued("--confidence", "0.95", "0.5", "0.9999"),
  valued("--weight", "0.5", "0.0001", "0.9999"),
  valued("--long-run", "hac", "iid"),
  valued("--format", "text", "csv", "jsonl"),
];
const structureFlags: Flag[] = [
  valued("--low-beta", "0.7", "1.2", "1.9999", "1e-12"),
  valued("--factor-vol", "0.04", "1e-100", "1e100"),
  valued("--factor-mean", "0", "0.005", "-1e100"),
  valued("--low-noise-vol", "0", "0.01", "1e-100", "1e100"),
  valued("--high-noise-vol", "0", "0.02"),
  valued("--weight", "0.5", "0.0001", "0.9999"),
  valued("--rf", "0", "0.002"),
];
const impliedFlags: Flag[] = [...structureFlags, valued("--steps", "2", "11"), valued("--format", "text", "json", "csv")];
const simulateFlags: Flag[] = [
  ...structureFlags,
  small("--periods", "1", "2", "3", "24"),
  valued("--seed", "1", "0", "9007199254740991"),
  valued("--tails", "3", "2.0001", "30"),
  valued("--noise-ar", "0", "0.5", "-0.99999"),
  valued("--garch", "0,0", "0.1,0.8", "0,0.99999", "0.5,0.5", "-0,1", "NaN,0", "1e308,0", "0.1"),
  valued("--digits", "1", "6", "17"),
  valued("--frequency", "daily", "weekly", "monthly", "quarterly", "annual"),
  valued("--start", "2000-01-01", "1999-12-31", "2024-02-29", "2023-02-29"),
  valued("--format", "csv", "jsonl"),
];

/** Some of `flags`, each with a value drawn for it. */
function flagsFrom(flags: readonly Flag[]): fc.Arbitrary<string[]> {
  return fc
    .subarray([...flags], { maxLength: 4 })
    .chain((chosen) =>
      fc.tuple(...chosen.map((flag) => (flag.length === 1 ? fc.constant([flag[0]]) : flag[1].map((value) => [flag[0], value])))),
    )
    .map((parts) => parts.flat());
}

/** A small table: low and high with a degenerate structure at some scale, a few rows, now and then a bad cell. */
const table = fc
  .record({
    rows: fc.constantFrom(0, 2, 3, 4, 10, 12, 20, 20, 20),
    ints: fc.array(fc.integer({ min: -5, max: 5 }), { minLength: 20, maxLength: 20 }),
    others: fc.array(fc.integer({ min: -5, max: 5 }), { minLength: 20, maxLength: 20 }),
    high: fc.constantFrom(
      "independent",
      "independent",
      "independent",
      "identical",
      "double",
      "negated",
      "negated-double",
      "perturbed",
      "constant",
      "tiny-scaled",
    ),
    lowConstant: fc.constantFrom(false, false, false, false, false, true),
    scale: fc.constantFrom(1e-300, 1e-80, 0.01, 0.01, 0.01, 1, 1e80, 1e300),
    bad: fc.constantFrom("none", "none", "none", "none", "none", "none", "none", "none", "NaN", "empty", "text", "Infinity"),
  })
  .map(({ rows, ints, others, high, lowConstant, scale, bad }) => {
    const lows = ints.slice(0, rows).map((k, t) => (lowConstant ? 0.01 : k * 0.01 + (t % 3) * 0.001) * scale);
    const highs = lows.map((l, t) => {
      const other = others[t]! * 0.013 * scale;
      switch (high) {
        case "identical":
          return l;
        case "double":
          return 2 * l;
        case "negated":
          return -l;
        case "negated-double":
          return -2 * l;
        case "perturbed":
          return l + (t % 2 === 0 ? 1e-17 * scale : 0);
        case "constant":
          return 0.02 * scale;
        case "tiny-scaled":
          return other * 1e-30;
        default:
          return other;
      }
    });
    const cells = lows.map((l, t) => [String(l), String(highs[t])]);
    if (bad !== "none" && cells.length > 1) cells[1]![1] = bad === "empty" ? "" : bad === "text" ? "0.01abc" : bad;
    const dates = cells.map((_, t) => `${2000 + Math.floor(t / 12)}-${String((t % 12) + 1).padStart(2, "0")}-28`);
    return `date,low,high\n${cells.map((c, t) => `${dates[t]},${c[0]},${c[1]}`).join("\n")}\n`;
  });

const command = fc.oneof(
  { weight: 4, arbitrary: fc.tuple(fc.constant("solve"), table, flagsFrom(solveFlags)) },
  { weight: 3, arbitrary: fc.tuple(fc.constant("roll"), table, flagsFrom(rollFlags)) },
  { weight: 2, arbitrary: fc.tuple(fc.constant("implied"), fc.constant(""), flagsFrom(impliedFlags)) },
  { weight: 2, arbitrary: fc.tuple(fc.constant("simulate"), fc.constant(""), flagsFrom(simulateFlags)) },
);

interface FuzzCase {
  readonly args: string[];
  readonly data: string;
}

const cases: FuzzCase[] = fc.sample(command, { seed, numRuns: runs }).map(([name, data, flags], k) => {
  if (name === "implied" || name === "simulate") {
    // The required structure first, so that most runs get past the command line; the drawn flags override it.
    const base = ["--low-beta", "0.7", "--factor-vol", "0.04", "--low-noise-vol", "0.01", "--high-noise-vol", "0.015"];
    return { args: [name, ...base, ...(name === "simulate" ? ["--periods", "12"] : []), ...flags], data };
  }
  const file = join(scratch, `case-${k}.csv`);
  writeFileSync(file, data);
  const windows = name === "roll" && !flags.includes("--window") && !flags.includes("--expanding") ? ["--window", "4"] : [];
  return { args: [name, file, "--low", "low", "--high", "high", "--allow-extreme", ...windows, ...flags], data };
});

/** The cases run as the built executable too: every sixth. */
const realEvery = 6;
const realIndices = cases.map((_, k) => k).filter((k) => k % realEvery === 0);
let results: CliRun[] = [];
let realResults: CliRun[] = [];
beforeAll(async () => {
  [results, realResults] = await Promise.all([runAllInProcess(cases.map((c) => c.args)), runAll(realIndices.map((k) => cases[k]!.args))]);
}, 300_000);

describe(`fuzzing the executable (${runs} runs, seed ${seed})`, () => {
  it("keeps the contract on every run: no exit 70, no NaN or Infinity with exit 0, no stack trace, no stdout when refused", () => {
    const failures = results
      .map((run, k) => ({ run, breaches: contractBreaches(run), data: cases[k]!.data }))
      .filter((f) => f.breaches.length > 0)
      .map((f) => `${describeRun(f.run)}: ${f.breaches.join("; ")}\n${f.run.stderr.slice(0, 400)}\ndata:\n${f.data.slice(0, 400)}`);
    expect(failures, failures.join("\n\n")).toEqual([]);
  });

  it("reaches every kind of outcome: successes, refused command lines, refused inputs and rejected models", () => {
    const codes = new Set(results.map((r) => r.code));
    for (const code of [0, 1, 2]) expect(codes.has(code), `exit ${code} among ${[...codes].join(", ")}`).toBe(true);
  });

  it(`the executable keeps the contract on every ${realEvery}th case and writes what the in-process run wrote`, () => {
    expect(realResults.length).toBe(realIndices.length);
    realResults.forEach((run, j) => {
      const k = realIndices[j]!;
      expect(contractBreaches(run), describeRun(run)).toEqual([]);
      const restated = asFromSource(run);
      expect(restated.code, describeRun(run)).toBe(results[k]!.code);
      expect(restated.stderr, describeRun(run)).toBe(results[k]!.stderr);
      expect(restated.stdout, describeRun(run)).toBe(results[k]!.stdout);
    });
  });
});
