/**
 * The pricing section end to end (docs/methods.md §30): the verdict and the outside-the-set
 * diagnostics follow the test, never the point estimates alone; without standard errors nothing is
 * concluded; raw means are flagged; an unbounded Fieller set is reported as such.
 */
import { describe, expect, it } from "vitest";
import { exitCodes } from "../../src/cli/runtime/exitCodes.js";
import { run } from "../../src/cli/program.js";
import { drawSample } from "../../src/core/forward/simulate.js";
import { pricingSchema } from "../../src/schema/pricing.js";
import { fakeIo } from "./fakeIo.js";

const structure = { weight: 0.5, factorVol: 0.045, factorMean: 0.006, lowBeta: 0.8, lowNoiseVol: 0, highNoiseVol: 0.03 };

function csvOf(low: ArrayLike<number>, high: ArrayLike<number>): string {
  const lines = ["date,low,high"];
  for (let t = 0; t < low.length; t++) {
    const month = new Date(Date.UTC(1960, t + 1, 0)).toISOString().slice(0, 10);
    lines.push(`${month},${low[t]},${high[t]}`);
  }
  return `${lines.join("\n")}\n`;
}

async function solveJson(csv: string, extra: string[] = []) {
  const { io, stdout, stderr } = fakeIo({ "s.csv": csv });
  const code = await run(["solve", "s.csv", "--low", "low", "--high", "high", "--format", "json", ...extra], io);
  return { code, json: JSON.parse(stdout()), stderr: stderr() };
}

const codes = (json: { diagnostics: { code: string }[] }) => json.diagnostics.map((d) => d.code);

describe("solve's pricing section", () => {
  it("an alpha no structure explains: 'not explained', and the outside warning with its p-value", async () => {
    const sample = drawSample(structure, { periods: 687, seed: 1 });
    const { code, json, stderr } = await solveJson(
      csvOf(
        sample.low.map((r) => r + 0.006),
        sample.high,
      ),
      ["--rf", "0"],
    );
    expect(code).toBe(exitCodes.ok);
    expect(pricingSchema.safeParse(json.pricing).success).toBe(true);
    expect(json.pricing.test.verdict).toBe("not explained");
    expect(json.pricing.test.pValue).toBeLessThan(0.05);
    expect(json.pricing.alpha.low.unexplained).toBeGreaterThan(0);
    expect(json.pricing.alpha.low.annualised.observed).toBeCloseTo(12 * json.pricing.alpha.low.observed, 14);
    expect(codes(json)).toContain("return-implied-outside-set");
    expect(stderr).toContain("significantly");
    expect(json.pricing.excessReturns).toBe(true);
  });

  it("a point outside the set that the test does not reject: info with the p-value, no warning", async () => {
    // Samples from the model (H0 true at the upper end): find one whose point falls outside by chance.
    for (let seed = 1; seed < 60; seed++) {
      const sample = drawSample(structure, { periods: 687, seed });
      const { json, stderr } = await solveJson(csvOf(sample.low, sample.high));
      const outside = json.diagnostics.find((d: { code: string }) => d.code === "return-implied-outside-not-significant");
      if (outside === undefined) continue;
      expect(json.pricing.test.verdict).not.toBe("not explained");
      expect(outside.severity).toBe("info");
      expect(outside.detail.pValue).toBe(json.pricing.test.pValue);
      expect(outside.detail.pValue).toBeGreaterThanOrEqual(0.05);
      expect(codes(json)).not.toContain("return-implied-outside-set");
      expect(stderr).toBe("");
      // Without a risk-free rate the section says raw means were used.
      expect(json.pricing.excessReturns).toBe(false);
      return;
    }
    throw new Error("no sample with its point outside the set");
  });

  it("without standard errors: the point figures only, no test and no verdict", async () => {
    const sample = drawSample(structure, { periods: 687, seed: 1 });
    const { json } = await solveJson(
      csvOf(
        sample.low.map((r) => r + 0.006),
        sample.high,
      ),
      ["--no-uncertainty"],
    );
    expect(json.pricing.test).toBeNull();
    expect(json.pricing.returnImpliedLowBeta.stdError).toBeNull();
    expect(json.pricing.returnImpliedLowBeta.shape).toBeNull();
    expect(json.pricing.alpha.low.observedLower).toBeNull();
    expect(codes(json)).not.toContain("return-implied-outside-set");
    const outside = json.diagnostics.find((d: { code: string }) => d.code === "return-implied-outside-not-significant");
    expect(outside.detail.pValue).toBeNull();
    const { io, stdout } = fakeIo({
      "s.csv": csvOf(
        sample.low.map((r) => r + 0.006),
        sample.high,
      ),
    });
    await run(["solve", "s.csv", "--low", "low", "--high", "high", "--no-uncertainty"], io);
    expect(stdout()).toContain("Not tested (no standard errors)");
  });

  it("a market mean not distinguishable from zero: Fieller's set unbounded, reported as such, and no point", async () => {
    const sample = drawSample({ ...structure, factorMean: 0.0005 }, { periods: 240, seed: 3 });
    const { json } = await solveJson(csvOf(sample.low, sample.high));
    const r = json.pricing.returnImpliedLowBeta;
    expect(["two-rays", "whole-line"]).toContain(r.shape);
    expect(r.lower).toBeNull();
    expect(r.upper).toBeNull();
    expect(json.landmarks.returnImplied).toBeNull();
    expect(codes(json)).toContain("market-mean-near-zero");
    const { io, stdout } = fakeIo({ "s.csv": csvOf(sample.low, sample.high) });
    await run(["solve", "s.csv", "--low", "low", "--high", "high"], io);
    expect(stdout()).toMatch(/Fieller 95% set unbounded/);
    expect(stdout()).toContain("No risk-free rate was given");
  });
});
