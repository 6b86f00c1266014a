/**
 * The model with an independent index (docs/methods.md §3): the exact example from its population
 * moments, the analytic Jacobian against central differences, and a simulated sample against an
 * independent numpy implementation and against the truth it was drawn from (test/fixtures/models).
 */
import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { identifiedBounds } from "../../../src/core/identify.js";
import {
  type IndexMoments,
  indexJacobian,
  indexParameterNames,
  indexPoint,
  momentsFromVector,
  momentVector,
  parameterVector,
} from "../../../src/core/models/indexModel.js";
import { solveIndex } from "../../../src/core/models/indexSolve.js";
import { centralDifferenceJacobian } from "../../../src/core/numerics/jacobian.js";
import { expectClose } from "../../support/close.js";

const fixture = JSON.parse(readFileSync(new URL("../../fixtures/models/models_expected.json", import.meta.url), "utf8")).index as {
  observations: number;
  riskFree: number;
  truth: Record<string, number>;
  moments: Record<string, number>;
  estimates: Record<string, number>;
  iidStdErrors: Record<string, number>;
};
const rows = readFileSync(new URL("../../fixtures/models/index_dataset.csv", import.meta.url), "utf8")
  .trim()
  .split("\n")
  .slice(1)
  .map((line) => line.split(",").slice(1).map(Number));
const [low, high, index] = [0, 1, 2].map((k) => Float64Array.from(rows, (row) => row[k]!)) as [Float64Array, Float64Array, Float64Array];
const sample = { low, high, index, riskFree: fixture.riskFree };
const hac = { longRun: "hac" as const, hac: {} };
const plain = { weight: 0.5, uncertainty: hac, bootstrap: null, lowBetaBounds: null };

describe("the exact example of docs/methods.md §3", () => {
  // Truth b_low 3/4, b_high 5/4, b_I 1, phi 4, s = (2, 3, 1), w 1/2: population moments
  // V_low = 17/4, V_high = 37/4, V_I = 5, C_LH = 15/4, C_LI = 3, C_HI = 5 (docs/methods.md §3).
  const m: IndexMoments = {
    weight: 0.5,
    lowVariance: 17 / 4,
    highVariance: 37 / 4,
    indexVariance: 5,
    lowHigh: 15 / 4,
    lowIndex: 3,
    highIndex: 5,
  };
  const truth = {
    lowBeta: 3 / 4,
    highBeta: 5 / 4,
    indexLoading: 1,
    factorVariance: 4,
    lowNoiseVariance: 2,
    highNoiseVariance: 3,
    indexNoiseVariance: 1,
  };

  it("is recovered from its population moments (to the last bit or one rounding)", () => {
    const point = indexPoint(m);
    for (const name of indexParameterNames) expectClose(point[name], truth[name], { rel: 2.3e-16 });
    expect(point.lowBeta).toBe(0.75);
    expect(point.highBeta).toBe(1.25);
  });

  it("lies inside the two-book set [15/26, 17/16] from (V_low, V_high, C_LH)", () => {
    const bounds = identifiedBounds({
      weight: 0.5,
      lowMean: 0,
      highMean: 0,
      lowVariance: 17 / 4,
      highVariance: 37 / 4,
      covariance: 15 / 4,
    });
    expectClose(bounds.lowBeta.min, 15 / 26);
    expectClose(bounds.lowBeta.max, 17 / 16);
  });

  it("has the analytic Jacobian that central differences give (to 1e-8; b_low's row is (5/32, -3/32) in C_LI, C_HI)", () => {
    const analytic = indexJacobian(m);
    const numeric = centralDifferenceJacobian((x) => parameterVector(indexPoint(momentsFromVector(0.5, x))), momentVector(m), 1e-5);
    analytic.forEach((row, i) => row.forEach((value, j) => expect(Math.abs(value - numeric[i]![j]!), `${i},${j}`).toBeLessThan(1e-8)));
    // docs/methods.md §3: d b_low / d(C_LI, C_HI) = ((1 - w) C_HI, -(1 - w) C_LI) / D^2 with D = 4.
    expect(analytic[0]!.slice(4)).toEqual([2.5 / 16, -1.5 / 16]);
  });
});

describe("a simulated sample (numpy, T = 2,000, seed 20261215: test/fixtures/models)", () => {
  it("gives numpy's estimates (to 1e-11)", () => {
    const solved = solveIndex(sample, plain);
    for (const name of indexParameterNames) expectClose(solved[name], fixture.estimates[name]!, { rel: 1e-11 });
    expect(solved).toMatchObject({ signCondition: true, admissible: true, insideSet: null, diagnostics: [] });
  });

  it("gives numpy's iid delta-method standard errors (numerical Jacobian there, analytic here; to 1e-6)", () => {
    const solved = solveIndex(sample, { ...plain, uncertainty: { longRun: "iid", hac: {} } });
    for (const name of indexParameterNames) expectClose(solved.stdErrors![name], fixture.iidStdErrors[name]!, { rel: 1e-6 });
  });

  it("with a HAC lag of 0 gives the iid standard errors times sqrt((n - 1) / n) (divisor n against n - 1)", () => {
    const iid = solveIndex(sample, { ...plain, uncertainty: { longRun: "iid", hac: {} } });
    const lagZero = solveIndex(sample, { ...plain, uncertainty: { longRun: "hac", hac: { lags: 0 } } });
    const n = fixture.observations;
    for (const name of indexParameterNames)
      expectClose(lagZero.stdErrors![name], iid.stdErrors![name]! * Math.sqrt((n - 1) / n), { rel: 1e-9 });
  });

  it("covers the truth within 3.5 HAC standard errors for every parameter", () => {
    const solved = solveIndex(sample, plain);
    for (const name of indexParameterNames) {
      const z = Math.abs(solved[name]! - fixture.truth[name]!) / solved.stdErrors![name]!;
      expect(z, name).toBeLessThan(3.5);
    }
  });

  it("has bootstrap standard errors within 20% of the delta method's (iid data, 600 replicates)", () => {
    const solved = solveIndex(sample, { ...plain, bootstrap: { replicates: 600, blockLength: 1, seed: 7 } });
    // The sd of a bootstrap sd with 600 replicates is about 1/sqrt(2 * 600) = 3%; 20% allows the delta method's own error.
    for (const name of indexParameterNames) expectClose(solved.bootstrapStdErrors![name], solved.stdErrors![name]!, { rel: 0.2 });
  });

  it("says whether the point lies in the two-book set", () => {
    expect(solveIndex(sample, { ...plain, lowBetaBounds: { min: 0.6, max: 0.8 } }).insideSet).toBe(true);
    expect(solveIndex(sample, { ...plain, lowBetaBounds: { min: 0.71, max: 0.8 } }).insideSet).toBe(false);
  });

  it("reports results in the index's own units: an index times 2^-70 or 1e-80", () => {
    // Excess returns given as such (an index of 1e-80 minus a risk-free rate of 1e-4 would be rounding).
    const excess = (x: Float64Array, factor = 1) => x.map((v) => (v - fixture.riskFree) * factor);
    const base = solveIndex({ low: excess(low), high: excess(high), index: excess(index) }, plain);
    for (const factor of [2 ** -70, 1e-80]) {
      const scaled = solveIndex({ low: excess(low), high: excess(high), index: excess(index, factor) }, plain);
      expectClose(scaled.lowBeta, base.lowBeta!, { rel: 1e-12 });
      expectClose(scaled.indexLoading, base.indexLoading! * factor, { rel: 1e-12 });
      expectClose(scaled.indexNoiseVariance, base.indexNoiseVariance! * factor * factor, { rel: 1e-10 });
      expectClose(scaled.factorVariance, base.factorVariance!, { rel: 1e-12 });
      expectClose(scaled.stdErrors!.indexLoading, base.stdErrors!.indexLoading! * factor, { rel: 1e-9 });
    }
  });
});

describe("inadmissible and unidentified cases are diagnostics", () => {
  it("an index that is the books' sum is a Heywood case: s_I = -(V_low V_high - C^2) / C, reported as computed", () => {
    const sum = low.map((l, t) => l + high[t]!);
    const solved = solveIndex({ low, high, index: sum }, plain);
    const { lowVariance: vl, highVariance: vh, lowHigh: c } = fixture.moments;
    expectClose(solved.indexNoiseVariance, -(vl! * vh! - c! * c!) / c!, { rel: 1e-9 });
    expect(solved.admissible).toBe(false);
    expect(solved.signCondition).toBe(true);
    expect(solved.diagnostics.map((d) => [d.code, d.severity, (d.detail as { series: string }).series])).toEqual([
      ["index-heywood", "warning", "index"],
    ]);
  });

  it("covariances of opposite signs break the sign condition (index = high - 1.8 low)", () => {
    const solved = solveIndex({ low, high, index: high.map((h, t) => h - 1.8 * low[t]!) }, plain);
    expect(solved.signCondition).toBe(false);
    expect(solved.admissible).toBe(false);
    expect(solved.factorVariance).toBeLessThan(0);
    expect(solved.diagnostics[0]?.code).toBe("index-sign-condition");
  });

  it("a constant index, one of 1e-300, and one orthogonal to both books give no estimates", () => {
    const n = low.length;
    const constant = solveIndex({ low, high, index: new Float64Array(n).fill(0.01) }, plain);
    expect(constant.diagnostics.map((d) => d.code)).toEqual(["index-constant"]);
    expect(constant.lowBeta).toBeNull();
    expect(constant.stdErrors).toBeNull();
    const tiny = solveIndex({ low, high, index: index.map((v) => v * 1e-300) }, plain);
    expect(tiny.diagnostics.map((d) => d.code)).toEqual(["index-out-of-range"]);
    // Binary patterns: the books +-0.5 and +-0.25 (as the degenerate catalogue's zero covariance), the index orthogonal to both.
    const a = Float64Array.from({ length: 64 }, (_, t) => (t % 2 === 0 ? 0.5 : -0.5) + (t % 4 < 2 ? 0.25 : -0.25));
    const b = Float64Array.from({ length: 64 }, (_, t) => (t % 2 === 0 ? 0.5 : -0.5) - (t % 4 < 2 ? 0.25 : -0.25));
    const orthogonal = Float64Array.from({ length: 64 }, (_, t) => (t % 8 < 4 ? 0.125 : -0.125));
    const unidentified = solveIndex({ low: a, high: b, index: orthogonal }, plain);
    expect(unidentified.diagnostics.map((d) => d.code)).toEqual(["index-not-identified"]);
    expect(unidentified.diagnostics[0]!.detail).toMatchObject({ quantity: "lowIndex", value: 0 });
  });
});
