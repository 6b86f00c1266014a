/**
 * The text report's annualised figures and plain words, checked against the JSON document of the
 * same run: means times the periods per year and volatilities (standard deviations times its
 * square root) in % a year, the CAPM alpha a year, the landmark and grid tables' volatilities, the
 * landmarks by name in words, the note on why the two books' CAPM fits mirror each other, and
 * "returns" rather than "excess returns" when no risk-free rate was given.
 */
import { readFileSync } from "node:fs";
import { describe, expect, test } from "vitest";
import { run } from "../../src/cli/program.js";
import { landmarkNames } from "../../src/core/types.js";
import { landmarkWords } from "../../src/report/conventions.js";
import { formatNumber, tableDigits } from "../../src/report/format.js";
import { fakeIo } from "../cli/fakeIo.js";

const monthly = readFileSync(new URL("../../examples/harbourline-monthly.csv", import.meta.url), "utf8");
const pair = ["--low", "Stillwater Low Vol", "--high", "Kestrel High Beta"];

async function solve(extra: string[]) {
  const { io, stdout } = fakeIo({ "m.csv": monthly });
  expect(await run(["solve", "m.csv", ...pair, ...extra], io)).toBe(0);
  const json = fakeIo({ "m.csv": monthly });
  expect(await run(["solve", "m.csv", ...pair, ...extra, "--format", "json"], json.io)).toBe(0);
  return { text: stdout(), json: JSON.parse(json.stdout()) };
}

const literal = (s: string) => s.replace(/[.*+?^${}()|[\]\\]/g, "\\$&");

describe("annualised figures and plain words in the text report", () => {
  test("moments, the CAPM alpha and the landmarks' volatilities a year follow from the per-period figures", async () => {
    const { text, json } = await solve(["--rf", "0.002", "--bootstrap", "30", "--threads", "1"]);
    const ppy = json.input.frequency.periodsPerYear;
    expect(ppy).toBe(12);
    const m = json.moments.low;
    const momentsRow = [m.mean, m.stdev, m.variance, m.sharpeRatio].map((x) => formatNumber(x));
    const annual = [formatNumber(100 * ppy * m.mean, 3), formatNumber(100 * Math.sqrt(ppy) * m.stdev, 3)];
    expect(text).toMatch(new RegExp(`\\n  low +${[...momentsRow, ...annual].map(literal).join(" +")}\\n`));
    const alphas = [json.capm.low.alpha, json.capm.high.alpha].map((a: number) => literal(formatNumber(100 * ppy * a, 3)));
    expect(text).toMatch(new RegExp(`\\n  alpha, % a year \\(x 12\\) +${alphas.join(" +")}\\n`));
    for (const name of landmarkNames) {
      const c = json.landmarks[name];
      const vol = (v: number) => formatNumber(Math.sign(v) * 100 * Math.sqrt(ppy * Math.abs(v)), tableDigits);
      const cells = [
        formatNumber(c.lowBeta, tableDigits),
        formatNumber(c.highBeta, tableDigits),
        vol(c.factorVariance),
        vol(c.lowNoiseVariance),
        vol(c.highNoiseVariance),
        formatNumber(c.noiseShare, tableDigits),
        formatNumber(100 * ppy * c.expectedLowAlpha, tableDigits),
        formatNumber(100 * ppy * c.expectedHighAlpha, tableDigits),
      ];
      expect(text).toMatch(new RegExp(`\\n  ${literal(landmarkWords[name])} +${cells.map(literal).join(" +")}\\n`));
      expect(text).not.toContain(name);
    }
    expect(text.replace(/\s+/g, " ")).toContain("vol: volatility in % a year (the square root of the variance times sqrt(12))");
    expect(text).toContain(`${landmarkWords.capmConsistent} low beta`);
    expect(text.split("\n").filter((line) => line.length >= 100)).toEqual([]);
  });

  test("the CAPM section says why the fits mirror each other, and the JSON bears it out at w = 0.6", async () => {
    const { text, json } = await solve(["--weight", "0.6"]);
    const flat = text.replace(/\s+/g, " ");
    expect(flat).toContain("w alpha_low + (1 - w) alpha_high = 0 and var(e_high) = (w / (1 - w))^2 var(e_low).");
    const w = 0.6;
    const { low, high } = json.capm;
    expect(Math.abs(w * low.alpha + (1 - w) * high.alpha)).toBeLessThan(1e-15);
    expect(high.residualVariance / low.residualVariance).toBeCloseTo((w / (1 - w)) ** 2, 12);
    expect((await solve([])).text.replace(/\s+/g, " ")).toContain("at w = 0.5 the residual variances are equal and the alphas opposite");
  });

  test("headings say returns, not excess returns, when no risk-free rate was given", async () => {
    const raw = (await solve([])).text;
    expect(raw).toContain("\nSample moments (returns, per period)\n");
    expect(raw).toContain("\nSharpe ratios (returns: no risk-free rate given)\n");
    expect(raw).not.toContain("excess returns,");
    const excess = (await solve(["--rf", "0.002"])).text;
    expect(excess).toContain("\nSample moments (excess returns, per period)\n");
    expect(excess).toContain("\nSharpe ratios (excess returns)\n");
  });
});

describe("standard deviations in the candidate tables when the frequency is unknown", () => {
  test("implied recovers the volatilities it was given at the return-implied landmark (the true structure)", async () => {
    const { io, stdout } = fakeIo();
    const args = ["implied", "--low-beta", "0.72", "--factor-vol", "0.045", "--factor-mean", "0.006"];
    expect(await run([...args, "--low-noise-vol", "0.014", "--high-noise-vol", "0.022"], io)).toBe(0);
    // The population's return-implied point is the structure itself: its stdevs are the vols given.
    const row = stdout()
      .split("\n")
      .find((line) => line.startsWith(`  ${landmarkWords.returnImplied} `));
    const cells = row!.trim().split(/ +/).slice(1);
    expect(cells.slice(0, 5)).toEqual(["0.7200", "1.280", "0.04500", "0.01400", "0.02200"]);
    expect(stdout()).toContain("stdev: standard deviation per period");
  });
});
