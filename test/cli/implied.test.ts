import { describe, expect, it } from "vitest";
import { exitCodes } from "../../src/cli/runtime/exitCodes.js";
import { run } from "../../src/cli/program.js";
import { fakeIo } from "./fakeIo.js";

const structure = [
  "--low-beta",
  "0.72",
  "--factor-vol",
  "0.045",
  "--factor-mean",
  "0.006",
  "--low-noise-vol",
  "0.014",
  "--high-noise-vol",
  "0.022",
];

/** Every key path of a JSON value, arrays collapsed to their first element. */
function keyPaths(value: unknown, prefix = ""): string[] {
  if (Array.isArray(value)) return value.length === 0 ? [prefix] : keyPaths(value[0], `${prefix}[]`);
  if (value === null || typeof value !== "object") return [prefix];
  return Object.entries(value).flatMap(([key, child]) => keyPaths(child, prefix === "" ? key : `${prefix}.${key}`));
}

async function runJson(args: string[], files: Record<string, string> = {}) {
  const { io, stdout, stderr } = fakeIo(files);
  const code = await run(args, io);
  return { code, json: JSON.parse(stdout() || "null"), stderr: stderr() };
}

describe("betabound implied", () => {
  it("uses the same field names as solve for moments, bounds, grid and landmarks", async () => {
    const population = await runJson(["implied", ...structure, "--format", "json"]);
    expect(population.code).toBe(exitCodes.ok);
    const { io, stdout } = fakeIo();
    await run(["simulate", ...structure, "--periods", "600", "--seed", "4"], io);
    const solved = await runJson(["solve", "s.csv", "--low", "low", "--high", "high", "--format", "json"], { "s.csv": stdout() });
    for (const key of ["moments", "bounds", "grid", "landmarks"] as const) {
      expect(keyPaths(population.json[key]), key).toEqual(keyPaths(solved.json[key]));
    }
    for (const field of ["alpha", "beta", "rSquared", "residualVariance"]) {
      expect(solved.json.capm.low).toHaveProperty(field);
      expect(population.json.capm.low).toHaveProperty(field);
    }
  });

  it("reports the true structure inside its own identified set", async () => {
    const { json } = await runJson(["implied", ...structure, "--format", "json"]);
    expect(json.truth.lowBeta).toBe(0.72);
    expect(json.truth.insideSet).toBe(true);
    expect(json.bounds.lowBeta.min).toBeLessThan(0.72);
    expect(json.bounds.lowBeta.max).toBeGreaterThan(0.72);
  });

  it("adds --rf to the expected raw returns and leaves the excess moments alone", async () => {
    const without = await runJson(["implied", ...structure, "--format", "json"]);
    const withRf = await runJson(["implied", ...structure, "--rf", "0.002", "--format", "json"]);
    expect(withRf.json.moments).toEqual(without.json.moments);
    expect(withRf.json.riskFree).toBe(0.002);
    // E[R_low] = rf + b_low * factorMean = 0.002 + 0.72 * 0.006.
    expect(withRf.json.expectedReturns.low).toBeCloseTo(0.002 + 0.72 * 0.006, 15);
  });

  it("refuses a low beta at or above 1/w with exit 1", async () => {
    const { code, stderr } = await runJson(["implied", ...structure.slice(2), "--low-beta", "2.5", "--weight", "0.4"]);
    expect(code).toBe(exitCodes.usage);
    expect(stderr).toContain("option '--low-beta' is invalid: must be below 1/w");
  });

  it("writes a CSV whose first row is the truth", async () => {
    const { io, stdout } = fakeIo();
    expect(await run(["implied", ...structure, "--format", "csv", "--steps", "3"], io)).toBe(exitCodes.ok);
    const lines = stdout().trim().split("\n");
    expect(lines[0]).toMatch(/^point,lowBeta,highBeta/);
    expect(lines[1]).toMatch(/^truth,0\.72,1\.28/);
    expect(lines.filter((l) => l.startsWith("grid-"))).toHaveLength(3);
  });
});

describe("betabound simulate", () => {
  it("refuses invalid structures and options with exit 1 and names the option", async () => {
    for (const [extra, option] of [
      [["--periods", "0"], "--periods"],
      [["--periods", "10", "--tails", "2"], "--tails"],
      [["--periods", "10", "--garch", "0.5,0.6"], "--garch"],
      [["--periods", "10", "--start", "2024-13-45"], "--start"],
      [["--periods", "10", "--noise-ar", "1"], "--noise-ar"],
    ] as const) {
      const { io, stdout, stderr } = fakeIo();
      expect(await run(["simulate", ...structure, ...extra], io), option).toBe(exitCodes.usage);
      expect(stdout()).toBe("");
      expect(stderr(), option).toContain(option);
    }
  });

  it("writes JSON Lines with the requested column names", async () => {
    const { io, stdout } = fakeIo();
    await run(
      ["simulate", ...structure, "--periods", "3", "--format", "jsonl", "--names", "when,calm,bold", "--frequency", "quarterly"],
      io,
    );
    const records = stdout()
      .trim()
      .split("\n")
      .map((line) => JSON.parse(line));
    expect(records).toHaveLength(3);
    expect(Object.keys(records[0])).toEqual(["when", "calm", "bold"]);
    expect(records.map((r) => r.when)).toEqual(["2000-03-31", "2000-06-30", "2000-09-30"]);
  });
});
