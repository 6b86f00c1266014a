/**
 * solve --index and --noise-correlation in process: the JSON and text report of the extensions
 * (docs/methods.md §2, §3), the index column read like the books', and the option from a flag and a
 * config file.
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { run } from "../../src/cli/program.js";
import { exitCodes } from "../../src/cli/runtime/exitCodes.js";
import type { SolveOutputJson } from "../../src/schema/solveOutput.js";
import { expectClose } from "../support/close.js";
import { fakeIo } from "./fakeIo.js";

const dataset = readFileSync(new URL("../fixtures/models/index_dataset.csv", import.meta.url), "utf8");
const expected = JSON.parse(readFileSync(new URL("../fixtures/models/models_expected.json", import.meta.url), "utf8")).index as {
  riskFree: number;
  estimates: Record<string, number>;
  iidStdErrors: Record<string, number>;
};
const books = ["--low", "low", "--high", "high"];

/**
 * Example A of docs/methods.md §1.7 as seven rows with exact sample moments (divisor 6): V_low 4,
 * V_high 9, C 5 (low deviations -4, -1, 0, 1, 1, 1, 2 plus 5; high -6, -1, 2, 0, 2, 3, 0 plus 7).
 */
const exampleA = [
  "date,low,high",
  ...[-4, -1, 0, 1, 1, 1, 2].map((l, t) => `2024-0${t + 1}-15,${l + 5},${[-6, -1, 2, 0, 2, 3, 0][t]! + 7}`),
].join("\n");

async function solve(files: Record<string, string>, args: string[]) {
  const { io, stdout, stderr } = fakeIo(files);
  const code = await run(["solve", ...args], io);
  return { code, stdout: stdout(), stderr: stderr() };
}
const json = (text: string) => JSON.parse(text) as SolveOutputJson;

describe("solve --index", () => {
  it("writes numpy's estimates and iid delta-method standard errors (test/fixtures/models)", async () => {
    const { code, stdout } = await solve({ "d.csv": dataset }, [
      "d.csv",
      ...books,
      "--index",
      "index",
      "--rf",
      String(expected.riskFree),
      "--long-run",
      "iid",
      "--format",
      "json",
    ]);
    expect(code).toBe(exitCodes.ok);
    const index = json(stdout).index!;
    expect(index).toMatchObject({
      column: "index",
      signCondition: true,
      admissible: true,
      insideSet: true,
      bootstrapStdErrors: null,
      diagnostics: [],
    });
    for (const [name, value] of Object.entries(expected.estimates)) expectClose(index[name as "lowBeta"], value, { rel: 1e-11 });
    for (const [name, value] of Object.entries(expected.iidStdErrors))
      expectClose(index.stdErrors![name as "lowBeta"], value, { rel: 1e-6 });
  });

  it("adds bootstrap standard errors with --bootstrap, the same for any number of threads", async () => {
    const args = ["d.csv", ...books, "--index", "index", "--bootstrap", "300", "--format", "json"];
    const one = json((await solve({ "d.csv": dataset }, [...args, "--threads", "1"])).stdout).index!;
    const two = json((await solve({ "d.csv": dataset }, [...args, "--threads", "2"])).stdout).index!;
    expect(one.bootstrapStdErrors).toEqual(two.bootstrapStdErrors);
    // 300 replicates: the bootstrap's sd is known to about 4%; 25% allows the delta method's own error.
    expectClose(one.bootstrapStdErrors!.lowBeta, one.stdErrors!.lowBeta!, { rel: 0.25 });
  });

  it("prints a section in the text report", async () => {
    const { code, stdout } = await solve({ "d.csv": dataset }, ["d.csv", ...books, "--index", "index"]);
    expect(code).toBe(exitCodes.ok);
    expect(stdout).toContain('Model with an independent index (column "index")');
    expect(stdout).toMatch(/low structural beta\s+0\.70140/);
    expect(stdout).toMatch(/in the two-book set\s+yes/);
  });

  it("refuses a missing index column as it refuses a missing book column (exit 2)", async () => {
    const missingIndex = await solve({ "d.csv": dataset }, ["d.csv", ...books, "--index", "SPX"]);
    const missingBook = await solve({ "d.csv": dataset }, ["d.csv", "--low", "SPX", "--high", "high"]);
    expect(missingIndex.code).toBe(exitCodes.input);
    expect(missingIndex.stdout).toBe("");
    expect(missingIndex.stderr).toBe(missingBook.stderr);
    expect(missingIndex.stderr).toContain('"SPX"');
  });

  it("reports a constant index as a warning with no estimates (exit 0)", async () => {
    const lines = dataset.trim().split("\n");
    const constant = [lines[0], ...lines.slice(1).map((line) => line.replace(/[^,]+$/, "0.01"))].join("\n");
    const { code, stdout, stderr } = await solve({ "d.csv": constant }, ["d.csv", ...books, "--index", "index", "--format", "json"]);
    expect(code).toBe(exitCodes.ok);
    const index = json(stdout).index!;
    expect(index.lowBeta).toBeNull();
    expect(index.diagnostics.map((d) => d.code)).toEqual(["index-constant"]);
    expect(stderr).toContain("the index series is constant");
  });
});

describe("solve --noise-correlation", () => {
  it("gives the sensitivity table of docs/methods.md §2 for Example A (to 1e-6)", async () => {
    const { code, stdout } = await solve({ "a.csv": exampleA }, [
      "a.csv",
      ...books,
      "--noise-correlation",
      "-0.5,-0.3,0,0.3,0.5,0.8",
      "--format",
      "json",
    ]);
    expect(code).toBe(exitCodes.ok);
    const table = json(stdout).sensitivity!;
    // docs/methods.md §2, Example A: the set of b_low at each rho (six decimals).
    const reference = [
      [0.714286, 0.888889],
      [0.714286, 0.888889],
      [0.714286, 0.888889],
      [0.709335, 0.894225],
      [0.697831, 0.906712],
      [0.615385, 1.0],
    ];
    expect(table.map((e) => e.noiseCorrelation)).toEqual([-0.5, -0.3, 0, 0.3, 0.5, 0.8]);
    table.forEach((entry, i) => {
      expect(Math.abs(entry.bounds.lowBeta.min! - reference[i]![0]!)).toBeLessThan(1e-6);
      expect(Math.abs(entry.bounds.lowBeta.max! - reference[i]![1]!)).toBeLessThan(1e-6);
    });
    expect(table.map((e) => e.kind)).toEqual(["unchanged", "unchanged", "unchanged", "wider", "wider", "wider"]);
  });

  it("takes one negative value as a flag's argument, and the table in the text report", async () => {
    const { code, stdout } = await solve({ "a.csv": exampleA }, ["a.csv", ...books, "--noise-correlation", "-1"]);
    expect(code).toBe(exitCodes.ok);
    expect(stdout).toContain("Sensitivity to correlated noise");
    expect(stdout).toMatch(/-1\s+0\.71429\s+0\.88889\s+1\.1111\s+1\.2857\s+same as uncorrelated/);
  });

  it("states rho at or above the observed correlation (5/6) as a warning, with null bounds (exit 0)", async () => {
    const { code, stdout, stderr } = await solve({ "a.csv": exampleA }, [
      "a.csv",
      ...books,
      "--noise-correlation",
      "1",
      "--format",
      "json",
    ]);
    expect(code).toBe(exitCodes.ok);
    const [entry] = json(stdout).sensitivity!;
    expect(entry).toMatchObject({ kind: "not-an-interval", bounds: { lowBeta: { min: null, max: null } } });
    expect(stderr).toContain("at or above the books' observed correlation 0.833333");
  });

  it("reads a number or a list from a config file", async () => {
    for (const value of [0.3, [0.3, 0.5]]) {
      const { io, stdout } = fakeIo({ "a.csv": exampleA, "c.json": JSON.stringify({ noiseCorrelation: value }) });
      expect(await run(["solve", "a.csv", ...books, "--config", "c.json", "--format", "json"], io)).toBe(exitCodes.ok);
      expect(json(stdout()).sensitivity!.map((e) => e.noiseCorrelation)).toEqual([value].flat());
    }
  });

  it("refuses a value outside [-1, 1] in the same words from a flag and a config file", async () => {
    const flag = await solve({ "a.csv": exampleA }, ["a.csv", ...books, "--noise-correlation", "0.3,1.5"]);
    expect(flag.code).toBe(exitCodes.usage);
    expect(flag.stderr).toContain("must be a number >= -1 and <= 1, or several such numbers separated by commas");
  });
});
