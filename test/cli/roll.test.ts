import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { exitCodes } from "../../src/cli/runtime/exitCodes.js";
import { run } from "../../src/cli/program.js";
import { windowUncertainty } from "../../src/core/inference/windowUncertainty.js";
import { solve } from "../../src/core/solve.js";
import { rollRecordSchema } from "../../src/schema/rollOutput.js";
import { fakeIo } from "./fakeIo.js";

const monthly = readFileSync(new URL("../../examples/harbourline-monthly.csv", import.meta.url), "utf8");
const rows = monthly
  .trim()
  .split("\n")
  .slice(1)
  .map((line) => line.split(","));
const low = rows.map((r) => Number(r[1]));
const high = rows.map((r) => Number(r[2]));
const books = ["--low", "Stillwater Low Vol", "--high", "Kestrel High Beta"];

async function roll(args: string[], files: Record<string, string> = { "m.csv": monthly }) {
  const { io, stdout, stderr } = fakeIo(files);
  const code = await run(["roll", ...args], io);
  return { code, stdout: stdout(), stderr: stderr() };
}

/** CSV text to records keyed by header name. */
function parseCsv(text: string): Record<string, string>[] {
  const [header, ...lines] = text.trim().split("\n");
  const names = header!.split(",");
  return lines.map((line) => Object.fromEntries(line.split(",").map((v, i) => [names[i], v])));
}

describe("betabound roll", () => {
  it("gives every rolling window the bounds and CAPM betas solve gives on that window's rows", async () => {
    const { code, stdout } = await roll(["m.csv", ...books, "--window", "48", "--step", "7", "--format", "csv"]);
    expect(code).toBe(exitCodes.ok);
    const windows = parseCsv(stdout);
    expect(windows).toHaveLength(Math.floor((180 - 48) / 7) + 1);
    for (const w of windows) {
      const from = rows.findIndex((r) => r[0] === w.start);
      const to = rows.findIndex((r) => r[0] === w.end);
      expect(to - from + 1).toBe(48);
      const direct = solve({ low: low.slice(from, to + 1), high: high.slice(from, to + 1) });
      if (!direct.ok) throw new Error("window did not solve");
      // Incremental windows agree with recomputation within 1e-10 relative (src/core/rolling/).
      expect(Number(w.lowBetaMin)).toBeCloseTo(direct.value.bounds!.lowBeta.min, 10);
      expect(Number(w.lowBetaMax)).toBeCloseTo(direct.value.bounds!.lowBeta.max, 10);
      expect(Number(w.lowBeta)).toBeCloseTo(direct.value.capm.low.beta, 10);
      expect(Number(w.highBeta)).toBeCloseTo(direct.value.capm.high.beta, 10);
    }
  });

  it("writes JSON Lines records that validate against the roll-record schema, with solve's field names", async () => {
    const { code, stdout } = await roll([
      "m.csv",
      ...books,
      "--expanding",
      "--min-periods",
      "120",
      "--step",
      "30",
      "--format",
      "jsonl",
      "--uncertainty",
    ]);
    expect(code).toBe(exitCodes.ok);
    const records = stdout
      .trim()
      .split("\n")
      .map((line) => JSON.parse(line));
    expect(records.map((r) => r.observations)).toEqual([120, 150, 180]);
    for (const record of records) {
      const parsed = rollRecordSchema.safeParse(record);
      expect(parsed.success, JSON.stringify(parsed.error?.issues?.[0])).toBe(true);
      expect(record.start).toBe("2011-01-31");
      expect(Object.keys(record.landmarks)).toEqual(["lowNoiseFree", "highNoiseFree", "equalNoise", "capmConsistent", "returnImplied"]);
    }
    const last = records[2];
    const direct = solve({ low, high });
    if (!direct.ok) throw new Error("did not solve");
    expect(last.bounds.lowBeta.min).toBeCloseTo(direct.value.bounds!.lowBeta.min, 12);
    expect(last.moments.covariance.lowHigh).toBeCloseTo(direct.value.moments.covariance.lowHigh, 15);
    const u = windowUncertainty(
      Float64Array.from(low),
      Float64Array.from(high),
      0,
      179,
      {
        weight: 0.5,
        lowMean: 0,
        highMean: 0,
        lowVariance: direct.value.moments.low.variance,
        highVariance: direct.value.moments.high.variance,
        covariance: direct.value.moments.covariance.lowHigh,
      },
      { confidence: 0.95, longRun: "hac" },
    );
    expect(last.uncertainty.lowBeta.interval.lower).toBeCloseTo(u!.lowBeta.interval.lower, 10);
  });

  it("reports a failing pair in its own record and exits 5, carrying on with the others", async () => {
    const { code, stdout, stderr } = await roll([
      "m.csv",
      "--pair",
      "Stillwater Low Vol:Kestrel High Beta",
      "--pair",
      "Stillwater Low Vol:Nope",
      "--window",
      "170",
      "--format",
      "jsonl",
    ]);
    expect(code).toBe(exitCodes.partial);
    const records = stdout
      .trim()
      .split("\n")
      .map((line) => JSON.parse(line));
    expect(records.filter((r) => r.status === "ok")).toHaveLength(11);
    const failure = records.find((r) => r.status === "failed");
    expect(failure.errors[0].code).toBe("unknown-column");
    expect(records.every((r) => rollRecordSchema.safeParse(r).success)).toBe(true);
    expect(stderr).toContain("Nope");
  });

  it("refuses a window longer than the data, and a missing or double window choice", async () => {
    const long = await roll(["m.csv", ...books, "--window", "500"]);
    expect(long.code).toBe(exitCodes.input);
    expect(long.stderr).toContain("fewer than the 500");
    const none = await roll(["m.csv", ...books]);
    expect(none.code).toBe(exitCodes.usage);
    expect(none.stderr).toContain("--window");
    const both = await roll(["m.csv", ...books, "--window", "60", "--expanding", "--min-periods", "60"]);
    expect(both.code).toBe(exitCodes.usage);
  });

  it("prints a table for a person with the caution", async () => {
    const { code, stdout } = await roll(["m.csv", ...books, "--window", "60", "--step", "60"]);
    expect(code).toBe(exitCodes.ok);
    expect(stdout).toContain("the identified set through time");
    expect(stdout).toMatch(/2015-12-31\s+60\s+0\.\d+/);
    expect(stdout).toContain("not investment advice");
  });
});

describe("roll --uncertainty carries the pricing test per window", () => {
  it("a window over every row has solve's return-implied interval, p-values and verdict", async () => {
    const rolled = await roll(["m.csv", ...books, "--rf", "0.002", "--window", "180", "--uncertainty", "--format", "jsonl"]);
    expect(rolled.code).toBe(exitCodes.ok);
    const record = JSON.parse(rolled.stdout.trim());
    const { io, stdout } = fakeIo({ "m.csv": monthly });
    expect(await run(["solve", "m.csv", ...books, "--rf", "0.002", "--format", "json"], io)).toBe(exitCodes.ok);
    const solved = JSON.parse(stdout());
    const window = record.uncertainty.pricing;
    expect(window.pValue).toBeCloseTo(solved.pricing.test.pValue, 12);
    expect(window.explainedPValue).toBeCloseTo(solved.pricing.test.explainedPValue, 12);
    expect(window.verdict).toBe(solved.pricing.test.verdict);
    expect(window.returnImpliedLowBeta.lower).toBeCloseTo(solved.pricing.returnImpliedLowBeta.lower, 12);
    expect(window.returnImpliedLowBeta.upper).toBeCloseTo(solved.pricing.returnImpliedLowBeta.upper, 12);
    expect(window.returnImpliedLowBeta.stdError).toBeCloseTo(solved.pricing.returnImpliedLowBeta.stdError, 12);
    expect(rollRecordSchema.safeParse(record).success).toBe(true);
  });

  it("puts the p-value and verdict in the CSV columns and the text table", async () => {
    const csv = await roll(["m.csv", ...books, "--window", "60", "--step", "30", "--uncertainty", "--format", "csv"]);
    const windows = parseCsv(csv.stdout);
    for (const w of windows) {
      expect(Number(w.pricingPValue)).toBeGreaterThanOrEqual(0);
      expect(Number(w.pricingPValue)).toBeLessThanOrEqual(1);
      expect(["explained", "not explained", "undetermined"]).toContain(w.pricingVerdict);
    }
    const text = await roll(["m.csv", ...books, "--window", "60", "--step", "30", "--uncertainty"]);
    expect(text.stdout).toContain("verdict");
    expect(text.stdout).toMatch(/undetermined|explained/);
  });
});
