/**
 * The published library (dist/index.js and dist/core.js through the package's own "exports"), used
 * without the CLI: the jobs print what the executable prints, byte for byte, and the pure core loads
 * no package at all.
 */
import { spawnSync } from "node:child_process";
import { readFileSync } from "node:fs";
import { join } from "node:path";
import { pathToFileURL } from "node:url";
import { describe, expect, it } from "vitest";

const root = new URL("../../", import.meta.url).pathname;
const cli = join(root, "dist/cli.cjs");
const exampleName = "examples/harbourline-monthly.csv";
const example = readFileSync(join(root, exampleName));
const dailyName = "examples/harbourline-daily.csv";
const daily = readFileSync(join(root, dailyName));
const books = { low: "Stillwater Low Vol", high: "Kestrel High Beta" } as const;
const bookFlags = ["--low", books.low, "--high", books.high];

type Library = typeof import("../../src/index.js");
const library = (): Promise<Library> => import(pathToFileURL(join(root, "dist/index.js")).href) as Promise<Library>;

function betabound(args: string[]): { code: number | null; stdout: string } {
  const result = spawnSync(process.execPath, [cli, ...args], { cwd: root, encoding: "utf8", env: { ...process.env, NO_COLOR: "1" } });
  return { code: result.status, stdout: result.stdout };
}

describe('import { solveJob, rollJob, impliedJob } from "betabound"', () => {
  it.each([
    ["the defaults", {}, []],
    [
      "a risk-free rate, 21 candidates and Stoye intervals",
      { rf: "0.002", steps: 21, interval: "stoye" },
      ["--rf", "0.002", "--steps", "21", "--interval", "stoye"],
    ],
    ["a bootstrap on one thread", { bootstrap: 200, seed: 7, threads: 1 }, ["--bootstrap", "200", "--seed", "7", "--threads", "1"]],
    ["no uncertainty and w = 0.3", { uncertainty: false, weight: 0.3 }, ["--no-uncertainty", "--weight", "0.3"]],
  ] as const)("solveJob reproduces solve --format json with %s", async (_, options, flags) => {
    const { solveJob, sourcesFrom } = await library();
    const result = await solveJob(
      [exampleName],
      { ...books, ...options, format: "json" },
      { read: sourcesFrom({ [exampleName]: example }) },
    );
    if (!result.ok) throw new Error(result.issues.message);
    const printed = betabound(["solve", exampleName, ...bookFlags, ...flags, "--format", "json"]);
    expect(printed.code).toBe(0);
    expect(`${JSON.stringify(result.value.pairs[0]?.document, null, 2)}\n`).toBe(printed.stdout);
  });

  it("solveJob reproduces solve --format jsonl for several files and pairs, a failure included", async () => {
    const { solveJob, sourcesFrom } = await library();
    const pair = [books, { low: books.low, high: "No Such Book" }];
    const read = sourcesFrom({ [exampleName]: example, [dailyName]: daily });
    const result = await solveJob([exampleName, dailyName], { pair, format: "jsonl" }, { read });
    if (!result.ok) throw new Error(result.issues.message);
    const pairFlags = ["--pair", `${books.low}:${books.high}`, "--pair", `${books.low}:No Such Book`];
    const printed = betabound(["solve", exampleName, dailyName, ...pairFlags, "--format", "jsonl"]);
    expect(printed.code).toBe(5);
    expect(result.value.pairs.map((p) => `${JSON.stringify(p.document)}\n`).join("")).toBe(printed.stdout);
    expect(result.value.pairs.map((p) => p.status)).toEqual(["ok", "failed", "ok", "failed"]);
  });

  it("rollJob reproduces roll --format jsonl, with uncertainty", async () => {
    const { rollJob, sourcesFrom } = await library();
    const job = rollJob(
      [exampleName],
      { ...books, window: 60, step: 12, uncertainty: true, format: "jsonl" },
      { read: sourcesFrom({ [exampleName]: example }) },
    );
    if (!job.ok) throw new Error(job.issues.message);
    let lines = "";
    for await (const pair of job.value.pairs)
      if (pair.kind === "windows") for (const record of pair.records()) lines += `${JSON.stringify(record)}\n`;
    const printed = betabound(["roll", exampleName, ...bookFlags, "--window", "60", "--step", "12", "--uncertainty", "--format", "jsonl"]);
    expect(printed.code).toBe(0);
    expect(lines).toBe(printed.stdout);
  });

  it("impliedJob reproduces implied --format json", async () => {
    const { impliedJob } = await library();
    const structure = { lowBeta: 0.72, factorVol: 0.045, factorMean: 0.006, lowNoiseVol: 0.014, highNoiseVol: 0.022, rf: 0.001 };
    const result = impliedJob({ ...structure, format: "json" });
    if (!result.ok) throw new Error(result.issues.message);
    const flags = Object.entries(structure).flatMap(([key, value]) => [
      `--${key.replace(/[A-Z]/g, (c) => `-${c.toLowerCase()}`)}`,
      String(value),
    ]);
    const printed = betabound(["implied", ...flags, "--format", "json"]);
    expect(printed.code).toBe(0);
    expect(`${JSON.stringify(result.value.document, null, 2)}\n`).toBe(printed.stdout);
  });

  it("leaves the caller's zod settings alone", () => {
    const script = `
      import * as z from "zod/mini";
      const before = Object.keys(z.config()).sort().join(",");
      await import("betabound");
      console.log(JSON.stringify({ before, after: Object.keys(z.config()).sort().join(",") }));
    `;
    const result = spawnSync(process.execPath, ["--input-type=module", "-e", script], { cwd: root, encoding: "utf8" });
    expect(result.stderr).toBe("");
    const { before, after } = JSON.parse(result.stdout);
    expect(after).toBe(before);
  });

  it("refuses an option value in the words the command line uses, as a value, not an exception", async () => {
    const { solveJob, sourcesFrom } = await library();
    const result = await solveJob([exampleName], { ...books, weight: 1.3 }, { read: sourcesFrom({}) });
    expect(result.ok).toBe(false);
    if (!result.ok)
      expect(result.issues).toEqual({ code: "invalid-value", option: "weight", message: "must be a number >= 0.0001 and <= 0.9999" });
  });
});

describe('import { ... } from "betabound/core"', () => {
  it("gives the pure core, which solves a sample without loading any package", () => {
    const script = `
      import { solve, assessUncertainty, implied } from "betabound/core";
      const low = [0.01, -0.02, 0.015, 0.004, -0.006, 0.012, 0.003, -0.011, 0.02, 0.001, -0.004, 0.007];
      const high = [0.02, -0.035, 0.03, 0.001, -0.012, 0.02, 0.004, -0.02, 0.033, 0.005, -0.01, 0.011];
      const result = solve({ low, high });
      const u = assessUncertainty({ low, high }).value;
      console.log(JSON.stringify({ ok: result.ok, bounds: result.ok ? result.value.bounds.lowBeta : null, se: u.bounds.lowBeta.min.stdError > 0, implied: implied({ lowBeta: 0.7, weight: 0.5, factorVol: 0.04, factorMean: 0.005, lowNoiseVol: 0.01, highNoiseVol: 0.02 }, 3).value.truth.insideSet }));
    `;
    const result = spawnSync(process.execPath, ["--input-type=module", "-e", script], { cwd: root, encoding: "utf8" });
    expect(result.stderr).toBe("");
    const out = JSON.parse(result.stdout);
    expect(out.ok).toBe(true);
    expect(out.bounds.min).toBeLessThan(out.bounds.max);
    expect(out.se).toBe(true);
    expect(out.implied).toBe(true);
  });

  it("imports no package (the core), and the full library none of the CLI's (commander) or the charts' (vega)", () => {
    const imports = (file: string) =>
      [...readFileSync(join(root, "dist", file), "utf8").matchAll(/^import .* from "([^"]+)";?$/gm)]
        .map((m) => m[1]!)
        .filter((name) => !name.startsWith("node:"));
    expect(imports("core.js")).toEqual([]);
    expect([...new Set(imports("index.js"))].sort()).toEqual(["csv-parse/sync", "zod/mini"]);
  });
});
